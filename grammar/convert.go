package grammar

import (
	"regexp"
	"strings"
	"unicode"

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

// field turns a field token (xpos:NNS, lemma:/^valv/, …) into its test.
func (p *parser) field(t token) Node {
	pos := p.pos(t.off)
	i := strings.IndexByte(t.text, ':')
	key, val := t.text[:i], t.text[i+1:]
	vpos := t.off + i + 1
	isRe := strings.HasPrefix(val, "/")
	if isRe {
		val = val[1 : len(val)-1]
	} else if strings.HasPrefix(val, `"`) || strings.HasPrefix(val, "'") {
		val, _ = unquote(val)
	}
	if !isRe && val == "" {
		p.errorf(vpos, "%s: needs a value", key)
		return &Test{Pos: pos, Kind: Any}
	}
	switch key {
	case "xpos":
		if isRe {
			return p.regexTest(vpos, XPOSRe, val)
		}
		return &Test{Pos: pos, Kind: XPOS, Value: val}
	case "lemma":
		if isRe {
			return p.regexTest(vpos, LemmaRe, val)
		}
		return &Test{Pos: pos, Kind: Lemma, Value: strings.ToLower(val)}
	case "chars":
		if isRe {
			return p.regexTest(vpos, CharsRe, val)
		}
		if msg := checkChars(val); msg != "" {
			p.errorf(vpos, "chars:%s %s", val, msg)
			return &Test{Pos: pos, Kind: Any}
		}
		return &Test{Pos: pos, Kind: Chars, Value: val}
	case "begins", "ends":
		kind := Begins
		if key == "ends" {
			kind = Ends
		}
		if isRe {
			p.errorf(vpos, "%s: takes plain letters, not a regular expression (use /…/ for the word instead)", key)
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
	p.errorf(t.off, "%s", msg)
	return &Test{Pos: pos, Kind: Any}
}

func (p *parser) regexTest(off int, kind TestKind, expr string) Node {
	re, err := regexp.Compile(expr)
	if err != nil {
		msg := err.Error()
		msg = strings.TrimPrefix(msg, "error parsing regexp: ")
		p.errorf(off, "bad regular expression /%s/: %s", expr, msg)
		return &Test{Pos: p.pos(off), Kind: Any}
	}
	return &Test{Pos: p.pos(off), Kind: kind, Value: expr, Re: re}
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
