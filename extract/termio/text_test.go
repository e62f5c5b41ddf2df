package termio

import (
	"bytes"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/encoding/unicode"
)

// utf16 encodes s as UTF-16 with a byte order mark (RFC 2781), as a
// spreadsheet saves "Unicode text".
func utf16(t *testing.T, s string, big bool) []byte {
	t.Helper()
	order := unicode.LittleEndian
	if big {
		order = unicode.BigEndian
	}
	b, err := unicode.UTF16(order, unicode.UseBOM).NewEncoder().Bytes([]byte(s))
	require.NoError(t, err)
	return b
}

// A term list reads as the terms a user sees in an editor, whatever the
// editor saved: the byte order mark of UTF-8 (U+FEFF, The Unicode
// Standard 16.0, section 23.8) is no part of the first term, UTF-16 is
// decoded, Windows line ends are line ends.
func TestReadTermList(t *testing.T) {
	const text = "drip tray\r\n\r\n  door heater  \r\n# a comment\r\nKältemittel\r\n蒸発器コイル\r\n"
	want := []string{"drip tray", "door heater", "Kältemittel", "蒸発器コイル"}
	for _, c := range []struct {
		name string
		data []byte
	}{
		{"UTF-8", []byte(text)},
		{"UTF-8 with a byte order mark", append([]byte("\xef\xbb\xbf"), text...)},
		{"UTF-16 LE", utf16(t, text, false)},
		{"UTF-16 BE", utf16(t, text, true)},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, err := ReadTermList(bytes.NewReader(c.data))
			require.NoError(t, err)
			assert.Equal(t, want, got)
		})
	}
}

// A glossary table saved as UTF-16 "Unicode text" by a spreadsheet reads
// as its UTF-8 twin.
func TestReadTableUTF16(t *testing.T) {
	const text = "term\tstatus\r\nKältemittel\tpreferred\r\nKaeltemittel\tdeprecated\r\n"
	want, err := ReadTable(bytes.NewReader([]byte(text)), "g.txt", '\t', "de")
	require.NoError(t, err)
	require.Len(t, want.Entries, 2)
	for _, big := range []bool{false, true} {
		got, err := ReadTable(bytes.NewReader(utf16(t, text, big)), "g.txt", '\t', "de")
		require.NoError(t, err)
		assert.Empty(t, got.Problems)
		assert.Equal(t, want.Entries, got.Entries)
	}
}
