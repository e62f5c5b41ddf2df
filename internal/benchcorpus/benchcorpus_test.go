package benchcorpus

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"glossmith/internal/testenv"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func demoParagraphs(t *testing.T) []string {
	t.Helper()
	paras, err := LoadParagraphs(testenv.Demo(t))
	require.NoError(t, err)
	return paras
}

func TestSameSeedSameCorpus(t *testing.T) {
	paras := demoParagraphs(t)
	opt := Options{DocSize: 2000, Rare: 0.05, Seed: 3}
	a, b := NewGenerator(paras, opt), NewGenerator(paras, opt)
	for i := range 20 {
		require.Equal(t, a.Document(), b.Document(), "document %d of two generators with seed 3", i)
	}
	opt.Seed = 4
	assert.NotEqual(t, NewGenerator(paras, Options{DocSize: 2000, Rare: 0.05, Seed: 3}).Document(),
		NewGenerator(paras, opt).Document(), "first documents of seeds 3 and 4")
}

func TestDocumentsAreDrawnFromTheSources(t *testing.T) {
	paras := demoParagraphs(t)
	g := NewGenerator(paras, Options{DocSize: 3000, Seed: 1}) // no invented words
	known := map[string]bool{}
	for _, p := range paras {
		known[p] = true
	}
	for range 10 {
		d := g.Document()
		if len(d) < 1500 {
			t.Errorf("document of %d bytes, want at least half of 3000", len(d))
		}
		for _, p := range strings.Split(strings.TrimSpace(d), "\n\n") {
			if !known[p] {
				t.Fatalf("paragraph not from the sources: %q", p)
			}
		}
	}
}

func TestRareWordsGrowTheVocabulary(t *testing.T) {
	paras := demoParagraphs(t)
	vocab := func(rare float64) int {
		g := NewGenerator(paras, Options{DocSize: 4000, Rare: rare, Seed: 1})
		seen := map[string]bool{}
		for range 50 {
			for _, w := range strings.Fields(g.Document()) {
				seen[strings.ToLower(w)] = true
			}
		}
		return len(seen)
	}
	plain, rare := vocab(0), vocab(0.05)
	if rare <= plain*11/10 {
		t.Errorf("vocabulary %d with 5%% invented words, %d without: want clearly more", rare, plain)
	}
}

func TestWrite(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "corpus")
	g := NewGenerator(demoParagraphs(t), Options{Size: 20000, DocSize: 3000, Seed: 1})
	docs, n, err := g.Write(dir)
	require.NoError(t, err)
	files, _ := filepath.Glob(filepath.Join(dir, "doc-*.txt"))
	if len(files) != docs || docs < 2 || n < 20000 {
		t.Fatalf("%d documents (%d files), %d bytes", docs, len(files), n)
	}
	var total int64
	for _, f := range files {
		fi, err := os.Stat(f)
		require.NoError(t, err)
		total += fi.Size()
	}
	if total != n {
		t.Errorf("files hold %d bytes, Write reported %d", total, n)
	}
}

func TestParseSize(t *testing.T) {
	for in, want := range map[string]int64{"100MB": 100 << 20, "512KiB": 512 << 10, "2g": 2 << 30, "1000": 1000, "1.5M": 3 << 19} {
		if got, err := ParseSize(in); err != nil || got != want {
			t.Errorf("ParseSize(%q) = %d, %v; want %d", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "MB", "-3M", "ten"} {
		if _, err := ParseSize(bad); err == nil {
			t.Errorf("ParseSize(%q): no error", bad)
		}
	}
}
