package check

import (
	"bytes"
	"unicode/utf8"

	"glossmith/tagger/read"
)

// utf16Source is a source file in UTF-16 with a byte order mark, decoded
// to UTF-8 for the check's look at its markup (code elements, skip
// comments), with the way back from offsets of the decoded text to the
// file's bytes, which the reader's offsets (doc.Document.ReadOffset) are.
// It decodes as the reader does, with the reader's own step
// (read.UTF16Rune).
type utf16Source struct {
	data      []byte // the file, byte order mark included
	bigEndian bool
	// text and file are where the last walk back stopped: offset text of
	// the decoded text is byte file of the file.
	text, file int
}

// newUTF16Source returns data as a utf16Source, or nil when it has no UTF-16
// byte order mark.
func newUTF16Source(data []byte) *utf16Source {
	switch {
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE}):
		return &utf16Source{data: data, file: 2}
	case bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
		return &utf16Source{data: data, bigEndian: true, file: 2}
	}
	return nil
}

// decoded returns the file's text in UTF-8, without the byte order mark.
func (u *utf16Source) decoded() []byte {
	out := make([]byte, 0, len(u.data))
	for f := 2; f < len(u.data); {
		r, n := u.next(f)
		out = utf8.AppendRune(out, r)
		f += n
	}
	return out
}

// next returns the character at byte f of the file and the bytes it
// takes, as the reader decodes it (read.UTF16Rune).
func (u *utf16Source) next(f int) (rune, int) {
	r, n, _ := read.UTF16Rune(u.data, f, u.bigEndian)
	return r, n
}

// fileOffset returns the byte of the file where offset off of the
// decoded text (a character's start) stands. Offsets asked in increasing
// order are walked to once in all.
func (u *utf16Source) fileOffset(off int) int {
	if off < u.text {
		u.text, u.file = 0, 2
	}
	for u.text < off && u.file < len(u.data) {
		r, n := u.next(u.file)
		u.text += utf8.RuneLen(r)
		u.file += n
	}
	return u.file
}
