// Package benchcorpus builds large benchmark corpora from a small set of
// real texts, so that throughput and memory can be measured on inputs of
// realistic size (hundreds of megabytes, thousands of documents) without
// shipping such data.
//
// Documents are made of paragraphs drawn at random (from a fixed seed, so
// every build is identical) from the source texts. Drawing alone would give
// a corpus whose vocabulary stops growing after the first megabyte; real
// corpora keep meeting new words (names, part numbers, misspellings,
// compounds), and those rare words are what fills count tables. So a small
// share of the words is replaced by invented words spliced from two real
// ones, which gives the long tail that a memory budget has to cope with.
package benchcorpus

import (
	"bufio"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Options describe the corpus to build.
type Options struct {
	Size    int64   // total bytes of text to write
	DocSize int     // mean bytes per document (0: DefaultDocSize)
	Rare    float64 // share of words replaced by invented words (0..1)
	Seed    uint64  // random seed; the same seed gives the same corpus
}

// DefaultDocSize is the mean document size: a manual chapter or a short
// report.
const DefaultDocSize = 32 << 10

// DefaultRare is the default share of invented words. With it the 100 MB
// corpus of seed 1 has about 90,000 distinct words (letters only, case
// folded) against 8,900 in the source texts; real corpora of that size
// usually have more, so the memory it takes is a low estimate for them.
const DefaultRare = 0.01

// LoadParagraphs reads every *.txt file under the given directories (not
// recursively) and splits them into paragraphs at blank lines. Files are
// taken in name order so the pool, and the corpus built from it, never
// depends on directory listing order.
func LoadParagraphs(dirs ...string) ([]string, error) {
	var files []string
	for _, d := range dirs {
		m, err := filepath.Glob(filepath.Join(d, "*.txt"))
		if err != nil {
			return nil, err
		}
		files = append(files, m...)
	}
	sort.Strings(files)
	var paras []string
	for _, f := range files {
		b, err := os.ReadFile(f)
		if err != nil {
			return nil, err
		}
		if !utf8.Valid(b) {
			return nil, fmt.Errorf("%s: not UTF-8", f)
		}
		text := strings.ReplaceAll(strings.TrimPrefix(string(b), "\ufeff"), "\r\n", "\n")
		for _, p := range strings.Split(text, "\n\n") {
			if p = strings.TrimSpace(p); p != "" {
				paras = append(paras, p)
			}
		}
	}
	if len(paras) == 0 {
		return nil, fmt.Errorf("no paragraphs in %s", strings.Join(dirs, ", "))
	}
	return paras, nil
}

// Generator writes documents drawn from a paragraph pool.
type Generator struct {
	paras []string
	words []string // pool of words for invented words
	opt   Options
	rng   *rand.Rand
}

// NewGenerator returns a generator over the paragraph pool.
func NewGenerator(paras []string, opt Options) *Generator {
	if opt.DocSize <= 0 {
		opt.DocSize = DefaultDocSize
	}
	g := &Generator{paras: paras, opt: opt, rng: rand.New(rand.NewPCG(opt.Seed, 0x676c6f7373))}
	seen := map[string]bool{}
	for _, p := range paras {
		for _, w := range strings.FieldsFunc(p, func(r rune) bool { return !unicode.IsLetter(r) }) {
			if utf8.RuneCountInString(w) >= 4 && !seen[w] {
				seen[w] = true
				g.words = append(g.words, strings.ToLower(w))
			}
		}
	}
	sort.Strings(g.words)
	return g
}

// Document returns the next document's text: paragraphs drawn at random
// until the size drawn for this document (uniform in [DocSize/2,
// 3·DocSize/2]) is reached.
func (g *Generator) Document() string {
	target := g.opt.DocSize/2 + g.rng.IntN(g.opt.DocSize+1)
	var b strings.Builder
	for b.Len() < target {
		p := g.paras[g.rng.IntN(len(g.paras))]
		if g.opt.Rare > 0 {
			p = g.mutate(p)
		}
		b.WriteString(p)
		b.WriteString("\n\n")
	}
	return b.String()
}

// mutate replaces a share of the paragraph's longer words by invented
// words: the first part of the word joined to the last part of another one
// ("irrigation" + "controller" → "irrigtroller"), keeping the capital.
func (g *Generator) mutate(p string) string {
	var b strings.Builder
	b.Grow(len(p) + 16)
	start := -1
	flush := func(end int) {
		w := p[start:end]
		if utf8.RuneCountInString(w) >= 4 && len(g.words) > 0 && g.rng.Float64() < g.opt.Rare {
			w = g.invent(w)
		}
		b.WriteString(w)
		start = -1
	}
	for i, r := range p {
		if unicode.IsLetter(r) {
			if start < 0 {
				start = i
			}
			continue
		}
		if start >= 0 {
			flush(i)
		}
		b.WriteRune(r)
	}
	if start >= 0 {
		flush(len(p))
	}
	return b.String()
}

func (g *Generator) invent(w string) string {
	other := []rune(g.words[g.rng.IntN(len(g.words))])
	rs := []rune(w)
	head := rs[:1+g.rng.IntN(len(rs)-1)]
	tail := other[g.rng.IntN(len(other)-1)+1:]
	return string(head) + string(tail)
}

// Write writes documents named doc-NNNNN.txt into dir until opt.Size bytes
// are written, and returns the number of documents and bytes.
func (g *Generator) Write(dir string) (docs int, bytes int64, err error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return 0, 0, err
	}
	for bytes < g.opt.Size {
		text := g.Document()
		name := filepath.Join(dir, fmt.Sprintf("doc-%05d.txt", docs+1))
		if err := writeFile(name, text); err != nil {
			return docs, bytes, err
		}
		docs++
		bytes += int64(len(text))
	}
	return docs, bytes, nil
}

func writeFile(name, text string) error {
	f, err := os.Create(name)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(f)
	if _, err := io.WriteString(w, text); err != nil {
		f.Close()
		return err
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// ParseSize reads a size such as "100MB", "512KiB", "2G" or "1000".
// K, M and G are powers of 1024 whether or not an "i" or "B" follows.
func ParseSize(s string) (int64, error) {
	t := strings.ToUpper(strings.TrimSpace(s))
	t = strings.TrimSuffix(t, "B")
	t = strings.TrimSuffix(t, "I")
	mult := int64(1)
	switch {
	case strings.HasSuffix(t, "K"):
		mult, t = 1<<10, t[:len(t)-1]
	case strings.HasSuffix(t, "M"):
		mult, t = 1<<20, t[:len(t)-1]
	case strings.HasSuffix(t, "G"):
		mult, t = 1<<30, t[:len(t)-1]
	}
	var n float64
	if _, err := fmt.Sscanf(strings.TrimSpace(t), "%g", &n); err != nil || n < 0 {
		return 0, fmt.Errorf("bad size %q (want e.g. 100MB, 512KiB, 1G)", s)
	}
	return int64(n * float64(mult)), nil
}
