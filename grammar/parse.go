package grammar

import (
	"errors"
	"os"
	"regexp"
	"strings"

	"github.com/alecthomas/participle/v2"
	"github.com/alecthomas/participle/v2/lexer"
)

// File is one parsed rule file.
type File struct {
	// Name is the file's path as given (or "stock/NAME.gsr" for a built-in set).
	Name string
	// Src is the file's text.
	Src string
	// Uses lists the file's `use` statements in order.
	Uses []*Use
	// Rules in file order.
	Rules []*Rule
	// Examples in file order (each is also attached to its rule by Load).
	Examples []*Example

	lines *lineTable
}

// Use is a `use "path"` or `use stock NAME` statement.
type Use struct {
	Pos   Pos
	Path  string // for use "path": the path as written
	Stock string // for use stock NAME: the set's name
}

// Rule is a named pattern.
type Rule struct {
	Name string
	// Doc is the text of the `#` comment lines directly above the rule, with
	// the leading "#" and one space removed, lines joined by "\n".
	Doc  string
	Pos  Pos
	Expr Node
	// Examples holds the rule's expect/reject examples from every loaded file
	// (filled by Load).
	Examples []*Example
}

// Example is an `expect RULE: "…[span]…"` or `reject RULE: "…"` statement.
type Example struct {
	Pos    Pos
	Rule   string
	Expect bool
	// Text is the example's text with the brackets removed.
	Text string
	// Span is the byte range of the bracketed part within Text (expect only).
	Span [2]int
}

// Reserved words cannot name rules.
var reserved = map[string]bool{"use": true, "expect": true, "reject": true, "stock": true, "_": true}

var gsrLexer = lexer.MustSimple([]lexer.SimpleRule{
	{Name: "Comment", Pattern: `#[^\n]*`},
	{Name: "Whitespace", Pattern: `[ \t\r\n]+`},
	// A chars: value may hold '+' (a run of one class, as in chars:Aa+).
	{Name: "CharsField", Pattern: `chars:(?:/(?:\\.|[^/\\\n])*/|"(?:\\.|[^"\\\n])*"|'(?:\\.|[^'\\\n])*'|[^\s;|&()!{}*?#"'/@\[\]]+)`},
	{Name: "Field", Pattern: `[A-Za-z_][A-Za-z0-9_]*:(?:/(?:\\.|[^/\\\n])*/|"(?:\\.|[^"\\\n])*"|'(?:\\.|[^'\\\n])*'|[^\s;|&()!{}*+?#"'/@\[\]]+)`},
	{Name: "Ident", Pattern: `[A-Za-z_][A-Za-z0-9_]*`},
	{Name: "Label", Pattern: `@[A-Za-z_][A-Za-z0-9_]*`},
	{Name: "String", Pattern: `"(?:\\.|[^"\\\n])*"`},
	{Name: "Raw", Pattern: `'(?:\\.|[^'\\\n])*'`},
	{Name: "Regex", Pattern: `/(?:\\.|[^/\\\n])*/`},
	{Name: "Number", Pattern: `[0-9]+`},
	{Name: "Punct", Pattern: `[|&!?*+(){},:;^$=]`},
	// Anything else becomes a Bad token, so that the parser (not the lexer)
	// reports it with a clear message.
	{Name: "Unterminated", Pattern: `["'/][^\n]*`},
	{Name: "Bad", Pattern: `.`},
})

type pFile struct {
	Stmts []*pStmt `parser:"@@*"`
}

type pStmt struct {
	Use     *pUse     `parser:"@@"`
	Example *pExample `parser:"| @@"`
	Rule    *pRule    `parser:"| @@"`
}

type pUse struct {
	Pos   lexer.Position
	Stock *pToken `parser:"\"use\" ( \"stock\" @@"`
	Path  *pStr   `parser:"| @@ ) \";\"?"`
}

// pToken captures one name with its position.
type pToken struct {
	Pos   lexer.Position
	Value string `parser:"@Ident"`
}

// pStr captures one quoted string with its position.
type pStr struct {
	Pos   lexer.Position
	Value string `parser:"@(String | Raw)"`
}

type pExample struct {
	Pos   lexer.Position
	Kind  string  `parser:"@(\"expect\" | \"reject\")"`
	Rule  string  `parser:"( @Ident \":\""`
	Text  *pStr   `parser:"@@"`
	Field *pField `parser:"| @@ ) \";\""`
}

type pField struct {
	Pos   lexer.Position
	Value string `parser:"@(Field | CharsField)"`
}

type pRule struct {
	Pos  lexer.Position
	Name string `parser:"@Ident \"=\""`
	Body *pAlt  `parser:"@@ \";\""`
}

type pAlt struct {
	Pos  lexer.Position
	Seqs []*pSeq `parser:"@@ ( \"|\" @@ )*"`
}

type pSeq struct {
	Pos   lexer.Position
	Elems []*pElem `parser:"@@+"`
}

type pElem struct {
	Pos   lexer.Position
	Label string  `parser:"@Label?"`
	Conj  *pConj  `parser:"@@"`
	Quant *pQuant `parser:"@@?"`
}

type pQuant struct {
	Pos   lexer.Position
	Op    string `parser:"(  @(\"?\" | \"*\" | \"+\")"`
	Min   string `parser:"| \"{\" @Number"`
	Comma bool   `parser:"@\",\"?"`
	Max   string `parser:"@Number? \"}\" )"`
}

type pConj struct {
	Pos   lexer.Position
	Terms []*pNot `parser:"@@ ( \"&\" @@ )*"`
}

type pNot struct {
	Pos   lexer.Position
	Bangs []string `parser:"@\"!\"*"`
	Atom  *pAtom   `parser:"@@"`
}

type pAtom struct {
	Pos   lexer.Position
	Group *pAlt  `parser:"\"(\" @@ \")\""`
	Field string `parser:"| @(Field | CharsField)"`
	Regex string `parser:"| @Regex"`
	Str   string `parser:"| @String"`
	Raw   string `parser:"| @Raw"`
	Begin bool   `parser:"| @\"^\""`
	End   bool   `parser:"| @\"$\""`
	Ident string `parser:"| @Ident"`
}

var parser = participle.MustBuild[pFile](
	participle.Lexer(gsrLexer),
	participle.Elide("Comment", "Whitespace"),
)

// ParseFile reads and parses the rule file at path. It returns the file even
// when there are errors (with whatever could be parsed), together with an
// ErrorList; an unreadable file gives a plain error.
func ParseFile(path string) (*File, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return ParseString(path, string(b))
}

// maxParseErrors bounds the syntax errors reported for one file.
const maxParseErrors = 50

// ParseString parses src as a rule file called name. Syntax errors do not
// stop the parse: the statement in error is skipped up to its `;` and
// parsing goes on, so that one run reports every broken statement. The
// error, if not nil, is an ErrorList.
func ParseString(name, src string) (*File, error) {
	f := &File{Name: name, Src: src, lines: newLineTable(name, src)}
	var errs ErrorList
	from := 0
	if strings.HasPrefix(src, "\ufeff") { // a byte order mark, as some editors write
		from = len("\ufeff")
	}
	for {
		pf, err := parser.ParseString(name, blankBefore(src, from))
		if err == nil {
			f.convert(pf, &errs)
			break
		}
		off := errorOffset(err, src)
		if off < from {
			off = from
		}
		f.lines.errorf(&errs, off, "%s", parseMessage(err))
		// Keep the statements that end before the error.
		if b := lastSemicolon(src, from, off); b > from {
			if pf, err := parser.ParseString(name, blankBefore(src[:b], from)); err == nil {
				f.convert(pf, &errs)
			}
		}
		next := resumeAfter(src, off)
		if next < 0 || len(errs) >= maxParseErrors {
			break
		}
		from = next
	}
	f.checkLocal(&errs)
	errs.Sort()
	return f, errs.Err()
}

// blankBefore returns src with every byte before from replaced by a space,
// keeping newlines, so that positions in the rest stay right.
func blankBefore(src string, from int) string {
	if from <= 0 {
		return src
	}
	b := []byte(src)
	for i := 0; i < from && i < len(b); i++ {
		if b[i] != '\n' {
			b[i] = ' '
		}
	}
	return string(b)
}

func errorOffset(err error, src string) int {
	var pe participle.Error
	if errors.As(err, &pe) {
		p := pe.Position()
		if p.Offset > 0 || p.Line > 0 {
			return p.Offset
		}
	}
	return len(src)
}

// parseMessage turns participle's message into one for people who write
// rules, not grammars.
func parseMessage(err error) string {
	var ut *participle.UnexpectedTokenError
	if errors.As(err, &ut) {
		tok := ut.Unexpected
		// Name what was expected only when it is one plain symbol.
		expected := ""
		if m := expectedRe.FindStringSubmatch(ut.Message()); m != nil {
			expected = " (expected '" + m[1] + "')"
		}
		syms := gsrLexer.Symbols()
		switch {
		case tok.EOF():
			if expected != "" && expected != " (expected ';')" {
				return "unexpected end of file" + expected
			}
			return "unexpected end of file: is the ';' after the last rule missing?"
		case tok.Value == "=":
			return "unexpected '=': is the ';' at the end of the rule above missing?"
		case tok.Type == syms["Unterminated"]:
			if tok.Value[0] == '/' {
				return "unterminated regular expression: missing closing '/'"
			}
			return "unterminated string: missing closing " + string(tok.Value[0])
		case tok.Type == syms["Bad"]:
			return "unexpected character " + quoteToken(tok.Value)
		case tok.Type == syms["Label"]:
			return "a label must be followed by the element it names, as in @node NOUN"
		case tok.Value == ";" && expected == "":
			return "unexpected ';': something is missing before it"
		}
		return "unexpected " + quoteToken(tok.Value) + expected
	}
	var pe participle.Error
	if errors.As(err, &pe) {
		return strings.TrimPrefix(pe.Message(), "lexer: ")
	}
	return err.Error()
}

var expectedRe = regexp.MustCompile(`\(expected "([^"\s]+)"\)$`)

func quoteToken(s string) string {
	if strings.ContainsRune(s, '\'') {
		return `"` + s + `"`
	}
	return "'" + s + "'"
}

// scanSemicolons lists the offsets of statement-ending semicolons in
// src[from:to], skipping comments, strings and regular expressions.
func scanSemicolons(src string, from, to int, first bool) []int {
	var out []int
	for i := from; i < to && i < len(src); i++ {
		switch c := src[i]; c {
		case '#':
			for i < len(src) && src[i] != '\n' {
				i++
			}
		case '"', '\'', '/':
			for i++; i < len(src) && src[i] != c && src[i] != '\n'; i++ {
				if src[i] == '\\' {
					i++
				}
			}
		case ';':
			out = append(out, i)
			if first {
				return out
			}
		}
	}
	return out
}

// lastSemicolon returns the offset just past the last `;` in src[from:to],
// or from when there is none.
func lastSemicolon(src string, from, to int) int {
	s := scanSemicolons(src, from, to, false)
	if len(s) == 0 {
		return from
	}
	return s[len(s)-1] + 1
}

// statementStart matches a line that begins a new statement.
var statementStart = regexp.MustCompile(`(?m)^(?:[A-Za-z_][A-Za-z0-9_]*[ \t]*=|use\b|expect\b|reject\b)`)

// resumeAfter returns where parsing goes on after a syntax error at off:
// after the next `;`, or at the next line that starts a statement if that
// comes first (so that an unterminated string, which hides the `;` of its
// own line, does not swallow the next rule). It returns -1 at the end.
func resumeAfter(src string, off int) int {
	next := -1
	if q := nextSemicolon(src, off); q >= 0 {
		next = q + 1
	}
	if nl := strings.IndexByte(src[off:], '\n'); nl >= 0 {
		lineEnd := off + nl + 1
		if loc := statementStart.FindStringIndex(src[lineEnd:]); loc != nil && (next < 0 || lineEnd+loc[0] < next) {
			next = lineEnd + loc[0]
		}
	}
	return next
}

// nextSemicolon returns the offset of the first `;` at or after from, or -1.
func nextSemicolon(src string, from int) int {
	s := scanSemicolons(src, from, len(src), true)
	if len(s) == 0 {
		return -1
	}
	return s[0]
}
