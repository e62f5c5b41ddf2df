package read

import (
	"bytes"
	"regexp"
	"strings"
	"unicode/utf16"
	"unicode/utf8"
)

// sniffLen is how much of a file the content checks look at.
const sniffLen = 8 << 10

// maxEncodingWarnings caps the per-line warnings about invalid bytes in
// one file; the rest are summed up in one last warning.
const maxEncodingWarnings = 10

var (
	bomUTF8    = []byte{0xEF, 0xBB, 0xBF}
	bomUTF16LE = []byte{0xFF, 0xFE}
	bomUTF16BE = []byte{0xFE, 0xFF}
)

// decode turns the bytes of a text file into valid UTF-8 without NUL
// characters. A byte order mark decides first: UTF-8 (dropped), UTF-16 LE
// or BE (converted). Then the encoding named by --encoding, then (HTML
// only) the charset the page declares. Otherwise valid UTF-8 is taken as
// it is; data that is not, but holds no UTF-8 sequence at all and no byte
// Windows-1252 leaves undefined, is read as Windows-1252 with a note; in
// the rest every byte that is not part of a valid UTF-8 sequence (or every
// unpaired UTF-16 surrogate) becomes U+FFFD, with a warning naming the
// line. Line breaks are left as they are.
func (r *reader) decode(data []byte, format string) string {
	return r.dropNUL(r.decodeText(data, format))
}

func (r *reader) decodeText(data []byte, format string) string {
	switch {
	case bytes.HasPrefix(data, bomUTF8):
		r.coding = coding{altered: true, skip: len(bomUTF8)}
		return r.decodeUTF8(data[len(bomUTF8):])
	case bytes.HasPrefix(data, bomUTF16LE):
		r.coding = coding{altered: true, skip: 2, kind: unitUTF16LE}
		return r.decodeUTF16(data[2:], false)
	case bytes.HasPrefix(data, bomUTF16BE):
		r.coding = coding{altered: true, skip: 2, kind: unitUTF16BE}
		return r.decodeUTF16(data[2:], true)
	}
	if e, name, why := r.chosenEncoding(data, format); e != nil && name != "utf-8" {
		return r.decodeWith(data, e, name, why)
	} else if name == "utf-8" {
		return r.decodeUTF8(data)
	}
	if utf8.Valid(data) {
		return string(data)
	}
	if looksWindows1252(data) {
		return r.readWindows1252(data)
	}
	return r.decodeUTF8(data)
}

// decodeUTF8 replaces each byte that is not part of a valid UTF-8
// sequence by U+FFFD, with warnings naming the lines.
func (r *reader) decodeUTF8(data []byte) string {
	if utf8.Valid(data) {
		return string(data)
	}
	r.coding.altered = true
	var b strings.Builder
	b.Grow(len(data) + 16)
	w := encodingWarnings{r: r}
	line := 1
	for i := 0; i < len(data); {
		c := data[i]
		if c < utf8.RuneSelf {
			if c == '\n' {
				line++
			}
			b.WriteByte(c)
			i++
			continue
		}
		ru, n := utf8.DecodeRune(data[i:])
		if ru == utf8.RuneError && n == 1 {
			b.WriteRune(utf8.RuneError)
			w.bad(line)
		} else {
			b.Write(data[i : i+n])
		}
		i += n
	}
	w.flush("invalid UTF-8")
	return b.String()
}

func (r *reader) decodeUTF16(data []byte, bigEndian bool) string {
	var b strings.Builder
	b.Grow(len(data))
	w := encodingWarnings{r: r}
	line := 1
	for i := 0; i < len(data); {
		ru, n, ok := UTF16Rune(data, i, bigEndian)
		switch {
		case !ok:
			b.WriteRune(utf8.RuneError)
			w.bad(line)
		case ru == '\n':
			line++
			b.WriteByte('\n')
		default:
			b.WriteRune(ru)
		}
		i += n
	}
	w.flush("invalid UTF-16")
	return b.String()
}

// UTF16Rune decodes the character at byte i of UTF-16 data (after any
// byte order mark): one unit, or a surrogate pair of two; ok is false for
// an unpaired surrogate (2 bytes) or a cut-off last byte (1), which the
// reader reads as U+FFFD. It is the reader's step, exported for code that
// must map offsets of the decoded text back to the file's bytes (the
// document check) and so decodes the file again, the same way.
func UTF16Rune(data []byte, i int, bigEndian bool) (r rune, size int, ok bool) {
	if i+1 >= len(data) {
		return utf8.RuneError, len(data) - i, false
	}
	unit := func(i int) rune {
		if bigEndian {
			return rune(data[i])<<8 | rune(data[i+1])
		}
		return rune(data[i+1])<<8 | rune(data[i])
	}
	u := unit(i)
	if !utf16.IsSurrogate(u) {
		return u, 2, true
	}
	if u < 0xDC00 && i+3 < len(data) {
		if p := utf16.DecodeRune(u, unit(i+2)); p != utf8.RuneError {
			return p, 4, true
		}
	}
	return utf8.RuneError, 2, false
}

// encodingWarnings gathers the lines with invalid bytes into at most
// maxEncodingWarnings warnings plus a summary.
type encodingWarnings struct {
	r            *reader
	lines        []int // lines warned about, in order
	counts       []int // replacements on each
	more, moreBy int   // lines and replacements beyond the cap
	lastMore     int
}

func (w *encodingWarnings) bad(line int) {
	if n := len(w.lines); n > 0 && w.lines[n-1] == line {
		w.counts[n-1]++
		return
	}
	if len(w.lines) < maxEncodingWarnings {
		w.lines = append(w.lines, line)
		w.counts = append(w.counts, 1)
		return
	}
	if w.more == 0 || w.lastMore != line {
		w.more++
		w.lastMore = line
	}
	w.moreBy++
}

func (w *encodingWarnings) flush(what string) {
	for i, line := range w.lines {
		unit := "byte"
		if what == "invalid UTF-16" {
			unit = "code unit"
		}
		if w.counts[i] > 1 {
			unit += "s"
		}
		w.r.warnf(line, "%s: %d %s replaced by U+FFFD", what, w.counts[i], unit)
	}
	if w.more > 0 {
		w.r.warnf(0, "%s on %d more lines (%d replacements in all there)", what, w.more, w.moreBy)
	}
}

// isGzip reports whether data starts with the gzip magic number (RFC 1952).
func isGzip(data []byte) bool { return len(data) >= 2 && data[0] == 0x1F && data[1] == 0x8B }

// magic lists signatures of common formats that are not text, so a stray
// image or archive is named as such rather than read as garbage. Each is
// the format's published file signature (common practice: the "magic"
// numbers documented with each format and collected by file(1)).
var magic = []struct {
	prefix string
	kind   string
}{
	{"%PDF-", "a PDF file"},
	{"PK\x03\x04", "a zip archive"},
	{"\x1F\x8B", "gzip data"},
	{"\x89PNG\r\n\x1A\n", "a PNG image"},
	{"\xFF\xD8\xFF", "a JPEG image"},
	{"GIF87a", "a GIF image"},
	{"GIF89a", "a GIF image"},
	{"II*\x00", "a TIFF image"},
	{"MM\x00*", "a TIFF image"},
	{"\x7FELF", "an ELF executable"},
	{"\xCA\xFE\xBA\xBE", "a Java class or Mach-O file"},
	{"\xCF\xFA\xED\xFE", "a Mach-O executable"},
	{"\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1", "an OLE2 file (old Word/Excel format; save it as .docx)"},
	{"7z\xBC\xAF\x27\x1C", "a 7-Zip archive"},
	{"Rar!\x1A\x07", "a RAR archive"},
	{"\xFD7zXZ\x00", "xz data"},
	{"\x28\xB5\x2F\xFD", "zstd data"},
	{"SQLite format 3\x00", "an SQLite database"},
	{"\x00asm", "a WebAssembly module"},
	{"OggS", "an Ogg media file"},
	{"fLaC", "a FLAC audio file"},
	{"wOFF", "a WOFF font"},
	{"wOF2", "a WOFF2 font"},
	{"{\\rtf", "an RTF document (save it as .docx or .txt)"},
}

// binaryKind says why data is not text, or "" when it looks like text:
// a known signature, NUL bytes, or more than 10% control bytes in the
// first 8 KiB (common practice; file(1) and Git use the same kind of test).
// UTF-16 with a byte order mark is text and is judged after decoding.
func binaryKind(data []byte) string {
	for _, m := range magic {
		if bytes.HasPrefix(data, []byte(m.prefix)) {
			return m.kind
		}
	}
	head := data[:min(len(data), sniffLen)]
	var s string
	switch {
	case bytes.HasPrefix(head, bomUTF16LE), bytes.HasPrefix(head, bomUTF16BE):
		s = peekText(head)
	default:
		s = string(head)
	}
	control := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == 0:
			return "contains NUL bytes"
		case c < 0x20 && c != '\t' && c != '\n' && c != '\r' && c != '\f' && c != '\v' && c != 0x1B, c == 0x7F:
			control++
		}
	}
	if len(s) > 0 && control*10 > len(s) {
		return "too many control characters"
	}
	return ""
}

// peekText decodes the start of data for sniffing, without warnings.
func peekText(data []byte) string {
	data = data[:min(len(data), sniffLen)]
	switch {
	case bytes.HasPrefix(data, bomUTF8):
		return string(data[3:])
	case bytes.HasPrefix(data, bomUTF16LE), bytes.HasPrefix(data, bomUTF16BE):
		be := data[0] == 0xFE
		data = data[2:]
		u := make([]uint16, len(data)/2)
		for i := range u {
			if be {
				u[i] = uint16(data[2*i])<<8 | uint16(data[2*i+1])
			} else {
				u[i] = uint16(data[2*i+1])<<8 | uint16(data[2*i])
			}
		}
		return string(utf16.Decode(u))
	}
	return string(data)
}

// sniff guesses the format of a file whose name does not tell it. It
// returns "" after reporting content it cannot read.
func (r *reader) sniff(data []byte) string {
	head := data
	if bytes.HasPrefix(head, []byte("%PDF-")) {
		return FormatPDF
	}
	if bytes.HasPrefix(data, []byte("PK\x03\x04")) {
		return FormatDocx
	}
	if kind := binaryKind(data); kind != "" {
		r.skipf("not text (%s)", kind)
		return ""
	}
	return sniffText(peekText(data))
}

// htmlStart matches the byte patterns by which the WHATWG MIME Sniffing
// Standard (section 7.1, "rules for identifying an unknown MIME type")
// recognizes HTML: after leading white space, one of these tags followed by
// a space or ">".
var htmlStart = regexp.MustCompile(`(?i)^[\t\n\f\r ]*<(!doctype html|html|head|script|iframe|h1|div|font|table|a|style|title|b|body|br|p|!--)[ >]`)

var (
	mdHeading = regexp.MustCompile(`(?m)^ {0,3}#{1,6}[ \t]+\S`)
	mdFence   = regexp.MustCompile("(?m)^ {0,3}(```|~~~)")
	mdLink    = regexp.MustCompile(`!?\[[^\]\n]+\]\([^)\s]+\)`)
	mdTable   = regexp.MustCompile(`(?m)^ {0,3}\|? *:?-{3,}:? *\|`)
	mdFront   = regexp.MustCompile(`^---\r?\n`)
	mdSetext  = regexp.MustCompile(`(?m)^\S.*\r?\n(={3,}|-{3,})[ \t]*\r?$`)
	mdEmph    = regexp.MustCompile(`(^|[\s(])(\*\*|__)[^\s*_][^*_\n]*(\*\*|__)`)
)

// sniffText tells HTML, CoNLL-U and Markdown from plain text by the start
// of the decoded text.
func sniffText(s string) string {
	if htmlStart.MatchString(s) {
		return FormatHTML
	}
	if looksConllu(s) {
		return FormatConllu
	}
	for _, re := range []*regexp.Regexp{mdHeading, mdFence, mdLink, mdTable, mdFront, mdSetext, mdEmph} {
		if re.MatchString(s) {
			return FormatMarkdown
		}
	}
	return FormatText
}

// looksConllu reports whether the first lines that are not blank or
// comments are 10 tab-separated columns starting with a numeric ID, or a
// comment is one of CoNLL-U's own ("# sent_id", "# newdoc").
func looksConllu(s string) bool {
	rows := 0
	for _, line := range strings.SplitN(s, "\n", 50) {
		line = strings.TrimRight(line, "\r")
		switch {
		case strings.TrimSpace(line) == "":
			continue
		case strings.HasPrefix(line, "#"):
			c := strings.TrimSpace(line[1:])
			if strings.HasPrefix(c, "sent_id ") || strings.HasPrefix(c, "sent_id=") || strings.HasPrefix(c, "newdoc") {
				return true
			}
			continue
		}
		cols := strings.Split(line, "\t")
		if len(cols) != 10 || cols[0] == "" || cols[0][0] < '1' || cols[0][0] > '9' {
			return false
		}
		if rows++; rows >= 2 {
			return true
		}
	}
	return rows > 0
}
