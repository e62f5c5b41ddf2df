// Package suggest finds the names a person most likely meant when the one
// they typed does not exist: the one "did you mean" of the whole program, so
// that a misspelt flag value, tag, rule, field or stock set is answered the
// same way everywhere.
//
// Closeness is the optimal string alignment distance (Damerau 1964;
// insertions, deletions, substitutions and swaps of two neighbouring
// characters each cost one edit), counted in characters with case ignored.
// A candidate is offered only when it is near enough to be the likely
// intent: within MaxDistance(word) edits, which allows one edit in a word
// of up to five characters, two in one of six to eight and three in longer
// ones. Shorter words get fewer edits because two edits turn most short
// names into unrelated ones ("tag" is two edits from "to" and from "the").
package suggest

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// MaxResults is the most candidates Closest returns: more than a few
// choices is a list, not a suggestion.
const MaxResults = 3

// MaxDistance is the largest distance at which a candidate is offered for
// word: a third of its length in characters, at least 1 and at most 3.
func MaxDistance(word string) int {
	return min(3, max(1, utf8.RuneCountInString(word)/3))
}

// Closest returns the candidates nearest to word, all at the same smallest
// distance, within MaxDistance(word), in the order of candidates and at
// most MaxResults of them (duplicates once). It returns nil when word is
// itself a candidate (exactly, case kept), when nothing is near enough, or
// when word is empty.
func Closest(word string, candidates []string) []string {
	if word == "" {
		return nil
	}
	lw := []rune(strings.ToLower(word))
	limit := MaxDistance(word)
	best := limit + 1
	var out []string
	for _, c := range candidates {
		if c == word {
			return nil
		}
		d := distance(lw, []rune(strings.ToLower(c)), limit)
		switch {
		case d > limit:
		case d < best:
			best, out = d, append(out[:0], c)
		case d == best && len(out) < MaxResults && !contains(out, c):
			out = append(out, c)
		}
	}
	if len(out) == 0 {
		return nil
	}
	return out
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// Hint returns `did you mean "x"?` (or `did you mean "x" or "y"?`) for the
// candidates Closest finds, and "" when it finds none; callers append it to
// their own message.
func Hint(word string, candidates []string) string {
	return Phrase(Closest(word, candidates))
}

// Phrase renders names as a did-you-mean question, each name quoted:
// `did you mean "a"?`, `did you mean "a" or "b"?`, `did you mean "a", "b"
// or "c"?`. It returns "" for no names.
func Phrase(names []string) string {
	if len(names) == 0 {
		return ""
	}
	var b strings.Builder
	b.WriteString("did you mean ")
	for i, n := range names {
		switch {
		case i == 0:
		case i == len(names)-1:
			b.WriteString(" or ")
		default:
			b.WriteString(", ")
		}
		b.WriteString(strconv.Quote(n))
	}
	b.WriteByte('?')
	return b.String()
}

// distance is the optimal string alignment distance between a and b; it
// may stop early and return any value above limit once the distance is
// known to exceed it.
func distance(a, b []rune, limit int) int {
	if d := len(a) - len(b); d > limit || -d > limit {
		return limit + 1
	}
	// Three rows of the dynamic programme: two back (for swaps), one back,
	// and the current one.
	prev2 := make([]int, len(b)+1)
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		rowMin := cur[0]
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			v := min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				v = min(v, prev2[j-2]+1)
			}
			cur[j] = v
			rowMin = min(rowMin, v)
		}
		if rowMin > limit {
			return limit + 1
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}
