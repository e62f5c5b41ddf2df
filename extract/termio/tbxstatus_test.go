package termio

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/tbx"
	"glossmith/extract/tbx/tbxtest"
	"glossmith/extract/termbase"
	"glossmith/extract/terms"
)

// A terms run with a termbase writes TBX whose terms carry the
// administrative status the termbase holds (TBX-Basic's
// administrativeStatus values, ISO 30042 / TBX-Basic_DCA.sch), the label
// TBX has no field for as a note, and no rejected term; the files validate
// against the TBX schemas (tbxtest: RELAX NG and Schematron). An invented
// greenhouse glossary.
func TestTermsTBXCarriesTermbaseStatus(t *testing.T) {
	s := openStore(t)
	_, err := s.Import("glossary", []*termbase.Entry{
		{Terms: []*termbase.Term{
			{Text: "solenoid valve", Status: termbase.Preferred},
			{Text: "magnet valve", Status: termbase.Deprecated}}},
		{Terms: []*termbase.Term{
			{Text: "set point", Status: termbase.Preferred},
			{Text: "set-point", Status: termbase.Admitted},
			{Text: "setpoint", Status: termbase.Deprecated}}},
		{Terms: []*termbase.Term{{Text: "climate computer", Status: termbase.Preferred, Forms: []string{"greenhouse computer"}}}},
		{Terms: []*termbase.Term{{Text: "RMS", Status: termbase.Preferred}}},
		{Terms: []*termbase.Term{{Text: "next step", Status: termbase.Rejected}}},
		{Terms: []*termbase.Term{{Text: "drip line", Status: termbase.Candidate, Deferred: true}}},
	})
	require.NoError(t, err)
	ix, err := s.Index(s.Lang)
	require.NoError(t, err)
	cand := func(rank int, term string, forms ...string) *terms.Term {
		c := &terms.Term{Rank: rank, Term: term, POS: "NOUN NOUN", Freq: 10 - rank, Docs: 2}
		for _, f := range append([]string{term}, forms...) {
			c.Variants = append(c.Variants, terms.Variant{Form: f, Count: 2})
		}
		return c
	}
	full := cand(6, "root zone moisture sensor", "RMS")
	full.Acronym = "RMS"
	acr := cand(7, "RMS")
	acr.FullForm = full.Term
	cands := []*terms.Term{
		cand(1, "solenoid valve", "solenoid valves"),
		cand(2, "magnet valve"),
		cand(3, "set point", "set-point", "setpoint"),
		cand(4, "greenhouse computer"),
		cand(5, "next step"),
		full, acr,
		cand(8, "drip line"),
		cand(9, "drip emitter"),
	}
	Label(ix, cands)

	type got struct{ status, label string }
	want := map[string]got{
		"solenoid valve":            {tbx.PreferredStatus, ""},
		"magnet valve":              {tbx.DeprecatedStatus, "termbase: deprecated of solenoid valve"},
		"set point":                 {tbx.PreferredStatus, ""},
		"set-point":                 {tbx.AdmittedStatus, ""}, // spelling variants: their own status
		"setpoint":                  {tbx.DeprecatedStatus, ""},
		"greenhouse computer":       {"", "termbase: variant of climate computer"},
		"root zone moisture sensor": {"", "termbase: full form of RMS"},
		"RMS":                       {tbx.PreferredStatus, ""},
		"drip line":                 {"", "termbase: new"}, // deferred: no decision yet
		"drip emitter":              {"", "termbase: new"},
	}
	for _, dialect := range []string{tbx.Basic, tbx.Core} {
		t.Run(dialect, func(t *testing.T) {
			var buf bytes.Buffer
			format := map[string]string{tbx.Basic: "tbx-basic", tbx.Core: "tbx"}[dialect]
			require.NoError(t, terms.Write(&buf, format, cands, terms.WriteOptions{TermStatus: TermStatus(ix)}))
			tbxtest.Validate(t, dialect, buf.Bytes())
			doc, err := tbx.Read(bytes.NewReader(buf.Bytes()), "out.tbx")
			require.NoError(t, err)
			assert.Contains(t, doc.Source, "1 candidate(s) the termbase rejected are left out")
			have := map[string]got{}
			for _, e := range doc.Entries {
				for _, x := range e.Terms {
					g := got{status: x.Status}
					for _, n := range x.Notes {
						if strings.HasPrefix(n, "termbase: ") {
							g.label = n
						}
					}
					have[x.Text] = g
				}
			}
			assert.Equal(t, want, have)
			assert.NotContains(t, buf.String(), "next step", "a rejected candidate is left out")
		})
	}

	// Without a termbase nothing of it is written.
	var buf bytes.Buffer
	require.NoError(t, terms.Write(&buf, "tbx-basic", cands, terms.WriteOptions{}))
	assert.NotContains(t, buf.String(), "administrativeStatus")
	assert.NotContains(t, buf.String(), "termbase: ")
	assert.Contains(t, buf.String(), "<term>next step</term>")
}
