package read

import (
	"bytes"
	"context"
	"errors"
	"io"
	"os"
	"os/exec"
	"strings"
	"time"

	"golang.org/x/net/html"

	"glossmith/tagger/doc"
)

// PDFTimeout bounds one run of pdftotext, so a pathological PDF cannot
// hang a whole batch.
const PDFTimeout = 2 * time.Minute

// pdfToText is the program that extracts text from PDF files.
const pdfToText = "pdftotext"

// pdf extracts text with pdftotext from poppler-utils.
func (r *reader) pdf(data []byte) *doc.Document {
	prog, err := exec.LookPath(pdfToText)
	if err != nil {
		r.errorf(0, "reading PDF needs the %s program, which is not on PATH; install it with the poppler-utils package (Debian/Ubuntu: apt-get install poppler-utils)", pdfToText)
		return nil
	}
	if !bytes.HasPrefix(data, []byte("%PDF-")) && !bytes.Contains(data[:min(len(data), 1024)], []byte("%PDF-")) {
		r.skipf("not a PDF file (no %%PDF- header)")
		return nil
	}
	// pdftotext wants a file. Pass the user's own file when there is one;
	// standard input and decompressed data go through a temporary file.
	path := r.in.Path
	if path == "-" || r.unpacked {
		f, err := os.CreateTemp("", "glossmith-*.pdf")
		if err != nil {
			r.errorf(0, "cannot make a temporary file for pdftotext: %v", err)
			return nil
		}
		defer os.Remove(f.Name())
		_, err = f.Write(data)
		if cerr := f.Close(); err == nil {
			err = cerr
		}
		if err != nil {
			r.errorf(0, "cannot write a temporary file for pdftotext: %v", err)
			return nil
		}
		path = f.Name()
	} else if strings.HasPrefix(path, "-") {
		path = "./" + path // not an option to pdftotext
	}
	ctx, cancel := context.WithTimeout(context.Background(), PDFTimeout)
	defer cancel()
	// -bbox-layout writes the words of each line, the lines of each text
	// block and the blocks of each page as XHTML, in poppler's reading order
	// (column by column, unlike -layout, which sets columns side by side and
	// would glue their lines together). Its blocks are what the plain
	// output lacks: the paragraph structure, without which a heading would
	// run into the sentence below it.
	cmd := exec.CommandContext(ctx, prog, "-enc", "UTF-8", "-bbox-layout", path, "-")
	stderr := &tailBuffer{max: 16 << 10}
	cmd.Stderr = stderr
	stdout, err := cmd.StdoutPipe()
	if err == nil {
		err = cmd.Start()
	}
	if err != nil {
		r.errorf(0, "cannot run pdftotext: %v", err)
		return nil
	}
	limit := r.opt.maxBytes()
	// The markup is some ten times the text; cap both.
	lr := &limitedReader{r: stdout, n: 16 * limit}
	text, tooBig := bboxText(lr, limit)
	if tooBig || lr.exceeded {
		cancel()
	}
	_, _ = io.Copy(io.Discard, stdout)
	err = cmd.Wait()
	switch {
	case tooBig || lr.exceeded:
		r.errorf(0, "pdftotext produced more than the %s limit on one document", size(limit))
		return nil
	case ctx.Err() != nil:
		r.errorf(0, "pdftotext did not finish within %v", PDFTimeout)
		return nil
	case err != nil:
		msg := stderr.lastLine()
		var ee *exec.ExitError
		if errors.As(err, &ee) && ee.ExitCode() == 3 {
			msg = "the PDF does not permit copying its text" + suffix(msg)
		} else if msg == "" {
			msg = err.Error()
		}
		r.errorf(0, "pdftotext failed: %s", msg)
		return nil
	}
	return &doc.Document{Text: r.dropNUL(r.decodeUTF8(text))}
}

// bboxText turns pdftotext's -bbox-layout XHTML into text: the words of a
// line joined by spaces, a line break after each line, a blank line after
// each block and each page. It stops, reporting tooBig, once the text
// would pass limit bytes.
func bboxText(rd io.Reader, limit int64) (text []byte, tooBig bool) {
	z := html.NewTokenizer(rd)
	var b bytes.Buffer
	inWord, lineHasWord, pendingPara := false, false, false
	for {
		switch z.Next() {
		case html.ErrorToken:
			return bytes.TrimRight(b.Bytes(), "\n"), false
		case html.StartTagToken:
			name, _ := z.TagName()
			switch string(name) {
			case "word":
				inWord = true
			case "line":
				lineHasWord = false
			}
		case html.EndTagToken:
			name, _ := z.TagName()
			switch string(name) {
			case "word":
				inWord = false
			case "line":
				if lineHasWord {
					b.WriteByte('\n')
				}
			case "block", "page":
				if b.Len() > 0 {
					pendingPara = true
				}
			}
		case html.TextToken:
			if !inWord {
				continue
			}
			w := bytes.TrimSpace(z.Text())
			if len(w) == 0 {
				continue
			}
			if pendingPara {
				b.WriteByte('\n')
				pendingPara = false
			}
			if lineHasWord {
				b.WriteByte(' ')
			}
			b.Write(w)
			lineHasWord = true
			if int64(b.Len()) > limit {
				return nil, true
			}
		}
	}
}

func suffix(msg string) string {
	if msg == "" {
		return ""
	}
	return " (" + msg + ")"
}

// tailBuffer keeps the last max bytes written to it: the end of
// pdftotext's messages, where the fatal one is.
type tailBuffer struct {
	b   []byte
	max int
}

func (t *tailBuffer) Write(p []byte) (int, error) {
	t.b = append(t.b, p...)
	if len(t.b) > t.max {
		t.b = append(t.b[:0], t.b[len(t.b)-t.max:]...)
	}
	return len(p), nil
}

// lastLine returns the last non-empty line written.
func (t *tailBuffer) lastLine() string {
	lines := strings.Split(strings.TrimSpace(string(t.b)), "\n")
	return strings.TrimSpace(lines[len(lines)-1])
}
