package concord

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/tabular"
)

// Concordance lines line the matches up in the terminal's columns, and a
// context is cut to --width columns, not characters: a Japanese or emoji
// context (two columns a character, Unicode Standard Annex #11) pushed
// its match out of line.
func TestConcordanceAlignsByDisplayWidth(t *testing.T) {
	hits := []Hit{
		{Doc: "a.md", Line: 1, Text: "storage tank", Left: "Fill the ", Right: " now."},
		{Doc: "b.md", Line: 2, Text: "storage tank", Left: "太陽熱温水器の ", Right: " 🌞 holds 200 litres."},
		{Doc: "c.md", Line: 3, Text: "storage tank", Left: "ラベル 太陽熱温水器 太陽熱温水器 and the ", Right: " 太陽熱温水器太陽熱温水器太陽熱温水器 x"},
		{Doc: "d.md", Line: 4, Text: "storage tank", Left: "🌞🌞🌞🌞🌞🌞🌞🌞🌞🌞🌞🌞 the ", Right: "."},
	}
	const width = 20
	var b bytes.Buffer
	w, err := NewHitWriter(&b, "text", Style{Width: width})
	require.NoError(t, err)
	require.NoError(t, w.Write(hits))
	require.NoError(t, w.Flush())
	lines := strings.Split(strings.TrimSuffix(b.String(), "\n"), "\n")
	require.Len(t, lines, len(hits))
	for i, line := range lines {
		open := strings.Index(line, "[")
		require.GreaterOrEqual(t, open, 0, line)
		assert.Equal(t, len("a.md:1")+2+width, tabular.Width(line[:open]), "match of line %d starts in column %d: %q", i+1, len("a.md:1")+2+width, line)
		close := strings.Index(line, "]")
		assert.LessOrEqual(t, tabular.Width(line[close+1:]), width, "right context of line %d: %q", i+1, line)
	}
	assert.Contains(t, lines[2], "…", "a long context is cut")
}
