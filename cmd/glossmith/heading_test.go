package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A tagged file round-trips with its headings: tag writes a Markdown
// heading's sentence with "# heading = yes" in CoNLL-U; that file with
// its LEMMA, UPOS and XPOS cells emptied, tagged again, comes back the
// same, since the reader restores the mark and the tagger reads the
// heading as a heading again; without the comment it is running text.
func TestTagHeadingRoundTrip(t *testing.T) {
	dir := t.TempDir()
	md := filepath.Join(dir, "emitters.md")
	require.NoError(t, os.WriteFile(md, []byte("# Cleaning the Drip Emitters\n\nFlush the drip emitters every week.\n"), 0o644))
	r := run(t, "", "tag", "-q", "--to", "conllu", md)
	require.Equal(t, 0, r.code, r.stderr)
	tagged := r.stdout
	require.Equal(t, 1, strings.Count(tagged, "\n# heading = yes\n"), tagged)
	require.Contains(t, tagged, "\tDrip\tdrip\tNOUN\tNN\t", "the heading read as running text writes it")

	blank := regexp.MustCompile(`(?m)^(\d+\t[^\t]*)\t[^\t]*\t[^\t]*\t[^\t]*\t`).ReplaceAllString(tagged, "$1\t_\t_\t_\t")
	require.NotEqual(t, tagged, blank)
	untagged := filepath.Join(dir, "untagged.conllu")
	require.NoError(t, os.WriteFile(untagged, []byte(blank), 0o644))
	r = run(t, "", "tag", "-q", "--to", "conllu", untagged)
	require.Equal(t, 0, r.code, r.stderr)
	assert.Equal(t, tagged, r.stdout, "tagged again, the file differs")

	r = run(t, "", "tag", "-q", "--to", "jsonl", untagged)
	require.Equal(t, 0, r.code, r.stderr)
	var heads []bool
	for _, line := range strings.Split(strings.TrimSpace(r.stdout), "\n") {
		var s struct{ Heading bool }
		require.NoError(t, json.Unmarshal([]byte(line), &s))
		heads = append(heads, s.Heading)
	}
	assert.Equal(t, []bool{true, false}, heads)

	r = run(t, strings.Replace(blank, "# heading = yes\n", "", 1), "tag", "-q", "--from", "conllu", "--to", "jsonl", "-")
	require.Equal(t, 0, r.code, r.stderr)
	assert.NotContains(t, r.stdout, `"heading":true`, "without the comment no sentence is a heading")
}
