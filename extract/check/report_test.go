package check

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
	"unsafe"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestReportKeepsNoDocumentText checks that the findings a report holds,
// the glossary's and the mixed ones, point into no document's text (a
// substring kept would keep the whole text of every document with a
// finding alive until the end of a run), and that a text found twice is
// held once.
func TestReportKeepsNoDocumentText(t *testing.T) {
	m := Compile(pumpGlossary())
	rules := termRules(t)
	a, srcA := annotate(t, "a.txt", "Open the magnet valve first.\nThe flow meter reads the flow meter value.\nClose the magnet valve.\n")
	b, srcB := annotate(t, "b.txt", "The flowmeter of the second pump.\n")
	rep := NewReport(m)
	rep.Add(Check(a, srcA, Options{Glossary: m, Candidates: rules}))
	rep.Add(Check(b, srcB, Options{Glossary: m, Candidates: rules}))

	inside := func(s, text string) bool {
		p, lo := uintptr(unsafe.Pointer(unsafe.StringData(s))), uintptr(unsafe.Pointer(unsafe.StringData(text)))
		return len(s) > 0 && p >= lo && p < lo+uintptr(len(text))
	}
	var magnet []string
	kinds := map[Kind]int{}
	for _, f := range rep.Findings() {
		kinds[f.Kind]++
		for _, d := range []string{a.Text, b.Text} {
			assert.False(t, inside(f.Text, d), "%s:%d: text %q points into the document", f.File, f.Line, f.Text)
			assert.False(t, inside(f.Message, d), "%s:%d: message points into the document", f.File, f.Line)
		}
		if f.Text == "magnet valve" {
			magnet = append(magnet, f.Text)
		}
	}
	assert.Equal(t, map[Kind]int{KindDeprecated: 2, KindMixed: 1}, kinds)
	require.Len(t, magnet, 2)
	assert.Same(t, unsafe.StringData(magnet[0]), unsafe.StringData(magnet[1]), "one string for a text found twice")
}

// The report's compact record of variant uses gives the mixed findings
// that the plain definition gives (plainMixed: per group its spellings
// with their uses, the majority by total, a finding per other spelling
// and document), on random documents whose spellings differ in case and
// share positions.
func TestMixedMatchesPlainDefinition(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	keys := []string{"set point", "flow meter", "drip line", "vent", "pump"}
	forms := map[string][]string{
		"set point": {"set point", "setpoint", "set-point", "Set point"}, "flow meter": {"flow meter", "flowmeter"},
		"drip line": {"drip line"}, "vent": {"vent", "Vent"}, "pump": {"pump", "pumps", "PUMP"},
	}
	for round := range 200 {
		var docs []*DocResult
		for d := range 1 + rng.IntN(6) {
			res := &DocResult{Name: fmt.Sprintf("d%d.txt", d)}
			seen := map[string]bool{}
			for range rng.IntN(8) {
				key := keys[rng.IntN(len(keys))]
				sp := forms[key][rng.IntN(len(forms[key]))]
				if seen[key+"\x00"+strings.ToLower(sp)] {
					continue // a document has one record per spelling, case aside
				}
				seen[key+"\x00"+strings.ToLower(sp)] = true
				line, col := 1+rng.IntN(3), 1+rng.IntN(4)
				res.spellings = append(res.spellings, docSpelling{key: key, spelling: sp, n: 1 + rng.IntN(3),
					line: int32(line), col: int32(col), endLine: int32(line), endCol: int32(col + rng.IntN(12)), text: sp})
			}
			docs = append(docs, res)
		}
		rep := NewReport(nil)
		for _, d := range docs {
			rep.Add(d)
		}
		require.Equal(t, plainMixed(docs), rep.Findings(), "round %d", round)
	}
}

// plainMixed is the mixed findings of docs as the check defines them,
// computed the plain way.
func plainMixed(docs []*DocResult) []Finding {
	type use struct {
		doc int
		s   docSpelling
	}
	type spelling struct {
		text, lower string
		total       int
		uses        []use
	}
	var order []string
	groups := map[string][]*spelling{}
	for di, d := range docs {
		for _, s := range d.spellings {
			if _, ok := groups[s.key]; !ok {
				order = append(order, s.key)
			}
			var sp *spelling
			for _, x := range groups[s.key] {
				if x.lower == strings.ToLower(s.spelling) {
					sp = x
				}
			}
			if sp == nil {
				sp = &spelling{text: s.spelling, lower: strings.ToLower(s.spelling)}
				groups[s.key] = append(groups[s.key], sp)
			}
			sp.total += s.n
			sp.uses = append(sp.uses, use{di, s})
		}
	}
	perDoc := map[int][]Finding{}
	for _, key := range order {
		g := groups[key]
		if len(g) < 2 {
			continue
		}
		byTotal := slices.Clone(g)
		slices.SortStableFunc(byTotal, func(a, b *spelling) int { return b.total - a.total })
		using, here := map[int]bool{}, map[int][]string{}
		var all []string
		for _, s := range byTotal {
			all = append(all, fmt.Sprintf("%s %d", s.text, s.total))
			for _, u := range s.uses {
				using[u.doc] = true
				here[u.doc] = append(here[u.doc], fmt.Sprintf("%s %d", s.text, u.s.n))
			}
		}
		major := byTotal[0].text
		for _, s := range byTotal[1:] {
			for _, u := range s.uses {
				f := Finding{File: docs[u.doc].Name, Line: int(u.s.line), Column: int(u.s.col), EndLine: int(u.s.endLine), EndColumn: int(u.s.endCol),
					Text: u.s.text, Kind: KindMixed, Preferred: major, Entry: major}
				f.Message = fmt.Sprintf("%q is one of %d spellings of a term: here %s; in %d document(s) %s: use %q",
					f.Text, len(g), strings.Join(here[u.doc], ", "), len(using), strings.Join(all, ", "), major)
				perDoc[u.doc] = append(perDoc[u.doc], f)
			}
		}
	}
	var out []Finding
	for di := range docs {
		fs := perDoc[di]
		sortFindings(fs)
		out = append(out, dropCovering(fs)...)
	}
	return out
}
