package check

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/encoding/unicode"
)

// Columns are those of the text as read: characters that normalization
// removes (soft hyphens, zero-width and bidirectional marks) or composes
// (e + U+0301) still count before a finding, whether the column comes
// from the source line (UTF-8 text) or from the text as read (a
// Windows-1252 file, no source, HTML). want is each line of the file as a
// person counts its characters, where "magnet valve" is looked for.
func TestColumnsOfTheTextAsRead(t *testing.T) {
	cases := []struct {
		name, file, content string
		noSource            bool
		lines               []string // the lines as read, in characters
	}{
		{name: "windows-1252, CRLF", file: "a.txt",
			content: "The pres\xADsure gauge and the magnet valve.\r\nA\xAD magnet\xAD valve, then\xAD a magnet valve.\r\n",
			lines:   []string{"The pres\u00ADsure gauge and the magnet valve.", "A\u00AD magnet\u00AD valve, then\u00AD a magnet valve."}},
		{name: "decomposed, no source", file: "b.txt", noSource: true,
			content: "The cafe\u0301 has a magnet valve.\nZero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve.\n",
			lines:   []string{"The cafe\u0301 has a magnet valve.", "Zero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve."}},
		{name: "decomposed, source", file: "c.txt",
			content: "The cafe\u0301 has a magnet valve.\r\nZero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve.\r\n",
			lines:   []string{"The cafe\u0301 has a magnet valve.", "Zero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve."}},
		// The file's bytes as read differ from the text: a byte-order mark,
		// an "é" of two bytes in UTF-8 and one in Windows-1252, UTF-16
		// (two bytes a character, four for U+1D706 MATHEMATICAL ITALIC
		// SMALL LAMDA). Columns count characters, as read.
		{name: "utf-8 byte-order mark, CRLF", file: "e.txt",
			content: "\uFEFFThe café has a magnet valve.\r\nThe 𝜆 sensor, a magnet valve.\r\n",
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a magnet valve."}},
		{name: "latin-1 café", file: "f.txt",
			content: "The caf\xE9 has a magnet valve.\nNa\xEFve caf\xE9s, a magnet valve.\n",
			lines:   []string{"The café has a magnet valve.", "Naïve cafés, a magnet valve."}},
		{name: "utf-16 LE, CRLF", file: "g.txt",
			content: utf16File(t, unicode.LittleEndian, "The café has a magnet valve.\r\nThe 𝜆 sensor, a pres\u00ADsure magnet valve.\r\n"),
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a pres\u00ADsure magnet valve."}},
		{name: "utf-16 BE", file: "h.txt",
			content: utf16File(t, unicode.BigEndian, "The café has a magnet valve.\nThe 𝜆 sensor, a magnet valve.\n"),
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a magnet valve."}},
		{name: "html", file: "d.html",
			content: "<p>The pres&shy;sure gauge and the magnet valve.</p>\n<p>The cafe&#x301; has a magnet valve.</p>\n",
			lines:   []string{"The pres\u00ADsure gauge and the magnet valve.", "The cafe\u0301 has a magnet valve."}},
	}
	m := Compile(pumpGlossary())
	for _, tc := range cases {
		d, src := annotate(t, tc.file, tc.content)
		if tc.noSource {
			src = nil
		}
		res := Check(d, src, Options{Glossary: m})
		var want, got [][2]int // start and end column ("just past")
		for _, line := range tc.lines {
			for from := 0; ; {
				i := strings.Index(line[from:], "magnet")
				if i < 0 {
					break
				}
				end := from + i + strings.Index(line[from+i:], "valve") + len("valve")
				want = append(want, [2]int{utf8.RuneCountInString(line[:from+i]) + 1, utf8.RuneCountInString(line[:end]) + 1})
				from += i + 1
			}
		}
		for _, f := range res.Findings {
			require.Equal(t, "magnet valve", f.Text, tc.name)
			got = append(got, [2]int{f.Column, f.EndColumn})
		}
		assert.Equal(t, want, got, tc.name)
		require.NotEmpty(t, want, tc.name)

		// SARIF carries the same columns (columnKind unicodeCodePoints).
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, "sarif", res.Findings, WriteOptions{}))
		var log struct {
			Runs []struct {
				Results []struct {
					Locations []struct {
						PhysicalLocation struct {
							Region struct {
								StartColumn int `json:"startColumn"`
							} `json:"region"`
						} `json:"physicalLocation"`
					} `json:"locations"`
				} `json:"results"`
			} `json:"runs"`
		}
		require.NoError(t, json.Unmarshal(buf.Bytes(), &log))
		require.Len(t, log.Runs[0].Results, len(want), tc.name)
		for k, r := range log.Runs[0].Results {
			assert.Equal(t, want[k][0], r.Locations[0].PhysicalLocation.Region.StartColumn, tc.name)
		}
	}
}

// utf16File returns text as a UTF-16 file with a byte-order mark.
func utf16File(t *testing.T, order unicode.Endianness, text string) string {
	t.Helper()
	b, err := unicode.UTF16(order, unicode.UseBOM).NewEncoder().Bytes([]byte(text))
	require.NoError(t, err)
	return string(b)
}
