package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/terms"
)

// find --nested on one CoNLL-U sentence of 20,000 nouns: every span is a
// match of NOUN+, 200 million of them (8 GB of matches), so it hung; with spans bounded by
// terms.SpanLimit it lists the noun runs up to that length. The bound of
// two minutes only catches a hang.
func TestFindNestedLongSentence(t *testing.T) {
	var b strings.Builder
	const n = 20_000
	for i := 1; i <= n; i++ {
		fmt.Fprintf(&b, "%d\tvalve\tvalve\tNOUN\tNN\t_\t_\t_\t_\t_\n", i)
	}
	b.WriteString("\n")
	path := filepath.Join(t.TempDir(), "long.conllu")
	require.NoError(t, os.WriteFile(path, []byte(b.String()), 0o644))
	r, finished := runBounded(t, "", 2*time.Minute, "find", "--nested", "--count", "NOUN+", path)
	require.True(t, finished, "find --nested --count did not finish")
	require.Equal(t, 0, r.code, r.stderr)
	lines := strings.Split(strings.TrimSpace(r.stdout), "\n")
	limit := terms.SpanLimit(terms.DefaultMaxWords)
	assert.Len(t, lines, limit, "one line per run length 1..%d", limit)
	assert.Equal(t, fmt.Sprintf("%d  valve", n), strings.TrimSpace(lines[0]))
}
