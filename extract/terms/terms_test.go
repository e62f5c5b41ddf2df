package terms

import (
	"bytes"
	"sort"
	"strings"
	"testing"
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
	if group == nil {
		t.Fatal("no set point candidate")
	}
	got := forms(group)
	want := []string{"set point", "set points", "set-point", "setpoint"}
	if strings.Join(got, "|") != strings.Join(want, "|") {
		t.Errorf("variants %v, want %v", got, want)
	}
	if group.Freq != 4 || group.Docs != 2 {
		t.Errorf("freq %d docs %d, want 4 and 2", group.Freq, group.Docs)
	}
}

// The canonical form lemmatizes the head, folds case when a lower-case
// spelling occurs, keeps acronyms, and lemmatizes the noun before "of".
func TestCanonicalForm(t *testing.T) {
	ts := extractTexts(t,
		"Drip Emitters\n\nClean the drip emitters weekly. Each drip emitter delivers 2 litres.",
		"The EC reading rose. Check the EC sensor and the rates of flow at the pump.")
	if x := find(ts, "drip emitter"); x == nil || !strings.Contains(strings.Join(forms(x), "|"), "Drip Emitters") {
		t.Errorf("drip emitter: %+v", x)
	}
	if find(ts, "EC") == nil || find(ts, "EC sensor") == nil {
		t.Errorf("acronym case not kept: %v", names(ts))
	}
	if find(ts, "rate of flow") == nil {
		t.Errorf("no 'rate of flow' (head before 'of' lemmatized): %v", names(ts))
	}
}

// A nested candidate never cuts a hyphenated word: "compensating drip
// emitter" is not a candidate inside "pressure-compensating drip emitter".
func TestNoCutHyphen(t *testing.T) {
	ts := extractTexts(t, "Fit a pressure-compensating drip emitter to each pot.")
	if find(ts, "compensating drip emitter") != nil || find(ts, "compensating") != nil {
		t.Errorf("a candidate cuts the hyphenated word: %v", names(ts))
	}
	if find(ts, "pressure-compensating drip emitter") == nil || find(ts, "drip emitter") == nil {
		t.Errorf("missing candidates: %v", names(ts))
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
	ts := extractTexts(t, "First line.\nThe pilot port clogs. The pilot port is small.", "A pilot port needs cleaning.")
	x := find(ts, "pilot port")
	if x == nil || len(x.Contexts) != 3 {
		t.Fatalf("pilot port contexts: %+v", x)
	}
	if x.Contexts[0].Doc != "a" || x.Contexts[0].Line != 2 || x.Contexts[0].Text != "The pilot port clogs." || x.Contexts[1].Doc != "b" {
		t.Errorf("contexts %+v", x.Contexts)
	}
}

// Plausible drops symbols, keeps acronyms.
func TestPlausible(t *testing.T) {
	for term, want := range map[string]bool{"r": false, "ϕ": false, "cl": false, "EC": true, "valve": true, "3a": false, "drip line": true} {
		if got := Plausible(&Term{Term: term, Words: len(strings.Fields(term))}); got != want {
			t.Errorf("Plausible(%q) = %v, want %v", term, got, want)
		}
	}
}

// The default list ends at the score cut-off; --all keeps every candidate.
func TestCutoff(t *testing.T) {
	ts := extractTexts(t, "The solenoid valve opens. The solenoid valve closes. It was a good day for everyone.")
	all, _ := Rank(ts, RankOptions{All: true})
	def, _ := Rank(ts, RankOptions{})
	if len(def) >= len(all) {
		t.Fatalf("cut-off removed nothing: %d of %d", len(def), len(all))
	}
	for _, x := range def {
		if x.Score < Cutoff {
			t.Errorf("%q scores %.2f below the cut-off", x.Term, x.Score)
		}
	}
}
