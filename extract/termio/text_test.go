package termio

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
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

// A quote a glossary's row opens and never closes is reported at the row
// that opens it, and the rows after it are read: the CSV rules (RFC 4180,
// section 2) let a quoted field run over lines, so the reader takes the
// rest of the file for one field and gives up at its end — the file's
// last line was named and every later row lost.
func TestReadTableRecoversFromAnUnclosedQuote(t *testing.T) {
	for _, c := range []struct {
		name, text string
		problems   []string
		terms      []string
	}{
		{"unclosed quote", "term,status\nvalve a,preferred\n\"valve b,preferred\nvalve c,preferred\nvalve d,admitted\n",
			[]string{`g.csv:3: a quoted field starts here and is not closed (a '"' is missing); the lines after it are read as rows`},
			[]string{"valve a", "valve c", "valve d"}},
		{"two unclosed quotes", "term,status\n\"valve a,preferred\nvalve b,preferred\n\"valve c,preferred\nvalve d,admitted\n",
			[]string{`g.csv:2: a quoted field starts here`, `g.csv:4: a quoted field starts here`},
			[]string{"valve b", "valve d"}},
		{"a closed field over two lines", "term,status,note\nvalve a,preferred,\"seen in\nthe v2 manual\"\nvalve b,admitted,\n",
			nil, []string{"valve a", "valve b"}},
		{"unclosed on the last line", "term,status\nvalve a,preferred\n\"valve b,preferred\n",
			[]string{`g.csv:3: extraneous or missing " in quoted-field`}, []string{"valve a"}},
		{"bare quote", "term,status\nvalve a,preferred\nvalve \"b\",preferred\nvalve c,preferred\n",
			[]string{`g.csv:3: bare " in non-quoted-field`}, []string{"valve a", "valve c"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			imp, err := ReadTable(strings.NewReader(c.text), "g.csv", ',', "en")
			require.NoError(t, err)
			require.Len(t, imp.Problems, len(c.problems))
			for i, p := range c.problems {
				assert.Contains(t, imp.Problems[i].Error(), p)
			}
			var got []string
			for _, e := range imp.Entries {
				got = append(got, e.Terms[0].Text)
			}
			assert.Equal(t, c.terms, got)
		})
	}
}

// A TBX concept entry whose terms are all empty is reported and left
// out, not stored as an entry without terms that list counts but never
// shows; an empty term beside a real one is passed over.
func TestTBXEntryWithoutTermsIsReported(t *testing.T) {
	const doc = `<?xml version="1.0" encoding="UTF-8"?>
<tbx type="TBX-Core" style="dca" xml:lang="en" xmlns="urn:iso:std:iso:30042:ed-2"><text><body>
<conceptEntry id="c1"><langSec xml:lang="en"><termSec><term>fan guard</term></termSec></langSec></conceptEntry>
<conceptEntry id="c2"><langSec xml:lang="en"><termSec><term></term></termSec><termSec><term>  </term></termSec></langSec></conceptEntry>
<conceptEntry id="c3"><langSec xml:lang="en"><termSec><term/></termSec><termSec><term>drip tray</term></termSec></langSec></conceptEntry>
</body></text></tbx>`
	path := filepath.Join(t.TempDir(), "g.tbx")
	require.NoError(t, os.WriteFile(path, []byte(doc), 0o644))
	imp, err := ReadFile(path, "en")
	require.NoError(t, err)
	require.Len(t, imp.Problems, 1)
	assert.Equal(t, path+`: concept entry "c2" has no term: left out`, imp.Problems[0].Error())
	var got []string
	for _, e := range imp.Entries {
		for _, x := range e.Terms {
			got = append(got, e.ExtID+" "+x.Text)
		}
	}
	assert.Equal(t, []string{"c1 fan guard", "c3 drip tray"}, got)
}
