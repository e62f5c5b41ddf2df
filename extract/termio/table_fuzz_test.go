package termio

import (
	"bytes"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/termbase"
)

// FuzzReadTable reads any bytes as a CSV and a TSV glossary and as a term
// list. The reader must not panic; each problem names a line of the file
// (between 1 and its number of lines), an error names the file and, past
// the empty file, a line; and ReadTermList agrees with a slow reference:
// the text split at "\n", each line trimmed, blank and "#" lines left out.
func FuzzReadTable(f *testing.F) {
	f.Add([]byte(glossaryCSV))
	f.Add([]byte("term\tstatus\r\nKältemittel\tpreferred\r\nKaeltemittel\tdeprecated\r\n"))
	f.Add([]byte("term,status\n\"valve a,preferred\nvalve b,preferred\n\"valve c,preferred\nvalve d,admitted\n"))
	f.Add([]byte("term,decision,comment\ndrip tray,accept,ok\nvent,maybe,\n"))
	f.Add([]byte("\xef\xbb\xbfterm\n\"a\"\"b\"\nx\"y\n"))
	f.Add([]byte("\xff\xfet\x00e\x00r\x00m\x00\n\x00"))
	f.Add([]byte("# comment\n  door heater  \r\n\n蒸発器コイル"))
	lineRef := regexp.MustCompile(`^g\.csv:\d+:`)
	f.Fuzz(func(t *testing.T, data []byte) {
		text, err := plainText(data)
		if err != nil {
			_, err := ReadTable(bytes.NewReader(data), "g.csv", ',', "en")
			assert.Error(t, err, "text that does not decode is an error")
			return
		}
		nLines := strings.Count(string(text), "\n") + 1
		for _, sep := range []rune{',', '\t'} {
			imp, err := ReadTable(bytes.NewReader(data), "g.csv", sep, "en")
			if err != nil {
				msg := err.Error()
				if strings.HasPrefix(msg, "g.csv: empty file") {
					assert.Empty(t, strings.TrimSpace(string(text)), "only a file without a record is empty")
					continue
				}
				assert.True(t, lineRef.MatchString(msg) || strings.Contains(msg, " line "), "an error names a line: %s", msg)
				continue
			}
			for _, p := range imp.Problems {
				assert.Equal(t, "g.csv", p.File)
				assert.True(t, p.Line >= 1 && p.Line <= nLines, "problem on line %d of %d: %s", p.Line, nLines, p.Msg)
			}
			for _, e := range imp.Entries {
				require.NotEmpty(t, e.Terms, "an entry without terms")
				for _, x := range e.Terms {
					assert.NotEmpty(t, x.Text)
					assert.NotEmpty(t, x.Lang)
				}
			}
		}

		got, err := ReadTermList(bytes.NewReader(data))
		require.NoError(t, err)
		var want []string
		for _, l := range strings.Split(string(text), "\n") {
			if l = strings.TrimSpace(l); l != "" && !strings.HasPrefix(l, "#") {
				want = append(want, l)
			}
		}
		assert.Equal(t, want, got)
	})
}

// FuzzTableRoundTrip writes an entry of two terms as glossmith's CSV and
// TSV export does (WriteTable) and reads the file back (ReadTable): the
// same entry comes back, its cells as the reader promises to take them
// (spaces around a cell trimmed, a note cell one note a line).
func FuzzTableRoundTrip(f *testing.F) {
	f.Add("v1", "solenoid valve", "en", uint8(0), "noun", "irrigation", "A valve opened by an electromagnet.", "ISO 4126", "Shop-floor word; avoid.", "see: drip line", "Magnetventil", "de")
	f.Add("sp", "set point", "", uint8(3), "", "climate", "The value a controller holds.", "", "line one\nline two", "", "setpoint", "")
	f.Add("c,\"1\"", "a\tb \"c\"", "en-GB", uint8(5), "verb", "x\r\ny", "", "only a source", "\n\n", "a\nb\na", "#x", "fr")
	f.Fuzz(func(t *testing.T, concept, term, lang string, status uint8, pos, subject, def, source, note, conceptNote, term2, lang2 string) {
		// encoding/csv reads a CR LF inside a quoted field as LF (its
		// documented rule); the reader trims spaces around a cell.
		cell := func(s string) string { return strings.TrimSpace(strings.ReplaceAll(s, "\r\n", "\n")) }
		statuses := []termbase.Status{termbase.Preferred, termbase.Admitted, termbase.Deprecated, termbase.Candidate, termbase.Rejected, ""}
		st := statuses[int(status)%len(statuses)]
		deferred := st == termbase.Candidate && status >= 128
		e := &termbase.Entry{ExtID: cell(concept), Subject: cell(subject),
			Definition: cell(def), DefSource: cell(source)}
		if e.ExtID == "" {
			return // an empty concept makes each row an entry of its own
		}
		for _, n := range lines(cell(conceptNote)) {
			if !slices.Contains(e.Notes, n) {
				e.Notes = append(e.Notes, n)
			}
		}
		for _, x := range []*termbase.Term{
			{Text: cell(term), Lang: cell(lang), Status: st, Deferred: deferred, POS: cell(pos), Notes: lines(cell(note))},
			{Text: cell(term2), Lang: cell(lang2)},
		} {
			if x.Text == "" {
				return // a row without a term is a problem, tested elsewhere
			}
			if x.Lang == "" {
				x.Lang = "en" // the importer's language
			}
			e.Terms = append(e.Terms, x)
		}
		for _, sep := range []rune{',', '\t'} {
			for _, bom := range []bool{false, true} {
				var buf bytes.Buffer
				require.NoError(t, WriteTable(&buf, []*termbase.Entry{e}, sep, bom))
				back, err := ReadTable(bytes.NewReader(buf.Bytes()), "export", sep, "en")
				require.NoError(t, err, "%q", buf.String())
				assert.Empty(t, back.Problems, "%q", buf.String())
				assert.Empty(t, back.Verdicts)
				require.Len(t, back.Entries, 1, "%q", buf.String())
				assert.Equal(t, e, back.Entries[0], "%q", buf.String())
			}
		}
	})
}
