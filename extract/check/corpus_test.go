package check

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/read"
)

const pumpsDir = "testdata/pumps"

// readTSV reads a tab-separated file with a header, skipping # comments.
func readTSV(t *testing.T, path string) []map[string]string {
	t.Helper()
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	var head []string
	var rows []map[string]string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		cells := strings.Split(line, "\t")
		if head == nil {
			head = cells
			continue
		}
		row := map[string]string{}
		for i, h := range head {
			if i < len(cells) {
				row[h] = cells[i]
			}
		}
		rows = append(rows, row)
	}
	require.NoError(t, sc.Err())
	return rows
}

// loadGlossary reads the test corpus's glossary: entry, term, status, pos,
// case ("yes" for a case-sensitive term).
func loadGlossary(t *testing.T, path string) Glossary {
	t.Helper()
	var g Glossary
	index := map[string]int{}
	for _, r := range readTSV(t, path) {
		st, err := ParseStatus(r["status"])
		require.NoError(t, err)
		i, ok := index[r["entry"]]
		if !ok {
			i = len(g.Entries)
			index[r["entry"]] = i
			g.Entries = append(g.Entries, Entry{ID: r["entry"]})
		}
		g.Entries[i].Forms = append(g.Entries[i].Forms, Form{Text: r["term"], Status: st, POS: r["pos"], CaseSensitive: r["case"] == "yes"})
	}
	return g
}

// nthPosition finds the n-th occurrence of text in a file's source and
// returns its 1-based line and column in characters, and the column just
// past it: where a reader of the file would point.
func nthPosition(t *testing.T, src, text string, n int) (line, col, end int) {
	t.Helper()
	from := 0
	for k := 1; ; k++ {
		i := strings.Index(src[from:], text)
		require.GreaterOrEqual(t, i, 0, "occurrence %d of %q", n, text)
		if k == n {
			at := from + i
			lineStart := strings.LastIndexByte(src[:at], '\n') + 1
			line = strings.Count(src[:at], "\n") + 1
			col = utf8.RuneCountInString(src[lineStart:at]) + 1
			return line, col, col + utf8.RuneCountInString(text)
		}
		from += i + len(text)
	}
}

// TestPlantedCorpus checks the test corpus of an invented maker of solar
// water pumps (testdata/pumps: Markdown, HTML, plain text, DOCX — built
// from testdata/commissioning-report.docx.txt by testdata/tools/mkdocx.py
// of the repository), in which every
// use the check must report is listed in gold.tsv, and terms also stand in
// code blocks, inline code, URLs, file paths, an e-mail address, an HTML
// title and lines silenced by the skip marker, where nothing may be
// reported. maintenance-log.md holds terms with a word misspelt, and
// words that must not be taken for misspellings: a real word one edit from
// a term's word ("solenoid value"), a word too short ("flow metr"), a
// capitalized name ("Borehale"), a deprecated term one edit from the
// preferred one ("thermister"), and misspellings in code and on a silenced
// line. Capitalized misspellings are planted where the capital is the
// writing's — a sentence's start, a heading in title case and one in
// capitals (maintenance-log.md), an HTML heading (repair-sheet.html) and a
// line in capitals that the sentence splitter runs into the next sentence
// (fault-list.txt) — beside capitals that are the word's: the name
// "Borehale" at a sentence's start and in a heading, an acronym "FLAOT" in
// running text and in a heading in capitals, title case inside a sentence
// ("the Pump Invertre filter"), and a real word one edit from a term's in
// a heading ("Check Value"). Every planted finding must come at its exact
// line and column.
func TestPlantedCorpus(t *testing.T) {
	m := Compile(loadGlossary(t, filepath.Join(pumpsDir, "glossary.tsv")))
	type key struct {
		file, kind, text string
		line, col        int
	}
	taggerOnce.Do(func() { tagger, taggerErr = hmm.Default() })
	require.NoError(t, taggerErr)
	rep := NewReport(m)
	texts := map[string]string{}
	misspelt := NewMisspellings(m, tagger)
	for _, name := range []string{"installation-guide.md", "field-notes.txt", "service-bulletin.html", "commissioning-report.docx", "maintenance-log.md", "fault-list.txt", "repair-sheet.html"} {
		path := filepath.Join(pumpsDir, name)
		d, probs := pipeline.Annotate(read.Input{Name: name, Path: path}, read.Options{}, tagger)
		for _, p := range probs {
			require.NotEqual(t, read.Error, p.Severity, p.Error())
		}
		src, err := os.ReadFile(path)
		require.NoError(t, err)
		texts[name] = d.Text
		rep.Add(Check(d, src, Options{Glossary: m, Misspellings: misspelt}))
	}
	want := map[key]bool{}
	wantEnd := map[key]int{}
	for _, r := range readTSV(t, filepath.Join(pumpsDir, "gold.tsv")) {
		k := key{file: r["file"], kind: r["kind"], text: r["text"]}
		where := r["where"]
		nth, err := strconv.Atoi(where[1:])
		require.NoError(t, err, where)
		var end int
		switch where[0] {
		case '#':
			src, err := os.ReadFile(filepath.Join(pumpsDir, r["file"]))
			require.NoError(t, err)
			k.line, k.col, end = nthPosition(t, string(src), k.text, nth)
		case '@':
			k.line, k.col, end = nthPosition(t, texts[r["file"]], k.text, nth)
		default:
			t.Fatalf("bad position %q in gold.tsv", where)
		}
		wantEnd[k] = end
		want[k] = true
	}
	got := rep.Findings()
	tp := 0
	for _, f := range got {
		k := key{f.File, f.Kind.String(), f.Text, f.Line, f.Column}
		if want[k] {
			tp++
			assert.Equal(t, wantEnd[k], f.EndColumn, "end column of %s:%d:%d %q", f.File, f.Line, f.Column, f.Text)
			delete(want, k)
			continue
		}
		t.Errorf("not planted: %s:%d:%d: %s %q (%s)", f.File, f.Line, f.Column, f.Kind, f.Text, f.Message)
	}
	for k := range want {
		t.Errorf("missed: %s:%d:%d: %s %q", k.file, k.line, k.col, k.kind, k.text)
	}
	precision := float64(tp) / float64(max(len(got), 1))
	recall := float64(tp) / float64(tp+len(want))
	fmt.Printf("planted corpus: %d findings, %d planted, %d right: precision %.3f, recall %.3f\n", len(got), tp+len(want), tp, precision, recall)
	assert.GreaterOrEqual(t, precision, 0.95)
	assert.GreaterOrEqual(t, recall, 0.95)
	assert.Positive(t, rep.Suppressed, "the corpus holds terms in code, addresses and silenced lines")
}
