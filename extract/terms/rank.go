package terms

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"
	"unicode"
)

// RankOptions select, score and order candidates.
type RankOptions struct {
	MinFreq int    // candidates seen fewer times are left out (0 = 1)
	Sort    string // measure to sort by: score (default), freq, docs, keyness, weirdness, cvalue, dp, term
	// All keeps every candidate; otherwise the list ends at the default
	// cut-off (see Cutoff).
	All   bool
	Limit int // at most this many terms (0 = no limit)
}

// SortKeys lists the names RankOptions.Sort accepts.
var SortKeys = []string{"score", "freq", "docs", "keyness", "weirdness", "cvalue", "dp", "term"}

// Rank scores the candidates, filters and orders them and numbers the
// ranks from 1. Ties are broken by frequency (higher first), then by the
// term's text in byte order, so the same input always gives the same list.
func Rank(ts []*Term, opt RankOptions) ([]*Term, error) {
	key := opt.Sort
	if key == "" {
		key = "score"
	}
	get, ok := sortKey(key)
	if !ok {
		return nil, fmt.Errorf("unknown sort key %q (want one of %s)", opt.Sort, strings.Join(SortKeys, ", "))
	}
	minFreq := max(opt.MinFreq, 1)
	var out []*Term
	for _, t := range ts {
		t.Score = Score(t)
		// The default list ends at the cut-off: what scores below it is
		// left out before sorting (on a large corpus, most candidates).
		if t.Freq >= minFreq && (opt.All || t.Score >= settings.cutoff) {
			out = append(out, t)
		}
	}
	byScore := func(a, b *Term) int {
		switch {
		case a.Score != b.Score:
			return cmp.Compare(b.Score, a.Score)
		case a.Freq != b.Freq:
			return cmp.Compare(b.Freq, a.Freq)
		}
		return strings.Compare(a.Term, b.Term)
	}
	slices.SortStableFunc(out, byScore)
	if key != "score" {
		slices.SortStableFunc(out, func(a, b *Term) int {
			if key == "term" {
				return strings.Compare(a.Term, b.Term)
			}
			x, y := get(a), get(b)
			if key == "dp" {
				x, y = -x, -y // evenly spread first
			}
			if x != y {
				return cmp.Compare(y, x)
			}
			return byScore(a, b)
		})
	}
	for i, t := range out {
		t.Rank = i + 1
	}
	if opt.Limit > 0 && len(out) > opt.Limit {
		out = out[:opt.Limit]
	}
	return out, nil
}

func sortKey(name string) (func(*Term) float64, bool) {
	switch name {
	case "score":
		return func(t *Term) float64 { return t.Score }, true
	case "freq":
		return func(t *Term) float64 { return float64(t.Freq) }, true
	case "docs":
		return func(t *Term) float64 { return float64(t.Docs) }, true
	case "keyness":
		return func(t *Term) float64 { return t.Keyness }, true
	case "weirdness":
		return func(t *Term) float64 { return t.Weirdness }, true
	case "cvalue":
		return func(t *Term) float64 { return t.CValue }, true
	case "dp":
		return func(t *Term) float64 { return t.DP }, true
	case "term":
		return func(t *Term) float64 { return 0 }, true
	}
	return nil, false
}

// Cutoff is the score at which the default list ends. A single word seen
// once needs a weirdness above e^(2.5/ln 2) ≈ 37 to pass it, one seen 10
// times above e^(2.5/ln 11) ≈ 2.8; a phrase seen 10 times passes when its
// least specific word is about as frequent as in general language, with
// the RepeatedPhraseBonus. Chosen on the three evaluation domains, the
// score's settings first (README, "Leave-one-domain-out").
const Cutoff = 2.5

// Score is the combined ranking score of a candidate:
//
//	score = ln(1 + freq) · (ln(weirdness) · damping + unit)
//
// the evidence of use (frequency, damped) times the domain specificity of
// the candidate's least specific word. damping is 1 except for a word that
// a number or a label mostly follows, a document-structure word such as
// "figure" or "section" (structureDamping). unit is 0 for a single word
// and, for a candidate of two or more words, weighs the evidence that it
// is a unit of its own: RepeatedPhraseBonus when it is seen at least
// twice — a word sequence that comes back is a unit ("money laundering",
// "riding school") even when its words are each general — and
// −FragmentPenalty when it is mostly a piece of one longer candidate
// (Within: "horizontal-axis wind" of "horizontal-axis wind turbine") or
// longer than MaxUnitWords words. A
// candidate whose words are all more common in general language than in
// the documents scores below 0 unless it is such a repeated phrase.
// Candidates that cannot be glossary entries score -Inf-like low values:
// see Plausible.
func Score(t *Term) float64 {
	if !Plausible(t) || t.Weirdness <= 0 {
		return unlikely
	}
	s := damped(t.Weirdness, t.labelShare)
	switch {
	case t.Words < 2:
	case t.Within != "" || t.Words > MaxUnitWords:
		s -= settings.fragmentPenalty
	case t.Freq >= 2:
		s += settings.phraseBonus
	}
	return math.Log1p(float64(t.Freq)) * s
}

// scoreSettings are the constants of the score and the default list in one
// place, so that the leave-one-domain-out check (acter_test.go) can vary
// them; the program never changes them.
type scoreSettings struct {
	structureShare  float64 // StructureShare
	phraseBonus     float64 // RepeatedPhraseBonus
	fragmentPenalty float64 // FragmentPenalty
	cutoff          float64 // Cutoff
}

var settings = scoreSettings{StructureShare, RepeatedPhraseBonus, FragmentPenalty, Cutoff}

// RepeatedPhraseBonus is added to the domain specificity (ln weirdness)
// of a candidate of two or more words seen at least twice, unless it is a
// fragment: as if its least specific word were e^1.5 ≈ 4.5 times more
// specific. Without it a repeated phrase of everyday words ("working
// trot", "natural person") ranked below single words seen once. Chosen
// leave-one-domain-out on the evaluation lists (README).
const RepeatedPhraseBonus = 1.5

// FragmentPenalty is taken from the domain specificity of a candidate of
// two or more words that is mostly (WithinPercent) a piece of one longer
// candidate: such pieces are rarely terms of their own on the evaluation
// lists, while single words inside a longer term ("drip" in "drip
// emitter") often are, and keep their score. Chosen leave-one-domain-out
// (README).
const FragmentPenalty = 6.0

// MaxUnitWords is the longest phrase, in words, that the score takes for a
// unit of its own. Longer candidates (DefaultMaxWords allows four words)
// take the FragmentPenalty: on the evaluation lists a phrase of four
// words is rarely a term, and counting it as a candidate serves its parts
// (see DefaultMaxWords).
const MaxUnitWords = 3

// unlikely is the score of candidates Plausible rejects: far below any
// real score, finite so that sorting and printing stay well defined.
const unlikely = -1000

// Plausible rejects single-word candidates that are symbols rather than
// words: fewer than two letters ("r", "ϕ", "3a"), or a two-letter word in
// lower case ("cl", "sin") — two capitals pass as an acronym ("EC").
func Plausible(t *Term) bool {
	if t.Words != 1 || strings.Contains(t.Term, " ") {
		return true
	}
	letters, upper := 0, 0
	for _, r := range t.Term {
		if unicode.IsLetter(r) {
			letters++
			if unicode.IsUpper(r) {
				upper++
			}
		}
	}
	switch {
	case letters < 2:
		return false
	case letters == 2 && len([]rune(t.Term)) == 2:
		return upper == 2
	}
	return true
}
