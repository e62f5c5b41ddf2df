package main

import (
	"bufio"
	"context"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// copies writes n copies of a demo document into a new directory and
// returns their paths in order.
func copies(t *testing.T, n int) []string {
	t.Helper()
	b, err := os.ReadFile("../../testdata/demo/maintenance-schedule.txt")
	require.NoError(t, err)
	dir := t.TempDir()
	paths := make([]string, n)
	for i := range paths {
		paths[i] = filepath.Join(dir, fmt.Sprintf("copy%03d.txt", i))
		require.NoError(t, os.WriteFile(paths[i], b, 0o644))
	}
	return paths
}

// find --limit stops reading once it has its lines: after 20 documents
// (more than the documents in flight) comes a named pipe nobody writes
// to, which would block a run that went on reading.
func TestFindLimitStopsReading(t *testing.T) {
	inputs := append(copies(t, 20), fifoInput(t))
	for _, workers := range []string{"1", "2"} {
		args := append([]string{"find", "--limit", "2", "--workers", workers, "--to", "tsv", "NOUN"}, inputs...)
		r, finished := runBounded(t, "", 2*time.Minute, args...)
		require.True(t, finished, "find went on reading after --limit was reached (%s workers)", workers)
		assert.Equal(t, 0, r.code, r.stderr)
		assert.Len(t, strings.Split(strings.TrimSpace(r.stdout), "\n"), 3, "a header and two hits")
	}
}

// find | head -1: once the reader is gone, the run ends at once and
// quietly. The reader closes the pipe after the first line; the inputs are
// 40 documents and then a named pipe nobody writes to, which would block a
// run that went on reading (as one that wrote only at the end would).
func TestFindEndsWhenPipeCloses(t *testing.T) {
	inputs := append(copies(t, 40), fifoInput(t))
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, binary, append([]string{"find", "--workers", "1", "NOUN"}, inputs...)...)
	var stderr strings.Builder
	cmd.Stderr = &stderr
	pipe, err := cmd.StdoutPipe()
	require.NoError(t, err)
	require.NoError(t, cmd.Start())
	line, err := bufio.NewReader(pipe).ReadString('\n')
	require.NoError(t, err)
	assert.Contains(t, line, "[")
	pipe.Close() // the reader goes away, as head does
	_ = cmd.Wait()
	require.NoError(t, ctx.Err(), "find went on reading after its reader closed the pipe")
	assert.Empty(t, stderr.String(), "quietly")
}

// find's JSON Lines carry the contexts; CSV is RFC 4180 with the same
// columns as TSV; -o writes a file.
func TestFindFormats(t *testing.T) {
	r := run(t, "", "find", "--to", "jsonl", `"union" "nut"`, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	var hit map[string]any
	require.NoError(t, json.Unmarshal([]byte(firstLine(r.stdout)), &hit))
	for _, k := range []string{"doc", "line", "left", "text", "right", "rule"} {
		assert.Contains(t, hit, k)
	}
	assert.Equal(t, "union nut", strings.ToLower(hit["text"].(string)))

	out := filepath.Join(t.TempDir(), "hits.csv")
	r = run(t, "", "find", "-o", out, `"union" "nut"`, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	f, err := os.Open(out)
	require.NoError(t, err)
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	require.NoError(t, err)
	require.Greater(t, len(rows), 1)
	assert.Equal(t, []string{"doc", "sentence", "line", "start", "end", "rule", "left", "match", "right"}, rows[0])
	b, _ := os.ReadFile(out)
	assert.Contains(t, string(b), "\r\n", "RFC 4180 line ends")
}

// Control characters in a document and in a file name are escaped in text
// output: one line per hit, no escape sequence reaches the terminal.
func TestFindEscapesControls(t *testing.T) {
	dir := t.TempDir()
	name := filepath.Join(dir, "evil\nname\x1b[31m.txt")
	require.NoError(t, os.WriteFile(name, []byte("Check the \x1b[2J\x1b]0;title\x07valve seat before spring.\n"), 0o644))
	r := run(t, "", "find", "--color", "never", `"valve"`, name)
	require.Equal(t, 0, r.code, r.stderr)
	assert.NotContains(t, r.stdout, "\x1b")
	assert.NotContains(t, r.stdout, "\x07")
	assert.Equal(t, 1, strings.Count(r.stdout, "\n"), "one hit, one line: %q", r.stdout)
	assert.Contains(t, r.stdout, `evil\x0aname\x1b[31m.txt`)
	assert.Contains(t, r.stdout, "[valve]")

	// Problems naming the file are escaped too.
	r = run(t, "", "tag", name, filepath.Join(dir, "missing\x1b[2J.txt"))
	assert.NotContains(t, r.stderr, "\x1b")
}
