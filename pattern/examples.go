package pattern

import (
	"fmt"
	"strings"

	"glossmith/grammar"
	"glossmith/tagger/doc"
)

// Analyzer turns a text into tagged sentences: the tokenizer and tagger
// the examples are checked with. Token offsets are byte offsets into text.
type Analyzer func(text string) ([]doc.Sentence, error)

// CheckExamples runs every expect/reject example of rs through analyze and
// the rule it names (in the default, leftmost-longest mode):
//
//   - expect RULE: "… [span] …" passes when the bracketed span, once the
//     text is tokenized and tagged, is exactly one of RULE's matches;
//   - reject RULE: "…" passes when RULE matches nowhere in the text.
//
// It returns the number of examples checked and one positioned error per
// failure, naming the rule, what was wanted and what matched instead, with
// the tokens and their tags so that a tagging surprise is easy to see.
func CheckExamples(rs *grammar.RuleSet, analyze Analyzer) (int, grammar.ErrorList) {
	var fails grammar.ErrorList
	matchers := map[string]*Matcher{}
	checked := 0
	for _, ex := range rs.Examples() {
		fail := func(format string, args ...any) {
			fails.Add(ex.Pos, rs.SourceLine(ex.Pos), format, args...)
		}
		m := matchers[ex.Rule]
		if m == nil {
			var err error
			if m, err = Compile(rs, ex.Rule); err != nil {
				fail("%v", err)
				continue
			}
			matchers[ex.Rule] = m
		}
		checked++
		sents, err := analyze(ex.Text)
		if err != nil {
			fail("cannot analyze the example text: %v", err)
			continue
		}
		if ex.Expect {
			checkExpect(m, ex, sents, fail)
			continue
		}
		var found []string
		for _, s := range sents {
			for _, mt := range m.FindAll(s.Tokens) {
				found = append(found, "["+spanText(ex.Text, s.Tokens, mt.Start, mt.End)+"]")
			}
		}
		if len(found) > 0 {
			fail("reject %s: matched %s\n\ttokens: %s", ex.Rule, strings.Join(found, ", "), tagged(sents))
		}
	}
	return checked, fails
}

func checkExpect(m *Matcher, ex *grammar.Example, sents []doc.Sentence, fail func(string, ...any)) {
	// Trim spaces inside the brackets: "[ drip line ]" means "drip line".
	lo, hi := ex.Span[0], ex.Span[1]
	for lo < hi && isSpace(ex.Text[lo]) {
		lo++
	}
	for hi > lo && isSpace(ex.Text[hi-1]) {
		hi--
	}
	want := ex.Text[lo:hi]
	for _, s := range sents {
		start, end := -1, -1
		for i, t := range s.Tokens {
			if int(t.Start) == lo {
				start = i
			}
			if int(t.End) == hi {
				end = i + 1
			}
		}
		if start < 0 && end < 0 {
			continue
		}
		if start < 0 || end < 0 || end <= start {
			fail("expect %s: [%s] does not begin and end on token boundaries\n\ttokens: %s", ex.Rule, want, tagged(sents))
			return
		}
		var got []string
		for _, mt := range m.FindAll(s.Tokens) {
			if mt.Start == start && mt.End == end {
				return
			}
			got = append(got, "["+spanText(ex.Text, s.Tokens, mt.Start, mt.End)+"]")
		}
		instead := "nothing"
		if len(got) > 0 {
			instead = strings.Join(got, ", ")
		}
		fail("expect %s: wanted [%s], matched %s\n\ttokens: %s", ex.Rule, want, instead, tagged(sents))
		return
	}
	fail("expect %s: [%s] does not begin and end on token boundaries within one sentence\n\ttokens: %s", ex.Rule, want, tagged(sents))
}

func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' }

// spanText quotes tokens [start,end) of a sentence from the text.
func spanText(text string, toks []doc.Token, start, end int) string {
	a, b := int(toks[start].Start), int(toks[end-1].End)
	if 0 <= a && a <= b && b <= len(text) {
		return text[a:b]
	}
	parts := make([]string, 0, end-start)
	for _, t := range toks[start:end] {
		parts = append(parts, t.Form)
	}
	return strings.Join(parts, " ")
}

// tagged renders the sentences as word/UPOS/XPOS items.
func tagged(sents []doc.Sentence) string {
	var parts []string
	for i, s := range sents {
		if i > 0 {
			parts = append(parts, "|")
		}
		for _, t := range s.Tokens {
			parts = append(parts, fmt.Sprintf("%s/%s/%s", t.Form, t.UPOS, t.XPOS))
		}
	}
	return strings.Join(parts, " ")
}
