package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"
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
