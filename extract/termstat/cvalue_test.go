package termstat

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func cand(s string, f float64) Candidate { return Candidate{Words: strings.Fields(s), Freq: f} }

// TestCValueCarcinoma works the C-value formula of Frantzi, Ananiadou and
// Mima (2000), IJDL 3(2), by hand on the nested "basal cell carcinoma"
// family the paper uses to motivate nesting. The strings follow the paper's
// example; the frequencies are this test's own, and the expected values
// are hand arithmetic from the paper's definition of C-value:
//
//	C(a) = log2|a|·f(a)                              a not nested
//	C(a) = log2|a|·(f(a) − Σ_{b∈T_a} f(b) / P(T_a))  otherwise
//
//	adenoid cystic basal cell carcinoma  f=5   not nested: log2 5·5 = 2.321928·5 = 11.609640
//	cystic basal cell carcinoma          f=11  T = {adenoid…}: log2 4·(11 − 5/1) = 2·6 = 12
//	ulcerated basal cell carcinoma       f=7   not nested: log2 4·7 = 14
//	recurrent basal cell carcinoma       f=5   not nested: log2 4·5 = 10
//	circumscribed basal cell carcinoma   f=3   not nested: log2 4·3 = 6
//	basal cell carcinoma                 f=984 T = all five above, Σf(b) = 5+11+7+5+3 = 31,
//	                                           P(T) = 5: log2 3·(984 − 31/5) = 1.5849625·977.8
//	                                           = 1549.776
func TestCValueCarcinoma(t *testing.T) {
	cands := []Candidate{
		cand("adenoid cystic basal cell carcinoma", 5),
		cand("cystic basal cell carcinoma", 11),
		cand("ulcerated basal cell carcinoma", 7),
		cand("recurrent basal cell carcinoma", 5),
		cand("circumscribed basal cell carcinoma", 3),
		cand("basal cell carcinoma", 984),
	}
	want := []struct {
		score      float64
		containers int
		sum        float64
	}{
		{11.609640, 0, 0},
		{12, 1, 5},
		{14, 0, 0},
		{10, 0, 0},
		{6, 0, 0},
		{1549.776, 5, 31},
	}
	res, err := CValue(cands, CValueOptions{})
	require.NoError(t, err)
	for i, w := range want {
		r, name := res[i], strings.Join(cands[i].Words, " ")
		assert.InDelta(t, w.score, r.Score, 1e-3, "%s: hand-worked C-value", name)
		assert.Equal(t, w.containers, r.Containers, "%s: P(T)", name)
		assert.Equal(t, w.sum, r.ContainerFreq, "%s: Σf(b)", name)
	}
	// The most frequent container of "basal cell carcinoma" is "cystic
	// basal cell carcinoma" (f=11, the largest of 5, 11, 7, 5, 3).
	assert.Equal(t, 1, res[5].Top, "most frequent container")
}

// TestCValueSingleWordsAndRepeats is a second hand-worked example, with a
// single word, a candidate containing the same sub-sequence twice (T_a is a
// set, so it counts once), and both length weights:
//
//	valve                f=50  T = {control valve 20, drip control valve 6, valve to valve 4}
//	                           → f − 30/3 = 40; paper: log2 1·40 = 0; variant: log2 2·40 = 40
//	control valve        f=20  T = {drip control valve 6} → 20 − 6 = 14;
//	                           paper: 1·14 = 14; variant: log2 3·14 = 22.189475
//	drip control valve   f=6   not nested: paper log2 3·6 = 9.509775; variant 2·6 = 12
//	valve to valve       f=4   not nested: paper log2 3·4 = 6.339850; variant 2·4 = 8
//	irrigation zone      f=9   not nested: paper 1·9 = 9; variant log2 3·9 = 14.264663
func TestCValueSingleWordsAndRepeats(t *testing.T) {
	cands := []Candidate{
		cand("valve", 50),
		cand("control valve", 20),
		cand("drip control valve", 6),
		cand("valve to valve", 4),
		cand("irrigation zone", 9),
	}
	paper := []float64{0, 14, 9.509775, 6.339850, 9}
	variant := []float64{40, 22.189475, 12, 8, 14.264663}
	for _, tc := range []struct {
		opt  CValueOptions
		want []float64
	}{{CValueOptions{}, paper}, {CValueOptions{Weight: Log2LengthPlusOne}, variant}} {
		res, err := CValue(cands, tc.opt)
		require.NoError(t, err)
		for i, w := range tc.want {
			if math.Abs(res[i].Score-w) > 1e-6 {
				t.Errorf("weight %d, %q: C-value %.6f, hand-worked %.6f", tc.opt.Weight, strings.Join(cands[i].Words, " "), res[i].Score, w)
			}
		}
		if r := res[0]; r.Containers != 3 || r.ContainerFreq != 30 || !r.Nested() {
			t.Errorf("valve: %+v, want 3 containers with Σf = 30 (valve to valve counted once)", r)
		}
		if res[4].Nested() {
			t.Errorf("irrigation zone reported as nested")
		}
	}
}

// naiveCValue is the definition applied literally: compare every pair of
// candidates. Used to cross-check the map-based enumeration.
func naiveCValue(cands []Candidate, opt CValueOptions) []CValueResult {
	contains := func(long, short []string) bool {
		for i := 0; i+len(short) <= len(long); i++ {
			ok := true
			for j := range short {
				if long[i+j] != short[j] {
					ok = false
					break
				}
			}
			if ok {
				return true
			}
		}
		return false
	}
	res := make([]CValueResult, len(cands))
	for a, ca := range cands {
		for b, cb := range cands {
			if a != b && len(cb.Words) > len(ca.Words) && contains(cb.Words, ca.Words) {
				if top := cands[res[a].Top]; res[a].Containers == 0 || cb.Freq > top.Freq || cb.Freq == top.Freq && slices.Compare(cb.Words, top.Words) < 0 {
					res[a].Top = b
				}
				res[a].Containers++
				res[a].ContainerFreq += cb.Freq
			}
		}
		f := ca.Freq
		if res[a].Containers > 0 {
			f -= res[a].ContainerFreq / float64(res[a].Containers)
		}
		res[a].Score = lengthWeight(len(ca.Words), opt.Weight) * f
	}
	return res
}

func TestCValueMatchesPairwiseDefinition(t *testing.T) {
	r := rand.New(rand.NewPCG(2000, 3))
	vocab := []string{"valve", "zone", "drip", "sensor", "control", "humidity"}
	for trial := range 200 {
		seen := map[string]bool{}
		var cands []Candidate
		for range 40 {
			n := 1 + r.IntN(5)
			words := make([]string, n)
			for i := range words {
				words[i] = vocab[r.IntN(len(vocab))]
			}
			k := strings.Join(words, " ")
			if seen[k] {
				continue
			}
			seen[k] = true
			cands = append(cands, Candidate{Words: words, Freq: float64(1 + r.IntN(50))})
		}
		opt := CValueOptions{Weight: LengthWeight(trial % 2)}
		got, err := CValue(cands, opt)
		require.NoError(t, err)
		want := naiveCValue(cands, opt)
		for i := range cands {
			if got[i].Containers != want[i].Containers || got[i].ContainerFreq != want[i].ContainerFreq || got[i].Top != want[i].Top ||
				math.Abs(got[i].Score-want[i].Score) > 1e-9*math.Max(1, math.Abs(want[i].Score)) {
				t.Fatalf("trial %d, %q: got %+v, pairwise definition %+v", trial, strings.Join(cands[i].Words, " "), got[i], want[i])
			}
		}
	}
}

// Words are compared as whole words: "valve" must not be found inside
// "valves", nor "a b" inside "aa b".
func TestCValueWholeWords(t *testing.T) {
	res, err := CValue([]Candidate{cand("valves seat", 3), cand("valve", 5), cand("a b", 2), cand("x aa b", 1)}, CValueOptions{})
	require.NoError(t, err)
	for i, r := range res {
		if r.Nested() {
			t.Errorf("candidate %d wrongly nested: %+v", i, r)
		}
	}
}

func TestCValueErrors(t *testing.T) {
	for _, c := range []struct {
		cands []Candidate
		want  string
	}{
		{[]Candidate{cand("valve", 1), {Words: nil, Freq: 1}}, "candidate 1 has no words"},
		{[]Candidate{cand("drip valve", 1), cand("drip valve", 2)}, `candidate 1 ("drip valve") repeats candidate 0`},
		{[]Candidate{cand("valve", -1)}, "frequency -1"},
		{[]Candidate{cand("valve", math.NaN())}, "frequency NaN"},
		{[]Candidate{{Words: []string{"a\x00b"}, Freq: 1}}, "NUL byte"},
	} {
		_, err := CValue(c.cands, CValueOptions{})
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("CValue(%v) error = %v, want it to contain %q", c.cands, err, c.want)
		}
	}
	if res, err := CValue(nil, CValueOptions{}); err != nil || len(res) != 0 {
		t.Errorf("CValue(nil) = %v, %v", res, err)
	}
}

func BenchmarkCValue(b *testing.B) {
	r := rand.New(rand.NewPCG(1, 1))
	var cands []Candidate
	seen := map[string]bool{}
	for len(cands) < 20000 {
		n := 1 + r.IntN(5)
		words := make([]string, n)
		for i := range words {
			words[i] = fmt.Sprintf("w%d", r.IntN(300))
		}
		k := strings.Join(words, " ")
		if !seen[k] {
			seen[k] = true
			cands = append(cands, Candidate{Words: words, Freq: float64(1 + r.IntN(100))})
		}
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := CValue(cands, CValueOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
