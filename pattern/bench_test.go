package pattern

import (
	"math/rand"
	"testing"

	"glossmith/tagger/doc"
)

// syntheticCorpus makes tagged sentences that look like technical English:
// determiners, modifier runs, nouns, verbs, "of" phrases, hyphenated
// compounds, acronyms and punctuation, in proportions close to running
// text (about a quarter nouns).
func syntheticCorpus(nSent int) [][]doc.Token {
	r := rand.New(rand.NewSource(7))
	word := func(form, upos, xpos string) doc.Token {
		return doc.Token{Form: form, Lemma: form, UPOS: upos, XPOS: xpos}
	}
	det := []doc.Token{word("the", "DET", "DT"), word("a", "DET", "DT"), word("each", "DET", "DT"), word("their", "PRON", "PRP$")}
	adj := []doc.Token{word("stainless", "ADJ", "JJ"), word("humid", "ADJ", "JJ"), word("new", "ADJ", "JJ"), word("main", "ADJ", "JJ")}
	noun := []doc.Token{word("valve", "NOUN", "NN"), word("controller", "NOUN", "NN"), word("sensors", "NOUN", "NNS"),
		word("irrigation", "NOUN", "NN"), word("greenhouse", "NOUN", "NN"), word("pressure", "NOUN", "NN"), word("EC", "PROPN", "NNP")}
	verb := []doc.Token{word("opens", "VERB", "VBZ"), word("measured", "VERB", "VBN"), word("cooling", "VERB", "VBG"), word("check", "VERB", "VB")}
	aux := []doc.Token{word("is", "AUX", "VBZ"), word("will", "AUX", "MD")}
	adp := []doc.Token{word("in", "ADP", "IN"), word("on", "ADP", "IN"), word("of", "ADP", "IN")}
	adv := []doc.Token{word("slowly", "ADV", "RB"), word("very", "ADV", "RB")}
	pick := func(s []doc.Token) doc.Token { return s[r.Intn(len(s))] }
	np := func(out []doc.Token) []doc.Token {
		if r.Intn(3) > 0 {
			out = append(out, pick(det))
		}
		for k := r.Intn(3); k > 0; k-- {
			if r.Intn(2) == 0 {
				out = append(out, pick(adj))
			} else {
				out = append(out, pick(noun))
			}
		}
		if r.Intn(8) == 0 {
			out = append(out, pick(noun), word("-", "PUNCT", "HYPH"))
		}
		return append(out, pick(noun))
	}
	var corpus [][]doc.Token
	for s := 0; s < nSent; s++ {
		var t []doc.Token
		t = np(t)
		if r.Intn(3) == 0 {
			t = append(t, pick(aux))
		}
		if r.Intn(4) == 0 {
			t = append(t, pick(adv))
		}
		t = append(t, pick(verb))
		t = np(t)
		for k := r.Intn(3); k > 0; k-- {
			t = append(t, pick(adp))
			t = np(t)
		}
		t = append(t, word(".", "PUNCT", "."))
		corpus = append(corpus, t)
	}
	return corpus
}

func benchMatcher(b *testing.B, m *Matcher, find func(*Matcher, []doc.Token) []Match) {
	corpus := syntheticCorpus(2000)
	ntok := 0
	for _, s := range corpus {
		ntok += len(s)
	}
	b.ResetTimer()
	cpu0 := cpuSeconds()
	matches := 0
	for i := 0; i < b.N; i++ {
		for _, s := range corpus {
			matches += len(find(m, s))
		}
	}
	if cpu := cpuSeconds() - cpu0; cpu > 0 {
		b.ReportMetric(float64(ntok)*float64(b.N)/cpu, "tokens/cpu-s")
	}
	b.ReportMetric(float64(ntok)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
	b.ReportMetric(float64(matches)/float64(b.N)/float64(ntok), "matches/token")
}

func findAll(m *Matcher, s []doc.Token) []Match    { return m.FindAll(s) }
func findNested(m *Matcher, s []doc.Token) []Match { return m.FindNested(s) }

// BenchmarkTermsSet measures FindAll throughput of the stock terms set on
// pre-tagged tokens (the goal is at least 20 million tokens/s per core).
func BenchmarkTermsSet(b *testing.B) {
	m, err := CompileStock("terms")
	if err != nil {
		b.Fatal(err)
	}
	benchMatcher(b, m, findAll)
}

// BenchmarkTermsSetNested is the same in the every-span mode.
func BenchmarkTermsSetNested(b *testing.B) {
	m, err := CompileStock("terms")
	if err != nil {
		b.Fatal(err)
	}
	benchMatcher(b, m, findNested)
}

// BenchmarkPlain and BenchmarkPathological run side by side: the nested
// stars of (_*)*NOUN must cost no more per token than NOUN.
func BenchmarkPlain(b *testing.B) {
	benchMatcher(b, mustCompile(b, "r = NOUN ;"), findAll)
}

func BenchmarkPathological(b *testing.B) {
	benchMatcher(b, mustCompile(b, "r = (_*)*NOUN ;"), findAll)
}

// BenchmarkPathologicalLong runs the pathological rule on one long
// sentence without nouns at all, where a backtracking matcher would take
// quadratic time or worse.
func BenchmarkPathologicalLong(b *testing.B) {
	m := mustCompile(b, "r = (_*)*NOUN | (_ _*)* VERB ;")
	s := make([]doc.Token, 5000)
	for i := range s {
		s[i] = doc.Token{Form: "x", UPOS: "ADJ"}
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		m.FindAll(s)
	}
	b.ReportMetric(float64(len(s))*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
}

// BenchmarkPairsSet measures the default mode of the stock pairs set, as
// the collocations command runs it; every match carries @node and @collocate.
func BenchmarkPairsSet(b *testing.B) {
	m, err := CompileStock("pairs")
	if err != nil {
		b.Fatal(err)
	}
	benchMatcher(b, m, findAll)
}

// BenchmarkPairsSetNested measures the every-span mode of the stock pairs
// set, whose matches all carry @node and @collocate slots.
func BenchmarkPairsSetNested(b *testing.B) {
	m, err := CompileStock("pairs")
	if err != nil {
		b.Fatal(err)
	}
	benchMatcher(b, m, findNested)
}
