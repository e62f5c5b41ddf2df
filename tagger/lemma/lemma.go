// Package lemma turns a tagged word into its dictionary form.
//
// The lemmatizer is learned from a treebank in two parts. Suffix rewrite
// rules, one table per fine tag, say how a word ending in some letters
// becomes its lemma ("-ies" → "-y" for NNS, "-ied" → "-y" for VBD); they
// cover words never seen in training. A table of exceptions holds the
// (word, tag) pairs of the training data whose lemma the rules get wrong
// ("went"/VBD → "go", "I"/PRP → "I"), so every word seen in training gets
// the lemma it had there. Only exceptions are stored, which keeps the model
// small. Proper nouns and unit symbols ("mS", "kPa") keep their case;
// other words are lower-cased first, as Universal Dependencies lemmas are.
package lemma

import (
	"bytes"
	_ "embed"
	"encoding/binary"
	"errors"
	"fmt"
	"maps"
	"slices"
	"sort"
	"strings"
	"unicode"
)

// MaxSuffix is the longest word ending (in bytes) a rule is keyed on.
const MaxSuffix = 6

// Example is one annotated token of the training data.
type Example struct {
	Form, Lemma, UPOS, XPOS string
}

// rule rewrites a word: remove Strip bytes from its end, then append Add.
type rule struct {
	Strip int
	Add   string
}

// Lemmatizer maps (word, tag) to a lemma. It is read-only after Train or
// UnmarshalBinary and safe for concurrent use.
type Lemmatizer struct {
	// exceptions[tag][form] is the lemma of a training word the rules miss.
	exceptions map[string]map[string]string
	// rules[tag][suffix] is the most frequent rewrite of words of that tag
	// ending in suffix. Entries whose rule equals the one of the next
	// shorter suffix are dropped: the longest-match walk finds it there.
	rules map[string]map[string]rule
}

// tagKey is the tag rules are keyed on: the fine tag when there is one.
func tagKey(upos, xpos string) string {
	if xpos != "" {
		return xpos
	}
	return upos
}

// IsProper reports whether a tag marks a proper noun, whose lemma keeps
// the case of the word.
func IsProper(upos, xpos string) bool {
	return upos == "PROPN" || xpos == "NNP" || xpos == "NNPS"
}

// Train learns rules and exceptions from annotated tokens. Tokens without
// a lemma are ignored. The result does not depend on the order of examples
// beyond tie-breaking, which is made deterministic by sorting.
func Train(examples []Example) *Lemmatizer {
	// Most frequent lemma of each (tag, form).
	type key struct{ tag, form string }
	counts := map[key]map[string]int{}
	for _, e := range examples {
		if e.Lemma == "" || e.Form == "" {
			continue
		}
		k := key{tagKey(e.UPOS, e.XPOS), e.Form}
		m := counts[k]
		if m == nil {
			m = map[string]int{}
			counts[k] = m
		}
		m[e.Lemma]++
	}
	keys := make([]key, 0, len(counts))
	for k := range counts {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool {
		if keys[i].tag != keys[j].tag {
			return keys[i].tag < keys[j].tag
		}
		return keys[i].form < keys[j].form
	})
	best := make(map[key]string, len(keys))
	for _, k := range keys {
		best[k] = argmax(counts[k])
	}

	// Rules are counted over word types (distinct normalized forms per
	// tag): unseen words resemble the many rare types more than the few
	// frequent tokens.
	type tkey struct{ tag, norm string }
	typeLemma := map[tkey]string{}
	var types []tkey
	for _, k := range keys {
		proper := IsProper(k.tag, k.tag)
		norm, lem := k.form, best[k]
		if !proper {
			norm, lem = strings.ToLower(norm), strings.ToLower(lem)
		}
		tk := tkey{k.tag, norm}
		if _, ok := typeLemma[tk]; !ok {
			types = append(types, tk)
			typeLemma[tk] = lem
		}
	}
	ruleCounts := map[string]map[string]map[rule]int{}
	for _, tk := range types {
		r := makeRule(tk.norm, typeLemma[tk])
		bySuffix := ruleCounts[tk.tag]
		if bySuffix == nil {
			bySuffix = map[string]map[rule]int{}
			ruleCounts[tk.tag] = bySuffix
		}
		for l := r.Strip; l <= MaxSuffix && l <= len(tk.norm); l++ {
			suf := tk.norm[len(tk.norm)-l:]
			m := bySuffix[suf]
			if m == nil {
				m = map[rule]int{}
				bySuffix[suf] = m
			}
			m[r]++
		}
	}
	l := &Lemmatizer{exceptions: map[string]map[string]string{}, rules: map[string]map[string]rule{}}
	for tag, bySuffix := range ruleCounts {
		full := map[string]rule{}
		for suf, m := range bySuffix {
			full[suf] = argmaxRule(m)
		}
		kept := map[string]rule{}
		for suf, r := range full {
			if suf != "" {
				if p, ok := full[suf[1:]]; ok && p == r {
					continue
				}
			}
			kept[suf] = r
		}
		l.rules[tag] = kept
	}
	for _, k := range keys {
		want := best[k]
		if l.byRule(k.form, k.tag, k.tag) != want {
			m := l.exceptions[k.tag]
			if m == nil {
				m = map[string]string{}
				l.exceptions[k.tag] = m
			}
			m[k.form] = want
		}
	}
	return l
}

func argmax(m map[string]int) string {
	best, bc := "", -1
	for s, c := range m {
		if c > bc || (c == bc && s < best) {
			best, bc = s, c
		}
	}
	return best
}

func argmaxRule(m map[rule]int) rule {
	var best rule
	bc := -1
	for r, c := range m {
		if c > bc || (c == bc && (r.Strip < best.Strip || (r.Strip == best.Strip && r.Add < best.Add))) {
			best, bc = r, c
		}
	}
	return best
}

// makeRule finds the rewrite from form to lemma through their longest
// common prefix.
func makeRule(form, lemma string) rule {
	p := 0
	for p < len(form) && p < len(lemma) && form[p] == lemma[p] {
		p++
	}
	return rule{Strip: len(form) - p, Add: lemma[p:]}
}

// Lemma returns the lemma of form read with the given tags: the
// treebank's lemma for a word seen in training that the rules miss, else
// the lemma of a Latin or Greek plural (see classical.txt), the form of a
// unit symbol (isUnitSymbol), else what the suffix rules give.
func (l *Lemmatizer) Lemma(form, upos, xpos string) string {
	tag := tagKey(upos, xpos)
	if m := l.exceptions[tag]; m != nil {
		if lem, ok := m[form]; ok {
			return lem
		}
	}
	if lem, ok := classicalLemma(form, upos, xpos); ok {
		return lem
	}
	if stem, ok := acronymPlural(form, xpos); ok {
		if IsProper(upos, xpos) {
			return stem
		}
		return strings.ToLower(stem)
	}
	if (upos == "NOUN" || IsProper(upos, xpos)) && isUnitSymbol(form) {
		// A unit symbol is its own lemma, case and all: the rule of "-s"
		// plurals made millisiemens "mS" the metre "m", and lower-cased it
		// would be the millisecond "ms".
		return form
	}
	if xpos == "NN" && isCapitals(form) {
		// A singular acronym: its letters are no word for the suffix
		// rules ("LED" → "le" by the rule of "used").
		return strings.ToLower(form)
	}
	return l.byRule(form, upos, xpos)
}

// isUnitSymbol reports whether form has the shape of a prefixed or
// compound unit symbol: two to four letters, a capital after the first and
// a lower-case one ("mS", "kPa", "MHz", "MWh", "µS", "kΩ"), whose case SI
// writing makes meaningful ("mS" millisiemens, "ms" millisecond). All
// capitals are an acronym's ("MS", "LEDS" in a heading), and a lower-case
// "s" right after a capital an acronym's plural ("PCs", "IDs"): no symbol.
// A few byte tests for most words: no table look-up, no allocation.
func isUnitSymbol(form string) bool {
	if len(form) < 2 || len(form) > 8 { // four letters of up to two bytes
		return false
	}
	n, capital, lower, prevUpper := 0, false, false, false
	for i, r := range form {
		upper := unicode.IsUpper(r)
		switch {
		case !unicode.IsLetter(r) || n == 4:
			return false
		case upper && i > 0:
			capital = true
		case r == 's' && prevUpper && i == len(form)-1:
			return false
		case !upper:
			lower = true
		}
		n, prevUpper = n+1, upper
	}
	return capital && lower
}

// isCapitals reports whether s has two or more capital letters A–Z and
// no lower-case one (digits and hyphens may come between): an acronym.
func isCapitals(s string) bool {
	upper := 0
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c >= 'A' && c <= 'Z':
			upper++
		case c >= 'a' && c <= 'z', c >= 0x80:
			return false
		}
	}
	return upper >= 2
}

// acronymPlural returns the acronym of a plural written as an acronym with
// a lower-case "s" ("RMSs", "PLCs", "HAWTs"): two or more capitals (digits
// and hyphens may come between) and the "s". Suffix rules learned from
// lower-case words read the letters as a word ("RMSs" → "rme"), which would
// part the plural from its acronym. Only plural tags qualify (common
// practice of English technical writing; "UPSs", not "UPS'").
func acronymPlural(form, xpos string) (string, bool) {
	if xpos != "NNS" && xpos != "NNPS" {
		return "", false
	}
	n := len(form)
	if n < 3 || form[n-1] != 's' {
		return "", false
	}
	upper := 0
	for i := 0; i < n-1; i++ {
		switch c := form[i]; {
		case c >= 'A' && c <= 'Z':
			upper++
		case c >= '0' && c <= '9', c == '-' && i > 0:
		default:
			return "", false
		}
	}
	if upper < 2 || form[n-2] == '-' {
		return "", false
	}
	return form[:n-1], true
}

//go:embed classical.txt
var classicalText string

// classical maps Latin and Greek plurals to their lemmas ("vortices" →
// "vortex", "axes" → "axis"): suffix rules learned from web text turn them
// into non-words ("vortice", "ax"), which would split a term from its
// plural. The list is WordNet's, filtered against the treebank
// (internal/mkclassical).
var classical = func() map[string]string {
	m := map[string]string{}
	for _, line := range strings.Split(classicalText, "\n") {
		if p, l, ok := strings.Cut(line, " "); ok && !strings.HasPrefix(line, "#") {
			m[p] = l
		}
	}
	return m
}()

// classicalLemma returns the lemma of a common noun that is a Latin or
// Greek plural in classical.
func classicalLemma(form, upos, xpos string) (string, bool) {
	if upos != "NOUN" || IsProper(upos, xpos) || form == "" {
		return "", false
	}
	switch form[len(form)-1] { // every plural of the list ends so
	case 'a', 'e', 'i', 's', 'A', 'E', 'I', 'S':
	default:
		return "", false
	}
	lem, ok := classical[strings.ToLower(form)]
	return lem, ok
}

// byRule applies the rule of the longest known suffix of the word. An
// abbreviation (a word ending in a period, "Fig.", "approx.") keeps its
// form: rules learned from other abbreviations would rewrite it ("Aug." →
// "August" made "Fig." "Figust"); those seen in training have their lemma
// among the exceptions.
func (l *Lemmatizer) byRule(form, upos, xpos string) string {
	norm := form
	if !IsProper(upos, xpos) {
		norm = strings.ToLower(form)
	}
	if len(norm) > 1 && norm[len(norm)-1] == '.' {
		return norm
	}
	rs := l.rules[tagKey(upos, xpos)]
	if rs == nil {
		return norm
	}
	for n := min(MaxSuffix, len(norm)); n >= 0; n-- {
		r, ok := rs[norm[len(norm)-n:]]
		if !ok {
			continue
		}
		if r.Strip >= len(norm) { // would leave nothing of the word
			return norm
		}
		if r.Strip == 0 && r.Add == "" {
			return norm
		}
		return norm[:len(norm)-r.Strip] + r.Add
	}
	return norm
}

// Size returns the number of exceptions and rules, for model statistics.
func (l *Lemmatizer) Size() (exceptions, rules int) {
	for _, m := range l.exceptions {
		exceptions += len(m)
	}
	for _, m := range l.rules {
		rules += len(m)
	}
	return
}

const magic = "LEM1"

// MarshalBinary encodes the lemmatizer with sorted keys, so the same
// lemmatizer always gives the same bytes.
func (l *Lemmatizer) MarshalBinary() ([]byte, error) {
	var b bytes.Buffer
	b.WriteString(magic)
	putStr := func(s string) {
		b.Write(binary.AppendUvarint(nil, uint64(len(s))))
		b.WriteString(s)
	}
	putInt := func(n int) { b.Write(binary.AppendUvarint(nil, uint64(n))) }
	tags := slices.Sorted(maps.Keys(l.exceptions))
	putInt(len(tags))
	for _, t := range tags {
		putStr(t)
		m := l.exceptions[t]
		forms := slices.Sorted(maps.Keys(m))
		putInt(len(forms))
		for _, f := range forms {
			putStr(f)
			putStr(m[f])
		}
	}
	tags = slices.Sorted(maps.Keys(l.rules))
	putInt(len(tags))
	for _, t := range tags {
		putStr(t)
		m := l.rules[t]
		sufs := slices.Sorted(maps.Keys(m))
		putInt(len(sufs))
		for _, s := range sufs {
			putStr(s)
			putInt(m[s].Strip)
			putStr(m[s].Add)
		}
	}
	return b.Bytes(), nil
}

var errShort = errors.New("lemmatizer data truncated")

// UnmarshalBinary decodes what MarshalBinary wrote; malformed input gives
// an error, never a panic.
func (l *Lemmatizer) UnmarshalBinary(data []byte) error {
	if !bytes.HasPrefix(data, []byte(magic)) {
		return errors.New("not lemmatizer data")
	}
	p := data[len(magic):]
	var err error
	getInt := func() int {
		if err != nil {
			return 0
		}
		v, n := binary.Uvarint(p)
		if n <= 0 || v > uint64(len(data)) {
			err = errShort
			return 0
		}
		p = p[n:]
		return int(v)
	}
	getStr := func() string {
		n := getInt()
		if err != nil {
			return ""
		}
		if n > len(p) {
			err = errShort
			return ""
		}
		s := string(p[:n])
		p = p[n:]
		return s
	}
	l.exceptions = map[string]map[string]string{}
	l.rules = map[string]map[string]rule{}
	nt := getInt()
	for i := 0; i < nt && err == nil; i++ {
		t := getStr()
		m := map[string]string{}
		nf := getInt()
		for j := 0; j < nf && err == nil; j++ {
			f := getStr()
			m[f] = getStr()
		}
		l.exceptions[t] = m
	}
	nt = getInt()
	for i := 0; i < nt && err == nil; i++ {
		t := getStr()
		m := map[string]rule{}
		ns := getInt()
		for j := 0; j < ns && err == nil; j++ {
			s := getStr()
			strip := getInt()
			m[s] = rule{Strip: strip, Add: getStr()}
		}
		l.rules[t] = m
	}
	if err != nil {
		return err
	}
	if len(p) != 0 {
		return fmt.Errorf("lemmatizer data: %d trailing bytes", len(p))
	}
	return nil
}
