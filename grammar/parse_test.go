package grammar

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func parseRule(t *testing.T, body string) string {
	t.Helper()
	f, err := ParseString("t.gsr", "r = "+body+" ;")
	require.NoError(t, err, body)
	return Format(f.Rules[0].Expr)
}

// The binding order is fixed by the language reference: ! binds tightest,
// then &, then repetition, then sequence, then |.
func TestPrecedence(t *testing.T) {
	for in, want := range map[string]string{
		`ADJ | VERB & xpos:VBN`:        `(ADJ | (VERB & xpos:VBN))`,
		`!ADJ & NOUN`:                  `(!ADJ & NOUN)`,
		`!(ADJ & NOUN)`:                `!(ADJ & NOUN)`,
		`ADJ NOUN | VERB`:              `((ADJ NOUN) | VERB)`,
		`ADJ* NOUN+`:                   `((ADJ)* (NOUN)+)`,
		`(ADJ NOUN)*`:                  `((ADJ NOUN))*`,
		`NOUN & xpos:NNS+`:             `((NOUN & xpos:NNS))+`,
		`!NOUN?`:                       `(!NOUN)?`,
		`(ADJ | NOUN){2,3} NOUN`:       `(((ADJ | NOUN)){2,3} NOUN)`,
		`NOUN{2}`:                      `(NOUN){2}`,
		`NOUN{2,}`:                     `(NOUN){2,}`,
		`@h NOUN+ "of"`:                `(@h (NOUN)+ "of")`,
		`^ _ $`:                        `(^ _ $)`,
		`"in order to"`:                `("in" "order" "to")`,
		`'Valve' "VALVE"`:              `('Valve' "valve")`,
		`lemma:Valve begins:UN`:        `(lemma:"valve" begins:"un")`,
		`xpos:PRP$ chars:Aa+-9`:        `(xpos:PRP$ chars:"Aa+-9")`,
		`xpos:/^VB/ /^[A-Z]{2,5}$/`:    `(xpos:/^VB/ /^[A-Z]{2,5}$/)`,
		`term "of" DET? term`:          `(term "of" (DET)? term)`,
		`ADJ|NOUN|PROPN|VERB&xpos:VBN`: `(ADJ | NOUN | PROPN | (VERB & xpos:VBN))`,
		`a & b & c`:                    `(a & b & c)`,
		`"a\"b" 'it\'s'`:               `("a\"b" 'it\'s')`,
	} {
		assert.Equal(t, want, parseRule(t, in), in)
	}
}

func TestStatements(t *testing.T) {
	src := `# valves.gsr — rules for the irrigation manual
use "units.gsr"
use stock terms ;

# A valve part: "valve body", "valve seat".
# Second line of the doc.
valve_part = "valve" NOUN ;

# not a doc: a blank line follows

unrelated = NOUN ;
expect valve_part: "Check the [valve seat] for grit." ;   # trailing comment
reject valve_part: "The valve opened." ;
expect valve_part:"the [valve \[1\] body]" ;
`
	f, err := ParseString("valves.gsr", src)
	require.NoError(t, err)
	require.Len(t, f.Uses, 2)
	assert.Equal(t, "units.gsr", f.Uses[0].Path)
	assert.Equal(t, "terms", f.Uses[1].Stock)
	assert.Equal(t, 3, f.Uses[1].Pos.Line)
	require.Len(t, f.Rules, 2)
	r := f.Rules[0]
	assert.Equal(t, "valve_part", r.Name)
	assert.Equal(t, "A valve part: \"valve body\", \"valve seat\".\nSecond line of the doc.", r.Doc)
	assert.Equal(t, [2]int{7, 1}, [2]int{r.Pos.Line, r.Pos.Col})
	assert.Equal(t, [2]int{7, 28}, [2]int{r.End.Line, r.End.Col}, "just past the ';'")
	assert.Empty(t, f.Rules[1].Doc, "a blank line parts a comment from the rule")
	require.Len(t, f.Examples, 3)
	e := f.Examples[0]
	assert.True(t, e.Expect)
	assert.Equal(t, "valve_part", e.Rule)
	assert.Equal(t, "Check the valve seat for grit.", e.Text)
	assert.Equal(t, "valve seat", e.Text[e.Span[0]:e.Span[1]])
	assert.Equal(t, 12, e.Pos.Line)
	assert.False(t, f.Examples[1].Expect)
	assert.Equal(t, "The valve opened.", f.Examples[1].Text)
	e = f.Examples[2]
	assert.Equal(t, "the valve [1] body", e.Text)
	assert.Equal(t, "valve [1] body", e.Text[e.Span[0]:e.Span[1]])
}

// wantErrors checks that src yields exactly the errors listed, each as
// "line:col: substring of the message".
func wantErrors(t *testing.T, err error, want ...string) {
	t.Helper()
	var el ErrorList
	require.ErrorAs(t, err, &el)
	require.Len(t, el, len(want), el.Format())
	for i, w := range want {
		pos, msg, _ := strings.Cut(w, ": ")
		got := el[i]
		assert.Equal(t, pos, strings.TrimPrefix(got.Pos.String(), got.Pos.File+":"), "error %d: %s", i, got.Msg)
		assert.Contains(t, got.Msg, msg, "error %d", i)
	}
}

func TestSyntaxErrors(t *testing.T) {
	_, err := ParseString("e.gsr", `a = NOUN
b = ADJ ;
c = ( NOUN ;
d = "open ;
e = NOUN % ;
f = NOUN{3,1} ;
g = /a(/ ;
h = lema:valve ;
i = NOUN{2000} ;
ok = NOUN ;
expect ok: "no span here" ;
reject ok: "a [span]" ;
expect ok: "[unclosed" ;
NOUN = ADJ ;
use = ADJ ;
j = @x ^ ;
k = (@x NOUN) & ADJ ;
l = @x NOUN @x ADJ ;
m = ^* ;
n = xpos:/x/ begins:/y/ ;
`)
	wantErrors(t, err,
		"2:3: unexpected '=': is the ';' at the end of the rule above missing?",
		"3:12: unexpected ';' (expected ')')",
		"4:5: unterminated string",
		"5:10: unexpected character '%'",
		"6:9: upper bound is below the lower one",
		"7:5: bad regular expression /a(/: missing closing )",
		"8:5: unknown test lema: — did you mean \"lemma:\"?",
		"9:9: bad repetition count 2000",
		"11:12: an expect example marks the span",
		"12:12: a reject example has no [span]",
		"13:12: '[' without a matching ']'",
		"14:1: NOUN is a UPOS tag and cannot name a rule",
		"15:1: \"use\" is a reserved word",
		"16:5: a label cannot name an anchor",
		"17:6: a label cannot stand inside & or !",
		"18:13: label @x is used twice in one sequence",
		"19:6: an anchor (^ or $) cannot be repeated",
		"20:21: begins: takes plain letters",
	)
}

func TestErrorCaret(t *testing.T) {
	_, err := ParseString("c.gsr", "term =\tADJ* NUON ;\nx = \"valve ;\n")
	var el ErrorList
	require.ErrorAs(t, err, &el)
	assert.Equal(t, "x = \"valve ;\n    ^", el[0].Caret())
	// Unicode before the column: columns count characters.
	_, err = ParseString("u.gsr", `r = "größe" % ;`)
	require.ErrorAs(t, err, &el)
	assert.Equal(t, 13, el[0].Pos.Col)
	assert.Equal(t, "r = \"größe\" % ;\n            ^", el[0].Caret())
	assert.Contains(t, el.Format(), "u.gsr:1:13: unexpected character '%'\n    r = \"größe\" % ;\n                ^\n")
}

func TestSetErrors(t *testing.T) {
	f, err := ParseString("s.gsr", `term = modifier* NUON ;
modifier = ADJ | NOUN | modifer ;
loop_a = loop_b NOUN ;
loop_b = ADJ loop_a? ;
seq = ADJ NOUN ;
bad_and = seq & NOUN ;
term = NOUN ;
expect trem: "the [valve]" ;
noun_ = noun ;
`)
	require.NoError(t, err)
	_, err = LoadFiles(f)
	wantErrors(t, err,
		"1:18: unknown tag NUON — did you mean \"NOUN\"?",
		"2:25: undefined rule modifer — did you mean \"modifier\"?",
		"4:14: rule cycle: loop_a → loop_b → loop_a",
		"6:11: & and ! combine tests of one token",
		"7:1: rule term is defined twice (first at s.gsr:1:1)",
		"8:1: example for undefined rule trem — did you mean \"term\"?",
		"9:9: undefined rule noun — did you mean \"NOUN\"?",
	)
}

func writeFiles(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, src := range files {
		p := filepath.Join(dir, name)
		require.NoError(t, os.MkdirAll(filepath.Dir(p), 0o755))
		require.NoError(t, os.WriteFile(p, []byte(src), 0o644))
	}
	return dir
}

func TestUseResolution(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"main.gsr":       "use \"lib/units.gsr\"\nuse \"lib/parts.gsr\"\nuse stock terms\nvalve_spec = number unit part ;\n",
		"lib/units.gsr":  "use \"common.gsr\"\nunit = \"mm\" | \"bar\" | \"l/h\" ;\n",
		"lib/parts.gsr":  "use \"common.gsr\"\npart = \"valve\" | \"emitter\" ;\n",
		"lib/common.gsr": "number = NUM ;\n",
	})
	rs, err := Load(filepath.Join(dir, "main.gsr"))
	require.NoError(t, err)
	names := strings.Join(rs.Names(), " ")
	// Used files come first, each once (common.gsr is used twice), in the
	// order of the use statements; stock rules after them.
	assert.True(t, strings.HasPrefix(names, "number unit part _modifier"), names)
	assert.True(t, strings.HasSuffix(names, "acronym valve_spec"), names)
	assert.Len(t, rs.Files, 5)
	assert.Equal(t, filepath.Join(dir, "lib/units.gsr"), rs.Rule("unit").Pos.File)
}

func TestUseErrors(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"a.gsr": "use \"b.gsr\"\na = NOUN ;\n",
		"b.gsr": "use \"c.gsr\"\nb = ADJ ;\n",
		"c.gsr": "use \"a.gsr\"\nuse \"missing.gsr\"\nuse stock term\nc = VERB ;\n",
	})
	_, err := Load(filepath.Join(dir, "a.gsr"))
	var el ErrorList
	require.ErrorAs(t, err, &el)
	require.Len(t, el, 3, el.Format())
	msgs := el.Format()
	for _, want := range []string{
		"c.gsr:1:1: use cycle: " + filepath.Join(dir, "a.gsr") + " → " + filepath.Join(dir, "b.gsr") + " → " + filepath.Join(dir, "c.gsr") + " → " + filepath.Join(dir, "a.gsr"),
		"c.gsr:2:1: cannot read used file " + filepath.Join(dir, "missing.gsr") + ": no such file or directory",
		"c.gsr:3:1: no stock rule set \"term\" — did you mean \"terms\"?",
	} {
		assert.Contains(t, msgs, want)
	}
	_, err = Load(filepath.Join(dir, "nope.gsr"))
	assert.ErrorContains(t, err, "nope.gsr")
	rs, err := Load("stock:pairs", "stock:terms")
	require.NoError(t, err)
	assert.NotNil(t, rs.Rule("adj_noun"))
	assert.NotNil(t, rs.Rule("term"))
}

func TestStockSets(t *testing.T) {
	names := StockNames()
	require.Equal(t, []string{"pairs", "phrases", "terms"}, names)
	rs, err := LoadStock(names...)
	require.NoError(t, err)
	for _, r := range rs.Rules {
		assert.NotEmpty(t, r.Doc, "%s: stock rule %s has no documentation comment", r.Pos, r.Name)
	}
	pairs := map[string]bool{"adj_noun": true, "noun_noun": true, "verb_obj": true, "adv_adj": true, "verb_particle": true, "noun_of_noun": true}
	for name := range pairs {
		r := rs.Rule(name)
		if !assert.NotNil(t, r, "pairs lacks %s", name) {
			continue
		}
		labels := map[string]bool{}
		Walk(r.Expr, func(n Node) {
			if l, ok := n.(*Label); ok {
				labels[l.Name] = true
			}
		})
		assert.Equal(t, map[string]bool{"node": true, "collocate": true}, labels, name)
	}
	_, err = Stock("nope")
	assert.Error(t, err)
}

func TestParsePattern(t *testing.T) {
	base, err := LoadStock("terms")
	require.NoError(t, err)
	rs, err := ParsePattern(`term "of" term`, base)
	require.NoError(t, err)
	assert.NotNil(t, rs.Rule(PatternRule))
	assert.Nil(t, base.Rule(PatternRule), "the base set is not changed")
	assert.Len(t, rs.Rules, len(base.Rules)+1)
	assert.Equal(t, Pos{File: "pattern", Line: 1, Col: 11, Offset: 10}, rs.Rule(PatternRule).Expr.(*Seq).Items[2].Position(), "positions are the pattern's own")
	_, err = ParsePattern(`ADJ (NOUN`, nil)
	wantErrors(t, err, "1:10: unexpected end of pattern (expected ')')")
	_, err = ParsePattern(`ADJ trm`, base)
	wantErrors(t, err, "1:5: undefined rule trm — did you mean \"term\"?")
}

// The rule samples of the guide and of the README (fences marked gsr) must
// load as whole files: the documents may not teach syntax the parser
// rejects, nor use files that do not exist.
func TestDocumentSamplesLoad(t *testing.T) {
	for _, doc := range []string{"LANGUAGE.md", "../README.md"} {
		b, err := os.ReadFile(doc)
		require.NoError(t, err)
		samples := RuleSamples(string(b))
		require.NotEmpty(t, samples, doc)
		for _, s := range samples {
			name := fmt.Sprintf("%s:%d", doc, s.Line)
			// Blank lines in front keep the positions of errors those of
			// the document.
			f, err := ParseString(doc, strings.Repeat("\n", s.Line-1)+s.Text)
			if assert.NoError(t, err, "%s:\n%s", name, s.Text) {
				_, err = LoadFiles(f)
				assert.NoError(t, err, "%s:\n%s", name, s.Text)
			}
		}
	}
	b, err := os.ReadFile("LANGUAGE.md")
	require.NoError(t, err)
	for _, want := range []string{"ADJ | VERB & xpos:VBN", "`!ADJ & NOUN`", "leftmost", "@node term", "`A+-9+`"} {
		assert.Contains(t, string(b), want)
	}
}

func TestRuleSamples(t *testing.T) {
	md := "text\n```gsr\na = NOUN ;\n```\n\n```text\nnot = rules\n```\n```\nplain\n```\n  ```gsr\nb = ADJ ;\n  ```\n"
	assert.Equal(t, []Sample{{Line: 3, Text: "a = NOUN ;\n"}, {Line: 13, Text: "b = ADJ ;\n"}}, RuleSamples(md))
}

func TestParseFileMissing(t *testing.T) {
	_, err := ParseFile(filepath.Join(t.TempDir(), "none.gsr"))
	assert.Error(t, err)
}

func TestByteOrderMarkAndCRLF(t *testing.T) {
	f, err := ParseString("bom.gsr", "\ufeff# doc line\r\nterm = ADJ* NOUN ;\r\nbad = NUON ;\r\n")
	require.NoError(t, err)
	require.Len(t, f.Rules, 2)
	assert.Equal(t, "doc line", f.Rules[0].Doc)
	assert.Equal(t, 3, f.Rules[1].Pos.Line)
	_, err = LoadFiles(f)
	wantErrors(t, err, "3:7: unknown tag NUON")
	assert.Equal(t, "bad = NUON ;\n      ^", err.(ErrorList)[0].Caret())
}

func TestBareWordSaysQuoteIt(t *testing.T) {
	_, err := ParsePattern("ADJ valve", nil)
	require.Error(t, err)
	assert.Equal(t, `pattern:1:5: undefined rule valve — to match the word, quote it: "valve"`, err.Error())
	var list ErrorList
	require.ErrorAs(t, err, &list)
	assert.Equal(t, "ADJ valve\n    ^", list[0].Caret())
}

func TestPatternMessages(t *testing.T) {
	for src, want := range map[string]string{
		"":           "pattern:1:1: empty pattern",
		"ADJ (NOUN":  "pattern:1:10: unexpected end of pattern (expected ')')",
		"NOUN ;":     "pattern:1:6: unexpected ';': a pattern is one rule body",
		"r = NOUN":   "pattern:1:3: unexpected '=': a pattern is one rule body",
		"NOUN\nADJ":  "pattern:1:1: a pattern is one line",
		"NOUN | % X": "pattern:1:8: unexpected character '%'",
	} {
		_, err := ParsePattern(src, nil)
		assert.ErrorContains(t, err, want, "%q", src)
	}
}
