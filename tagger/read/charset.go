package read

import (
	"bytes"
	"fmt"
	"regexp"
	"strings"
	"unicode/utf8"

	"golang.org/x/text/encoding"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/htmlindex"
)

// LookupEncoding returns the canonical name of an encoding label as the
// WHATWG Encoding Standard defines labels ("latin1", "cp1252",
// "shift_jis", "utf-16le", ...), or an error that lists a few. Commands
// call it to check --encoding before reading any input.
func LookupEncoding(label string) (string, error) {
	e, err := htmlindex.Get(label)
	if err != nil {
		return "", fmt.Errorf("unknown encoding %q (names as in the WHATWG Encoding Standard, e.g. utf-8, windows-1252, iso-8859-15, shift_jis, utf-16le)", label)
	}
	name, _ := htmlindex.Name(e)
	return name, nil
}

// metaCharset finds the charset a page declares in its first 1024 bytes,
// as the prescan of the HTML Standard (13.2.3.2, "prescan a byte stream to
// determine its encoding") looks for it: <meta charset="..."> or
// <meta http-equiv="Content-Type" content="...; charset=...">.
var metaCharset = regexp.MustCompile(`(?is)<meta\s[^>]*?charset\s*=\s*["']?\s*([A-Za-z0-9._:+-]+)`)

// xmlEncoding is the encoding declaration of an XML document (XML 1.0,
// section 4.3.3), for XHTML pages.
var xmlEncoding = regexp.MustCompile(`^<\?xml\s[^>]*?encoding\s*=\s*["']([A-Za-z][A-Za-z0-9._-]*)["']`)

// declaredCharset returns the encoding label a page declares, or "".
func declaredCharset(data []byte) string {
	head := data[:min(len(data), 1024)]
	if m := xmlEncoding.FindSubmatch(head); m != nil {
		return string(m[1])
	}
	if m := metaCharset.FindSubmatch(head); m != nil {
		return string(m[1])
	}
	return ""
}

// decodeWith decodes data from a named encoding (not UTF-8), reporting
// bytes that are not valid in it.
func (r *reader) decodeWith(data []byte, e encoding.Encoding, name, why string) string {
	r.coding.setEncoding(e)
	out, err := e.NewDecoder().Bytes(data)
	if err != nil { // x/text decoders replace bad input rather than fail
		r.errorf(0, "cannot decode as %s: %v", name, err)
		return ""
	}
	if bad := bytes.Count(out, []byte("\uFFFD")) - bytes.Count(data, []byte("\uFFFD")); bad > 0 {
		r.warnf(0, "%d byte sequence(s) not valid in %s (%s) replaced by U+FFFD", bad, name, why)
	}
	return string(out)
}

// chosenEncoding returns the encoding the user forced or the page
// declares, or nil to read the data as UTF-8 (with the Windows-1252
// fallback). A BOM has been looked at before: it wins over both.
func (r *reader) chosenEncoding(data []byte, format string) (encoding.Encoding, string, string) {
	if label := r.opt.Encoding; label != "" {
		e, err := htmlindex.Get(label)
		if err != nil {
			r.errorf(0, "unknown encoding %q; read as UTF-8", label)
			return nil, "", ""
		}
		name, _ := htmlindex.Name(e)
		return e, name, "as --encoding says"
	}
	if format != FormatHTML {
		return nil, "", ""
	}
	label := declaredCharset(data)
	if label == "" {
		return nil, "", ""
	}
	e, err := htmlindex.Get(label)
	if err != nil {
		r.warnf(0, "the page declares an unknown charset %q; read as UTF-8", label)
		return nil, "", ""
	}
	name, _ := htmlindex.Name(e)
	if strings.HasPrefix(name, "utf-16") {
		// HTML Standard 13.2.3.2: a meta declaring UTF-16 means UTF-8 (the
		// bytes could not have been read to find it otherwise).
		return nil, "", ""
	}
	return e, name, "as the page declares"
}

// cp1252Undefined are the five bytes to which Windows-1252 assigns no
// character (the Unicode Consortium's mapping table CP1252.TXT).
func cp1252Undefined(c byte) bool {
	return c == 0x81 || c == 0x8D || c == 0x8F || c == 0x90 || c == 0x9D
}

// looksWindows1252 reports whether data, which is not valid UTF-8, is
// better read as Windows-1252: it holds no valid multi-byte UTF-8
// sequence (a UTF-8 file with a few damaged bytes has many) and no byte
// that Windows-1252 leaves undefined.
func looksWindows1252(data []byte) bool {
	for i := 0; i < len(data); {
		c := data[i]
		if c < utf8.RuneSelf {
			i++
			continue
		}
		if cp1252Undefined(c) {
			return false
		}
		if r, n := utf8.DecodeRune(data[i:]); r != utf8.RuneError || n > 1 {
			return false
		}
		i++
	}
	return true
}

// readWindows1252 decodes data as Windows-1252 with a note saying so.
func (r *reader) readWindows1252(data []byte) string {
	r.coding.setEncoding(charmap.Windows1252)
	out, _ := charmap.Windows1252.NewDecoder().Bytes(data)
	r.notef(0, "not valid UTF-8; read as Windows-1252 (use --encoding to name another encoding)")
	return string(out)
}

// dropNUL removes NUL characters from decoded text with a warning naming
// the first line that had one. (A NUL in the first 8 KiB marks the file as
// binary before this; one further in is damage in a text file, and the
// rest of the text is worth reading.)
func (r *reader) dropNUL(s string) string {
	i := strings.IndexByte(s, 0)
	if i < 0 {
		return s
	}
	r.coding.altered = true
	line := 1 + strings.Count(s[:i], "\n")
	n := strings.Count(s, "\x00")
	r.warnf(line, "%d NUL character(s) dropped (the first on this line)", n)
	return strings.ReplaceAll(s, "\x00", "")
}
