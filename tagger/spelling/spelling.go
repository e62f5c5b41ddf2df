// Package spelling reads a misspelt word as the common word it stands for,
// so that the tagger tags "fisrt" as "first" and "developiong" as
// "developing": web text, chat and hurried service notes misspell words the
// tagger would know, and a word it does not know is read from its suffix
// and shape alone — which for "fisrt" or "ammazing" says little.
//
// A word is read as another when it is one edit away from a word of the
// dictionary — a letter left out, one too many, one wrong, or two
// neighbours swapped (Damerau 1964: most misspellings are one such edit) —
// or when it repeats letters for emphasis ("sooooo", "prettty"). Edits
// never touch the first letter, which writers seldom get wrong (common
// practice of spelling correctors), and the most frequent candidate wins.
// The caller decides which words are unknown enough to be read this way:
// the package only proposes.
//
// Candidates are found through the words' single deletions (the
// symmetric-deletion scheme of Garbe's SymSpell, 2012): two words one edit
// apart share a deletion, or one is a deletion of the other, so a query
// costs a look-up per letter instead of one per possible edit (about 50 a
// letter).
package spelling

import (
	"maps"
	"slices"
	"strings"
)

// MinEditLen is the shortest word read as an edit of another: shorter
// words are one edit away from too many others ("teh" and "wat" are left
// as they are; "ssome" is not).
const MinEditLen = 4

// Dictionary holds the words misspellings may be read as, with their
// frequencies. It is read-only once built and safe for concurrent use. It
// holds no pointers but its text, so that the garbage collector, which
// runs often in a long tagging run, need not scan 40,000 words.
type Dictionary struct {
	text string    // the words, sorted, one after the other
	off  []uint32  // word k is text[off[k]:off[k+1]]
	freq []float64 // frequency of word k
	// dels holds hash<<32|k for every word k, and for every single
	// deletion of it past the first letter, sorted: the words a hash
	// leads to are one run. A word is found by its own hash.
	dels []uint64
}

// NewDictionary builds a dictionary from lower-case words of letters a–z
// and their frequencies (any scale; higher wins). Other words are left out.
func NewDictionary(words map[string]float64) *Dictionary {
	d := &Dictionary{}
	var text []byte
	for _, w := range slices.Sorted(maps.Keys(words)) {
		if !lowerLetters(w) || words[w] <= 0 {
			continue
		}
		d.off = append(d.off, uint32(len(text)))
		d.freq = append(d.freq, words[w])
		text = append(text, w...)
	}
	d.off = append(d.off, uint32(len(text)))
	d.text = string(text)
	var buf []byte
	for k := range d.freq {
		w := d.word(int32(k))
		d.dels = append(d.dels, hash([]byte(w))<<32|uint64(k))
		if len(w) < MinEditLen-1 {
			continue // no word MinEditLen long is one edit away
		}
		for i := 1; i < len(w); i++ {
			buf = append(append(buf[:0], w[:i]...), w[i+1:]...)
			d.dels = append(d.dels, hash(buf)<<32|uint64(k))
		}
	}
	slices.Sort(d.dels)
	d.dels = slices.Compact(d.dels)
	return d
}

// Len is the number of words of the dictionary.
func (d *Dictionary) Len() int { return len(d.freq) }

// word returns word k.
func (d *Dictionary) word(k int32) string { return d.text[d.off[k]:d.off[k+1]] }

// run returns the entries of dels under a hash.
func (d *Dictionary) run(h uint64) []uint64 {
	i, _ := slices.BinarySearch(d.dels, h<<32)
	j := i
	for j < len(d.dels) && d.dels[j]>>32 == h {
		j++
	}
	return d.dels[i:j]
}

// Contains reports whether a word is in the dictionary.
func (d *Dictionary) Contains(w string) bool { return d.find([]byte(w)) >= 0 }

// find returns the index of a word, -1 when it is not in the dictionary.
func (d *Dictionary) find(w []byte) int32 {
	for _, e := range d.run(hash(w)) {
		if k := int32(e & 0xffffffff); d.word(k) == string(w) {
			return k
		}
	}
	return -1
}

// hash is the upper half of the 64-bit FNV-1a hash of b: the same on
// every run, so that the index is too.
func hash(b []byte) uint64 {
	h := uint64(14695981039346656037)
	for _, c := range b {
		h ^= uint64(c)
		h *= 1099511628211
	}
	return h >> 32
}

func lowerLetters(w string) bool {
	for i := 0; i < len(w); i++ {
		if w[i] < 'a' || w[i] > 'z' {
			return false
		}
	}
	return w != ""
}

// Corrector proposes readings from a dictionary. It keeps scratch space
// and is not safe for concurrent use; give each goroutine its own.
type Corrector struct {
	Dict *Dictionary
	buf  []byte
}

// Correct returns the reading of a lower-case word of letters a–z, and
// false when it has none or is in the dictionary itself. Repeated letters
// are squeezed first (to two, then to one: "prettty" → "pretty", "sooooo"
// → "so"); only when that finds no word are single edits tried.
func (c *Corrector) Correct(word string) (string, bool) {
	d := c.Dict
	if d == nil || !lowerLetters(word) {
		return "", false
	}
	c.buf = append(c.buf[:0], word...)
	if d.find(c.buf) >= 0 {
		return "", false
	}
	best, top := c.squeezed(word)
	if best < 0 && len(word) >= MinEditLen {
		c.buf = append(c.buf[:0], word...)
		c.candidates(hash(c.buf), word, &best, &top)
		for k := 1; k < len(word); k++ {
			c.buf = append(append(c.buf[:0], word[:k]...), word[k+1:]...)
			c.candidates(hash(c.buf), word, &best, &top)
		}
	}
	if best < 0 {
		return "", false
	}
	return d.word(best), true
}

// Emphasized returns the reading of a lower-case word of letters a–z that
// repeats a letter three times or more for emphasis ("sooooo" → "so",
// "veryyy" → "very") as the word its repeats squeezed make, and false when
// it has none (no such run, no such word, or the word itself is in the
// dictionary). No other edit is tried: a capitalized word is mostly a
// name, and a name one edit from a word is common ("Traci", "Track"),
// while a letter three times is seldom a name's.
func (c *Corrector) Emphasized(word string) (string, bool) {
	d := c.Dict
	if d == nil || !lowerLetters(word) || !tripled(word) {
		return "", false
	}
	c.buf = append(c.buf[:0], word...)
	if d.find(c.buf) >= 0 {
		return "", false
	}
	if best, _ := c.squeezed(word); best >= 0 {
		return d.word(best), true
	}
	return "", false
}

// tripled reports whether a word has a letter three times in a row and
// another letter too: one letter repeated is a placeholder ("YYYY",
// "AAA") or a sound, not a word emphasized.
func tripled(word string) bool {
	run := false
	for i := 2; i < len(word); i++ {
		if word[i] == word[i-1] && word[i] == word[i-2] {
			run = true
		}
	}
	return run && strings.Trim(word, word[:1]) != ""
}

// squeezed returns the most frequent dictionary word that the word's
// repeated letters squeezed to two, or to one, make (-1 for none), and its
// frequency.
func (c *Corrector) squeezed(word string) (best int32, top float64) {
	best = -1
	for _, keep := range [2]int{2, 1} {
		if k := c.Dict.find(c.squeeze(word, keep)); k >= 0 {
			better(k, c.Dict.freq[k], &best, &top)
		}
	}
	return best, top
}

// candidates checks the words a deletion hash leads to and keeps the most
// frequent one a single edit away from word.
func (c *Corrector) candidates(h uint64, word string, best *int32, top *float64) {
	d := c.Dict
	for _, e := range d.run(h) {
		k := int32(e & 0xffffffff)
		if (d.freq[k] > *top || d.freq[k] == *top && k < *best) && OneEdit(word, d.word(k)) {
			better(k, d.freq[k], best, top)
		}
	}
}

// better keeps word k of frequency f if it beats the best so far: higher
// frequency, or the same and first in alphabetical order, so that the
// reading does not depend on the order candidates are met in.
func better(k int32, f float64, best *int32, top *float64) {
	if f > *top || f == *top && k < *best {
		*best, *top = k, f
	}
}

// OneEdit reports whether b is a single edit away from a with the same
// first letter: a deletion, an insertion, a substitution or a swap of two
// neighbouring letters.
func OneEdit(a, b string) bool {
	if a == "" || b == "" || a[0] != b[0] || a == b {
		return false
	}
	switch len(a) - len(b) {
	case 0:
		i := 0
		for a[i] == b[i] {
			i++
		}
		if a[i+1:] == b[i+1:] {
			return true // substitution
		}
		return i+1 < len(a) && a[i] == b[i+1] && a[i+1] == b[i] && a[i+2:] == b[i+2:]
	case 1:
		a, b = b, a
		fallthrough
	case -1: // b has one letter more
		i := 0
		for i < len(a) && a[i] == b[i] {
			i++
		}
		return a[i:] == b[i+1:]
	}
	return false
}

// squeeze returns the word with every run of a letter longer than keep
// cut to keep letters, in the scratch buffer.
func (c *Corrector) squeeze(word string, keep int) []byte {
	c.buf = c.buf[:0]
	run := 0
	for i := 0; i < len(word); i++ {
		if i > 0 && word[i] == word[i-1] {
			run++
		} else {
			run = 1
		}
		if run <= keep {
			c.buf = append(c.buf, word[i])
		}
	}
	return c.buf
}
