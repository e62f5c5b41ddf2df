package grammar

import (
	"fmt"
	"io"
	"os"
	"regexp"
	"strings"
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

// ParseString parses src as a rule file called name. Syntax errors do not
// stop the parse: the statement in error is skipped up to its `;` (or the
// next line that starts a statement) and parsing goes on, so that one run
// reports every broken statement. The error, if not nil, is an ErrorList.
//
// The parser is a hand-written recursive descent over a scanner that reads
// each byte once; with nesting bounded by MaxNesting its time is linear in
// the size of src.
func ParseString(name, src string) (*File, error) {
	f := &File{Name: name, Src: src, lines: newLineTable(name, src)}
	p := &parser{f: f, sc: scanner{src: src}}
	if strings.HasPrefix(src, "\ufeff") { // a byte order mark, as some editors write
		p.sc.off = len("\ufeff")
	}
	syntaxErrors := 0
	for p.peek().kind != tEOF {
		off, msg, ok := p.statement()
		if ok {
			continue
		}
		f.lines.errorf(&p.errs, off, "%s", msg)
		syntaxErrors++
		next := resumeAfter(src, off)
		if next < 0 || syntaxErrors >= maxParseErrors {
			break
		}
		p.sc.off, p.ahead = next, nil
	}
	f.checkLocal(&p.errs)
	p.errs.Sort()
	return f, p.errs.Err()
}

// parser builds the syntax tree of one file straight from the tokens.
type parser struct {
	f     *File
	sc    scanner
	ahead []token // tokens read ahead, at most two
	errs  ErrorList
	// stmt collects the errors of the statement being read; they are kept
	// only if the statement is read to its end (a syntax error drops the
	// statement and them).
	stmt ErrorList
	// pattern is set when the source is one rule body given on the
	// command line, which messages call a pattern.
	pattern bool
}

// syntaxError stops the statement being read; statement recovers it.
type syntaxError struct {
	off int
	msg string
}

func (p *parser) peek() token { return p.peekN(0) }

func (p *parser) peekN(n int) token {
	for len(p.ahead) <= n {
		p.ahead = append(p.ahead, p.sc.next())
	}
	return p.ahead[n]
}

func (p *parser) next() token {
	t := p.peek()
	p.ahead = p.ahead[1:]
	return t
}

func (p *parser) fail(off int, format string, args ...any) {
	panic(syntaxError{off, fmt.Sprintf(format, args...)})
}

// unexpected stops the statement at t, naming what was expected (a
// punctuation character) when there is one thing to name.
func (p *parser) unexpected(t token, expected string) {
	p.fail(t.off, "%s", unexpectedMessage(t, expected, p.pattern))
}

// expect reads the punctuation character want or stops the statement.
func (p *parser) expect(want string) token {
	t := p.next()
	if t.kind != tPunct || t.text != want {
		p.unexpected(t, want)
	}
	return t
}

// errorf records a problem that does not stop the statement.
func (p *parser) errorf(off int, format string, args ...any) {
	p.f.lines.errorf(&p.stmt, off, format, args...)
}

func (p *parser) pos(off int) Pos { return p.f.lines.pos(off) }

// statement reads one statement; on a syntax error it returns the offset
// and message with ok false.
func (p *parser) statement() (off int, msg string, ok bool) {
	return p.try(p.readStatement)
}

// try runs read, which reads one statement, and catches its syntax error.
// The statement's other errors are kept only when it is read whole.
func (p *parser) try(read func()) (off int, msg string, ok bool) {
	p.stmt = p.stmt[:0]
	defer func() {
		if r := recover(); r != nil {
			se, isSyntax := r.(syntaxError)
			if !isSyntax {
				panic(r)
			}
			off, msg, ok = se.off, se.msg, false
		}
	}()
	read()
	p.errs = append(p.errs, p.stmt...)
	return 0, "", true
}

func (p *parser) readStatement() {
	t := p.next()
	isRule := p.peek().kind == tPunct && p.peek().text == "="
	switch {
	case t.kind == tIdent && t.text == "use" && !isRule:
		p.use(t)
	case t.kind == tIdent && (t.text == "expect" || t.text == "reject") && !isRule:
		p.example(t)
	case t.kind == tIdent && isRule:
		p.rule(t)
	default:
		p.unexpected(t, "")
	}
}

func (p *parser) use(kw token) {
	u := &Use{Pos: p.pos(kw.off)}
	t := p.next()
	switch {
	case t.kind == tIdent && t.text == "stock":
		name := p.next()
		if name.kind != tIdent {
			p.unexpected(name, "")
		}
		u.Stock = name.text
	case t.kind == tString || t.kind == tRaw:
		s, ok := unquote(t.text)
		if !ok || t.kind == tRaw {
			p.errorf(t.off, "use takes a file name in double quotes or `stock NAME`")
			u = nil
		} else {
			u.Path = s
		}
	default:
		p.unexpected(t, "")
	}
	if n := p.peek(); n.kind == tPunct && n.text == ";" {
		p.next()
	}
	if u != nil {
		p.f.Uses = append(p.f.Uses, u)
	}
}

func (p *parser) example(kw token) {
	ex := &Example{Pos: p.pos(kw.off), Expect: kw.text == "expect"}
	var raw string
	var rawOff int
	switch t := p.next(); t.kind {
	case tField: // expect rule:"text", without a space after the colon
		i := strings.IndexByte(t.text, ':')
		ex.Rule, raw, rawOff = t.text[:i], t.text[i+1:], t.off+i+1
	case tIdent:
		ex.Rule = t.text
		p.expect(":")
		s := p.next()
		if s.kind != tString && s.kind != tRaw {
			p.unexpected(s, "")
		}
		raw, rawOff = s.text, s.off
	default:
		p.unexpected(t, "")
	}
	p.expect(";")
	if !strings.HasPrefix(raw, `"`) {
		p.errorf(rawOff, "an example's text goes in double quotes")
		return
	}
	text, span, msg := parseExampleText(raw[1:len(raw)-1], ex.Expect)
	if msg != "" {
		p.errorf(rawOff, "%s", msg)
		return
	}
	ex.Text, ex.Span = text, span
	p.f.Examples = append(p.f.Examples, ex)
}

func (p *parser) rule(name token) {
	p.next() // =
	r := &Rule{Name: name.text, Pos: p.pos(name.off)}
	r.Expr = p.alt(0)
	end := p.expect(";")
	r.End = p.pos(end.off + 1)
	if reserved[r.Name] {
		p.errorf(name.off, "%q is a reserved word and cannot name a rule", r.Name)
	} else if IsUPOS(r.Name) {
		p.errorf(name.off, "%s is a UPOS tag and cannot name a rule", r.Name)
	}
	r.Doc = p.f.docAbove(r.Pos.Line)
	p.f.Rules = append(p.f.Rules, r)
}

// startsElement reports whether t can begin an element of a sequence.
func startsElement(t token) bool {
	switch t.kind {
	case tIdent, tField, tLabel, tString, tRaw, tRegex, tUnterminated:
		return true
	case tPunct:
		return t.text == "(" || t.text == "!" || t.text == "^" || t.text == "$"
	}
	return false
}

func isPunct(t token, s string) bool { return t.kind == tPunct && t.text == s }

// Positions are computed as soon as a node starts, in the order of the
// source, which keeps lineTable.pos from counting a long line again.

// operands reads item { sep item }: the one item, or join of them all.
func (p *parser) operands(sep string, depth int, item func(int) Node, join func(Pos, []Node) Node) Node {
	pos := p.pos(p.peek().off)
	items := []Node{item(depth)}
	for isPunct(p.peek(), sep) {
		p.next()
		items = append(items, item(depth))
	}
	if len(items) == 1 {
		return items[0]
	}
	return join(pos, items)
}

// alt reads Seq { "|" Seq }; depth is the nesting of ( and ! around it.
func (p *parser) alt(depth int) Node {
	return p.operands("|", depth, p.seq, func(pos Pos, alts []Node) Node { return &Alt{Pos: pos, Alts: alts} })
}

func (p *parser) seq(depth int) Node {
	pos := p.pos(p.peek().off)
	first := p.element(depth)
	if !startsElement(p.peek()) {
		return first
	}
	s := &Seq{Pos: pos, Items: []Node{first}}
	for startsElement(p.peek()) {
		s.Items = append(s.Items, p.element(depth))
	}
	return s
}

// element reads [ Label ] Conj [ Quant ].
func (p *parser) element(depth int) Node {
	var label token
	var labelPos Pos
	if t := p.peek(); t.kind == tLabel {
		label, labelPos = p.next(), p.pos(t.off)
		if n := p.peek(); !startsElement(n) || n.kind == tLabel {
			p.fail(label.off, "a label must be followed by the element it names, as in @node NOUN")
		}
	}
	n := p.conj(depth)
	if q := p.peek(); q.kind == tPunct && strings.Contains("?*+{", q.text) {
		n = p.quant(n)
	}
	if label.kind == tLabel {
		if _, ok := n.(*Anchor); ok {
			p.errorf(label.off, "a label cannot name an anchor (^ or $): it covers no token")
		}
		n = &Label{Pos: labelPos, Name: label.text[1:], Sub: n}
	}
	return n
}

func (p *parser) quant(n Node) Node {
	q := p.next()
	if _, ok := n.(*Anchor); ok {
		p.errorf(q.off, "an anchor (^ or $) cannot be repeated")
	}
	r := &Repeat{Pos: p.pos(q.off), Sub: n}
	switch q.text {
	case "?":
		r.Min, r.Max = 0, 1
	case "*":
		r.Min, r.Max = 0, -1
	case "+":
		r.Min, r.Max = 1, -1
	default: // {
		lo := p.next()
		if lo.kind != tNumber {
			p.unexpected(lo, "")
		}
		r.Min, r.Max = p.count(lo.text, q.off), -1
		hi := ""
		if isPunct(p.peek(), ",") {
			p.next()
			if t := p.peek(); t.kind == tNumber {
				hi = p.next().text
				r.Max = p.count(hi, q.off)
			}
		} else {
			r.Max = r.Min
		}
		p.expect("}")
		if hi != "" && r.Max < r.Min {
			p.errorf(q.off, "bad repetition {%s,%s}: the upper bound is below the lower one", lo.text, hi)
		}
	}
	return r
}

func (p *parser) count(s string, off int) int {
	n := 0
	for _, c := range []byte(s) {
		n = n*10 + int(c-'0')
		if n > MaxRepeat {
			p.errorf(off, "bad repetition count %s: at most %d", s, MaxRepeat)
			return MaxRepeat
		}
	}
	return n
}

// conj reads Not { "&" Not }.
func (p *parser) conj(depth int) Node {
	return p.operands("&", depth, p.not, func(pos Pos, subs []Node) Node { return &And{Pos: pos, Subs: subs} })
}

// not reads { "!" } Atom; each ! is a level of nesting.
func (p *parser) not(depth int) Node {
	pos := p.pos(p.peek().off)
	bangs := 0
	for isPunct(p.peek(), "!") {
		t := p.next()
		if bangs++; depth+bangs > MaxNesting {
			p.fail(t.off, "nested too deeply: more than %d levels of ( and !", MaxNesting)
		}
	}
	n := p.atom(depth + bangs)
	for range bangs {
		n = &Not{Pos: pos, Sub: n}
	}
	return n
}

func (p *parser) atom(depth int) Node {
	t := p.next()
	pos := p.pos(t.off)
	switch t.kind {
	case tPunct:
		switch t.text {
		case "(":
			if depth+1 > MaxNesting {
				p.fail(t.off, "nested too deeply: more than %d levels of ( and !", MaxNesting)
			}
			n := p.alt(depth + 1)
			p.expect(")")
			return n
		case "^":
			return &Anchor{Pos: pos}
		case "$":
			return &Anchor{Pos: pos, End: true}
		}
	case tField:
		return p.field(t)
	case tRegex:
		return p.regexTest(t.off, WordRe, t.text[1:len(t.text)-1])
	case tString, tRaw:
		kind := Word
		if t.kind == tRaw {
			kind = WordExact
		}
		s, _ := unquote(t.text)
		words := strings.Fields(s)
		if len(words) == 0 {
			p.errorf(t.off, "empty word: a quoted word needs at least one character")
			return &Test{Pos: pos, Kind: Any}
		}
		if len(words) == 1 {
			return wordTest(pos, kind, words[0])
		}
		// A quoted string with spaces is a sequence of words: "in order to".
		seq := &Seq{Pos: pos}
		for _, w := range words {
			seq.Items = append(seq.Items, wordTest(pos, kind, w))
		}
		return seq
	case tIdent:
		switch {
		case t.text == "_":
			return &Test{Pos: pos, Kind: Any}
		case IsUPOS(t.text):
			return &Test{Pos: pos, Kind: UPOS, Value: t.text}
		}
		return &Ref{Pos: pos, Name: t.text}
	}
	p.unexpected(t, "")
	return nil
}

// unexpectedMessage says what is wrong at an unexpected token in words for
// people who write rules, not grammars.
func unexpectedMessage(t token, expected string, pattern bool) string {
	exp := ""
	if expected != "" {
		exp = " (expected '" + expected + "')"
	}
	switch {
	case t.kind == tEOF && pattern:
		return "unexpected end of pattern" + exp
	case t.kind == tEOF:
		if expected != "" && expected != ";" {
			return "unexpected end of file" + exp
		}
		return "unexpected end of file: is the ';' after the last rule missing?"
	case pattern && t.kind == tPunct && (t.text == "=" || t.text == ";"):
		return "unexpected " + quoteToken(t.text) + ": a pattern is one rule body, as in 'ADJ* NOUN'"
	case t.kind == tPunct && t.text == "=":
		return "unexpected '=': is the ';' at the end of the rule above missing?"
	case t.kind == tUnterminated:
		if t.text[0] == '/' {
			return "unterminated regular expression: missing closing '/'"
		}
		return "unterminated string: missing closing " + string(t.text[0])
	case t.kind == tBad:
		return "unexpected character " + quoteToken(t.text)
	case t.kind == tLabel:
		return "a label must be followed by the element it names, as in @node NOUN"
	case t.kind == tPunct && t.text == ";" && expected == "":
		return "unexpected ';': something is missing before it"
	}
	return "unexpected " + quoteToken(t.text) + exp
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
