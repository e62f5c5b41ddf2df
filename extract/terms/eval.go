package terms

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"golang.org/x/text/encoding/unicode"
	"golang.org/x/text/transform"
	"golang.org/x/text/unicode/norm"
)

// Gold is a reference term list: lower-cased surface forms.
type Gold map[string]bool

// ReadGold reads a gold list with one term per line, optionally followed by
// a tab and a label (the layout of the ACTER term lists); blank lines and
// lines starting with "#" are ignored. Terms are lower-cased and put in
// Unicode NFC, as documents are.
func ReadGold(r io.Reader, name string) (Gold, error) {
	g := Gold{}
	// Lists saved by Windows tools: a UTF-8 byte-order mark is dropped,
	// UTF-16 with one decoded (golang.org/x/text, as termio reads lists).
	sc := bufio.NewScanner(transform.NewReader(r, unicode.BOMOverride(transform.Nop)))
	sc.Buffer(make([]byte, 64<<10), 1<<20)
	line := 0
	for sc.Scan() {
		line++
		if !utf8.Valid(sc.Bytes()) || bytes.IndexByte(sc.Bytes(), 0) >= 0 {
			return nil, fmt.Errorf("%s:%d: not a text file (a NUL byte or invalid UTF-8): want one term per line", name, line)
		}
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		term, _, _ := strings.Cut(text, "\t")
		// In the form documents are read in: "café" typed with a
		// combining accent is the same term.
		term = norm.NFC.String(strings.ToLower(strings.TrimSpace(term)))
		if term == "" {
			return nil, fmt.Errorf("%s:%d: empty term", name, line)
		}
		g[term] = true
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s:%d: %v", name, line+1, err)
	}
	if len(g) == 0 {
		return nil, fmt.Errorf("%s: no terms", name)
	}
	return g, nil
}

// Scores are precision, recall and F1 of an extracted list at one cut-off.
type Scores struct {
	Rank      int     `json:"rank"`      // candidates taken from the top of the list
	Extracted int     `json:"extracted"` // distinct lower-cased surface forms in them
	Correct   int     `json:"correct"`
	Precision float64 `json:"precision"`
	Recall    float64 `json:"recall"`
	F1        float64 `json:"f1"`
}

// Evaluation holds the scores of a default list and the best cut-off of the
// full ranking.
type Evaluation struct {
	Gold    int    `json:"gold"`
	Default Scores `json:"default"`
	Best    Scores `json:"best"`
}

// Evaluate scores a ranking against a gold list the way term-extraction
// research does (e.g. the ACTER shared task): the lower-cased surface forms
// of the extracted candidates (their variants) are compared as sets with
// the gold terms. ranked is the full ranking; defaultLen is how many of its
// candidates the default list keeps. Best is the cut-off k (over every
// k = 1..len(ranked)) with the highest F1; ties go to the smaller k.
func Evaluate(ranked []*Term, defaultLen int, gold Gold) Evaluation {
	ev := Evaluation{Gold: len(gold)}
	seen := map[string]bool{}
	correct := 0
	at := func(k int) Scores {
		s := Scores{Rank: k, Extracted: len(seen), Correct: correct}
		if len(seen) > 0 {
			s.Precision = float64(correct) / float64(len(seen))
		}
		if len(gold) > 0 {
			s.Recall = float64(correct) / float64(len(gold))
		}
		if s.Precision+s.Recall > 0 {
			s.F1 = 2 * s.Precision * s.Recall / (s.Precision + s.Recall)
		}
		return s
	}
	if defaultLen == 0 { // an empty default list
		ev.Default = at(0)
	}
	for i, t := range ranked {
		for _, v := range t.Variants {
			f := strings.ToLower(v.Form)
			if !seen[f] {
				seen[f] = true
				if gold[f] {
					correct++
				}
			}
		}
		s := at(i + 1)
		if s.F1 > ev.Best.F1 {
			ev.Best = s
		}
		if i+1 == defaultLen {
			ev.Default = s
		}
	}
	return ev
}
