package terms

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A gold list that is not text (a binary file, another encoding) is an
// error naming the file and line, not an empty or garbled list that would
// score zeros.
func TestReadGoldRefusesNonText(t *testing.T) {
	for name, in := range map[string]string{
		"binary": "valve\n\x00\x01\x02binary\n",
		"latin1": "valve\ncaf\xe9 filter\n",
	} {
		_, err := ReadGold(strings.NewReader(in), name+".tsv")
		require.Error(t, err, name)
		assert.Contains(t, err.Error(), name+".tsv:2: not a text file", name)
	}
	g, err := ReadGold(strings.NewReader("Valve\tTerm\n# note\n\ndrip emitter\n"), "gold.tsv")
	require.NoError(t, err)
	assert.Equal(t, Gold{"valve": true, "drip emitter": true}, g)
}

// A gold list saved by a Windows tool reads as its text, and a term is
// compared in the form the documents are read in (Unicode NFC): a
// Notepad byte-order mark glued to the first term, a UTF-16 "Unicode
// text" list or an accent typed as a combining mark matched nothing.
func TestReadGoldAsText(t *testing.T) {
	want := Gold{"storage tank": true, "café filter": true}
	utf16le := func(s string) string {
		b := []byte{0xff, 0xfe}
		for _, r := range s {
			b = append(b, byte(r), byte(r>>8))
		}
		return string(b)
	}
	tests := []struct{ name, in string }{
		{"UTF-8 with a byte-order mark, CRLF", "\ufeffStorage tank\r\ncafé filter\r\n"},
		{"UTF-16LE with a byte-order mark", utf16le("storage tank\r\ncafé filter\r\n")},
		{"combining accent", "storage tank\ncafe\u0301 filter\tSpecific_Term\n"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			g, err := ReadGold(strings.NewReader(tt.in), "gold.txt")
			require.NoError(t, err)
			assert.Equal(t, want, g)
		})
	}
}
