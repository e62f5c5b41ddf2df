package check

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// inAddress reports whether the text [start, end) lies in a URL, an e-mail
// address or a file path: the run of non-space characters around it,
// without the brackets, quotes and sentence punctuation around that, has
// a scheme ("https://"), starts with "www.", holds an "@" before a dot, or
// is a path — it starts with "/", "./", "../", "~/" or a drive ("C:\"),
// has two separators or more ("docs/pumps/setpoint"), or names a file with
// an extension ("pumps/setpoint.yaml", "setpoint.conf").
func inAddress(text string, start, end int) bool {
	for start > 0 {
		r, n := utf8.DecodeLastRuneInString(text[:start])
		if unicode.IsSpace(r) || r == '\u2029' {
			break
		}
		start -= n
	}
	for end < len(text) {
		r, n := utf8.DecodeRuneInString(text[end:])
		if unicode.IsSpace(r) || r == '\u2029' {
			break
		}
		end += n
	}
	if !addressLike(text[start:end]) {
		return false
	}
	w := strings.TrimLeft(text[start:end], "([{<\"'`«“‘")
	w = strings.TrimRight(w, ")]}>\"'`»”’.,;:!?")
	switch {
	case strings.Contains(w, "://"), strings.HasPrefix(strings.ToLower(w), "www."),
		strings.HasPrefix(strings.ToLower(w), "mailto:"):
		return true
	case strings.Contains(w, "@") && strings.Contains(w[strings.Index(w, "@"):], "."):
		return true
	}
	seps := strings.Count(w, "/") + strings.Count(w, `\`)
	if seps > 0 {
		switch {
		case strings.HasPrefix(w, "/"), strings.HasPrefix(w, "./"), strings.HasPrefix(w, "../"),
			strings.HasPrefix(w, "~/"), len(w) > 2 && w[1] == ':' && (w[2] == '\\' || w[2] == '/'):
			return true
		case seps >= 2:
			return true
		}
	}
	if dot := strings.LastIndexByte(w, '.'); dot > 0 && fileExtensions[strings.ToLower(w[dot+1:])] {
		return true
	}
	return false
}

// fileExtensions are the extensions that make a word a file name.
var fileExtensions = map[string]bool{
	"txt": true, "md": true, "html": true, "htm": true, "pdf": true, "docx": true, "xlsx": true, "csv": true,
	"tsv": true, "json": true, "jsonl": true, "yaml": true, "yml": true, "toml": true, "xml": true, "ini": true,
	"cfg": true, "conf": true, "log": true, "sh": true, "py": true, "go": true, "c": true, "h": true,
	"js": true, "ts": true, "exe": true, "bin": true, "hex": true, "zip": true, "gz": true, "tar": true,
	"png": true, "jpg": true, "svg": true, "dat": true, "bak": true,
}

// addressLike reports whether a run of non-space characters has what any
// address has: a slash, a backslash, an "@", a colon or a dot before its
// last character. Most words have none, and are passed at once.
func addressLike(w string) bool {
	for i := 0; i < len(w); i++ {
		switch w[i] {
		case '/', '\\', '@', ':':
			return true
		case '.':
			if i < len(w)-1 {
				return true
			}
		}
	}
	return false
}
