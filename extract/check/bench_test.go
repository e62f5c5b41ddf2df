package check

import (
	"fmt"
	"os"
	"runtime"
	"strings"
	"testing"

	"glossmith/extract/terms"
	"glossmith/internal/benchcorpus"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
)

// benchGlossarySize is the glossary size the check is measured with.
const benchGlossarySize = 10000

// benchGlossary makes a glossary of n entries from the term candidates of
// the documents, so that the check finds uses as it would in a real run:
// each candidate is an entry's preferred term; every third entry also has
// a deprecated term (another candidate) and every fifth an admitted closed
// spelling. When the documents offer too few candidates, invented entries
// fill up the rest (they cost the automaton's size without matching).
func benchGlossary(tb testing.TB, ranked []*terms.Term, n int) Glossary {
	var g Glossary
	for i := 0; len(g.Entries) < n; i++ {
		var e Entry
		if i < len(ranked) {
			t := ranked[i].Term
			e.Forms = append(e.Forms, Form{Text: t, Status: Preferred, POS: "noun"})
			if i%5 == 0 && strings.Contains(t, " ") {
				e.Forms = append(e.Forms, Form{Text: strings.ReplaceAll(t, " ", ""), Status: Admitted})
			}
			if i%3 == 0 && len(ranked) > n+i {
				e.Forms = append(e.Forms, Form{Text: ranked[n+i].Term, Status: Deprecated})
			}
		} else {
			e.Forms = []Form{{Text: fmt.Sprintf("zq%d flux capacitor", i), Status: Preferred}}
		}
		e.ID = fmt.Sprint(len(g.Entries) + 1)
		g.Entries = append(g.Entries, e)
	}
	return g
}

// BenchmarkCheck measures the check's own work per document (the glossary
// scan with a 10,000-entry glossary, suppression and positions; with the
// misspelling pass; then the mixed-spelling collection) against the candidate collection of the terms
// command on the same annotated documents — the per-document work each
// command adds to reading and tagging, which they share. The documents are
// 2 MiB of benchmark-corpus text, or the directory GLOSSMITH_BENCH_DIR.
// Rates are tokens per CPU second.
func BenchmarkCheck(b *testing.B) {
	dir := benchcorpus.SliceDir(b, 2<<20)
	model, err := hmm.Default()
	if err != nil {
		b.Fatal(err)
	}
	rules, err := pattern.CompileStock("terms")
	if err != nil {
		b.Fatal(err)
	}
	col := terms.NewCollector(rules, terms.Options{})
	corpus := terms.NewCorpus(0)
	var docs []*doc.Document
	var srcs [][]byte
	st := pipeline.Run([]string{dir}, pipeline.Options{Tagger: model}, col.Collect,
		func(d *doc.Document, dc *terms.DocCounts) {
			corpus.Add(dc)
			dc.Release()
			src, err := os.ReadFile(d.Name)
			if err != nil {
				b.Fatal(err)
			}
			docs, srcs = append(docs, d), append(srcs, src)
		})
	ranked, err := terms.Rank(corpus.Terms(modelRef{model}), terms.RankOptions{})
	if err != nil {
		b.Fatal(err)
	}
	g := benchGlossary(b, ranked, benchGlossarySize)
	b.Logf("%d documents, %.0f tokens, %d candidates", len(docs), float64(st.Tokens), len(ranked))
	m := Compile(g)
	tokens := float64(st.Tokens)
	run := func(b *testing.B, fn func(i int)) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			for i := range docs {
				fn(i)
			}
		}
		b.ReportMetric(tokens*float64(b.N)/(benchcorpus.CPUTime()-cpu0).Seconds(), "tokens/cpu-s")
		b.ReportMetric(0, "ns/op")
	}
	found := 0
	b.Run("compile", func(b *testing.B) {
		for b.Loop() {
			Compile(g)
		}
	})
	b.Run("check", func(b *testing.B) {
		run(b, func(i int) { found += len(Check(docs[i], srcs[i], Options{Glossary: m}).Findings) })
		if found == 0 {
			b.Fatal("the glossary made from the documents' own terms found nothing in them")
		}
	})
	// misspelt: check with the misspelling pass, its index and memo made
	// afresh for each pass over the documents, as a run makes them.
	b.Run("misspelt", func(b *testing.B) {
		var ms *Misspellings
		run(b, func(i int) {
			if i == 0 {
				ms = NewMisspellings(m, model)
			}
			Check(docs[i], srcs[i], Options{Glossary: m, Misspellings: ms})
		})
	})
	// report: the heap a report holds once every document's findings are
	// in it, per finding — what a run keeps until it writes them out
	// (the documents, which the benchmark holds anyway, not counted).
	b.Run("report", func(b *testing.B) {
		var held, findings float64
		var ms runtime.MemStats
		for b.Loop() {
			runtime.GC()
			runtime.ReadMemStats(&ms)
			before := ms.HeapAlloc
			rep, n := NewReport(m), 0
			for i := range docs {
				res := Check(docs[i], srcs[i], Options{Glossary: m})
				n += len(res.Findings)
				rep.Add(res)
			}
			runtime.GC()
			runtime.ReadMemStats(&ms)
			held += float64(ms.HeapAlloc) - float64(before)
			findings += float64(n)
			runtime.KeepAlive(rep)
		}
		if findings == 0 {
			b.Fatal("no findings to hold")
		}
		b.ReportMetric(held/findings, "held-B/finding")
		b.ReportMetric(findings/float64(b.N), "findings")
		b.ReportMetric(0, "ns/op")
	})
	b.Run("variants", func(b *testing.B) {
		run(b, func(i int) { Check(docs[i], srcs[i], Options{Candidates: rules}) })
	})
	b.Run("terms-collect", func(b *testing.B) {
		run(b, func(i int) { col.Collect(docs[i]).Release() })
	})
}

// modelRef is the tagger model's treebank counts as the reference corpus
// of the ranking, as the terms command uses them.
type modelRef struct{ m *hmm.Model }

func (r modelRef) Freq(w string) int { return r.m.RefLemmaFreq(w) }
func (r modelRef) Size() int         { return r.m.RefSize() }
