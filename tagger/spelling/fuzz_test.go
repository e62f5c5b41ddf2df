package spelling

import (
	"strings"
	"testing"
)

// FuzzCorrect checks the deletion index against a search of the whole
// dictionary (bruteForce) on any dictionary and word, and that Correct
// reads nothing that is no lower-case word.
func FuzzCorrect(f *testing.F) {
	f.Add("first fist pretty so some valve value", "fisrt")
	f.Add("cast cost cart", "cest")
	f.Add("ab abc abcd", "abbbbc")
	f.Add("aaaa aaab", "aaaaa")
	f.Add("x-ray Café", "x-ary")
	f.Fuzz(func(t *testing.T, dict, word string) {
		words := map[string]float64{}
		for i, w := range strings.Fields(dict) {
			words[w] = float64(1 + i%3)
		}
		c := &Corrector{Dict: NewDictionary(words)}
		got, ok := c.Correct(word)
		if ok != (got != "") {
			t.Fatalf("Correct(%q) = %q, %v", word, got, ok)
		}
		if !lowerLetters(word) {
			if ok {
				t.Fatalf("Correct(%q) read a word that is no lower-case word", word)
			}
			return
		}
		if want := bruteForce(words, word); got != want {
			t.Fatalf("Correct(%q) = %q, the whole dictionary says %q", word, got, want)
		}
		// An emphasis reading is Correct's reading, of a word with some
		// letter three times in a row.
		if e, ok := c.Emphasized(word); ok && (e != got || !hasRun3(word)) {
			t.Fatalf("Emphasized(%q) = %q, Correct %q", word, e, got)
		}
	})
}

// hasRun3 reports whether some letter of w stands three times in a row.
func hasRun3(w string) bool {
	for c := 'a'; c <= 'z'; c++ {
		if strings.Contains(w, strings.Repeat(string(c), 3)) {
			return true
		}
	}
	return false
}
