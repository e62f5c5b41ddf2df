package suggest

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// TestDistance checks the edit distance against worked examples of the
// Levenshtein and Damerau–Levenshtein articles of the English Wikipedia:
// kitten → sitting is 3 edits; "CA" → "ABC" is 3 in the optimal string
// alignment distance (2 in the unrestricted Damerau distance, which may
// edit a swapped pair again); a swap of neighbours is one edit.
func TestDistance(t *testing.T) {
	for _, tc := range []struct {
		a, b string
		want int
	}{
		{"kitten", "sitting", 3},
		{"sitting", "kitten", 3},
		{"ca", "abc", 3},
		{"ab", "ba", 1},
		{"", "abc", 3},
		{"abc", "abc", 0},
		{"nuon", "noun", 1},
		{"größe", "grösse", 2},
	} {
		assert.Equal(t, tc.want, distance([]rune(tc.a), []rune(tc.b), 10), "%q → %q", tc.a, tc.b)
	}
	// Above the limit, any value above it will do.
	assert.Greater(t, distance([]rune("kitten"), []rune("sitting"), 1), 1)
	assert.Greater(t, distance([]rune("a"), []rune("abcdef"), 2), 2)
}

func TestMaxDistance(t *testing.T) {
	for word, want := range map[string]int{"": 1, "x": 1, "tag": 1, "lemma": 1, "prefix": 2, "modifier": 2, "collocate": 3, "terminology": 3, "éééééé": 2} {
		assert.Equal(t, want, MaxDistance(word), word)
	}
}

func TestClosest(t *testing.T) {
	tags := []string{"ADJ", "ADP", "ADV", "AUX", "NOUN", "NUM", "PROPN", "VERB"}
	for _, tc := range []struct {
		word       string
		candidates []string
		want       []string
	}{
		{"NUON", tags, []string{"NOUN"}},             // a swap
		{"noun", tags, []string{"NOUN"}},             // case only
		{"ADX", tags, []string{"ADJ", "ADP", "ADV"}}, // ties, in candidate order
		{"NOUN", tags, nil},                          // an exact candidate: nothing to suggest
		{"XYZZY", tags, nil},                         // nothing near
		{"", tags, nil},                              // nothing typed
		{"modifer", []string{"modifier", "term"}, []string{"modifier"}},
		{"lema", []string{"xpos", "lemma", "begins", "ends"}, []string{"lemma"}},
		{"term", []string{"terms", "terms", "phrases"}, []string{"terms"}}, // duplicates once
		{"ab", []string{"abc", "abd", "abe", "abf"}, []string{"abc", "abd", "abe"}},
	} {
		assert.Equal(t, tc.want, Closest(tc.word, tc.candidates), tc.word)
	}
}

func TestHint(t *testing.T) {
	assert.Equal(t, `did you mean "NOUN"?`, Hint("NUON", []string{"NOUN", "VERB"}))
	assert.Equal(t, "", Hint("zzzz", []string{"NOUN", "VERB"}))
	assert.Equal(t, `did you mean "a" or "b"?`, Phrase([]string{"a", "b"}))
	assert.Equal(t, `did you mean "a", "b" or "c"?`, Phrase([]string{"a", "b", "c"}))
	assert.Equal(t, `did you mean "say \"hi\""?`, Phrase([]string{`say "hi"`}))
	assert.Equal(t, "", Phrase(nil))
}
