package read

import (
	"bytes"
	"compress/gzip"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Input is one document to read.
type Input struct {
	// Name is the path as shown to users: the argument as given, or the
	// argument joined with the path below it for a file found in a directory.
	Name string
	// Path is the file to open; "-" means standard input.
	Path string
	// Dir is the directory argument under which the file was found, or empty
	// when the user named the file (or a glob matched it) directly. Content
	// that is not text is an Error for a named file but only a Note for a
	// file met while walking a directory.
	Dir string
}

// Severity grades a Problem.
type Severity int

const (
	// Note is information: a hidden file skipped, an empty file.
	Note Severity = iota
	// Warning means the document was read but some of it was repaired, such
	// as invalid bytes replaced by U+FFFD.
	Warning
	// Error means something was skipped: a whole input or part of one. The
	// command goes on with the rest and exits non-zero at the end.
	Error
)

func (s Severity) String() string {
	switch s {
	case Note:
		return "note"
	case Warning:
		return "warning"
	case Error:
		return "error"
	}
	return fmt.Sprintf("Severity(%d)", int(s))
}

// Problem is something worth telling the user about one input.
type Problem struct {
	File     string
	Line     int // 1-based; 0 when the problem is not about one line
	Severity Severity
	Msg      string
}

// Error formats the problem as "file:line: msg", or "file: msg" when it has
// no line, the way compilers do, so editors can jump to it.
func (p Problem) Error() string {
	if p.Line > 0 {
		return fmt.Sprintf("%s:%d: %s", p.File, p.Line, p.Msg)
	}
	return fmt.Sprintf("%s: %s", p.File, p.Msg)
}

// Options control Expand and Read.
type Options struct {
	// Format forces one reader for every input (the CLI's --from): one of
	// Formats(). Empty means: by file extension, else by content.
	Format string
	// Stdin is read for the input "-"; nil means os.Stdin.
	Stdin io.Reader
	// MaxBytes caps the size of one document after decompression: a file,
	// standard input, a gzip stream, word/document.xml in a .docx, or the
	// output of pdftotext. 0 means DefaultMaxBytes.
	MaxBytes int64
	// Encoding names the encoding of the text formats (the CLI's
	// --encoding), overriding the charset a page declares and the
	// detection; a byte order mark still wins. Labels are the WHATWG
	// Encoding Standard's (see LookupEncoding). Empty means: detect.
	Encoding string
}

// DefaultMaxBytes is the size cap on one document when Options.MaxBytes is
// 0. About 20 million words of prose; a document this large would need some
// gigabytes once tokenized, so larger ones are refused with a message rather
// than left to exhaust memory. Split big corpora into files.
const DefaultMaxBytes = 128 << 20

// MaxLine is the longest line of a plain-text or Markdown source that is
// read; a longer line is left out (replaced by an empty line, so the lines
// after it keep their numbers) with an Error naming file and line. Prose has
// no megabyte-long lines; such a line is data (base64, minified code), and
// reading it as words would only fill the results with noise.
const MaxLine = 1 << 20

// maxBytes is the cap in force, never above doc.MaxText: token offsets
// and line numbers are 32-bit.
func (o Options) maxBytes() int64 {
	if o.MaxBytes > 0 {
		return min(o.MaxBytes, doc.MaxText)
	}
	return DefaultMaxBytes
}

// maxText is doc.MaxText, a variable so that a test can lower it.
var maxText = doc.MaxText

// Format names, as accepted by Options.Format.
const (
	FormatText     = "txt"
	FormatMarkdown = "md"
	FormatHTML     = "html"
	FormatDocx     = "docx"
	FormatPDF      = "pdf"
	FormatConllu   = "conllu"
)

// Formats returns the names of the formats Read understands.
func Formats() []string {
	return []string{FormatText, FormatMarkdown, FormatHTML, FormatDocx, FormatPDF, FormatConllu}
}

var extFormats = map[string]string{
	".txt":      FormatText,
	".text":     FormatText,
	".md":       FormatMarkdown,
	".markdown": FormatMarkdown,
	".html":     FormatHTML,
	".htm":      FormatHTML,
	".xhtml":    FormatHTML,
	".docx":     FormatDocx,
	".pdf":      FormatPDF,
	".conllu":   FormatConllu,
}

// formatByName returns the format of a file name by its extension (after a
// ".gz"), or "" when the extension is not one glossmith reads.
func formatByName(name string) string {
	ext := strings.ToLower(filepath.Ext(name))
	if ext == ".gz" {
		return formatByName(name[:len(name)-3])
	}
	return extFormats[ext]
}

func isGzipName(name string) bool { return strings.EqualFold(filepath.Ext(name), ".gz") }

// Read reads one input into a document of plain text (or, for CoNLL-U, of
// sentences taken as given). The document is nil when nothing could be
// read; the problems say why, and carry the notes and warnings of a
// document that was read.
func Read(in Input, opt Options) (*doc.Document, []Problem) {
	r := &reader{in: in, opt: opt}
	d := r.read()
	if d != nil && !d.Pretokenized {
		d.Text, d.Shifts = normalizeText(d.Text)
	}
	if d != nil {
		if !utf8.ValidString(d.Text) { // a reader bug, never the user's fault
			r.errorf(0, "internal error: extracted text is not valid UTF-8")
			return nil, r.probs
		}
		if len(d.Text) > maxText {
			// Markup can add a little text (paragraph marks) to what the
			// byte cap let in.
			r.errorf(0, "refused: %s of text, more than the %s one document may hold; split the file", size(int64(len(d.Text))), size(int64(maxText)))
			return nil, r.probs
		}
		if strings.TrimSpace(strings.ReplaceAll(d.Text, paraSep, "")) == "" {
			if d.Format == FormatPDF {
				r.notef(0, "no text (a PDF of scanned pages has none; glossmith does no character recognition)")
				return nil, r.probs
			}
			r.notef(0, "no text")
			return nil, r.probs
		}
	}
	return d, r.probs
}

type reader struct {
	in       Input
	opt      Options
	probs    []Problem
	unpacked bool // the data was decompressed, so the file on disk is not it
	coding   coding
	mdSource string // the Markdown source as parsed, line ends as LF, overlong lines left out
}

func (r *reader) add(sev Severity, line int, format string, args ...any) {
	r.probs = append(r.probs, Problem{File: r.in.Name, Line: line, Severity: sev, Msg: fmt.Sprintf(format, args...)})
}
func (r *reader) notef(line int, format string, args ...any)  { r.add(Note, line, format, args...) }
func (r *reader) warnf(line int, format string, args ...any)  { r.add(Warning, line, format, args...) }
func (r *reader) errorf(line int, format string, args ...any) { r.add(Error, line, format, args...) }

// skipf reports content that is not a document glossmith can read: an Error
// for an input the user named, a Note for a file met in a directory walk.
func (r *reader) skipf(format string, args ...any) {
	if r.in.Dir != "" {
		r.notef(0, "skipped: "+format, args...)
	} else {
		r.errorf(0, format, args...)
	}
}

func (r *reader) read() *doc.Document {
	limit := r.opt.maxBytes()
	data, ok := r.load(limit)
	if !ok {
		return nil
	}
	// The text formats copy what they keep (decode makes a string), so the
	// buffer goes back for the next input; the readers of binary formats
	// may keep slices of it and get a buffer of their own.
	loaded := data
	defer func() {
		if loaded != nil {
			putLoadBuffer(loaded)
		}
	}()
	name := r.in.Name
	if isGzip(data) || isGzipName(name) {
		if !isGzip(data) {
			r.errorf(0, "not gzip data, although the name ends in .gz")
			return nil
		}
		if data, ok = r.gunzip(data, limit); !ok {
			return nil
		}
		r.unpacked = true
		if isGzipName(name) {
			name = name[:len(name)-3]
		}
	}
	format := r.opt.Format
	if format != "" {
		if !knownFormat(format) {
			r.errorf(0, "unknown format %q; known formats: %s", format, strings.Join(Formats(), ", "))
			return nil
		}
	} else if format = formatByName(name); format == "" {
		format = r.sniff(data)
		if format == "" {
			return nil
		}
	}
	if len(bytes.TrimSpace(data)) == 0 {
		r.notef(0, "no text")
		return nil
	}
	var d *doc.Document
	switch format {
	case FormatPDF:
		loaded = nil
		d = r.pdf(data)
	case FormatDocx:
		loaded = nil
		d = r.docx(data, limit)
	default:
		if kind := binaryKind(data); kind != "" {
			r.skipf("not text (%s)", kind)
			return nil
		}
		text := r.decode(data, format)
		switch format {
		case FormatText:
			if d = r.text(text); r.coding.altered {
				d.Source = sourceRuns(data, d.Text, r.coding)
			}
		case FormatMarkdown:
			if d = r.markdown(text); r.coding.altered {
				d.Source = sourceRuns(data, r.mdSource, r.coding)
			}
		case FormatHTML:
			// The tokenizer turns CRLF and CR into LF; done first, the
			// source that Origins point into has the lines of the file.
			if strings.Contains(text, "\r") {
				r.coding.altered = true
				text = normalizeNewlines(text)
			}
			if d = r.html(text); r.coding.altered {
				d.Source = sourceRuns(data, text, r.coding)
			}
		case FormatConllu:
			d = r.conllu(text)
		}
	}
	if d != nil {
		d.Name, d.Format = r.in.Name, format
	}
	return d
}

func knownFormat(f string) bool {
	for _, k := range Formats() {
		if f == k {
			return true
		}
	}
	return false
}

// load reads the raw bytes of the input, refusing more than limit bytes.
func (r *reader) load(limit int64) ([]byte, bool) {
	var src io.Reader
	var hint int64
	if r.in.Path == "-" {
		src = r.opt.Stdin
		if src == nil {
			src = os.Stdin
		}
	} else {
		f, err := os.Open(r.in.Path)
		if err != nil {
			r.errorf(0, "cannot open: %s", Describe(err))
			return nil, false
		}
		defer f.Close()
		st, err := f.Stat()
		if err != nil {
			r.errorf(0, "cannot read: %s", Describe(err))
			return nil, false
		}
		if st.IsDir() {
			r.errorf(0, "is a directory")
			return nil, false
		}
		if st.Mode().IsRegular() && st.Size() > limit {
			r.errorf(0, "file is %s, larger than the %s limit on one document; split it", size(st.Size()), size(limit))
			return nil, false
		}
		src = f
		if st.Mode().IsRegular() {
			hint = st.Size()
		}
	}
	// Read into one buffer of the known size rather than one that grows by
	// doubling: a 100 MB file then costs 100 MB, not the sum of all steps.
	// The buffer of an earlier input is reused when there is one.
	var buf bytes.Buffer
	if b, _ := loadBuffers.Get().(*[]byte); b != nil {
		buf = *bytes.NewBuffer((*b)[:0])
	}
	buf.Grow(int(hint) + 512)
	if _, err := buf.ReadFrom(io.LimitReader(src, limit+1)); err != nil {
		r.errorf(0, "cannot read: %s", Describe(err))
		return nil, false
	}
	data := buf.Bytes()
	if int64(len(data)) > limit {
		r.errorf(0, "more than the %s limit on one document; split it", size(limit))
		return nil, false
	}
	return data, true
}

// loadBuffers holds read buffers for reuse (*[]byte); a buffer is only
// kept up to maxPooledLoad bytes, so that one big input does not pin its
// buffer for the rest of a run. Reusing them spared a third of the time
// spent reading a corpus of 32 KB files (allocating and clearing a new
// buffer for each).
var loadBuffers sync.Pool

const maxPooledLoad = 4 << 20

func putLoadBuffer(b []byte) {
	if cap(b) <= maxPooledLoad {
		b = b[:0]
		loadBuffers.Put(&b)
	}
}

// gunzip decompresses a gzip stream (all members), refusing output larger
// than limit: the check is on the bytes actually produced, not on the size
// the gzip trailer claims, so a gzip bomb costs at most limit bytes.
func (r *reader) gunzip(data []byte, limit int64) ([]byte, bool) {
	zr, err := gzip.NewReader(bytes.NewReader(data))
	if err != nil {
		r.errorf(0, "bad gzip data: %v", err)
		return nil, false
	}
	out, err := io.ReadAll(io.LimitReader(zr, limit+1))
	if err != nil {
		r.errorf(0, "bad gzip data: %v", err)
		return nil, false
	}
	if int64(len(out)) > limit {
		r.errorf(0, "decompresses to more than the %s limit on one document", size(limit))
		return nil, false
	}
	return out, true
}

// Describe shortens an *fs.PathError to its cause: the file name is
// already in the Problem (or the caller's message).
func Describe(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

func size(n int64) string {
	switch {
	case n >= 1<<30 && n%(1<<30) == 0:
		return fmt.Sprintf("%d GiB", n>>30)
	case n >= 1<<30:
		return fmt.Sprintf("%.1f GiB", float64(n)/(1<<30))
	case n >= 1<<20 && n%(1<<20) == 0:
		return fmt.Sprintf("%d MiB", n>>20)
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	case n >= 1<<10 && n%(1<<10) == 0:
		return fmt.Sprintf("%d KiB", n>>10)
	}
	return fmt.Sprintf("%d bytes", n)
}

// text reads plain text: the text as it is, line breaks normalized to "\n",
// overlong lines left out, and the lines that look like headings marked.
func (r *reader) text(s string) *doc.Document {
	if strings.Contains(s, "\r") {
		r.coding.altered = true
		s = normalizeNewlines(s)
	}
	if c := r.capLines(s); c != s {
		r.coding.altered = true
		s = c
	}
	return &doc.Document{Text: s, Headings: textHeadings(s)}
}

// normalizeNewlines turns CRLF and lone CR into LF, so every reader and the
// tokenizer see one kind of line break and line numbers match what editors
// show.
func normalizeNewlines(s string) string {
	if !strings.Contains(s, "\r") {
		return s
	}
	s = strings.ReplaceAll(s, "\r\n", "\n")
	return strings.ReplaceAll(s, "\r", "\n")
}

// capLines replaces each line longer than MaxLine by an empty line and
// reports it. Linear in the length of s.
func (r *reader) capLines(s string) string {
	var b *strings.Builder
	line, start := 1, 0
	for start <= len(s) {
		end := strings.IndexByte(s[start:], '\n')
		if end < 0 {
			end = len(s)
		} else {
			end += start
		}
		if end-start > MaxLine {
			if b == nil {
				b = &strings.Builder{}
				b.Grow(len(s))
				b.WriteString(s[:start])
			}
			r.errorf(line, "line is %s long, longer than the %s limit on one line; the line is left out", size(int64(end-start)), size(MaxLine))
		} else if b != nil {
			b.WriteString(s[start:end])
		}
		if end == len(s) {
			break
		}
		if b != nil {
			b.WriteByte('\n')
		}
		start = end + 1
		line++
	}
	if b == nil {
		return s
	}
	return b.String()
}
