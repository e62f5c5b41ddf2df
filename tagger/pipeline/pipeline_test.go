package pipeline_test

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"sync/atomic"
	"testing"

	"glossmith/extract/colloc"
	"glossmith/extract/measure"
	"glossmith/extract/terms"
	"glossmith/internal/benchcorpus"
	"glossmith/internal/testenv"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/read"

	"github.com/stretchr/testify/require"
)

var (
	modelOnce sync.Once
	model     *hmm.Model
	modelErr  error
)

func tagger(t *testing.T) *hmm.Model {
	t.Helper()
	modelOnce.Do(func() { model, modelErr = hmm.Default() })
	if modelErr != nil {
		t.Fatal(modelErr)
	}
	return model
}

// workerCounts are the worker counts every result is compared across:
// one (the reference order), two (the target machine) and more workers
// than cores, so that documents finish out of order.
var workerCounts = []int{1, 2, 3, 8}

func init() {
	if raceDetector {
		workerCounts = []int{1, 4}
	}
}

// smallDocs writes n short documents drawn from the demo corpus's text
// files into a temporary directory, with an empty file and a file that is
// not text among them, and returns the directory.
func smallDocs(t *testing.T, n int) string {
	t.Helper()
	paras, err := benchcorpus.LoadParagraphs(testenv.Demo(t))
	require.NoError(t, err)
	g := benchcorpus.NewGenerator(paras, benchcorpus.Options{DocSize: 700, Rare: 0.02, Seed: 7})
	dir := t.TempDir()
	for i := range n {
		text := g.Document()
		switch i {
		case 5:
			text = ""
		case 9:
			text = "\x00\x01\x02 binary \x00"
		}
		require.NoError(t, os.WriteFile(filepath.Join(dir, fmt.Sprintf("d%04d.txt", i)), []byte(text), 0o644))
	}
	return dir
}

// dump is a complete textual record of an annotated document.
func dump(d *doc.Document) string {
	var b strings.Builder
	fmt.Fprintf(&b, "# %s\n", d.Name)
	for _, s := range d.Sentences {
		for _, tk := range s.Tokens {
			fmt.Fprintf(&b, "%s\t%s\t%s\t%s\t%d\t%d\t%d\n", tk.Form, tk.Lemma, tk.UPOS, tk.XPOS, tk.Start, tk.End, tk.Line)
		}
		b.WriteByte('\n')
	}
	return b.String()
}

// annotated runs the pipeline and returns everything it delivered: the
// documents in reduce order, the problems and the totals. With reuse, the
// token arrays of reduced documents are reused: a document's tokens must
// still be its own when it is reduced (the check against its map result).
func annotated(t *testing.T, args []string, workers int, reuse bool) string {
	t.Helper()
	var b strings.Builder
	opt := pipeline.Options{Tagger: tagger(t), Workers: workers, ReuseTokens: reuse,
		Report: func(p read.Problem) { fmt.Fprintf(&b, "problem %s: %s\n", p.Severity, p.Error()) }}
	st := pipeline.Run(args, opt, dump, func(d *doc.Document, s string) {
		if s != dump(d) {
			t.Errorf("%s: map result does not belong to the document reduced with it", d.Name)
		}
		b.WriteString(s)
	})
	fmt.Fprintf(&b, "stats %d inputs, %d done, %d docs, %d bytes, %d tokens, %d skipped, %d/%d input bytes\n",
		st.Inputs, st.Done, st.Documents, st.Bytes, st.Tokens, st.Skipped, st.DoneBytes, st.InputBytes)
	if st.Done != st.Inputs || st.DoneBytes != st.InputBytes || st.InputBytes == 0 {
		t.Errorf("run ended with %d of %d inputs and %d of %d bytes done", st.Done, st.Inputs, st.DoneBytes, st.InputBytes)
	}
	return b.String()
}

func TestRunSameForAnyWorkerCount(t *testing.T) {
	for _, c := range []struct {
		name string
		args []string
	}{
		{"demo", []string{testenv.Demo(t)}},
		{"small", []string{smallDocs(t, 80)}},
	} {
		t.Run(c.name, func(t *testing.T) {
			want := annotated(t, c.args, 1, false)
			require.Contains(t, want, "\t", "no tokens delivered")
			for _, w := range workerCounts {
				for _, reuse := range []bool{false, true} {
					if w == 1 && !reuse {
						continue
					}
					if got := annotated(t, c.args, w, reuse); got != want {
						t.Errorf("%d workers (token arrays reused: %v) deliver other documents or order than 1 worker:\n%s", w, reuse, firstDiff(want, got))
					}
				}
			}
		})
	}
}

func TestRunDeliversInInputOrder(t *testing.T) {
	dir := smallDocs(t, 60)
	var names []string
	pipeline.Run([]string{dir}, pipeline.Options{Workers: 4}, nil, func(d *doc.Document, _ struct{}) {
		names = append(names, filepath.Base(d.Name))
	})
	// d0005 is empty (a document without tokens) and d0009 is not text.
	if len(names) < 58 {
		t.Fatalf("got %d documents, want at least 58", len(names))
	}
	for i := 1; i < len(names); i++ {
		if names[i-1] >= names[i] {
			t.Fatalf("document %s delivered after %s", names[i], names[i-1])
		}
	}
}

func TestRunBoundsDocumentsInFlight(t *testing.T) {
	dir := smallDocs(t, 80)
	for _, workers := range []int{1, 2, 5} {
		var inFlight, peak atomic.Int64
		pipeline.Run([]string{dir}, pipeline.Options{Workers: workers},
			func(d *doc.Document) int {
				n := inFlight.Add(1)
				for {
					p := peak.Load()
					if n <= p || peak.CompareAndSwap(p, n) {
						break
					}
				}
				return 0
			},
			func(*doc.Document, int) { inFlight.Add(-1) })
		// the window, plus the one being reduced
		if limit := int64(pipeline.DocsPerWorker*workers + 1); peak.Load() > limit {
			t.Errorf("%d workers: %d documents in flight, want at most %d", workers, peak.Load(), limit)
		}
		if peak.Load() == 0 {
			t.Errorf("%d workers: no document mapped", workers)
		}
	}
}

func TestRunReportsProblemsAndGoesOn(t *testing.T) {
	dir := smallDocs(t, 12)
	missing := filepath.Join(dir, "no-such-file.txt")
	for _, w := range workerCounts {
		var probs []string
		docs := 0
		st := pipeline.Run([]string{missing, filepath.Join(dir, "d0009.txt"), filepath.Join(dir, "d0001.txt")},
			pipeline.Options{Workers: w, Report: func(p read.Problem) { probs = append(probs, p.Error()) }},
			nil, func(*doc.Document, struct{}) { docs++ })
		if docs != 1 || st.Documents != 1 {
			t.Errorf("%d workers: %d documents processed, want 1 (the readable one)", w, docs)
		}
		if st.Done != 2 || st.Inputs != 2 {
			t.Errorf("%d workers: %d of %d inputs done, want 2 of 2 (the missing file is no input)", w, st.Done, st.Inputs)
		}
		if st.Skipped != 2 {
			t.Errorf("%d workers: Skipped = %d, want 2; problems: %q", w, st.Skipped, probs)
		}
		if len(probs) < 2 || !strings.Contains(probs[0], "no-such-file.txt") || !strings.Contains(probs[1], "d0009.txt") {
			t.Errorf("%d workers: problems not reported in input order: %q", w, probs)
		}
	}
}

func TestRunWithoutInputs(t *testing.T) {
	st := pipeline.Run[int](nil, pipeline.Options{}, nil, nil)
	if st.Inputs != 0 || st.Documents != 0 {
		t.Errorf("got %+v for no inputs", st)
	}
}

// termList runs term extraction through the pipeline, as the terms
// command does (reusing token arrays and the tables of released counts),
// and returns the JSON Lines output of every candidate.
func termList(t *testing.T, args []string, workers int) string {
	return termListReusing(t, args, workers, true)
}

func termListReusing(t *testing.T, args []string, workers int, reuse bool) string {
	t.Helper()
	m, err := pattern.CompileStock("terms")
	require.NoError(t, err)
	col := terms.NewCollector(m, terms.Options{Contexts: 3})
	corpus := terms.NewCorpus(3)
	pipeline.Run(args, pipeline.Options{Tagger: tagger(t), Workers: workers, ReuseTokens: reuse}, col.Collect,
		func(_ *doc.Document, dc *terms.DocCounts) {
			corpus.Add(dc)
			if reuse {
				dc.Release()
			}
		})
	ranked, err := terms.Rank(corpus.Terms(&terms.Counts{Words: map[string]int{"the": 1000}, Total: 100000}), terms.RankOptions{All: true})
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, terms.Write(&buf, "jsonl", ranked, terms.WriteOptions{Contexts: 3}))
	return buf.String()
}

// pairList counts relation pairs through the pipeline, as the
// collocations command does, and returns the TSV output of every pair.
func pairList(t *testing.T, args []string, workers int) string {
	t.Helper()
	m, err := pattern.CompileStock("pairs")
	require.NoError(t, err)
	total := colloc.NewCounter()
	pipeline.Run(args, pipeline.Options{Tagger: tagger(t), Workers: workers},
		func(d *doc.Document) *colloc.Counter {
			c := colloc.NewCounter()
			for i := range d.Sentences {
				toks := d.Sentences[i].Tokens
				for _, mt := range m.FindAll(toks) {
					if p, ok := colloc.SlotPair(mt.Rule, toks, mt.Slots, colloc.ByLemma); ok {
						c.Add(p)
					}
				}
				colloc.WindowPairs(toks, 3, colloc.ByLemma, nil, c.Add)
			}
			return c
		},
		func(_ *doc.Document, c *colloc.Counter) { total.Merge(c) })
	ms, err := measure.Lookup("g2")
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, colloc.Write(&buf, "tsv", total.Rank(colloc.RankOptions{Measure: ms}), ms.Name))
	return buf.String()
}

func TestTermsAndPairsSameForAnyWorkerCount(t *testing.T) {
	inputs := map[string][]string{"demo": {testenv.Demo(t)}, "small": {smallDocs(t, 80)}}
	for _, name := range []string{"demo", "small"} {
		args := inputs[name]
		for what, run := range map[string]func(*testing.T, []string, int) string{"terms": termList, "pairs": pairList} {
			t.Run(name+"/"+what, func(t *testing.T) {
				want := run(t, args, 1)
				if strings.Count(want, "\n") < 20 {
					t.Fatalf("only %d lines of output; the comparison would say little", strings.Count(want, "\n"))
				}
				for _, w := range workerCounts[1:] {
					if got := run(t, args, w); got != want {
						t.Errorf("%d workers give other output than 1 worker:\n%s", w, firstDiff(want, got))
					}
				}
			})
		}
	}
}

// TestTermsSameWithTokenReuse: the term counts keep nothing of the
// token arrays that later documents reuse, and the corpus nothing of the
// released counts' tables.
func TestTermsSameWithTokenReuse(t *testing.T) {
	args := []string{smallDocs(t, 80)}
	want := termListReusing(t, args, 1, false)
	for _, w := range workerCounts {
		if got := termListReusing(t, args, w, true); got != want {
			t.Errorf("%d workers reusing token arrays give other terms:\n%s", w, firstDiff(want, got))
		}
	}
}

// firstDiff shows the first line where two outputs differ.
func firstDiff(a, b string) string {
	al, bl := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := 0; i < len(al) && i < len(bl); i++ {
		if al[i] != bl[i] {
			return fmt.Sprintf("line %d:\n  1 worker: %q\n  N workers: %q", i+1, al[i], bl[i])
		}
	}
	return fmt.Sprintf("lengths differ: %d vs %d lines", len(al), len(bl))
}
