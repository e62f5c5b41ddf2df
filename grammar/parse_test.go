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
	if err != nil {
		t.Fatalf("%s: %v", body, err)
	}
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
		if got := parseRule(t, in); got != want {
			t.Errorf("%s\n got %s\nwant %s", in, got, want)
		}
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
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Uses) != 2 || f.Uses[0].Path != "units.gsr" || f.Uses[1].Stock != "terms" || f.Uses[1].Pos.Line != 3 {
		t.Errorf("uses = %+v %+v", f.Uses[0], f.Uses[1])
	}
	if len(f.Rules) != 2 {
		t.Fatalf("rules = %d", len(f.Rules))
	}
	if r := f.Rules[0]; r.Name != "valve_part" || r.Doc != "A valve part: \"valve body\", \"valve seat\".\nSecond line of the doc." || r.Pos.Line != 7 || r.Pos.Col != 1 {
		t.Errorf("rule 0 = %q doc %q at %v", r.Name, r.Doc, r.Pos)
	}
	if f.Rules[1].Doc != "" {
		t.Errorf("doc of unrelated = %q", f.Rules[1].Doc)
	}
	if len(f.Examples) != 3 {
		t.Fatalf("examples = %d", len(f.Examples))
	}
	e := f.Examples[0]
	if !e.Expect || e.Rule != "valve_part" || e.Text != "Check the valve seat for grit." || e.Text[e.Span[0]:e.Span[1]] != "valve seat" || e.Pos.Line != 12 {
		t.Errorf("example 0 = %+v", e)
	}
	if e := f.Examples[1]; e.Expect || e.Text != "The valve opened." {
		t.Errorf("example 1 = %+v", e)
	}
	if e := f.Examples[2]; e.Text != "the valve [1] body" || e.Text[e.Span[0]:e.Span[1]] != "valve [1] body" {
		t.Errorf("example 2 = %+v", e)
	}
}

// wantErrors checks that src yields exactly the errors listed, each as
// "line:col: substring of the message".
func wantErrors(t *testing.T, err error, want ...string) {
	t.Helper()
	el, ok := err.(ErrorList)
	if !ok {
		t.Fatalf("error %v (%T) is not an ErrorList", err, err)
	}
	if len(el) != len(want) {
		t.Fatalf("got %d errors, want %d:\n%s", len(el), len(want), el.Format())
	}
	for i, w := range want {
		pos, msg, _ := strings.Cut(w, ": ")
		got := el[i]
		if gp := strings.TrimPrefix(got.Pos.String(), got.Pos.File+":"); gp != pos || !strings.Contains(got.Msg, msg) {
			t.Errorf("error %d = %s: %s\nwant %s: …%s…", i, gp, got.Msg, pos, msg)
		}
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
	el := err.(ErrorList)
	c := el[0].Caret()
	if c != "x = \"valve ;\n    ^" {
		t.Errorf("caret:\n%s", c)
	}
	// Unicode before the column: columns count characters.
	_, err = ParseString("u.gsr", `r = "größe" % ;`)
	el = err.(ErrorList)
	if el[0].Pos.Col != 13 || el[0].Caret() != "r = \"größe\" % ;\n            ^" {
		t.Errorf("pos %v caret:\n%s", el[0].Pos, el[0].Caret())
	}
	if !strings.Contains(el.Format(), "u.gsr:1:13: unexpected character '%'\n    r = \"größe\" % ;\n                ^\n") {
		t.Errorf("Format:\n%s", el.Format())
	}
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
	if err != nil {
		t.Fatal(err)
	}
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
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
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
	if err != nil {
		t.Fatal(err.(ErrorList).Format())
	}
	names := strings.Join(rs.Names(), " ")
	// Used files come first, each once (common.gsr is used twice), in the
	// order of the use statements; stock rules after them.
	if !strings.HasPrefix(names, "number unit part _modifier") || !strings.HasSuffix(names, "acronym valve_spec") {
		t.Errorf("rules in order: %s", names)
	}
	if len(rs.Files) != 5 {
		t.Errorf("%d files loaded", len(rs.Files))
	}
	if rs.Rule("unit").Pos.File != filepath.Join(dir, "lib/units.gsr") {
		t.Errorf("unit from %s", rs.Rule("unit").Pos.File)
	}
}

func TestUseErrors(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"a.gsr": "use \"b.gsr\"\na = NOUN ;\n",
		"b.gsr": "use \"c.gsr\"\nb = ADJ ;\n",
		"c.gsr": "use \"a.gsr\"\nuse \"missing.gsr\"\nuse stock term\nc = VERB ;\n",
	})
	_, err := Load(filepath.Join(dir, "a.gsr"))
	el := err.(ErrorList)
	if len(el) != 3 {
		t.Fatalf("errors:\n%s", el.Format())
	}
	msgs := el.Format()
	for _, want := range []string{
		"c.gsr:1:1: use cycle: " + filepath.Join(dir, "a.gsr") + " → " + filepath.Join(dir, "b.gsr") + " → " + filepath.Join(dir, "c.gsr") + " → " + filepath.Join(dir, "a.gsr"),
		"c.gsr:2:1: cannot read used file " + filepath.Join(dir, "missing.gsr") + ": no such file or directory",
		"c.gsr:3:1: no stock rule set \"term\" — did you mean \"terms\"?",
	} {
		if !strings.Contains(msgs, want) {
			t.Errorf("missing %q in\n%s", want, msgs)
		}
	}
	if _, err := Load(filepath.Join(dir, "nope.gsr")); err == nil || !strings.Contains(err.Error(), "nope.gsr") {
		t.Errorf("missing top file: %v", err)
	}
	if rs, err := Load("stock:pairs", "stock:terms"); err != nil || rs.Rule("adj_noun") == nil || rs.Rule("term") == nil {
		t.Errorf("Load(stock:…) = %v", err)
	}
}

func TestStockSets(t *testing.T) {
	names := StockNames()
	if strings.Join(names, " ") != "pairs phrases terms" {
		t.Fatalf("stock names %v", names)
	}
	rs, err := LoadStock(names...)
	if err != nil {
		t.Fatal(err.(ErrorList).Format())
	}
	for _, r := range rs.Rules {
		if r.Doc == "" {
			t.Errorf("%s: stock rule %s has no documentation comment", r.Pos, r.Name)
		}
	}
	pairs := map[string]bool{"adj_noun": true, "noun_noun": true, "verb_obj": true, "adv_adj": true, "verb_particle": true, "noun_of_noun": true}
	for name := range pairs {
		r := rs.Rule(name)
		if r == nil {
			t.Errorf("pairs lacks %s", name)
			continue
		}
		labels := map[string]bool{}
		Walk(r.Expr, func(n Node) {
			if l, ok := n.(*Label); ok {
				labels[l.Name] = true
			}
		})
		if !labels["node"] || !labels["collocate"] || len(labels) != 2 {
			t.Errorf("%s labels %v, want exactly node and collocate", name, labels)
		}
	}
	if _, err := Stock("nope"); err == nil {
		t.Error("Stock(nope) gave no error")
	}
}

func TestParsePattern(t *testing.T) {
	base, err := LoadStock("terms")
	if err != nil {
		t.Fatal(err)
	}
	rs, err := ParsePattern(`term "of" term`, base)
	if err != nil {
		t.Fatal(err)
	}
	if rs.Rule(PatternRule) == nil || base.Rule(PatternRule) != nil || len(rs.Rules) != len(base.Rules)+1 {
		t.Errorf("pattern set has %d rules, base %d", len(rs.Rules), len(base.Rules))
	}
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
	if _, err := ParseFile(filepath.Join(t.TempDir(), "none.gsr")); err == nil {
		t.Error("no error for a missing file")
	}
}

func TestByteOrderMarkAndCRLF(t *testing.T) {
	f, err := ParseString("bom.gsr", "\ufeff# doc line\r\nterm = ADJ* NOUN ;\r\nbad = NUON ;\r\n")
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Rules) != 2 || f.Rules[0].Doc != "doc line" || f.Rules[1].Pos.Line != 3 {
		t.Errorf("rules %+v", f.Rules[0])
	}
	_, err = LoadFiles(f)
	wantErrors(t, err, "3:7: unknown tag NUON")
	if c := err.(ErrorList)[0].Caret(); c != "bad = NUON ;\n      ^" {
		t.Errorf("caret %q", c)
	}
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
