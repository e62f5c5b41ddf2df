package check

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// Kind is what a finding is about.
type Kind uint8

const (
	// KindDeprecated: a deprecated or forbidden term (or a spelling of one).
	KindDeprecated Kind = iota
	// KindSpelling: a spelling of a term other than its preferred form.
	KindSpelling
	// KindMixed: a variant group spelled more than one way.
	KindMixed
	// KindMisspelt: a term with one of its words misspelt (Misspellings).
	KindMisspelt
)

var kindNames = [...]string{"deprecated", "spelling", "mixed", "misspelt"}

func (k Kind) String() string { return kindNames[k] }

// ParseKind reads a kind name as String writes it.
func ParseKind(s string) (Kind, bool) {
	for i, n := range kindNames {
		if n == s {
			return Kind(i), true
		}
	}
	return 0, false
}

// Level is a finding's severity, in the order of SARIF's levels.
type Level uint8

const (
	Note Level = iota
	Warning
	Error
)

var levelNames = [...]string{"note", "warning", "error"}

func (l Level) String() string { return levelNames[l] }

// ParseLevel reads "error", "warning" or "note".
func ParseLevel(s string) (Level, error) {
	for i, n := range levelNames {
		if n == s {
			return Level(i), nil
		}
	}
	return 0, fmt.Errorf("unknown level %q (want error, warning or note)", s)
}

// Level is the severity of a kind: deprecated and forbidden terms are
// errors, other spellings and misspelt terms warnings, mixed use notes.
func (k Kind) Level() Level {
	switch k {
	case KindDeprecated:
		return Error
	case KindSpelling, KindMisspelt:
		return Warning
	}
	return Note
}

// Finding is one use a writer should look at.
type Finding struct {
	File string
	// Line and Column are 1-based; Column counts characters (Unicode code
	// points) of the original file's line. EndLine and EndColumn point
	// just past the text found.
	Line, Column       int
	EndLine, EndColumn int
	Text               string // the text found, white space folded
	Kind               Kind
	Preferred          string // the term to use
	Entry              string // the glossary entry (its id), or the variant group
	Message            string
	// Start and End are the byte offsets of the text in the document's
	// plain text (not written out).
	Start, End int
}

// Level is the finding's severity.
func (f *Finding) Level() Level { return f.Kind.Level() }

// message words a finding of a glossary entry.
func message(kind Kind, status Status, text, preferred string, caseOnly bool) string {
	use := ""
	if preferred != "" {
		use = fmt.Sprintf(": use %q", preferred)
	}
	switch {
	case kind == KindDeprecated && status == Forbidden:
		return fmt.Sprintf("%q is a forbidden term%s", text, use)
	case kind == KindDeprecated:
		return fmt.Sprintf("%q is a deprecated term%s", text, use)
	case caseOnly:
		return fmt.Sprintf("%q is written %q (the term's case matters)", text, preferred)
	}
	return fmt.Sprintf("%q is a spelling of %q%s", text, preferred, use)
}

// foldSpace returns s with every run of white space as one space and the
// hyphens U+2010 and U+2011 as "-".
func foldSpace(s string) string {
	if folded(s) {
		return s
	}
	var b strings.Builder
	space := false
	for _, r := range s {
		switch {
		case r == '\u2010' || r == '\u2011':
			r = '-'
		case r == '\u2029' || r == '\u00a0' || r == ' ' || r == '\t' || r == '\n' || r == '\r':
			space = true
			continue
		}
		if space && b.Len() > 0 {
			b.WriteByte(' ')
		}
		space = false
		b.WriteRune(r)
	}
	return b.String()
}

// folded reports whether foldSpace would leave s as it is: printable ASCII
// with single spaces between words, the usual case, is checked byte by byte.
func folded(s string) bool {
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= utf8.RuneSelf:
			return !strings.ContainsAny(s, "\u2010\u2011\u2029\u00a0") && !strings.ContainsAny(s, "\t\n\r") && !strings.Contains(s, "  ")
		case c == ' ':
			if i == 0 || i == len(s)-1 || s[i+1] == ' ' {
				return false
			}
		case c < ' ':
			return false
		}
	}
	return true
}
