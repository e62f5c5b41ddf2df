package terms

import (
	"bytes"
	"testing"

	"glossmith/internal/testenv"
	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
)

// Terms spreads its work over goroutines on a large corpus; the terms
// must come out the same, in every format, as when it runs on one. Run
// with -race, this also checks that the goroutines share nothing they
// write.
func TestTermsSameInParallel(t *testing.T) {
	model, col := defaultSetup(t)
	serial, parallel := NewCorpus(3), NewCorpus(3)
	pipeline.Run([]string{testenv.Demo(t)}, pipeline.Options{Tagger: model}, col.Collect,
		func(_ *doc.Document, dc *DocCounts) {
			serial.Add(dc)
			parallel.Add(dc)
		})
	write := func(c *Corpus, from int) [][]byte {
		defer func(old int) { parallelTermsFrom = old }(parallelTermsFrom)
		parallelTermsFrom = from
		ranked, err := Rank(c.Terms(ModelReference(model)), RankOptions{All: true})
		if err != nil {
			t.Fatal(err)
		}
		var out [][]byte
		for _, f := range Formats {
			var b bytes.Buffer
			if err := Write(&b, f, ranked, WriteOptions{Contexts: 3}); err != nil {
				t.Fatal(err)
			}
			out = append(out, b.Bytes())
		}
		return out
	}
	want, got := write(serial, 1<<62), write(parallel, 0)
	for i, f := range Formats {
		if !bytes.Equal(want[i], got[i]) {
			t.Errorf("%s: terms computed in parallel differ from those computed serially", f)
		}
	}
}
