package grammar

import (
	"regexp"
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

// docAbove collects the comment lines directly above line n. Rules on one
// line share it, so it is computed once per line (a long line of rules
// below a long comment would otherwise take quadratic time).
func (f *File) docAbove(n int) string {
	if d, ok := f.docs[n]; ok {
		return d
	}
	d := f.readDocAbove(n)
	if f.docs == nil {
		f.docs = map[int]string{}
	}
	f.docs[n] = d
	return d
}

func (f *File) readDocAbove(n int) string {
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

func wordTest(p Pos, kind TestKind, w string) *Test {
	if kind == Word {
		w = strings.ToLower(w)
	}
	return &Test{Pos: p, Kind: kind, Value: w}
}

// converter turns participle's parse tree of one run of statements into
// the AST and appends it to f. Positions in the tree are offsets in the
// text handed to the parser, which starts at byte base of f's source.
type converter struct {
	f    *File
	base int
	errs *ErrorList
}

func (c *converter) pos(off int) Pos { return c.f.lines.pos(off) }

// at returns the source offset of a position in the parsed text.
func (c *converter) at(p lexer.Position) int { return c.base + p.Offset }

func (c *converter) errorf(off int, format string, args ...any) {
	c.f.lines.errorf(c.errs, off, format, args...)
}

func (c *converter) file(pf *pFile) {
	for _, st := range pf.Stmts {
		switch {
		case st.Use != nil:
			c.use(st.Use)
		case st.Example != nil:
			c.example(st.Example)
		case st.Rule != nil:
			c.rule(st.Rule)
		}
	}
}

func (c *converter) use(pu *pUse) {
	u := &Use{Pos: c.pos(c.at(pu.Pos))}
	if pu.Path != nil {
		s, ok := unquote(pu.Path.Value)
		if !ok || strings.HasPrefix(pu.Path.Value, "'") {
			c.errorf(c.at(pu.Path.Pos), "use takes a file name in double quotes or `stock NAME`")
			return
		}
		u.Path = s
	} else {
		u.Stock = pu.Stock.Value
	}
	c.f.Uses = append(c.f.Uses, u)
}

func (c *converter) example(pe *pExample) {
	ex := &Example{Pos: c.pos(c.at(pe.Pos)), Expect: pe.Kind == "expect", Rule: pe.Rule}
	var raw string
	var rawOff int
	if pe.Field != nil { // expect rule:"text", without a space after the colon
		i := strings.IndexByte(pe.Field.Value, ':')
		ex.Rule, raw, rawOff = pe.Field.Value[:i], pe.Field.Value[i+1:], c.at(pe.Field.Pos)+i+1
	} else {
		raw, rawOff = pe.Text.Value, c.at(pe.Text.Pos)
	}
	if !strings.HasPrefix(raw, `"`) {
		c.errorf(rawOff, "an example's text goes in double quotes")
		return
	}
	text, span, msg := parseExampleText(raw[1:len(raw)-1], ex.Expect)
	if msg != "" {
		c.errorf(rawOff, "%s", msg)
		return
	}
	ex.Text, ex.Span = text, span
	c.f.Examples = append(c.f.Examples, ex)
}

func (c *converter) rule(pr *pRule) {
	off := c.at(pr.Pos)
	r := &Rule{Name: pr.Name, Pos: c.pos(off)}
	r.Expr = c.alt(pr.Body)
	r.End = c.pos(c.at(pr.EndPos))
	if reserved[r.Name] {
		c.errorf(off, "%q is a reserved word and cannot name a rule", r.Name)
	} else if IsUPOS(r.Name) {
		c.errorf(off, "%s is a UPOS tag and cannot name a rule", r.Name)
	}
	r.Doc = c.f.docAbove(r.Pos.Line)
	c.f.Rules = append(c.f.Rules, r)
}

// Positions are computed as a node starts, in the order of the source,
// which keeps lineTable.pos from counting a long line again.

func (c *converter) alt(pa *pAlt) Node {
	if len(pa.Seqs) == 1 {
		return c.seq(pa.Seqs[0])
	}
	a := &Alt{Pos: c.pos(c.at(pa.Pos))}
	for _, s := range pa.Seqs {
		a.Alts = append(a.Alts, c.seq(s))
	}
	return a
}

func (c *converter) seq(ps *pSeq) Node {
	if len(ps.Elems) == 1 {
		return c.elem(ps.Elems[0])
	}
	s := &Seq{Pos: c.pos(c.at(ps.Pos))}
	for _, e := range ps.Elems {
		s.Items = append(s.Items, c.elem(e))
	}
	return s
}

// elem converts [ Label ] Conj [ Quant ].
func (c *converter) elem(pe *pElem) Node {
	var labelPos Pos
	if pe.Label != "" {
		labelPos = c.pos(c.at(pe.Pos))
	}
	n := c.conj(pe.Conj)
	if q := pe.Quant; q != nil {
		n = c.quant(q, n)
	}
	if pe.Label != "" {
		if _, ok := n.(*Anchor); ok {
			c.errorf(c.at(pe.Pos), "a label cannot name an anchor (^ or $): it covers no token")
		}
		n = &Label{Pos: labelPos, Name: pe.Label[1:], Sub: n}
	}
	return n
}

func (c *converter) quant(q *pQuant, n Node) Node {
	off := c.at(q.Pos)
	if _, ok := n.(*Anchor); ok {
		c.errorf(off, "an anchor (^ or $) cannot be repeated")
	}
	r := &Repeat{Pos: c.pos(off), Sub: n}
	switch q.Op {
	case "?":
		r.Min, r.Max = 0, 1
	case "*":
		r.Min, r.Max = 0, -1
	case "+":
		r.Min, r.Max = 1, -1
	default: // {n}, {n,}, {n,m}
		r.Min = c.count(q.Min, off)
		switch {
		case !q.Comma:
			r.Max = r.Min
		case q.Max == "":
			r.Max = -1
		default:
			r.Max = c.count(q.Max, off)
			if r.Max < r.Min {
				c.errorf(off, "bad repetition {%s,%s}: the upper bound is below the lower one", q.Min, q.Max)
			}
		}
	}
	return r
}

func (c *converter) count(s string, off int) int {
	n := 0
	for _, d := range []byte(s) {
		n = n*10 + int(d-'0')
		if n > MaxRepeat {
			c.errorf(off, "bad repetition count %s: at most %d", s, MaxRepeat)
			return MaxRepeat
		}
	}
	return n
}

func (c *converter) conj(pc *pConj) Node {
	if len(pc.Terms) == 1 {
		return c.not(pc.Terms[0])
	}
	a := &And{Pos: c.pos(c.at(pc.Pos))}
	for _, t := range pc.Terms {
		a.Subs = append(a.Subs, c.not(t))
	}
	return a
}

// not converts { "!" } Atom: one Not node per "!".
func (c *converter) not(pn *pNot) Node {
	var pos Pos
	if len(pn.Bangs) > 0 {
		pos = c.pos(c.at(pn.Pos))
	}
	n := c.atom(pn.Atom)
	for range pn.Bangs {
		n = &Not{Pos: pos, Sub: n}
	}
	return n
}

func (c *converter) atom(pa *pAtom) Node {
	off := c.at(pa.Pos)
	switch {
	case pa.Group != nil:
		return c.alt(pa.Group)
	case pa.Field != "":
		return c.field(off, pa.Field)
	}
	pos := c.pos(off)
	switch {
	case pa.Regex != "":
		return c.regexTest(off, WordRe, pa.Regex[1:len(pa.Regex)-1])
	case pa.Str != "" || pa.Raw != "":
		raw, kind := pa.Str, Word
		if raw == "" {
			raw, kind = pa.Raw, WordExact
		}
		s, _ := unquote(raw)
		words := strings.Fields(s)
		if len(words) == 0 {
			c.errorf(off, "empty word: a quoted word needs at least one character")
			return &Test{Pos: pos, Kind: Any}
		}
		if len(words) == 1 {
			return wordTest(pos, kind, words[0])
		}
		// A quoted string with spaces is a sequence of words: "in order to".
		seq := &Seq{Pos: pos}
		for _, w := range words {
			seq.Items = append(seq.Items, wordTest(pos, kind, w))
		}
		return seq
	case pa.Begin:
		return &Anchor{Pos: pos}
	case pa.End:
		return &Anchor{Pos: pos, End: true}
	case pa.Ident == "_":
		return &Test{Pos: pos, Kind: Any}
	case IsUPOS(pa.Ident):
		return &Test{Pos: pos, Kind: UPOS, Value: pa.Ident}
	}
	return &Ref{Pos: pos, Name: pa.Ident}
}

// field turns a field token (xpos:NNS, lemma:/^valv/, …) into its test.
func (c *converter) field(off int, text string) Node {
	pos := c.pos(off)
	i := strings.IndexByte(text, ':')
	key, val := text[:i], text[i+1:]
	vpos := off + i + 1
	isRe := strings.HasPrefix(val, "/")
	if isRe {
		val = val[1 : len(val)-1]
	} else if strings.HasPrefix(val, `"`) || strings.HasPrefix(val, "'") {
		val, _ = unquote(val)
	}
	if !isRe && val == "" {
		c.errorf(vpos, "%s: needs a value", key)
		return &Test{Pos: pos, Kind: Any}
	}
	switch key {
	case "xpos":
		if isRe {
			return c.regexTest(vpos, XPOSRe, val)
		}
		return &Test{Pos: pos, Kind: XPOS, Value: val}
	case "lemma":
		if isRe {
			return c.regexTest(vpos, LemmaRe, val)
		}
		return &Test{Pos: pos, Kind: Lemma, Value: strings.ToLower(val)}
	case "chars":
		if isRe {
			return c.regexTest(vpos, CharsRe, val)
		}
		if msg := checkChars(val); msg != "" {
			c.errorf(vpos, "chars:%s %s", val, msg)
			return &Test{Pos: pos, Kind: Any}
		}
		return &Test{Pos: pos, Kind: Chars, Value: val}
	case "begins", "ends":
		kind := Begins
		if key == "ends" {
			kind = Ends
		}
		if isRe {
			c.errorf(vpos, "%s: takes plain letters, not a regular expression (use /…/ for the word instead)", key)
		}
		return &Test{Pos: pos, Kind: kind, Value: strings.ToLower(val)}
	}
	msg := "unknown test " + key + ":"
	if now, ok := renamedFields[key]; ok {
		msg += " — " + suggest.Phrase([]string{now + ":"})
	} else if h := suggest.Hint(key+":", fieldNames()); h != "" {
		msg += " — " + h
	} else {
		msg += " (known: " + strings.Join(fieldNames(), ", ") + ")"
	}
	c.errorf(off, "%s", msg)
	return &Test{Pos: pos, Kind: Any}
}

func (c *converter) regexTest(off int, kind TestKind, expr string) Node {
	re, err := regexp.Compile(expr)
	if err != nil {
		msg := err.Error()
		msg = strings.TrimPrefix(msg, "error parsing regexp: ")
		c.errorf(off, "bad regular expression /%s/: %s", expr, msg)
		return &Test{Pos: c.pos(off), Kind: Any}
	}
	return &Test{Pos: c.pos(off), Kind: kind, Value: expr, Re: re}
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
