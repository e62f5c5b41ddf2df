package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// maxWordsTexts hold a five-word noun phrase, "night radiation sum set
// point", once, and some of its parts on their own elsewhere.
var maxWordsTexts = []string{
	"The climate controller stores the night radiation sum set point in its memory.",
	"The radiation sum rises at noon. Each zone has a set point for humidity.",
}

// A match longer than --max-words yields no fragment of itself: neither its
// first or last MaxWords words nor any other span inside it that the same
// rule matches. Its parts still count where they occur on their own.
func TestMaxWordsLeavesNoFragments(t *testing.T) {
	fragments := map[int][]string{
		3: {"sum set point", "radiation sum set", "night radiation sum", "radiation sum set point"},
		4: {"radiation sum set point", "night radiation sum set", "sum set point", "night radiation"},
	}
	for _, mw := range []int{3, 4} {
		ts := extractWith(t, Options{MaxWords: mw}, maxWordsTexts...)
		for _, f := range fragments[mw] {
			assert.Nil(t, find(ts, f), "max words %d: %q is a fragment of the five-word phrase", mw, f)
		}
		for _, term := range []string{"radiation sum", "set point"} {
			got := find(ts, term)
			require.NotNil(t, got, "max words %d: %q occurs on its own", mw, term)
			assert.Equal(t, 1, got.Freq, "max words %d: %q counts its own occurrence only", mw, term)
		}
		assert.NotNil(t, find(ts, "climate controller"), "max words %d: a phrase within the limit", mw)
	}

	// With room for the whole phrase, it and its nested spans are candidates.
	ts := extractWith(t, Options{MaxWords: 5}, maxWordsTexts...)
	for _, term := range []string{"night radiation sum set point", "sum set point", "night radiation sum set"} {
		assert.NotNil(t, find(ts, term), "max words 5: %q", term)
	}
	assert.Equal(t, 2, find(ts, "set point").Freq, "max words 5: nested in the phrase and on its own")
}
