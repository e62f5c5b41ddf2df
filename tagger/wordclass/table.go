// Package wordclass learns classes of words from unlabeled text and looks
// them up: words that occur in the same contexts share a class, and the
// classes form a binary tree whose paths ("0110…") name them, so that
// prefixes of a path name coarser classes. The tagger can use them as
// features, for the words it saw rarely or never in its treebank
// (hmm.TrainOptions.LearnedClasses).
//
// Learn forms the classes (see its comment for the method); the table of
// the default model is built by tagger/model/wordclasses and embedded
// beside the model (English).
package wordclass

import (
	"bufio"
	"bytes"
	"cmp"
	"compress/gzip"
	"fmt"
	"io"
	"maps"
	"slices"
	"strings"
)

// MaxPath is the longest path a table may hold.
const MaxPath = 255

// Table maps words to the paths of their classes.
type Table struct {
	class map[string]int32 // word → class
	paths []string         // class → path
}

// Len returns the number of words of the table.
func (t *Table) Len() int { return len(t.class) }

// Classes returns the number of classes; their numbers are 0..Classes()-1.
func (t *Table) Classes() int { return len(t.paths) }

// Path returns the path of class c.
func (t *Table) Path(c int32) string { return t.paths[c] }

// Class returns the class of a word, or -1 when the table lacks it. It
// does not allocate.
func (t *Table) Class(word []byte) int32 {
	if c, ok := t.class[string(word)]; ok {
		return c
	}
	return -1
}

// WriteText writes the table as text: one line per word, its path, a tab
// and the word, sorted by path and then by word.
func (t *Table) WriteText(w io.Writer) error {
	words := slices.SortedFunc(maps.Keys(t.class), func(a, b string) int {
		if d := cmp.Compare(t.paths[t.class[a]], t.paths[t.class[b]]); d != 0 {
			return d
		}
		return cmp.Compare(a, b)
	})
	bw := bufio.NewWriter(w)
	for _, word := range words {
		bw.WriteString(t.paths[t.class[word]])
		bw.WriteByte('\t')
		bw.WriteString(word)
		bw.WriteByte('\n')
	}
	return bw.Flush()
}

// Compress returns the table's text (WriteText) compressed with gzip
// (RFC 1952) at the best level, with no name or time in the header, so
// that the same table gives the same bytes.
func (t *Table) Compress() ([]byte, error) {
	var text, out bytes.Buffer
	if err := t.WriteText(&text); err != nil {
		return nil, err
	}
	zw, err := gzip.NewWriterLevel(&out, gzip.BestCompression)
	if err != nil {
		return nil, err
	}
	if _, err := zw.Write(text.Bytes()); err != nil {
		return nil, err
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

// ParseError is a line of a table that cannot be read.
type ParseError struct {
	File string
	Line int
	Msg  string
}

func (e *ParseError) Error() string { return fmt.Sprintf("%s:%d: %s", e.File, e.Line, e.Msg) }

// Parse reads a table in the text form WriteText writes; name is the
// file's name, for errors.
func Parse(r io.Reader, name string) (*Table, error) {
	var b tableBuilder
	sc := bufio.NewScanner(r)
	line := 0
	for sc.Scan() {
		line++
		fail := func(format string, args ...any) (*Table, error) {
			return nil, &ParseError{File: name, Line: line, Msg: fmt.Sprintf(format, args...)}
		}
		path, word, ok := strings.Cut(sc.Text(), "\t")
		switch {
		case !ok:
			return fail("want a path, a tab and a word")
		case len(path) > MaxPath:
			return fail("path of %d bits; at most %d", len(path), MaxPath)
		case strings.Trim(path, "01") != "":
			return fail("path %q is not made of 0 and 1", path)
		case word == "" || strings.ContainsAny(word, "\t\r"):
			return fail("empty word, or a word with a tab or carriage return")
		}
		if _, dup := b.t.class[word]; dup {
			return fail("word %q listed twice", word)
		}
		b.add(word, path)
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return &b.t, nil
}

// tableBuilder builds a table word by word, numbering the paths in order
// of first appearance.
type tableBuilder struct {
	t     Table
	index map[string]int32 // path → class
}

func (b *tableBuilder) add(word, path string) {
	if b.index == nil {
		b.index, b.t.class = map[string]int32{}, map[string]int32{}
	}
	c, ok := b.index[path]
	if !ok {
		c = int32(len(b.t.paths))
		b.index[path] = c
		b.t.paths = append(b.t.paths, path)
	}
	b.t.class[word] = c
}

// ParseCompressed reads a table compressed by Compress.
func ParseCompressed(data []byte, name string) (*Table, error) {
	zr, err := gzip.NewReader(bytes.NewReader(data))
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	t, err := Parse(zr, name)
	if err != nil {
		return nil, err
	}
	if err := zr.Close(); err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return t, nil
}
