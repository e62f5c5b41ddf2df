package tokenize

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// checkRoundTrip verifies the tokenizer's promises about sentences cut
// from text and returns a description of the first violation, or "".
// Tokens lie inside the text, in order and without overlap; Form is
// Text[Start:End]; only white space lies between tokens, so the tokens and
// the gaps give the text back exactly, and no token holds white space;
// SpaceAfter says whether a gap follows; FusedNext tokens touch their
// successor; Line is right; the first sentence starts a paragraph.
func checkRoundTrip(text string, sents []doc.Sentence) string {
	var b strings.Builder
	var pos, line, linePos int32 = 0, 1, 0
	var prev *doc.Token
	for si := range sents {
		s := &sents[si]
		if s.Index != si {
			return fmt.Sprintf("sentence %d has Index %d", si, s.Index)
		}
		if len(s.Tokens) == 0 {
			return fmt.Sprintf("sentence %d is empty", si)
		}
		if si == 0 && !s.NewPar {
			return "the first sentence does not start a paragraph"
		}
		for ti := range s.Tokens {
			tk := &s.Tokens[ti]
			if tk.Start < pos || tk.End <= tk.Start || int(tk.End) > len(text) {
				return fmt.Sprintf("token %q at [%d,%d) is out of order or outside the text (previous end %d, text length %d)",
					tk.Form, tk.Start, tk.End, pos, len(text))
			}
			if tk.Form != text[tk.Start:tk.End] {
				return fmt.Sprintf("token %q at [%d,%d) but the text there is %q", tk.Form, tk.Start, tk.End, text[tk.Start:tk.End])
			}
			if strings.IndexFunc(tk.Form, unicode.IsSpace) >= 0 {
				return fmt.Sprintf("token %q at %d contains white space", tk.Form, tk.Start)
			}
			gap := text[pos:tk.Start]
			if !allSpace(gap) {
				return fmt.Sprintf("non-space text %q before token %q at %d is in no token", gap, tk.Form, tk.Start)
			}
			if prev != nil {
				if prev.SpaceAfter != (gap != "") {
					return fmt.Sprintf("token %q at %d: SpaceAfter=%v but the gap after it is %q", prev.Form, prev.Start, prev.SpaceAfter, gap)
				}
				if prev.FusedNext && gap != "" {
					return fmt.Sprintf("token %q at %d is FusedNext but white space follows it", prev.Form, prev.Start)
				}
			}
			line += int32(strings.Count(text[linePos:tk.Start], "\n"))
			linePos = tk.Start
			if tk.Line != line {
				return fmt.Sprintf("token %q at %d has Line %d, want %d", tk.Form, tk.Start, tk.Line, line)
			}
			b.WriteString(gap)
			b.WriteString(tk.Form)
			pos = tk.End
			prev = tk
		}
	}
	rest := text[pos:]
	if !allSpace(rest) {
		return fmt.Sprintf("non-space text %q at the end is in no token", rest)
	}
	if prev != nil {
		if prev.SpaceAfter != (rest != "") {
			return fmt.Sprintf("last token %q: SpaceAfter=%v but the text after it is %q", prev.Form, prev.SpaceAfter, rest)
		}
		if prev.FusedNext {
			return fmt.Sprintf("last token %q is FusedNext", prev.Form)
		}
	}
	b.WriteString(rest)
	if b.String() != text {
		return "tokens and gaps do not rebuild the text"
	}
	return ""
}

func allSpace(s string) bool {
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && n == 1 || !unicode.IsSpace(r) {
			return false
		}
		i += n
	}
	return true
}
