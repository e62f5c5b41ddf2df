package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Acronyms, units and mixed-case words keep their case in the canonical
// form, the head lemmatized ("HAWTs" → "HAWT"); a word that also occurs in
// lower case is written so.
func TestCanonicalKeepsMeaningfulCase(t *testing.T) {
	ts := extractTexts(t,
		"The HAWT is large. Two HAWTs were built. The pressure is 200 kPa at the inlet. Set the pH set point before dawn.",
		"The pH set point drifts. Each turbine gives 3 MW of power. The kPa reading is shown. Each Valve Seat wears. The valve seat is cleaned.")
	for _, want := range []string{"HAWT", "kPa", "pH set point", "MW", "kPa reading", "valve seat"} {
		assert.NotNil(t, find(ts, want), "no candidate %q", want)
	}
	for _, lost := range []string{"hawt", "kpa", "ph set point", "mw", "Valve Seat"} {
		assert.Nil(t, find(ts, lost), "candidate %q", lost)
	}
}

// A Latin or Greek plural is one candidate with its singular, and an
// abbreviation keeps its form.
func TestClassicalPluralsGrouped(t *testing.T) {
	ts := extractTexts(t,
		"Vortices form behind each blade. A vortex forms at the tip. See Fig. 3 for the axes of the rotor.",
		"The axis of the rotor turns. Two formulae are given; the formula holds.")
	for _, c := range []struct{ term, plural string }{{"vortex", "Vortices"}, {"axis", "axes"}, {"formula", "formulae"}} {
		x := find(ts, c.term)
		if assert.NotNil(t, x, "no candidate %q", c.term) {
			assert.Contains(t, forms(x), c.plural, "variants of %q", c.term)
		}
	}
	for _, lost := range []string{"vortice", "ax", "figust", "Figust"} {
		assert.Nil(t, find(ts, lost), "candidate %q", lost)
	}
}

// URLs, e-mail addresses and file paths are no candidates, nor are the
// words the tokenizer cuts a path into; a legal reference like
// "ECB/2004/11" is no path.
func TestAddressesAreNoCandidates(t *testing.T) {
	ts := extractTexts(t,
		"See https://example.org/docs/valve.html for the valve manual. Mail support@example.com about the pump.",
		`Edit /etc/glossmith/config.yaml or C:\Users\grower\valve.cfg to set the flow rate. Open www.example.org today. Guideline ECB/2004/11 applies.`)
	for _, noise := range []string{"https://example.org/docs/valve.html", "support@example.com", "mail support@example.com",
		"config.yaml", "glossmith", "grower", "user", "valve.cfg", "www.example.org"} {
		assert.Nil(t, find(ts, noise), "candidate %q", noise)
	}
	for _, term := range []string{"valve manual", "flow rate", "pump", "ECB"} {
		assert.NotNil(t, find(ts, term), "no candidate %q", term)
	}
}

// A document's first context is a full sentence of reasonable length when
// it has one, not a heading or a list fragment.
func TestContextsPreferFullSentences(t *testing.T) {
	ts := extractTexts(t, "Pilot Port Cleaning\n\n- pilot port\n\nThe pilot port clogs when the water is hard.")
	x := find(ts, "pilot port")
	require.NotNil(t, x)
	require.NotEmpty(t, x.Contexts)
	assert.Equal(t, "The pilot port clogs when the water is hard.", x.Contexts[0].Text)
}
