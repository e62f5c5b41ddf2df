package grammar

import (
	"errors"
	"fmt"
	"io"
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
	docs  map[int]string // docAbove's results by line
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
	Doc string
	Pos Pos
	// End is the position just past the rule's closing ';'.
	End  Pos
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

// MaxNesting is the deepest nesting of parentheses and `!` a rule may
// have. Real rules stay within a handful of levels; the limit keeps the
// parser's and the checks' recursion bounded, so that no file can make
// them run out of stack or take quadratic time.
const MaxNesting = 100

// MaxFileSize is the largest rule file read (1 MiB, some thousand times
// the stock sets). Files are read through a reader limited to it, so that
// naming a device or a huge file cannot grow memory.
const MaxFileSize = 1 << 20

// ParseFile reads and parses the rule file at path. It returns the file even
// when there are errors (with whatever could be parsed), together with an
// ErrorList; an unreadable or too large file gives a plain error.
func ParseFile(path string) (*File, error) {
	b, err := readRuleFile(path)
	if err != nil {
		return nil, err
	}
	return ParseString(path, string(b))
}

// readRuleFile reads at most MaxFileSize bytes of path and fails on a
// longer file, whatever kind of file it is.
func readRuleFile(path string) ([]byte, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	b, err := io.ReadAll(io.LimitReader(fh, MaxFileSize+1))
	if err != nil {
		return nil, err
	}
	if len(b) > MaxFileSize {
		return nil, fmt.Errorf("larger than %d bytes, the most a rule file may hold", MaxFileSize)
	}
	return b, nil
}

// maxParseErrors bounds the syntax errors reported for one file.
const maxParseErrors = 50

// The rule language's tokens. Comments and white space are dropped before
// the grammar sees the tokens. Field tokens carry key, colon and value in
// one, so that `xpos:NN` and `xpos: NN` cannot be confused.
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

// The grammar, as participle structs; convert.go turns a parsed statement
// into the AST of ast.go.
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
	Pos    lexer.Position
	EndPos lexer.Position // just past the ';'
	Name   string         `parser:"@Ident \"=\""`
	Body   *pAlt          `parser:"@@ \";\""`
}

// pPattern is a rule body on its own, as given on the command line.
type pPattern struct {
	Body *pAlt `parser:"@@"`
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

var (
	fileParser = participle.MustBuild[pFile](
		participle.Lexer(gsrLexer),
		participle.Elide("Comment", "Whitespace"),
	)
	patternParser = participle.MustBuild[pPattern](
		participle.Lexer(gsrLexer),
		participle.Elide("Comment", "Whitespace"),
	)
)

// ParseString parses src as a rule file called name. Syntax errors do not
// stop the parse: the statement in error is skipped up to its `;` (or the
// next line that starts a statement) and parsing goes on, so that one run
// reports every broken statement. The error, if not nil, is an ErrorList.
//
// The file is handed to the participle parser one statement at a time (up
// to and including the next `;` outside comments, strings and regular
// expressions, or up to the next line that starts a statement), and each statement's nesting of ( and ! is checked against
// MaxNesting before it is parsed, so the time and memory of a parse are
// linear in the size of src whatever it holds.
func ParseString(name, src string) (*File, error) {
	f := &File{Name: name, Src: src, lines: newLineTable(name, src)}
	var errs ErrorList
	from := 0
	if strings.HasPrefix(src, "\ufeff") { // a byte order mark, as some editors write
		from = len("\ufeff")
	}
	// Lines that begin a statement bound a run of statements too, so that
	// an unterminated string, which hides its line's `;`, costs one line.
	starts := statementStart.FindAllStringIndex(src, -1)
	syntaxErrors := 0
	for from < len(src) {
		for len(starts) > 0 && starts[0][0] <= from {
			starts = starts[1:]
		}
		end, cut := len(src), false
		if len(starts) > 0 {
			end, cut = starts[0][0], true
		}
		if semi := nextSemicolon(src[:end], from); semi >= 0 {
			end, cut = semi+1, false
		}
		off, msg, ok := f.parseStatements(src[from:end], from, &errs)
		if !ok && cut && off == end {
			// A rule whose `;` is missing runs into the next line's
			// statement: parse on to the next `;`, so that the error
			// points where the parser meets the next statement.
			end = len(src)
			if semi := nextSemicolon(src, from); semi >= 0 {
				end = semi + 1
			}
			off, msg, ok = f.parseStatements(src[from:end], from, &errs)
		}
		if ok {
			from = end
			continue
		}
		f.lines.errorf(&errs, off, "%s", msg)
		syntaxErrors++
		next := resumeAfter(src, off)
		if next < 0 || syntaxErrors >= maxParseErrors {
			break
		}
		from = next
	}
	f.checkLocal(&errs)
	errs.Sort()
	return f, errs.Err()
}

// parseStatements parses chunk, the statements of f's source from offset
// base on, and adds them to f. On a syntax error it adds nothing and
// returns the error's offset in the source and its message.
func (f *File) parseStatements(chunk string, base int, errs *ErrorList) (off int, msg string, ok bool) {
	if off, msg := checkNesting(f.Name, chunk); msg != "" {
		return base + off, msg, false
	}
	pf, err := fileParser.ParseString(f.Name, chunk)
	if err != nil {
		return base + errorOffset(err, len(chunk)), parseMessage(err, false), false
	}
	c := converter{f: f, base: base, errs: errs}
	c.file(pf)
	return 0, "", true
}

// checkNesting returns the offset and message of the first ( or ! in src
// that nests deeper than MaxNesting, or "" when there is none. Each ! is a
// level for the atom that follows it, each ( a level up to its ). The
// check runs on the tokens, before the parser, whose recursion it bounds.
func checkNesting(name, src string) (int, string) {
	lx, err := gsrLexer.LexString(name, src)
	if err != nil {
		return 0, ""
	}
	depth, bangs := 0, 0
	var open []int // the bangs before each open (
	for {
		t, err := lx.Next()
		if err != nil || t.EOF() {
			return 0, ""
		}
		switch t.Value {
		case "!":
			bangs++
			if depth+bangs > MaxNesting {
				return t.Pos.Offset, nestingMessage
			}
			continue
		case "(":
			depth += bangs + 1
			open = append(open, bangs)
			bangs = 0
			if depth > MaxNesting {
				return t.Pos.Offset, nestingMessage
			}
			continue
		case ")":
			if n := len(open); n > 0 {
				depth -= open[n-1] + 1
				open = open[:n-1]
			}
		}
		if t.Type != gsrSymbols["Comment"] && t.Type != gsrSymbols["Whitespace"] {
			bangs = 0
		}
	}
}

var gsrSymbols = gsrLexer.Symbols()

var nestingMessage = fmt.Sprintf("nested too deeply: more than %d levels of ( and !", MaxNesting)

// errorOffset returns where participle's error err points, in the text it
// parsed (of length n when it names no position).
func errorOffset(err error, n int) int {
	var pe participle.Error
	if errors.As(err, &pe) {
		p := pe.Position()
		if p.Offset > 0 || p.Line > 0 {
			return p.Offset
		}
	}
	return n
}

// parseMessage turns participle's message into one for people who write
// rules, not grammars; pattern is set for a rule body given on the command
// line, which messages call a pattern.
func parseMessage(err error, pattern bool) string {
	var ut *participle.UnexpectedTokenError
	if errors.As(err, &ut) {
		tok := ut.Unexpected
		// Name what was expected only when it is one plain symbol.
		exp := ""
		if m := expectedRe.FindStringSubmatch(ut.Message()); m != nil {
			exp = m[1]
		}
		return unexpectedMessage(tok, exp, pattern)
	}
	var pe participle.Error
	if errors.As(err, &pe) {
		return strings.TrimPrefix(pe.Message(), "lexer: ")
	}
	return err.Error()
}

var expectedRe = regexp.MustCompile(`\(expected "([^"\s]+)"\)$`)

// unexpectedMessage says what is wrong at an unexpected token t, where
// expected names the one punctuation character that would have fitted
// ("" when there is not one).
func unexpectedMessage(t lexer.Token, expected string, pattern bool) string {
	exp := ""
	if expected != "" {
		exp = " (expected '" + expected + "')"
	}
	switch {
	case t.EOF() && pattern:
		return "unexpected end of pattern" + exp
	case t.EOF():
		if expected != "" && expected != ";" {
			return "unexpected end of file" + exp
		}
		return "unexpected end of file: is the ';' after the last rule missing?"
	case pattern && (t.Value == "=" || t.Value == ";"):
		return "unexpected " + quoteToken(t.Value) + ": a pattern is one rule body, as in 'ADJ* NOUN'"
	case t.Value == "=":
		return "unexpected '=': is the ';' at the end of the rule above missing?"
	case t.Type == gsrSymbols["Unterminated"]:
		if t.Value[0] == '/' {
			return "unterminated regular expression: missing closing '/'"
		}
		return "unterminated string: missing closing " + string(t.Value[0])
	case t.Type == gsrSymbols["Bad"]:
		return "unexpected character " + quoteToken(t.Value)
	case t.Type == gsrSymbols["Label"]:
		return "a label must be followed by the element it names, as in @node NOUN"
	case t.Value == ";" && expected == "":
		return "unexpected ';': something is missing before it"
	}
	return "unexpected " + quoteToken(t.Value) + exp
}

func quoteToken(s string) string {
	if strings.ContainsRune(s, '\'') {
		return `"` + s + `"`
	}
	return "'" + s + "'"
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

// nextSemicolon returns the offset of the first statement-ending `;` at or
// after from, skipping comments, strings and regular expressions, or -1.
func nextSemicolon(src string, from int) int {
	for i := from; i < len(src); i++ {
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
			return i
		}
	}
	return -1
}
