package spelling

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The four single edits of Damerau (1964): deletion, insertion,
// substitution, transposition of neighbours; the first letter is kept.
func TestOneEdit(t *testing.T) {
	for _, c := range []struct {
		a, b string
		want bool
	}{
		{"fisrt", "first", true},      // swap
		{"trainng", "training", true}, // letter left out
		{"ttable", "table", true},     // letter too many
		{"meral", "metal", true},      // letter wrong
		{"valv", "valve", true},       // last letter left out
		{"valvee", "valve", true},     // last letter too many
		{"first", "first", false},     // no edit
		{"sirst", "first", false},     // the first letter
		{"ifrst", "first", false},     // a swap with the first letter
		{"frist", "firts", false},     // two edits
		{"developing", "develop", false},
		{"", "a", false},
	} {
		assert.Equal(t, c.want, OneEdit(c.a, c.b), "%q %q", c.a, c.b)
		assert.Equal(t, c.want, OneEdit(c.b, c.a), "%q %q", c.b, c.a)
	}
}

func TestCorrect(t *testing.T) {
	d := NewDictionary(map[string]float64{
		"first": 500, "fist": 20, "pretty": 300, "so": 9000, "some": 4000,
		"valve": 80, "value": 400, "salve": 5, "the": 50000,
		"Capital": 100, "x-ray": 100, // not lower-case letters: left out
	})
	require.Equal(t, 9, d.Len())
	c := &Corrector{Dict: d}
	for _, tc := range []struct{ in, want string }{
		{"fisrt", "first"},
		{"frist", "first"},    // swap, though "fist" is a deletion away too: the more frequent wins
		{"prettty", "pretty"}, // repeated letters squeezed to two
		{"sooooo", "so"},      // … or to one
		{"ssome", "some"},
		{"valvue", "value"}, // both one edit away: the more frequent
		{"vlaev", ""},       // two edits
		{"teh", ""},         // shorter than MinEditLen
		{"first", ""},       // a word of the dictionary is no misspelling
		{"xalve", ""},       // the first letter is never changed
		{"Fisrt", ""},       // only lower-case letters are read
		{"fis-rt", ""},
	} {
		got, ok := c.Correct(tc.in)
		assert.Equal(t, tc.want, got, tc.in)
		assert.Equal(t, tc.want != "", ok, tc.in)
	}
}

// Equally frequent candidates: the first in alphabetical order, whatever
// order the index meets them in.
func TestCorrectTies(t *testing.T) {
	c := &Corrector{Dict: NewDictionary(map[string]float64{"cast": 10, "cost": 10, "cart": 10})}
	got, ok := c.Correct("cest")
	require.True(t, ok)
	assert.Equal(t, "cast", got)
}
