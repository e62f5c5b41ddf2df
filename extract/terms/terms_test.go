package terms

import (
	"bytes"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// extractTexts runs the default extraction over small texts, one document
// each, with the real tokenizer and tagger.
func extractTexts(t *testing.T, texts ...string) []*Term {
	t.Helper()
	return extractWith(t, Options{}, texts...)
}

func find(ts []*Term, term string) *Term {
	for _, t := range ts {
		if t.Term == term {
			return t
		}
	}
	return nil
}

func forms(t *Term) []string {
	var out []string
	for _, v := range t.Variants {
		out = append(out, v.Form)
	}
	sort.Strings(out)
	return out
}

// Hyphen, space and no-space spellings and the plural are one candidate;
// every surface form is kept with its count.
func TestVariantsGrouped(t *testing.T) {
	ts := extractTexts(t,
		"Adjust the set point of the heater. The set points are stored in memory.",
		"Each set-point is checked hourly. A new setpoint takes effect at once.")
	var group *Term
	for _, x := range ts {
		if strings.ReplaceAll(strings.ReplaceAll(strings.ToLower(x.Term), "-", ""), " ", "") == "setpoint" {
			if group != nil {
				t.Fatalf("two groups for set point: %q and %q", group.Term, x.Term)
			}
			group = x
		}
	}
	require.NotNil(t, group, "no set point candidate")
	assert.Equal(t, []string{"set point", "set points", "set-point", "setpoint"}, forms(group))
	assert.Equal(t, 4, group.Freq)
	assert.Equal(t, 2, group.Docs)
}

// The canonical form lemmatizes the head, folds case when a lower-case
// spelling occurs, keeps acronyms, and lemmatizes the noun before "of".
func TestCanonicalForm(t *testing.T) {
	ts := extractTexts(t,
		"Drip Emitters\n\nClean the drip emitters weekly. Each drip emitter delivers 2 litres.",
		"The EC reading rose. Check the EC sensor and the rates of flow at the pump.")
	if x := find(ts, "drip emitter"); assert.NotNil(t, x) {
		assert.Contains(t, forms(x), "Drip Emitters")
	}
	assert.NotNil(t, find(ts, "EC"), "acronym case not kept: %v", names(ts))
	assert.NotNil(t, find(ts, "EC sensor"), "acronym case not kept: %v", names(ts))
	assert.NotNil(t, find(ts, "rate of flow"), "head before 'of' lemmatized: %v", names(ts))
}

// A nested candidate never cuts a hyphenated word: "compensating drip
// emitter" is not a candidate inside "pressure-compensating drip emitter".
func TestNoCutHyphen(t *testing.T) {
	ts := extractTexts(t, "Fit a pressure-compensating drip emitter to each pot.")
	for _, cut := range []string{"compensating drip emitter", "compensating"} {
		assert.Nil(t, find(ts, cut), "a candidate cuts the hyphenated word: %v", names(ts))
	}
	for _, want := range []string{"pressure-compensating drip emitter", "drip emitter"} {
		assert.NotNil(t, find(ts, want), "missing candidate: %v", names(ts))
	}
}

func names(ts []*Term) []string {
	var out []string
	for _, t := range ts {
		out = append(out, t.Term)
	}
	return out
}

// Same input, same bytes, in every format; the ranking breaks ties by
// frequency, then by the term's text.
func TestDeterministicOutput(t *testing.T) {
	texts := []string{
		"The solenoid valve opens. The solenoid valve closes. A drip line feeds the pots.",
		"Flush the drip line. The valve seat wears. The valve seat is brass.",
	}
	first := make([][]byte, len(Formats))
	for run := 0; run < 3; run++ {
		ranked, err := Rank(extractTexts(t, texts...), RankOptions{All: true})
		if err != nil {
			t.Fatal(err)
		}
		for i, f := range Formats {
			var b bytes.Buffer
			if err := Write(&b, f, ranked, WriteOptions{Contexts: 1}); err != nil {
				t.Fatal(err)
			}
			if run == 0 {
				first[i] = b.Bytes()
			} else if !bytes.Equal(first[i], b.Bytes()) {
				t.Fatalf("%s output differs between runs", f)
			}
		}
	}
	ranked, _ := Rank(extractTexts(t, texts...), RankOptions{All: true})
	for i := 1; i < len(ranked); i++ {
		a, b := ranked[i-1], ranked[i]
		if a.Score < b.Score || a.Score == b.Score && (a.Freq < b.Freq || a.Freq == b.Freq && a.Term > b.Term) {
			t.Fatalf("order broken at %d: %+v before %+v", i, a, b)
		}
	}
}

// Contexts carry the document, the line and the sentence, at most one per
// document first.
func TestContexts(t *testing.T) {
	ts := extractTexts(t, "First line.\nThe pilot port clogs. The pilot port is small.", "A pilot port can clog.")
	x := find(ts, "pilot port")
	require.NotNil(t, x)
	require.Len(t, x.Contexts, 3)
	assert.Equal(t, Context{Doc: "a", Line: 2, Text: "The pilot port clogs."}, x.Contexts[0])
	assert.Equal(t, "b", x.Contexts[1].Doc, "one context per document first")
}

// Plausible drops symbols, keeps acronyms.
func TestPlausible(t *testing.T) {
	for term, want := range map[string]bool{"r": false, "ϕ": false, "cl": false, "EC": true, "valve": true, "3a": false, "drip line": true} {
		assert.Equal(t, want, Plausible(&Term{Term: term, Words: len(strings.Fields(term))}), "Plausible(%q)", term)
	}
}

// The default list ends at the score cut-off; --all keeps every candidate.
func TestCutoff(t *testing.T) {
	ts := extractTexts(t, "The solenoid valve opens. The solenoid valve closes. It was a good day for everyone.")
	all, _ := Rank(ts, RankOptions{All: true})
	def, _ := Rank(ts, RankOptions{})
	require.Less(t, len(def), len(all), "the cut-off removed nothing")
	for _, x := range def {
		assert.GreaterOrEqual(t, x.Score, Cutoff, "%q scores below the cut-off", x.Term)
	}
}
