package main

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// writeTemp writes a file into a fresh directory and returns its path.
func writeTemp(t *testing.T, name, content string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(p, []byte(content), 0o644))
	return p
}

// conlluRows builds a CoNLL-U sentence of the given (form, UPOS, XPOS)
// rows; "_" leaves a column empty.
func conlluRows(id string, rows ...[3]string) string {
	var b strings.Builder
	b.WriteString("# sent_id = " + id + "\n")
	for i, r := range rows {
		b.WriteString(strings.Join([]string{strconv.Itoa(i + 1), r[0], strings.ToLower(r[0]), r[1], r[2], "_", "0", "root", "_", "_"}, "\t") + "\n")
	}
	return b.String() + "\n"
}

// valvesOpen is n tagged CoNLL-U sentences "Valves open .".
func valvesOpen(n int) string {
	var b strings.Builder
	for i := 0; i < n; i++ {
		b.WriteString(conlluRows("g"+strconv.Itoa(i), [3]string{"Valves", "NOUN", "NNS"}, [3]string{"open", "VERB", "VBP"}, [3]string{".", "PUNCT", "."}))
	}
	return b.String()
}

// eval tagging on input without gold tags — plain text, or CoNLL-U whose
// tag columns are empty — prints its errors, no table, and fails.
func TestEvalTaggingWithoutGoldTags(t *testing.T) {
	text := writeTemp(t, "notes.txt", "The valve opens at dawn.\nThe vent closes at noon.\n")
	untagged := writeTemp(t, "untagged.conllu",
		conlluRows("1", [3]string{"Valves", "_", "_"}, [3]string{"open", "_", "_"}))
	for _, p := range []string{text, untagged} {
		r := run(t, "", "eval", "tagging", p)
		assert.Equal(t, 1, r.code, "exit status for %s", p)
		assert.Empty(t, r.stdout, "no report for %s", p)
		assert.Contains(t, r.stderr, p+":")
		assert.Contains(t, r.stderr, "no sentences with gold tags")
	}
	r := run(t, "", "eval", "tagging", untagged)
	assert.Contains(t, r.stderr, untagged+`:2: token "Valves" has neither UPOS nor XPOS`)
}

// train names the file and line of an untagged token and of a tag that is
// not one, leaves those sentences out, trains on the rest and exits 1.
func TestTrainRefusesBadTagsByFileAndLine(t *testing.T) {
	var good strings.Builder
	for i := 0; i < 5; i++ {
		good.WriteString(conlluRows("g"+strconv.Itoa(i), [3]string{"Valves", "NOUN", "NNS"}, [3]string{"open", "VERB", "VBP"}, [3]string{".", "PUNCT", "."}))
	}
	bad := conlluRows("b1", [3]string{"Vents", "NOUN", "NNS"}, [3]string{"close", "_", "_"}) +
		conlluRows("b2", [3]string{"Pumps", "NOUNS", "NNS"}, [3]string{"run", "VERB", "VBP"})
	in := writeTemp(t, "train.conllu", good.String()+bad)
	out := filepath.Join(t.TempDir(), "m.glsm")
	r := run(t, "", "train", "-q", "--method", "hmm", "-o", out, in)
	assert.Equal(t, 1, r.code)
	lines := strings.Count(good.String(), "\n")
	assert.Contains(t, r.stderr, in+":"+strconv.Itoa(lines+3)+`: token "close" has neither UPOS nor XPOS`)
	assert.Contains(t, r.stderr, in+":"+strconv.Itoa(lines+6)+`: token "Pumps": UPOS "NOUNS" is not a Universal Dependencies tag`)
	assert.Contains(t, r.stderr, "2 malformed or untagged sentence(s) left out of training")
	_, err := os.Stat(out)
	assert.NoError(t, err, "the model of the good sentences is written")

	// Nothing left to train on: no model.
	only := writeTemp(t, "bad.conllu", bad)
	out2 := filepath.Join(t.TempDir(), "none.glsm")
	r = run(t, "", "train", "-q", "-o", out2, only)
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stderr, "no annotated sentences to train on")
	_, err = os.Stat(out2)
	assert.True(t, os.IsNotExist(err), "no model file")

	// The method is checked before any input is read.
	r = run(t, "", "train", "--method", "bogus", "-o", out2, "/nonexistent/input.conllu")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, `--method "bogus"`)
}

// A CoNLL-U input that cannot be read is reported with its name, as tag
// reports it, and the commands that read gold files go on with the others
// and exit 1 at the end (an input problem, not a usage error: exit 2).
func TestGoldReadersGoOnPastUnreadableFiles(t *testing.T) {
	in := writeTemp(t, "gold.conllu", valvesOpen(5))
	missing := filepath.Join(t.TempDir(), "missing.conllu")
	dir := t.TempDir()
	model := filepath.Join(t.TempDir(), "m.glsm")
	for _, c := range []struct {
		name     string
		args     []string
		unread   string // the input reported
		summary  string
		produced func(r result) bool
	}{
		{"train, a missing file", []string{"train", "-q", "--method", "hmm", "-o", model, missing, in}, missing,
			"1 unreadable file(s) left out of training", func(result) bool { _, err := os.Stat(model); return err == nil }},
		{"train, a directory", []string{"train", "-q", "--method", "hmm", "-o", model, in, dir}, dir,
			"1 unreadable file(s) left out of training", func(result) bool { _, err := os.Stat(model); return err == nil }},
		{"train, a missing dev file", []string{"train", "-q", "--method", "hmm", "--dev", missing, "-o", model, in}, missing,
			"1 unreadable file(s) left out of training", func(result) bool { _, err := os.Stat(model); return err == nil }},
		{"eval tagging, a missing file", []string{"eval", "tagging", missing, in}, missing,
			"1 unreadable file(s) left out", func(r result) bool { return strings.Contains(r.stdout, "UPOS") }},
		{"tag, a missing file", []string{"tag", "--to", "text", missing, in}, missing,
			"1 problem(s) with the inputs", func(r result) bool { return strings.Contains(r.stdout, "Valves/NNS") }},
	} {
		t.Run(c.name, func(t *testing.T) {
			require.NoError(t, os.RemoveAll(model))
			r := run(t, "", c.args...)
			assert.Equal(t, 1, r.code, r.stderr)
			assert.Contains(t, r.stderr, "error: "+c.unread+": cannot ")
			assert.Contains(t, r.stderr, c.summary)
			assert.True(t, c.produced(r), "the readable input was not used: %s", r.stdout)
		})
	}
}

// A column over no tokens has no accuracy: eval tagging with a model that
// knows every word of the gold file prints "–" for unknown words, not a
// 0.00% that reads as all wrong, and "none" under a confusion list
// without confusions.
func TestEvalTaggingEmptyColumns(t *testing.T) {
	in := writeTemp(t, "gold.conllu", valvesOpen(5))
	model := filepath.Join(t.TempDir(), "m.glsm")
	r := run(t, "", "train", "-q", "--method", "hmm", "-o", model, in)
	require.Equal(t, 0, r.code, r.stderr)

	r = run(t, "", "eval", "tagging", "--model", model, in)
	require.Equal(t, 0, r.code, r.stderr)
	lines := strings.Split(r.stdout, "\n")
	require.GreaterOrEqual(t, len(lines), 5, r.stdout)
	assert.Equal(t, []string{"UPOS", "100.00%", "100.00%", "–"}, strings.Fields(lines[1]))
	assert.Equal(t, []string{"tokens", "15", "15", "0"}, strings.Fields(lines[4]))
	assert.NotContains(t, r.stdout, " 0.00%")
	assert.Contains(t, r.stdout, "(gold → tagged):\n  none\n")
}

// A gold list that cannot be opened is named with the flag that gave it,
// as the other inputs are named ("open FILE: no such file or directory"
// did not say which of the command's files it was).
func TestEvalTermsGoldUnreadableNamed(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "gold.tsv")
	r := run(t, "", "eval", "terms", "--gold", missing, "testdata/demo/maintenance-schedule.txt")
	assert.Equal(t, 2, r.code, r.stderr)
	assert.Equal(t, "glossmith: --gold "+missing+": cannot open: no such file or directory\n", r.stderr)
	assert.Empty(t, r.stdout)
}
