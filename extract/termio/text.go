package termio

import (
	"bufio"
	"bytes"
	"io"
	"strings"

	"golang.org/x/text/encoding/unicode"
	"golang.org/x/text/transform"
)

// plainText returns the bytes of a text file as UTF-8: a UTF-8 byte order
// mark dropped (Notepad and spreadsheets write one), UTF-16 with a byte
// order mark (a spreadsheet's "Unicode text") converted. Without a mark
// the bytes are taken as they are.
func plainText(data []byte) ([]byte, error) {
	out, _, err := transform.Bytes(unicode.BOMOverride(transform.Nop), data)
	return out, err
}

// ReadTermList reads one term a line, as termbase accept --from-file
// takes them: spaces around a term, blank lines and lines starting with
// "#" are left out; the text is read as plainText reads it.
func ReadTermList(r io.Reader) ([]string, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	if data, err = plainText(data); err != nil {
		return nil, err
	}
	var out []string
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(nil, len(data)+1)
	for sc.Scan() {
		if t := strings.TrimSpace(sc.Text()); t != "" && !strings.HasPrefix(t, "#") {
			out = append(out, t)
		}
	}
	return out, sc.Err()
}
