package check

import (
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
