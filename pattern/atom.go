package pattern

import (
	"math/bits"
	"regexp"
	"regexp/syntax"
	"sort"
	"strings"

	"glossmith/grammar"
)

// The token fields atoms read; each has its own cache.
const (
	fieldUPOS = iota
	fieldXPOS
	fieldForm
	fieldLemma
	numFields
)

// atom is one distinct token test, evaluated once per distinct value of
// the field it reads.
type atom struct {
	kind  grammar.TestKind
	key   string
	value string
	re    *regexp.Regexp
	first *[256]bool          // bytes a matching word can start with, or nil
	set   map[string]struct{} // for alternations of plain words or lemmas
	fold0 byte                // Word: the value's first byte when ASCII and lower case, else 0
}

func newAtom(t *grammar.Test) *atom {
	a := &atom{kind: t.Kind, key: t.Key(), value: t.Value, re: t.Re}
	if t.Kind == grammar.WordRe && t.Re != nil {
		a.first = firstBytes(t.Re)
	}
	if (t.Kind == grammar.Word || t.Kind == grammar.Begins) && t.Value != "" && t.Value[0] < 0x80 && t.Value[0] != 'k' && t.Value[0] != 's' {
		// k and s have non-ASCII case variants (Kelvin sign, long s)
		// that EqualFold accepts; for them the full test always runs.
		a.fold0 = lowerASCII(t.Value[0])
	}
	return a
}

func newSetAtom(kind grammar.TestKind, items []string) *atom {
	items = sortedUnique(items)
	a := &atom{kind: kind, set: make(map[string]struct{}, len(items))}
	a.key = "set:" + kind.String() + ":" + strings.Join(items, "\x00")
	for _, w := range items {
		a.set[w] = struct{}{}
	}
	return a
}

func (a *atom) field() int {
	switch a.kind {
	case grammar.UPOS:
		return fieldUPOS
	case grammar.XPOS, grammar.XPOSRe:
		return fieldXPOS
	case grammar.Lemma, grammar.LemmaRe:
		return fieldLemma
	}
	return fieldForm
}

// direct reports whether the atom is cheap enough to evaluate on every
// token (a comparison with a short word) rather than through a cache.
func (a *atom) direct() bool {
	switch a.kind {
	case grammar.Word, grammar.WordExact, grammar.Begins, grammar.Ends:
		return a.set == nil
	}
	return false
}

// test evaluates the atom on the value of its field.
func (a *atom) test(s string) bool {
	switch a.kind {
	case grammar.Any:
		return true
	case grammar.UPOS, grammar.XPOS, grammar.WordExact:
		return s == a.value
	case grammar.Word, grammar.Lemma:
		if a.set != nil {
			if _, ok := a.set[s]; ok {
				return true
			}
			_, ok := a.set[strings.ToLower(s)]
			return ok
		}
		return strings.EqualFold(s, a.value)
	case grammar.XPOSRe, grammar.LemmaRe:
		return a.re.MatchString(s)
	case grammar.WordRe:
		if a.first != nil && (s == "" || !a.first[s[0]]) {
			return false
		}
		return a.re.MatchString(s)
	case grammar.Begins:
		return len(s) >= len(a.value) && strings.EqualFold(s[:len(a.value)], a.value)
	case grammar.Ends:
		return len(s) >= len(a.value) && strings.EqualFold(s[len(s)-len(a.value):], a.value)
	case grammar.Chars:
		return grammar.CharClasses(s) == a.value
	case grammar.CharsRe:
		return a.re.MatchString(grammar.CharClasses(s))
	}
	return false
}

// evalField returns the bits of the atoms reading field f that hold for
// the value s.
func (m *Matcher) evalField(f int, s string) uint64 {
	var out uint64
	mask := m.fieldMask[f]
	for mask != 0 {
		i := bits.TrailingZeros64(mask)
		mask &^= 1 << uint(i)
		if m.atoms[i].test(s) {
			out |= 1 << uint(i)
		}
	}
	return out
}

// firstBytes returns, for a regular expression that can only match text
// starting with one of a known set of bytes at the very start, that set;
// otherwise nil. It lets the matcher skip the regular expression for most
// words ("/^[A-Z]{2,6}s?$/" is tried only on words starting with a capital).
func firstBytes(re *regexp.Regexp) *[256]bool {
	t, err := syntax.Parse(re.String(), syntax.Perl)
	if err != nil {
		return nil
	}
	t = t.Simplify()
	if t.Op != syntax.OpConcat || len(t.Sub) < 2 || t.Sub[0].Op != syntax.OpBeginText {
		return nil
	}
	var set [256]bool
	if !firstOf(&syntax.Regexp{Op: syntax.OpConcat, Sub: t.Sub[1:]}, &set) {
		return nil
	}
	return &set
}

// firstOf adds to set every byte a match of t can start with and reports
// whether t surely consumes at least one character (otherwise the set
// says nothing).
func firstOf(t *syntax.Regexp, set *[256]bool) bool {
	switch t.Op {
	case syntax.OpLiteral:
		if len(t.Rune) == 0 || t.Flags&syntax.FoldCase != 0 || t.Rune[0] >= 0x80 {
			return false
		}
		set[t.Rune[0]] = true
		return true
	case syntax.OpCharClass:
		for i := 0; i+1 < len(t.Rune); i += 2 {
			lo, hi := t.Rune[i], t.Rune[i+1]
			if hi >= 0x80 {
				for b := 0xC0; b < 0x100; b++ { // any UTF-8 lead byte
					set[b] = true
				}
				hi = 0x7F
			}
			for r := lo; r <= hi; r++ {
				set[r] = true
			}
		}
		return len(t.Rune) > 0
	case syntax.OpCapture, syntax.OpPlus:
		return firstOf(t.Sub[0], set)
	case syntax.OpRepeat:
		return t.Min >= 1 && firstOf(t.Sub[0], set)
	case syntax.OpConcat:
		return len(t.Sub) > 0 && firstOf(t.Sub[0], set)
	case syntax.OpAlternate:
		for _, s := range t.Sub {
			if !firstOf(s, set) {
				return false
			}
		}
		return true
	}
	return false
}

// sortedUnique returns items sorted, each once, for stable set atoms.
func sortedUnique(items []string) []string {
	s := append([]string(nil), items...)
	sort.Strings(s)
	out := s[:0]
	for i, x := range s {
		if i == 0 || x != s[i-1] {
			out = append(out, x)
		}
	}
	return out
}
