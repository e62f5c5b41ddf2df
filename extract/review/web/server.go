// Package web serves the review page of a Dataset on the loopback
// interface, saving each decision to a review.Store, and writes the same
// page as one self-contained static report. The page's HTML, CSS and
// script are embedded files (assets/); nothing is fetched from elsewhere.
//
// The server sees documents that may be confidential, so every request
// must carry the session's secret token (in the address once, then in an
// HttpOnly, SameSite=Strict cookie), changes are POSTs that also carry
// the token in a header (which a page of another origin cannot set
// without the browser asking first), the Host header must name the
// address the server listens on (a page of another site that rebinds its
// DNS name to 127.0.0.1 sends its own name), request bodies are small,
// and only the embedded files and the API are served.
package web

import (
	"crypto/rand"
	"crypto/subtle"
	"embed"
	"encoding/hex"
	"encoding/json"
	"errors"
	"html/template"
	"io"
	"net"
	"net/http"
	"reflect"
	"strconv"
	"sync"

	"glossmith/extract/review"
)

//go:embed assets
var assets embed.FS

// cookieName is the session cookie holding the token.
const cookieName = "glossmith_review"

// tokenHeader carries the token on changes.
const tokenHeader = "X-Glossmith-Token"

// MaxBody is the largest request body accepted: an action is a few hundred
// bytes, a definition at most review.MaxText.
const MaxBody = 64 << 10

// contextPage is how many contexts the detail view gets at first and per
// "more" request.
const contextPage = 4

// Server is the review page of one dataset.
type Server struct {
	ds    *review.Dataset
	store review.Store
	token string
	hosts map[string]bool
	index *template.Template

	mu        sync.Mutex // guards decisions and orders the store's changes
	decisions []review.Decision
	byTerm    map[string]int
}

// New returns the server of a dataset, with the decisions the store holds
// on its candidates.
func New(ds *review.Dataset, store review.Store) (*Server, error) {
	tok := make([]byte, 24)
	if _, err := rand.Read(tok); err != nil {
		return nil, err
	}
	index, err := template.ParseFS(assets, "assets/index.html")
	if err != nil {
		return nil, err
	}
	s := &Server{ds: ds, store: store, token: hex.EncodeToString(tok), index: index,
		hosts: map[string]bool{}, byTerm: make(map[string]int, len(ds.Candidates))}
	for i, c := range ds.Candidates {
		if _, dup := s.byTerm[c.Term]; !dup {
			s.byTerm[c.Term] = i
		}
	}
	if err := s.reload(); err != nil {
		return nil, err
	}
	return s, nil
}

// Token returns the session's secret.
func (s *Server) Token() string { return s.token }

// Allow accepts requests whose Host header is this address (host:port).
// The server allows nothing until told what it listens on: see Listen.
func (s *Server) Allow(hostport string) { s.hosts[hostport] = true }

// Listen opens the listener on addr (host:port, port 0 for a free one) and
// allows the Host headers that name it: for a loopback address its
// numeric form, "localhost" and the other loopback form with the port. It
// returns the page's address with the token.
func (s *Server) Listen(addr string) (net.Listener, string, error) {
	ln, err := net.Listen("tcp", addr)
	if err != nil {
		return nil, "", err
	}
	ta := ln.Addr().(*net.TCPAddr)
	port := strconv.Itoa(ta.Port)
	host := ta.IP.String()
	if ta.IP.IsUnspecified() {
		host = "127.0.0.1"
	}
	s.Allow(net.JoinHostPort(host, port))
	if ta.IP.IsLoopback() || ta.IP.IsUnspecified() {
		for _, h := range []string{"127.0.0.1", "localhost", "::1"} {
			s.Allow(net.JoinHostPort(h, port))
		}
	}
	return ln, "http://" + net.JoinHostPort(host, port) + "/?t=" + s.token, nil
}

// reload reads the decisions on every candidate from the store.
func (s *Server) reload() error {
	names := make([]string, len(s.ds.Candidates))
	for i, c := range s.ds.Candidates {
		names[i] = c.Term
	}
	got, err := s.store.Lookup(names)
	if err != nil {
		return err
	}
	s.decisions = make([]review.Decision, len(names))
	for i, n := range names {
		s.decisions[i] = normal(got[n])
	}
	return nil
}

func normal(d review.Decision) review.Decision {
	if d.Status == "" {
		d.Status = review.New
	}
	return d
}

// Handler returns the server's routes behind the checks every request
// passes.
func (s *Server) Handler() http.Handler {
	mux := http.NewServeMux()
	mux.HandleFunc("GET /{$}", s.page)
	mux.HandleFunc("GET /app.js", s.asset("assets/app.js", "text/javascript; charset=utf-8"))
	mux.HandleFunc("GET /app.css", s.asset("assets/app.css", "text/css; charset=utf-8"))
	mux.HandleFunc("GET /favicon.svg", s.asset("assets/favicon.svg", "image/svg+xml"))
	mux.HandleFunc("GET /api/data", s.data)
	mux.HandleFunc("GET /api/detail", s.detail)
	mux.HandleFunc("GET /api/contexts", s.contexts)
	mux.HandleFunc("POST /api/act", s.act)
	mux.HandleFunc("POST /api/undo", s.undo)
	return s.guard(mux)
}

// guard applies the checks of every request: the Host header, the token,
// and for changes the token header and a JSON body of bounded size.
func (s *Server) guard(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		h := w.Header()
		h.Set("Content-Security-Policy", "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self'; connect-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'")
		h.Set("X-Content-Type-Options", "nosniff")
		h.Set("Referrer-Policy", "no-referrer")
		h.Set("X-Frame-Options", "DENY")
		h.Set("Cache-Control", "no-store")
		if !s.hosts[r.Host] {
			http.Error(w, "unknown host "+strconv.Quote(r.Host)+": open the address glossmith printed", http.StatusMisdirectedRequest)
			return
		}
		if q := r.URL.Query().Get("t"); q != "" && r.Method == http.MethodGet && r.URL.Path == "/" {
			if !s.tokenOK(q) {
				http.Error(w, "wrong token", http.StatusForbidden)
				return
			}
			// The token leaves the address bar for the cookie.
			http.SetCookie(w, &http.Cookie{Name: cookieName, Value: s.token, Path: "/", HttpOnly: true, SameSite: http.SameSiteStrictMode})
			http.Redirect(w, r, "/", http.StatusSeeOther)
			return
		}
		c, err := r.Cookie(cookieName)
		if err != nil || !s.tokenOK(c.Value) {
			http.Error(w, "no valid token: open the address glossmith printed", http.StatusForbidden)
			return
		}
		if r.Method != http.MethodGet && r.Method != http.MethodHead {
			if r.Method != http.MethodPost || !s.tokenOK(r.Header.Get(tokenHeader)) {
				http.Error(w, "changes need a POST with the token", http.StatusForbidden)
				return
			}
			if ct := r.Header.Get("Content-Type"); ct != "application/json" {
				http.Error(w, "want application/json", http.StatusUnsupportedMediaType)
				return
			}
			r.Body = http.MaxBytesReader(w, r.Body, MaxBody)
		}
		next.ServeHTTP(w, r)
	})
}

func (s *Server) tokenOK(t string) bool {
	return subtle.ConstantTimeCompare([]byte(t), []byte(s.token)) == 1
}

func (s *Server) page(w http.ResponseWriter, r *http.Request) {
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	if err := s.index.Execute(w, struct{ Token string }{s.token}); err != nil {
		http.Error(w, err.Error(), http.StatusInternalServerError)
	}
}

func (s *Server) asset(name, ctype string) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		b, err := assets.ReadFile(name)
		if err != nil {
			http.NotFound(w, r)
			return
		}
		w.Header().Set("Content-Type", ctype)
		w.Write(b)
	}
}

func writeJSON(w http.ResponseWriter, v any) {
	w.Header().Set("Content-Type", "application/json; charset=utf-8")
	enc := json.NewEncoder(w)
	if err := enc.Encode(v); err != nil {
		http.Error(w, err.Error(), http.StatusInternalServerError)
	}
}

// dataReply is the table: the candidates and their decisions.
type dataReply struct {
	*review.Dataset
	Decisions []review.Decision `json:"decisions"`
	Live      bool              `json:"live"`
}

func (s *Server) data(w http.ResponseWriter, r *http.Request) {
	s.mu.Lock()
	// Read back from the termbase: decisions made since by termbase
	// commands or another page show on a reload.
	err := s.reload()
	d := append([]review.Decision(nil), s.decisions...)
	s.mu.Unlock()
	if err != nil {
		http.Error(w, "could not read the termbase: "+err.Error(), http.StatusInternalServerError)
		return
	}
	writeJSON(w, dataReply{s.ds, d, true})
}

// candidate reads the id parameter.
func (s *Server) candidate(r *http.Request) (int, error) {
	id, err := strconv.Atoi(r.URL.Query().Get("id"))
	if err != nil || id < 0 || id >= len(s.ds.Candidates) {
		return 0, errors.New("no such candidate")
	}
	return id, nil
}

// detailReply is a detail view with its first contexts.
type detailReply struct {
	review.Detail
	More     int             `json:"more"` // contexts not sent yet
	Decision review.Decision `json:"decision"`
}

func (s *Server) detail(w http.ResponseWriter, r *http.Request) {
	id, err := s.candidate(r)
	if err != nil {
		http.Error(w, err.Error(), http.StatusNotFound)
		return
	}
	d := s.ds.Details[id]
	n := len(d.Contexts)
	d.Contexts = d.Contexts[:min(n, contextPage)]
	s.mu.Lock()
	dec := s.decisions[id]
	s.mu.Unlock()
	writeJSON(w, detailReply{d, n - len(d.Contexts), dec})
}

func (s *Server) contexts(w http.ResponseWriter, r *http.Request) {
	id, err := s.candidate(r)
	if err != nil {
		http.Error(w, err.Error(), http.StatusNotFound)
		return
	}
	from, err := strconv.Atoi(r.URL.Query().Get("from"))
	all := s.ds.Details[id].Contexts
	if err != nil || from < 0 || from > len(all) {
		http.Error(w, "bad from", http.StatusBadRequest)
		return
	}
	to := min(len(all), from+2*contextPage)
	writeJSON(w, struct {
		Contexts []review.Context `json:"contexts"`
		More     int              `json:"more"`
	}{all[from:to], len(all) - to})
}

// actRequest is an action on candidates named by id.
type actRequest struct {
	ID    int         `json:"id"`
	Kind  review.Kind `json:"kind"`
	Form  string      `json:"form"`
	Other int         `json:"other"` // merge: the other candidate's id
	Text  string      `json:"text"`
}

// change is the reply to an action: the decisions that changed and the
// counter.
type change struct {
	Changed  map[int]review.Decision `json:"changed"`
	Reviewed int                     `json:"reviewed"`
	Total    int                     `json:"total"`
	Undone   bool                    `json:"undone,omitempty"`
}

func (s *Server) act(w http.ResponseWriter, r *http.Request) {
	var req actRequest
	body, err := io.ReadAll(r.Body)
	if err == nil {
		err = json.Unmarshal(body, &req)
	}
	if err != nil {
		http.Error(w, "bad request: "+err.Error(), http.StatusBadRequest)
		return
	}
	if req.ID < 0 || req.ID >= len(s.ds.Candidates) {
		http.Error(w, "no such candidate", http.StatusNotFound)
		return
	}
	a := review.Action{Kind: req.Kind, Term: s.ds.Candidates[req.ID].Term, Form: req.Form, Text: req.Text}
	if a.Kind == review.Merge {
		if req.Other < 0 || req.Other >= len(s.ds.Candidates) {
			http.Error(w, "no such candidate to merge with", http.StatusNotFound)
			return
		}
		a.Other = s.ds.Candidates[req.Other].Term
	}
	if err := a.Check(); err != nil {
		http.Error(w, err.Error(), http.StatusBadRequest)
		return
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	if err := s.store.Apply(a); err != nil {
		http.Error(w, "not saved: "+err.Error(), http.StatusConflict)
		return
	}
	ch, err := s.refresh(s.affected(a))
	if err != nil {
		http.Error(w, "saved, but could not read back: "+err.Error(), http.StatusInternalServerError)
		return
	}
	writeJSON(w, ch)
}

// affected lists the candidates whose decision an action may change: its
// own, the other one of a merge, the form it names, those shown as
// variants of either, and the acronym or full form the documents link
// either to (labelled by the other's decision).
func (s *Server) affected(a review.Action) []int {
	names := map[string]bool{a.Term: true, a.Other: true, a.Form: true}
	for _, n := range []string{a.Term, a.Other} {
		if i, ok := s.byTerm[n]; ok {
			if e := s.decisions[i].Entry; e != "" {
				names[e] = true
			}
			c := s.ds.Candidates[i]
			names[c.Acronym], names[c.FullForm] = true, true
		}
	}
	delete(names, "")
	var ids []int
	for i, d := range s.decisions {
		c := s.ds.Candidates[i]
		if names[c.Term] || names[d.Entry] || names[c.Acronym] || names[c.FullForm] {
			ids = append(ids, i)
		}
	}
	return ids
}

// refresh reads the decisions of the candidates ids back from the store.
// Called with s.mu held.
func (s *Server) refresh(ids []int) (change, error) {
	names := make([]string, len(ids))
	for k, i := range ids {
		names[k] = s.ds.Candidates[i].Term
	}
	got, err := s.store.Lookup(names)
	if err != nil {
		return change{}, err
	}
	ch := change{Changed: map[int]review.Decision{}}
	for _, i := range ids {
		d := normal(got[s.ds.Candidates[i].Term])
		s.decisions[i] = d
		ch.Changed[i] = d
	}
	ch.Reviewed, ch.Total = s.counter()
	return ch, nil
}

func (s *Server) counter() (reviewed, total int) {
	for _, d := range s.decisions {
		if d.Reviewed() {
			reviewed++
		}
	}
	return reviewed, len(s.decisions)
}

func (s *Server) undo(w http.ResponseWriter, r *http.Request) {
	io.Copy(io.Discard, r.Body)
	s.mu.Lock()
	defer s.mu.Unlock()
	old := append([]review.Decision(nil), s.decisions...)
	undone, err := s.store.Undo()
	if err != nil {
		http.Error(w, "not undone: "+err.Error(), http.StatusConflict)
		return
	}
	// An undo may touch any entry: read every decision back.
	if err := s.reload(); err != nil {
		http.Error(w, "undone, but could not read back: "+err.Error(), http.StatusInternalServerError)
		return
	}
	ch := change{Changed: map[int]review.Decision{}, Undone: undone}
	for i, d := range s.decisions {
		if !reflect.DeepEqual(d, old[i]) {
			ch.Changed[i] = d
		}
	}
	ch.Reviewed, ch.Total = s.counter()
	writeJSON(w, ch)
}
