package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/extract/termstat"
)

// A candidate's keyness and weirdness are those of its least specific word
// (the lowest smoothed weirdness), not means over its words: "wind turbine
// design" is as specific as "design". The help of terms and the README say
// so (TestTermsHelpDescribesMeasuresAsComputed in cmd/glossmith).
func TestSpecificityOfLeastSpecificWord(t *testing.T) {
	c := NewCorpus(0)
	for w, n := range map[string]int{"wind": 40, "turbine": 60, "design": 20} {
		c.words.add(w, n, 0)
	}
	c.words.total = 1000
	ref := &Counts{Words: map[string]int{"wind": 50, "turbine": 2, "design": 900}, Total: 100_000}
	ll, weird, _ := c.specificity([]string{"wind", "turbine", "design"}, ref, Alpha)
	design := termstat.Contrast{Study: 20, Reference: 900, StudySize: 1000, ReferenceSize: 100_000}
	assert.InDelta(t, design.SmoothedWeirdness(Alpha), weird, 1e-12)
	assert.InDelta(t, design.LL(), ll, 1e-12)
	for _, w := range []string{"wind", "turbine"} {
		other := termstat.Contrast{Study: float64(c.words.get(w)), Reference: float64(ref.Freq(w)), StudySize: 1000, ReferenceSize: 100_000}
		assert.Greater(t, other.SmoothedWeirdness(Alpha), weird, "%s is more specific than design", w)
	}
}
