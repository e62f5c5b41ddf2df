package grammar

import (
	"regexp"
	"strconv"
	"strings"
	"unicode"

	"github.com/alecthomas/participle/v2/lexer"

	"glossmith/internal/suggest"
)

// MaxRepeat is the largest count allowed in {n,m}; it keeps compiled
// programs small (Go's regexp has the same limit).
const MaxRepeat = 1000

// fieldKeys are the names accepted before a colon in a token test.
var fieldKeys = []string{"xpos", "lemma", "begins", "ends", "chars"}

// renamedFields maps the field names of earlier versions to today's; an old
// name is an error that names the new one (there are no aliases).
var renamedFields = map[string]string{"tag": "xpos", "prefix": "begins", "suffix": "ends", "shape": "chars"}

// fieldNames returns the field keys as written, colon included.
func fieldNames() []string {
	out := make([]string, len(fieldKeys))
	for i, k := range fieldKeys {
		out[i] = k + ":"
	}
	return out
}

func (f *File) pos(p lexer.Position) Pos { return f.lines.pos(p.Offset) }

func (f *File) errorf(errs *ErrorList, p lexer.Position, format string, args ...any) {
	f.lines.errorf(errs, p.Offset, format, args...)
}

// convert turns participle's parse tree into the AST and appends it to f.
func (f *File) convert(pf *pFile, errs *ErrorList) {
	for _, st := range pf.Stmts {
		switch {
		case st.Use != nil:
			u := &Use{Pos: f.pos(st.Use.Pos)}
			if st.Use.Path != nil {
				s, ok := unquote(st.Use.Path.Value)
				if !ok || strings.HasPrefix(st.Use.Path.Value, "'") {
					f.errorf(errs, st.Use.Path.Pos, "use takes a file name in double quotes or `stock NAME`")
					continue
				}
				u.Path = s
			} else {
				u.Stock = st.Use.Stock.Value
			}
			f.Uses = append(f.Uses, u)
		case st.Example != nil:
			f.convertExample(st.Example, errs)
		case st.Rule != nil:
			f.convertRule(st.Rule, errs)
		}
	}
}

func (f *File) convertExample(pe *pExample, errs *ErrorList) {
	ex := &Example{Pos: f.pos(pe.Pos), Expect: pe.Kind == "expect", Rule: pe.Rule}
	raw, rawPos := "", pe.Pos
	if pe.Field != nil {
		i := strings.IndexByte(pe.Field.Value, ':')
		ex.Rule, raw, rawPos = pe.Field.Value[:i], pe.Field.Value[i+1:], pe.Field.Pos
		rawPos.Offset += i + 1
	} else {
		raw, rawPos = pe.Text.Value, pe.Text.Pos
	}
	if !strings.HasPrefix(raw, `"`) {
		f.errorf(errs, rawPos, "an example's text goes in double quotes")
		return
	}
	text, span, msg := parseExampleText(raw[1:len(raw)-1], ex.Expect)
	if msg != "" {
		f.errorf(errs, rawPos, "%s", msg)
		return
	}
	ex.Text, ex.Span = text, span
	f.Examples = append(f.Examples, ex)
}

// parseExampleText removes the escapes and the [ ] of an example text and
// returns the plain text with the bracketed byte span.
func parseExampleText(s string, expect bool) (string, [2]int, string) {
	var b strings.Builder
	open, close := -1, -1
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '\\' && i+1 < len(s):
			i++
			b.WriteByte(s[i])
		case c == '[':
			if open >= 0 {
				return "", [2]int{}, "an example has one [span]; found a second '['"
			}
			open = b.Len()
		case c == ']':
			if open < 0 || close >= 0 {
				return "", [2]int{}, "']' without a matching '['"
			}
			close = b.Len()
		default:
			b.WriteByte(c)
		}
	}
	switch {
	case open >= 0 && close < 0:
		return "", [2]int{}, "'[' without a matching ']'"
	case expect && open < 0:
		return "", [2]int{}, `an expect example marks the span that must match with [ ], as in "the [drip line] leaked"`
	case !expect && open >= 0:
		return "", [2]int{}, "a reject example has no [span]: no part of its text may match"
	case expect && strings.TrimSpace(b.String()[open:close]) == "":
		return "", [2]int{}, "the [span] of an expect example is empty"
	}
	if !expect {
		open, close = 0, 0
	}
	return b.String(), [2]int{open, close}, ""
}

func (f *File) convertRule(pr *pRule, errs *ErrorList) {
	r := &Rule{Name: pr.Name, Pos: f.pos(pr.Pos)}
	if reserved[r.Name] {
		f.errorf(errs, pr.Pos, "%q is a reserved word and cannot name a rule", r.Name)
	} else if IsUPOS(r.Name) {
		f.errorf(errs, pr.Pos, "%s is a UPOS tag and cannot name a rule", r.Name)
	}
	r.Doc = f.docAbove(r.Pos.Line)
	r.Expr = f.convAlt(pr.Body, errs)
	f.Rules = append(f.Rules, r)
}

// docAbove collects the comment lines directly above line n.
func (f *File) docAbove(n int) string {
	var lines []string
	for l := n - 1; l >= 1; l-- {
		s := strings.TrimSpace(strings.TrimPrefix(f.lines.line(l), "\ufeff"))
		if !strings.HasPrefix(s, "#") {
			break
		}
		s = strings.TrimPrefix(s, "#")
		s = strings.TrimPrefix(s, " ")
		lines = append(lines, s)
	}
	for i, j := 0, len(lines)-1; i < j; i, j = i+1, j-1 {
		lines[i], lines[j] = lines[j], lines[i]
	}
	return strings.TrimRight(strings.Join(lines, "\n"), "\n")
}

func (f *File) convAlt(pa *pAlt, errs *ErrorList) Node {
	if len(pa.Seqs) == 1 {
		return f.convSeq(pa.Seqs[0], errs)
	}
	a := &Alt{Pos: f.pos(pa.Pos)}
	for _, s := range pa.Seqs {
		a.Alts = append(a.Alts, f.convSeq(s, errs))
	}
	return a
}

func (f *File) convSeq(ps *pSeq, errs *ErrorList) Node {
	if len(ps.Elems) == 1 {
		return f.convElem(ps.Elems[0], errs)
	}
	s := &Seq{Pos: f.pos(ps.Pos)}
	for _, e := range ps.Elems {
		s.Items = append(s.Items, f.convElem(e, errs))
	}
	return s
}

func (f *File) convElem(pe *pElem, errs *ErrorList) Node {
	n := f.convConj(pe.Conj, errs)
	if q := pe.Quant; q != nil {
		if _, ok := n.(*Anchor); ok {
			f.errorf(errs, q.Pos, "an anchor (^ or $) cannot be repeated")
		}
		r := &Repeat{Pos: f.pos(q.Pos), Sub: n}
		switch q.Op {
		case "?":
			r.Min, r.Max = 0, 1
		case "*":
			r.Min, r.Max = 0, -1
		case "+":
			r.Min, r.Max = 1, -1
		default:
			r.Min = f.count(q.Min, q.Pos, errs)
			switch {
			case !q.Comma:
				r.Max = r.Min
			case q.Max == "":
				r.Max = -1
			default:
				r.Max = f.count(q.Max, q.Pos, errs)
				if r.Max < r.Min {
					f.errorf(errs, q.Pos, "bad repetition {%s,%s}: the upper bound is below the lower one", q.Min, q.Max)
				}
			}
		}
		n = r
	}
	if pe.Label != "" {
		if _, ok := n.(*Anchor); ok {
			f.errorf(errs, pe.Pos, "a label cannot name an anchor (^ or $): it covers no token")
		}
		n = &Label{Pos: f.pos(pe.Pos), Name: pe.Label[1:], Sub: n}
	}
	return n
}

func (f *File) count(s string, p lexer.Position, errs *ErrorList) int {
	n, err := strconv.Atoi(s)
	if err != nil || n > MaxRepeat {
		f.errorf(errs, p, "bad repetition count %s: at most %d", s, MaxRepeat)
		return MaxRepeat
	}
	return n
}

func (f *File) convConj(pc *pConj, errs *ErrorList) Node {
	if len(pc.Terms) == 1 {
		return f.convNot(pc.Terms[0], errs)
	}
	a := &And{Pos: f.pos(pc.Pos)}
	for _, t := range pc.Terms {
		a.Subs = append(a.Subs, f.convNot(t, errs))
	}
	return a
}

func (f *File) convNot(pn *pNot, errs *ErrorList) Node {
	n := f.convAtom(pn.Atom, errs)
	for i := len(pn.Bangs) - 1; i >= 0; i-- {
		n = &Not{Pos: f.pos(pn.Pos), Sub: n}
	}
	return n
}

func (f *File) convAtom(pa *pAtom, errs *ErrorList) Node {
	p := f.pos(pa.Pos)
	switch {
	case pa.Group != nil:
		return f.convAlt(pa.Group, errs)
	case pa.Field != "":
		return f.convField(pa, errs)
	case pa.Regex != "":
		return f.regexTest(pa.Pos, WordRe, pa.Regex[1:len(pa.Regex)-1], errs)
	case pa.Str != "" || pa.Raw != "":
		raw, kind := pa.Str, Word
		if raw == "" {
			raw, kind = pa.Raw, WordExact
		}
		s, _ := unquote(raw)
		words := strings.Fields(s)
		if len(words) == 0 {
			f.errorf(errs, pa.Pos, "empty word: a quoted word needs at least one character")
			return &Test{Pos: p, Kind: Any}
		}
		if len(words) == 1 {
			return wordTest(p, kind, words[0])
		}
		// A quoted string with spaces is a sequence of words: "in order to".
		seq := &Seq{Pos: p}
		for _, w := range words {
			seq.Items = append(seq.Items, wordTest(p, kind, w))
		}
		return seq
	case pa.Begin:
		return &Anchor{Pos: p}
	case pa.End:
		return &Anchor{Pos: p, End: true}
	case pa.Ident == "_":
		return &Test{Pos: p, Kind: Any}
	case IsUPOS(pa.Ident):
		return &Test{Pos: p, Kind: UPOS, Value: pa.Ident}
	}
	return &Ref{Pos: p, Name: pa.Ident}
}

func wordTest(p Pos, kind TestKind, w string) *Test {
	if kind == Word {
		w = strings.ToLower(w)
	}
	return &Test{Pos: p, Kind: kind, Value: w}
}

func (f *File) convField(pa *pAtom, errs *ErrorList) Node {
	p := f.pos(pa.Pos)
	i := strings.IndexByte(pa.Field, ':')
	key, val := pa.Field[:i], pa.Field[i+1:]
	vpos := pa.Pos
	vpos.Offset += i + 1
	isRe := strings.HasPrefix(val, "/")
	if isRe {
		val = val[1 : len(val)-1]
	} else if strings.HasPrefix(val, `"`) || strings.HasPrefix(val, "'") {
		val, _ = unquote(val)
	}
	if !isRe && val == "" {
		f.errorf(errs, vpos, "%s: needs a value", key)
		return &Test{Pos: p, Kind: Any}
	}
	switch key {
	case "xpos":
		if isRe {
			return f.regexTest(vpos, XPOSRe, val, errs)
		}
		return &Test{Pos: p, Kind: XPOS, Value: val}
	case "lemma":
		if isRe {
			return f.regexTest(vpos, LemmaRe, val, errs)
		}
		return &Test{Pos: p, Kind: Lemma, Value: strings.ToLower(val)}
	case "chars":
		if isRe {
			return f.regexTest(vpos, CharsRe, val, errs)
		}
		if msg := checkChars(val); msg != "" {
			f.errorf(errs, vpos, "chars:%s %s", val, msg)
			return &Test{Pos: p, Kind: Any}
		}
		return &Test{Pos: p, Kind: Chars, Value: val}
	case "begins", "ends":
		kind := Begins
		if key == "ends" {
			kind = Ends
		}
		if isRe {
			f.errorf(errs, vpos, "%s: takes plain letters, not a regular expression (use /…/ for the word instead)", key)
		}
		return &Test{Pos: p, Kind: kind, Value: strings.ToLower(val)}
	}
	msg := "unknown test " + key + ":"
	if now, ok := renamedFields[key]; ok {
		msg += " — " + suggest.Phrase([]string{now + ":"})
	} else if h := suggest.Hint(key+":", fieldNames()); h != "" {
		msg += " — " + h
	} else {
		msg += " (known: " + strings.Join(fieldNames(), ", ") + ")"
	}
	f.errorf(errs, pa.Pos, "%s", msg)
	return &Test{Pos: p, Kind: Any}
}

func (f *File) regexTest(p lexer.Position, kind TestKind, expr string, errs *ErrorList) Node {
	re, err := regexp.Compile(expr)
	if err != nil {
		msg := err.Error()
		msg = strings.TrimPrefix(msg, "error parsing regexp: ")
		f.errorf(errs, p, "bad regular expression /%s/: %s", expr, msg)
		return &Test{Pos: f.pos(p), Kind: Any}
	}
	return &Test{Pos: f.pos(p), Kind: kind, Value: expr, Re: re}
}

// unquote removes the quotes of a "…" or '…' token and resolves backslash
// escapes: \n, \t and \\ as usual, and \x for any other x stands for x.
func unquote(s string) (string, bool) {
	if len(s) < 2 || (s[0] != '"' && s[0] != '\'') || s[len(s)-1] != s[0] {
		return s, false
	}
	s = s[1 : len(s)-1]
	if !strings.ContainsRune(s, '\\') {
		return s, true
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '\\' && i+1 < len(s) {
			i++
			switch s[i] {
			case 'n':
				b.WriteByte('\n')
			case 't':
				b.WriteByte('\t')
			default:
				b.WriteByte(s[i])
			}
			continue
		}
		b.WriteByte(s[i])
	}
	return b.String(), true
}

// checkLocal runs the checks that need no other rule: label placement and
// duplicate labels.
func (f *File) checkLocal(errs *ErrorList) {
	for _, r := range f.Rules {
		checkLabels(f, r.Expr, false, errs)
	}
}

// checkLabels reports labels inside & or ! (they would name no span of their
// own) and returns the labels the node can set, reporting a label set twice
// along one path through a sequence.
func checkLabels(f *File, n Node, inToken bool, errs *ErrorList) map[string]bool {
	switch n := n.(type) {
	case *Label:
		if inToken {
			f.lines.errorf(errs, n.Pos.Offset, "a label cannot stand inside & or !: label the whole test instead")
		}
		sub := checkLabels(f, n.Sub, inToken, errs)
		if sub[n.Name] {
			f.lines.errorf(errs, n.Pos.Offset, "label @%s is nested inside itself", n.Name)
		}
		if sub == nil {
			sub = map[string]bool{}
		}
		sub[n.Name] = true
		return sub
	case *Seq:
		var all map[string]bool
		for _, it := range n.Items {
			sub := checkLabels(f, it, inToken, errs)
			for name := range sub {
				if all[name] {
					f.lines.errorf(errs, it.Position().Offset, "label @%s is used twice in one sequence", name)
				}
				if all == nil {
					all = map[string]bool{}
				}
				all[name] = true
			}
		}
		return all
	case *Alt:
		var all map[string]bool
		for _, a := range n.Alts {
			for name := range checkLabels(f, a, inToken, errs) {
				if all == nil {
					all = map[string]bool{}
				}
				all[name] = true
			}
		}
		return all
	case *Repeat:
		return checkLabels(f, n.Sub, inToken, errs)
	case *Not:
		return checkLabels(f, n.Sub, true, errs)
	case *And:
		for _, s := range n.Subs {
			checkLabels(f, s, true, errs)
		}
	}
	return nil
}

// IsUPOS reports whether s is one of the 17 Universal POS tags.
func IsUPOS(s string) bool {
	for _, u := range UPOSTags {
		if u == s {
			return true
		}
	}
	return false
}

// UPOSTags are the 17 Universal Dependencies part-of-speech tags
// (universaldependencies.org/u/pos/), in the order of that page.
var UPOSTags = []string{
	"ADJ", "ADP", "ADV", "AUX", "CCONJ", "DET", "INTJ", "NOUN", "NUM",
	"PART", "PRON", "PROPN", "PUNCT", "SCONJ", "SYM", "VERB", "X",
}

// looksLikeTag reports whether an identifier is written like a tag name
// (upper case), so errors can say "unknown tag" instead of "unknown rule".
func looksLikeTag(s string) bool {
	for _, r := range s {
		if unicode.IsLower(r) {
			return false
		}
	}
	return true
}
