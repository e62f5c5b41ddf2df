package lemma

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// Latin and Greek plurals get their singular, as WordNet 3.0's noun
// exception list gives it (classical.txt), whatever the suffix rules
// learned from web text would make of them; abbreviations keep their form
// unless training saw them ("Aug." → "August" there).
func TestClassicalPluralsAndAbbreviations(t *testing.T) {
	l := Train([]Example{
		{"valves", "valve", "NOUN", "NNS"}, {"devices", "device", "NOUN", "NNS"}, {"pumps", "pump", "NOUN", "NNS"},
		{"Aug.", "August", "PROPN", "NNP"}, {"Aug.", "August", "NOUN", "NN"}, {"dept.", "department", "NOUN", "NN"},
	})
	for _, c := range []struct{ form, xpos, want string }{
		{"vortices", "NNS", "vortex"}, // -ices → -ex
		{"Vortices", "NNS", "vortex"},
		{"matrices", "NNS", "matrix"}, // -ices → -ix
		{"axes", "NNS", "axis"},       // -es → -is
		{"analyses", "NNS", "analysis"},
		{"formulae", "NNS", "formula"},   // -ae → -a
		{"criteria", "NNS", "criterion"}, // -a → -on
		{"spectra", "NNS", "spectrum"},   // -a → -um
		{"radii", "NNS", "radius"},       // -i → -us
		{"lattices", "NNS", "lattice"},   // not classical: the rules
		{"Fig.", "NN", "fig."},           // an abbreviation keeps its form
		{"Aug.", "NN", "August"},         // one seen in training keeps its lemma
	} {
		assert.Equal(t, c.want, l.Lemma(c.form, "NOUN", c.xpos), "Lemma(%q, %s)", c.form, c.xpos)
	}
	assert.Equal(t, "Vortices", l.Lemma("Vortices", "PROPN", "NNPS"), "a proper noun is no Latin plural")
	assert.Greater(t, len(classical), 1000, "classical.txt read")
	for _, regular := range []string{"taxes", "bases", "data"} { // the treebank has "tax", "base", "data"
		assert.NotContains(t, classical, regular)
	}
}
