package termbase

import (
	"fmt"
	"strings"
	"time"
	"unicode"
)

// Status is a term's standing in the termbase.
type Status string

// The statuses: the TBX-Basic administrative statuses, then the two review
// states of a candidate.
const (
	Preferred  Status = "preferred"
	Admitted   Status = "admitted"
	Deprecated Status = "deprecated"
	Candidate  Status = "candidate" // seen, not decided (Deferred when put off on purpose)
	Rejected   Status = "rejected"  // not a term; never offered as new again
)

// Statuses lists every status, in the order of the schema.
var Statuses = []Status{Preferred, Admitted, Deprecated, Candidate, Rejected}

// ParseStatus checks a status name.
func ParseStatus(s string) (Status, error) {
	for _, st := range Statuses {
		if string(st) == s {
			return st, nil
		}
	}
	return "", fmt.Errorf("unknown status %q (want one of preferred, admitted, deprecated, candidate, rejected)", s)
}

// Entry is one concept with its terms.
type Entry struct {
	ID         int64    `json:"id"`
	ExtID      string   `json:"ext_id,omitempty"` // the id it had where it was imported from
	Subject    string   `json:"subject,omitempty"`
	Definition string   `json:"definition,omitempty"`
	DefSource  string   `json:"definition_source,omitempty"`
	Notes      []string `json:"notes,omitempty"`
	Terms      []*Term  `json:"terms"`
}

// Term is one designation of a concept in one language.
type Term struct {
	ID       int64     `json:"id"`
	EntryID  int64     `json:"entry"`
	Lang     string    `json:"lang"`
	Text     string    `json:"text"`
	Key      string    `json:"key"`
	Status   Status    `json:"status"`
	Deferred bool      `json:"deferred,omitempty"`
	POS      string    `json:"pos,omitempty"`
	Notes    []string  `json:"notes,omitempty"`
	Forms    []string  `json:"forms,omitempty"` // surface forms seen in documents
	Contexts []Context `json:"contexts,omitempty"`
}

// Context is a sentence a term was seen in.
type Context struct {
	Text   string `json:"text"`
	Doc    string `json:"doc,omitempty"`
	Line   int    `json:"line,omitempty"`
	Source string `json:"source,omitempty"` // a bibliographic source, as TBX-Basic has it
}

// MaxContexts is how many contexts a term keeps.
const MaxContexts = 3

// Preferred returns the entry's preferred term in lang ("" for any
// language), or failing that its first admitted term, or its first term.
func (e *Entry) Preferred(lang string) *Term {
	var best *Term
	for _, t := range e.Terms {
		if lang != "" && t.Lang != lang {
			continue
		}
		if best == nil || statusRank(t.Status) < statusRank(best.Status) {
			best = t
		}
	}
	return best
}

// Head is the term an entry is shown by: its preferred term in lang when
// it has a term in lang, else its preferred term in any language.
func (e *Entry) Head(lang string) *Term {
	if t := e.Preferred(lang); t != nil {
		return t
	}
	return e.Preferred("")
}

// statusRank orders statuses for choosing the term an entry is named by.
func statusRank(s Status) int {
	switch s {
	case Preferred:
		return 0
	case Admitted:
		return 1
	case Candidate:
		return 2
	case Deprecated:
		return 3
	}
	return 4
}

// Term returns the entry's term with this text in lang, or nil.
func (e *Entry) Term(lang, text string) *Term {
	for _, t := range e.Terms {
		if t.Lang == lang && t.Text == text {
			return t
		}
	}
	return nil
}

// Key is the form terms are matched by: lower case, one space between
// words, no space at the ends. Spelling variants that differ in more than
// that ("set point", "setpoint") have different keys and are linked by
// being terms or forms of one entry.
func Key(s string) string {
	if isKey(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	space := false
	for _, r := range s {
		if unicode.IsSpace(r) {
			space = b.Len() > 0
			continue
		}
		if space {
			b.WriteByte(' ')
			space = false
		}
		b.WriteRune(unicode.ToLower(r))
	}
	return b.String()
}

// isKey reports whether s is its own Key: no upper case, no space other
// than single blanks between words. Most candidates are, and need no copy.
func isKey(s string) bool {
	prevSpace := true
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= 0x80:
			return false // leave the Unicode cases to Key's loop
		case c == ' ':
			if prevSpace {
				return false
			}
			prevSpace = true
		case c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f' || (c >= 'A' && c <= 'Z'):
			return false
		default:
			prevSpace = false
		}
	}
	return !prevSpace || s == ""
}

// Change is one row of the change log.
type Change struct {
	ID       int64     `json:"id"`
	Time     time.Time `json:"time"`
	User     string    `json:"user"`
	Action   string    `json:"action"`
	Summary  string    `json:"summary"`
	Undoes   int64     `json:"undoes,omitempty"`    // an undo: the change it undid
	UndoneBy int64     `json:"undone_by,omitempty"` // undone by this later change
}

// Run is a recorded run of term extraction.
type Run struct {
	ID        int64     `json:"id"`
	Label     string    `json:"label"`
	Time      time.Time `json:"time"`
	Inputs    []string  `json:"inputs"`
	Documents int       `json:"documents"`
	Tokens    int       `json:"tokens"`
}

// RunTerm is one candidate of a recorded run.
type RunTerm struct {
	Term     string    `json:"term"`
	POS      string    `json:"pos,omitempty"`
	Freq     int       `json:"freq"`
	Docs     int       `json:"docs"`
	Forms    []Form    `json:"forms,omitempty"`
	Contexts []Context `json:"contexts,omitempty"`
	// Acronym and FullForm are the acronym the run's documents define for
	// this candidate, or the full form they define it as the acronym of
	// (terms.Term's fields), so that a recorded run is labelled as the
	// live one is. Runs recorded before schema 3 have neither.
	Acronym  string `json:"acronym,omitempty"`
	FullForm string `json:"full_form,omitempty"`
}

// Form is a surface form with its count.
type Form struct {
	Text  string `json:"text"`
	Count int    `json:"count"`
}

// Proposal is a term put up for a decision with what is known of it.
type Proposal struct {
	Text     string
	Lang     string // "" for the store's language
	POS      string
	Forms    []string
	Contexts []Context
}
