package main

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// fifoInput makes a named pipe to use as an input: a command that opens
// it blocks until something writes to it, so a command that ends while
// nothing writes has not read its inputs.
func fifoInput(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "input.txt")
	require.NoError(t, syscall.Mkfifo(path, 0o600))
	return path
}

// A valid command line does open a named-pipe input (the control for the
// test below: were inputs never opened, that test could not fail).
func TestFIFOInputIsRead(t *testing.T) {
	fifo := fifoInput(t)
	opened := make(chan error, 1)
	go func() {
		f, err := os.OpenFile(fifo, os.O_WRONLY, 0) // blocks until a reader opens it
		if err == nil {
			_, err = f.WriteString("The solenoid valve opens the irrigation zone.\n")
			f.Close()
		}
		opened <- err
	}()
	r, finished := runBounded(t, "", 2*time.Minute, "tag", "--to", "text", fifo)
	require.True(t, finished, "tag did not finish")
	require.NoError(t, <-opened)
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "valve/NN")
}

// Every bad flag value ends the run with status 2 and one message naming
// the flag (and the valid values) before any input is opened: the input
// is a named pipe nobody writes to, which would block a reader forever.
func TestBadFlagValueFailsBeforeReading(t *testing.T) {
	cases := []struct {
		args []string
		want []string // in the message
	}{
		{[]string{"terms", "--to", "xml"}, []string{"--to", "text, tsv, csv, jsonl, tbx"}},
		{[]string{"terms", "--from", "bogus"}, []string{"--from", "txt", "conllu"}},
		{[]string{"terms", "--sort", "rank"}, []string{"--sort", "score", "cvalue"}},
		{[]string{"terms", "--workers", "0"}, []string{"--workers", "1 to 1024"}},
		{[]string{"terms", "--limit", "-1"}, []string{"--limit", "at least 0"}},
		{[]string{"terms", "--min-freq", "0"}, []string{"--min-freq", "at least 1"}},
		{[]string{"terms", "--max-words", "0"}, []string{"--max-words"}},
		{[]string{"terms", "--memory", "NaN"}, []string{"--memory", "16MiB"}},
		{[]string{"terms", "--memory", "Inf"}, []string{"--memory"}},
		{[]string{"terms", "--memory", "1e30"}, []string{"--memory"}},
		{[]string{"terms", "--memory", "1MiB"}, []string{"--memory"}},
		{[]string{"terms", "--to", "csv", "-o", "list.tbx"}, []string{"--to csv", "list.tbx"}},
		{[]string{"terms", "-o", "tokens.conllu"}, []string{"tokens.conllu", "--to"}},
		{[]string{"collocations", "--measure", "mutual"}, []string{"--measure", "g2", "logdice"}},
		{[]string{"collocations", "--by", "stem"}, []string{"--by", "lemma, word"}},
		{[]string{"collocations", "--window", "0"}, []string{"--window", "1 to 50"}},
		{[]string{"collocations", "--window", "100000"}, []string{"--window"}},
		{[]string{"collocations", "--min-freq", "-3"}, []string{"--min-freq"}},
		{[]string{"collocations", "--to", "tbx"}, []string{"--to", "text, tsv, csv, jsonl"}},
		{[]string{"find", "--color", "sometimes", "NOUN"}, []string{"--color", "auto, always, never"}},
		{[]string{"find", "--by", "stem", "--count", "NOUN"}, []string{"--by", "word, lemma"}},
		{[]string{"find", "--to", "xml", "NOUN"}, []string{"--to"}},
		{[]string{"find", "--limit", "-5", "NOUN"}, []string{"--limit"}},
		{[]string{"find", "--workers", "-1", "NOUN"}, []string{"--workers"}},
		{[]string{"tag", "--tagset", "penn"}, []string{"--tagset", "xpos, upos"}},
		{[]string{"tag", "--to", "xml"}, []string{"--to", "conllu"}},
		{[]string{"eval", "terms", "--gold", "x.tsv", "--to", "xml"}, []string{"--to", "text, json"}},
		{[]string{"eval", "terms", "--gold", "x.tsv", "--min-freq", "0"}, []string{"--min-freq"}},
	}
	fifo := fifoInput(t)
	for _, c := range cases {
		t.Run(strings.Join(c.args, " "), func(t *testing.T) {
			r, finished := runBounded(t, "", time.Minute, append(c.args, fifo)...)
			require.True(t, finished, "the command opened its input instead of refusing the flag")
			assert.Equal(t, 2, r.code)
			assert.Equal(t, 1, strings.Count(r.stderr, "\n"), "one message: %q", r.stderr)
			for _, w := range c.want {
				assert.Contains(t, r.stderr, w)
			}
		})
	}
}

// A valid value that a bad one resembles is offered.
func TestBadFlagValueSuggests(t *testing.T) {
	r := run(t, "", "terms", "--to", "tvs", "testdata/demo")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, `"tsv"`)
}

// The extension of -o picks the format when --to is not given.
func TestOutputExtensionPicksFormat(t *testing.T) {
	dir := t.TempDir()
	for ext, head := range map[string]string{".tsv": "rank\tterm", ".csv": "rank,term", ".tbx": "<?xml", ".jsonl": `{"`} {
		out := filepath.Join(dir, "list"+ext)
		r := run(t, "", "terms", "--limit", "3", "-o", out, "testdata/demo")
		require.Equal(t, 0, r.code, r.stderr)
		b, err := os.ReadFile(out)
		require.NoError(t, err)
		assert.True(t, strings.HasPrefix(string(b), head), "%s: %q", ext, firstLine(string(b)))
	}
	// An explicit --to that agrees is fine; an unknown extension keeps --to's default.
	out := filepath.Join(dir, "list.tsv")
	r := run(t, "", "terms", "--limit", "3", "--to", "tsv", "-o", out, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	out = filepath.Join(dir, "list.out")
	r = run(t, "", "terms", "--limit", "3", "-o", out, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	b, _ := os.ReadFile(out)
	assert.Contains(t, firstLine(string(b)), "term", "text output's header")
}

func firstLine(s string) string {
	line, _, _ := strings.Cut(s, "\n")
	return line
}

func TestUseColor(t *testing.T) {
	cases := []struct {
		mode, noColor, term string
		tty, want           bool
	}{
		{"auto", "", "xterm", true, true},
		{"auto", "", "xterm", false, false},
		{"auto", "1", "xterm", true, false}, // no-color.org: any value
		{"auto", "", "dumb", true, false},
		{"always", "1", "dumb", false, true},
		{"never", "", "xterm", true, false},
	}
	for _, c := range cases {
		t.Setenv("NO_COLOR", c.noColor)
		t.Setenv("TERM", c.term)
		assert.Equal(t, c.want, useColor(c.mode, c.tty), "%+v", c)
	}
}
