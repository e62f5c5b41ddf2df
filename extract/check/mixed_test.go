package check

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
	"glossmith/pattern"
)

func termRules(t *testing.T) *pattern.Matcher {
	t.Helper()
	rs, err := grammar.LoadStock("terms")
	require.NoError(t, err)
	m, err := pattern.Compile(rs)
	require.NoError(t, err)
	return m
}

func TestMixedSpellings(t *testing.T) {
	rules := termRules(t)
	a, srcA := annotate(t, "a.md", "# Pump set points\n\nAdjust the set point of the pump.\nThe **setpoint** is kept in `setpoint` memory.\nA third set point follows.\n")
	b, srcB := annotate(t, "b.txt", "The setpoint of the second pump.\nAnother set point here.\n")
	c, srcC := annotate(t, "c.txt", "Only the pump inverter here.\n")

	rep := NewReport(nil)
	rep.Add(Check(a, srcA, Options{Candidates: rules}))
	rep.Add(Check(b, srcB, Options{Candidates: rules}))
	rep.Add(Check(c, srcC, Options{Candidates: rules}))
	var mixed []Finding
	for _, f := range rep.Findings() {
		if f.Kind == KindMixed && f.Preferred == "set point" {
			mixed = append(mixed, f)
		}
	}
	// "set point" 4 times (the heading's "set points" is an inflection),
	// "setpoint" twice outside code: the minority spelling is reported at
	// its first use in each document using it.
	require.Len(t, mixed, 2, "%v", mixed)
	assert.Equal(t, "a.md", mixed[0].File)
	assert.Equal(t, [4]int{4, 7, 4, 15}, [4]int{mixed[0].Line, mixed[0].Column, mixed[0].EndLine, mixed[0].EndColumn})
	assert.Equal(t, "b.txt", mixed[1].File)
	assert.Equal(t, [2]int{1, 5}, [2]int{mixed[1].Line, mixed[1].Column})
	assert.Contains(t, mixed[0].Message, "here set point 3, setpoint 1")
	assert.Contains(t, mixed[1].Message, "here set point 1, setpoint 1")
	assert.Contains(t, mixed[0].Message, "in 2 document(s) set point 4, setpoint 2")
	assert.Equal(t, Note, mixed[0].Level())

	// With a glossary that has the term, its spellings are the glossary's
	// findings, not mixed ones.
	g := Compile(Glossary{Entries: []Entry{{ID: "sp", Forms: []Form{{Text: "set point"}}}}})
	rep = NewReport(g)
	rep.Add(Check(a, srcA, Options{Glossary: g, Candidates: rules}))
	rep.Add(Check(b, srcB, Options{Glossary: g, Candidates: rules}))
	kinds := map[Kind]int{}
	for _, f := range rep.Findings() {
		if f.Entry == "sp" || f.Preferred == "set point" {
			kinds[f.Kind]++
		}
	}
	assert.Equal(t, map[Kind]int{KindSpelling: 2}, kinds)
}
