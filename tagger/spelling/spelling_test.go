package spelling

import (
	"math/rand/v2"
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
	assert.True(t, d.Contains("so"))
	assert.True(t, d.Contains("first"))
	assert.False(t, d.Contains("fisrt"))
	assert.False(t, d.Contains("Capital"), "not lower-case letters: left out")
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

// Emphasized reads only letters repeated three times or more, squeezed
// to two or to one; no other edit.
func TestEmphasized(t *testing.T) {
	c := &Corrector{Dict: NewDictionary(map[string]float64{
		"so": 9000, "very": 3000, "pretty": 300, "first": 500, "brr": 1, "yy": 1, "s": 1,
	})}
	for _, tc := range []struct{ in, want string }{
		{"sooooo", "so"},
		{"veryyy", "very"},
		{"prettty", "pretty"},
		{"sooo", "so"},
		{"soo", ""},      // a letter twice is no emphasis
		{"fisrt", ""},    // a misspelling, not emphasis
		{"fisrrrt", ""},  // squeezed, "fisrrt" and "fisrt" are no words: no other edit
		{"brrrr", "brr"}, // squeezed to two
		{"Sooooo", ""},   // only lower-case letters are read
		{"yyyy", ""},     // one letter repeated is no word emphasized
		{"ssss", ""},
	} {
		got, ok := c.Emphasized(tc.in)
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

// bruteForce is the reading Correct must find, by the definition: every
// word of the dictionary one edit away (OneEdit), or a squeeze of the
// word, the most frequent first, then the first alphabetically; squeezes
// before edits.
func bruteForce(words map[string]float64, w string) string {
	pick := func(ok func(string) bool) string {
		best := ""
		for c, f := range words {
			if !lowerLetters(c) || !ok(c) {
				continue
			}
			if best == "" || f > words[best] || f == words[best] && c < best {
				best = c
			}
		}
		return best
	}
	if _, ok := words[w]; ok {
		return ""
	}
	c := &Corrector{}
	s2 := string(c.squeeze(w, 2)) // (one at a time: both share c's buffer)
	s1 := string(c.squeeze(w, 1))
	if r := pick(func(c string) bool { return c != w && (c == s2 || c == s1) }); r != "" {
		return r
	}
	if len(w) < MinEditLen {
		return ""
	}
	return pick(func(c string) bool { return OneEdit(w, c) })
}

// The deletion index finds what a search of the whole dictionary finds,
// over random words of a four-letter alphabet (so that many are one edit
// apart) with frequencies that often tie.
func TestCorrectMatchesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	word := func() string {
		b := make([]byte, 1+rng.IntN(7))
		for i := range b {
			b[i] = "abcd"[rng.IntN(4)]
		}
		return string(b)
	}
	words := map[string]float64{}
	for range 400 {
		words[word()] = float64(1 + rng.IntN(5))
	}
	c := &Corrector{Dict: NewDictionary(words)}
	for range 5000 {
		w := word()
		got, _ := c.Correct(w)
		require.Equal(t, bruteForce(words, w), got, w)
	}
}
