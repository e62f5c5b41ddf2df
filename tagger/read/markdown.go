package read

import (
	"html"
	"regexp"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// paraSep is U+2029 PARAGRAPH SEPARATOR. The Markdown reader puts it where a
// block (heading, list item, table row or cell, quote) begins right after a
// non-blank line, since it may not add the blank line that would otherwise
// mark the break without shifting the line numbers of everything below.
// Unicode defines it as a paragraph break (The Unicode Standard, section
// 5.8 "Newline Guidelines"; UAX #29 rule SB4 ends a sentence after it).
const paraSep = "\u2029"

var (
	mdFenceOpen   = regexp.MustCompile("^([ \t]*)(`{3,}|~{3,})(.*)$")
	mdThematic    = regexp.MustCompile(`^ {0,3}([-*_])([ \t]*[-*_]){2,}[ \t]*$`)
	mdSetextEq    = regexp.MustCompile(`^ {0,3}=+[ \t]*$`)
	mdLinkDef     = regexp.MustCompile(`^ {0,3}\[([^\]^][^\]]*)\]:[ \t]*\S`)
	mdFootDef     = regexp.MustCompile(`^ {0,3}\[\^[^\]]+\]:[ \t]*`)
	mdQuote       = regexp.MustCompile(`^ {0,3}> ?`)
	mdListItem    = regexp.MustCompile(`^[ \t]*([-*+]|[0-9]{1,9}[.)])([ \t]+|$)`)
	mdTask        = regexp.MustCompile(`^\[[ xX]\][ \t]+`)
	mdATX         = regexp.MustCompile(`^ {0,3}#{1,6}([ \t]+|$)`)
	mdATXClose    = regexp.MustCompile(`([ \t]+#+)?[ \t]*$`)
	mdDelimRow    = regexp.MustCompile(`^[ \t]*\|?[ \t]*:?-+:?[ \t]*(\|[ \t]*:?-+:?[ \t]*)*\|?[ \t]*$`)
	mdRawOpen     = regexp.MustCompile(`(?i)^[ \t]*<(script|style|textarea)[\s>]`)
	mdHTMLTag     = regexp.MustCompile(`^</?[A-Za-z][A-Za-z0-9-]*(\s[^<>]*)?/?>`)
	mdAutolink    = regexp.MustCompile(`^<([A-Za-z][A-Za-z0-9+.-]{1,31}:[^\s<>]*|[^\s@<>]+@[^\s@<>]+)>`)
	mdEntity      = regexp.MustCompile(`^&(#[0-9]{1,7}|#[xX][0-9a-fA-F]{1,6}|[A-Za-z][A-Za-z0-9]{1,31});`)
	mdFrontYAML   = regexp.MustCompile(`^(---|\.\.\.)[ \t]*$`)
	mdFrontTOML   = regexp.MustCompile(`^\+\+\+[ \t]*$`)
	mdLabelFolder = strings.NewReplacer("\t", " ", "  ", " ")
)

// markdown removes Markdown markup line by line; see the package comment
// for the rules. The text keeps exactly the source's lines.
func (r *reader) markdown(s string) *doc.Document {
	s = r.capLines(normalizeNewlines(s))
	lines := strings.Split(s, "\n")
	m := &mdReader{refs: map[string]bool{}}
	for _, l := range lines {
		if sm := mdLinkDef.FindStringSubmatch(l); sm != nil {
			m.refs[foldLabel(sm[1])] = true
		}
	}
	out := make([]string, len(lines))
	start := frontMatterEnd(lines)
	prevBlank, prevEnds, prevQuote := true, false, false
	for i := start; i < len(lines); i++ {
		line := lines[i]
		text, block, ends, quote := m.line(line, lines, i, prevBlank)
		if strings.TrimSpace(text) == "" {
			out[i] = ""
			prevBlank, prevEnds, prevQuote = true, false, false
			continue
		}
		if quote && !prevQuote {
			block = true
		}
		if !prevBlank && (block || prevEnds) {
			text = paraSep + text
		}
		out[i] = text
		prevBlank, prevEnds, prevQuote = false, ends, quote
	}
	return &doc.Document{Text: strings.Join(out, "\n")}
}

// frontMatterEnd returns the index of the first line after a YAML ("---")
// or TOML ("+++") front matter block at the top of the file, or 0.
func frontMatterEnd(lines []string) int {
	if len(lines) < 2 {
		return 0
	}
	var closer *regexp.Regexp
	switch strings.TrimRight(lines[0], " \t") {
	case "---":
		closer = mdFrontYAML
	case "+++":
		closer = mdFrontTOML
	default:
		return 0
	}
	for i := 1; i < len(lines); i++ {
		if closer.MatchString(lines[i]) {
			return i + 1
		}
	}
	return 0 // not closed: a thematic break, not front matter
}

func foldLabel(s string) string {
	return strings.ToLower(strings.TrimSpace(mdLabelFolder.Replace(s)))
}

// mdReader holds the state that runs across lines.
type mdReader struct {
	refs      map[string]bool // link reference labels defined in the file
	fence     string          // the open code fence ("```", "~~~~"), or ""
	raw       string          // the open raw HTML element (script, style), or ""
	inComment bool            // inside an HTML comment
	inTable   bool
	inList    bool
	inCode    bool // the previous line was indented code
}

// line turns one source line into text. block reports that the line starts
// a new block, ends that it ends one (a heading or a table row), quote that
// it is inside a block quote.
func (m *mdReader) line(line string, lines []string, i int, prevBlank bool) (text string, block, ends, quote bool) {
	switch {
	case m.fence != "":
		t := strings.TrimLeft(line, " \t")
		if strings.HasPrefix(t, m.fence) && strings.Trim(t, m.fence[:1]+" \t") == "" {
			m.fence = ""
		}
		return "", false, false, false
	case m.raw != "":
		if strings.Contains(strings.ToLower(line), "</"+m.raw) {
			m.raw = ""
		}
		return "", false, false, false
	}
	if strings.TrimSpace(line) == "" {
		m.inTable, m.inCode = false, false
		return "", false, false, false
	}
	if m.inComment {
		end := strings.Index(line, "-->")
		if end < 0 {
			return "", false, false, false
		}
		m.inComment = false
		if line = line[end+3:]; strings.TrimSpace(line) == "" {
			return "", false, false, false
		}
	}
	indent := indentWidth(line)
	if indent >= 4 && !m.inList && (prevBlank || m.inCode) && !m.inTable {
		m.inCode = true // indented code block: dropped like fenced code
		return "", false, false, false
	}
	m.inCode = false
	if indent < 4 || m.inList {
		if sm := mdFenceOpen.FindStringSubmatch(line); sm != nil && !(sm[2][0] == '`' && strings.Contains(sm[3], "`")) {
			m.fence = sm[2]
			return "", false, false, false
		}
	}
	if sm := mdRawOpen.FindStringSubmatch(line); sm != nil {
		tag := strings.ToLower(sm[1])
		if !strings.Contains(strings.ToLower(line), "</"+tag) {
			m.raw = tag
		}
		return "", false, false, false
	}
	if mdThematic.MatchString(line) || (!prevBlank && mdSetextEq.MatchString(line)) || mdLinkDef.MatchString(line) {
		m.inTable = false
		return "", false, false, false
	}
	// Tables (GitHub Flavored Markdown): a header row, a delimiter row,
	// then rows until a line without a pipe.
	if m.inTable && strings.Contains(line, "|") {
		if mdDelimRow.MatchString(line) {
			return "", false, false, false
		}
		return m.tableRow(line), true, true, false
	}
	m.inTable = false
	if strings.Contains(line, "|") && i+1 < len(lines) && strings.Contains(lines[i+1], "|") && mdDelimRow.MatchString(lines[i+1]) {
		m.inTable = true
		return m.tableRow(line), true, true, false
	}
	// Container markers: block quotes, then list items and footnotes.
	for {
		loc := mdQuote.FindStringIndex(line)
		if loc == nil {
			break
		}
		quote = true
		line = line[loc[1]:]
	}
	if loc := mdListItem.FindStringIndex(line); loc != nil && !mdThematic.MatchString(line) {
		m.inList = true
		block = true
		line = line[loc[1]:]
		if loc := mdTask.FindStringIndex(line); loc != nil {
			line = line[loc[1]:]
		}
	} else if loc := mdFootDef.FindStringIndex(line); loc != nil {
		block = true
		line = line[loc[1]:]
	} else if indent == 0 && prevBlank {
		m.inList = false
	}
	if loc := mdATX.FindStringIndex(line); loc != nil {
		line = line[loc[1]:]
		line = line[:mdATXClose.FindStringIndex(line)[0]]
		block, ends = true, true
	}
	return m.inline(line), block, ends, quote
}

func indentWidth(line string) int {
	w := 0
	for _, c := range line {
		switch c {
		case ' ':
			w++
		case '\t':
			w += 4 - w%4
		default:
			return w
		}
	}
	return w
}

// tableRow returns the cells of a table row, each preceded by a paragraph
// separator so that no sentence runs from one cell into the next.
func (m *mdReader) tableRow(line string) string {
	line = strings.TrimSpace(line)
	line = strings.TrimPrefix(line, "|")
	if strings.HasSuffix(line, "|") && !strings.HasSuffix(line, `\|`) {
		line = line[:len(line)-1]
	}
	var cells []string
	cell := strings.Builder{}
	for i := 0; i < len(line); i++ {
		switch {
		case line[i] == '\\' && i+1 < len(line) && line[i+1] == '|':
			cell.WriteString(`\|`)
			i++
		case line[i] == '|':
			cells = append(cells, cell.String())
			cell.Reset()
		default:
			cell.WriteByte(line[i])
		}
	}
	cells = append(cells, cell.String())
	var b strings.Builder
	for _, c := range cells {
		c = strings.TrimSpace(m.inline(c))
		if c == "" {
			continue
		}
		if b.Len() > 0 {
			b.WriteString(paraSep)
		}
		b.WriteString(c)
	}
	return b.String()
}

// piece is a bit of inline output: text, or a run of emphasis delimiters
// that is dropped when it pairs with another.
type piece struct {
	text            string
	delim           byte // '*', '_' or '~' for a delimiter run, else 0
	canOpen, canClo bool
	drop            bool
}

// inline removes inline markup from one line (or one table cell) in one
// left-to-right pass. Brackets, parentheses and code spans are matched
// beforehand in linear time, so no construct is searched for again and
// again: a megabyte line of "[" or "`" costs no more than any other.
func (m *mdReader) inline(s string) string {
	ps := m.scan(s)
	pairDelims(ps)
	var b strings.Builder
	b.Grow(len(s))
	for _, p := range ps {
		if !p.drop {
			b.WriteString(p.text)
		}
	}
	return b.String()
}

// matches holds, for one line, the partner of every matched "[" and "("
// and the closing run of every backtick run that opens a code span.
type matches struct {
	partner map[int]int
	code    map[int]int
}

func matchLine(s string) matches {
	var mt matches
	if !strings.ContainsAny(s, "[(`") {
		return mt
	}
	mt.partner, mt.code = map[int]int{}, map[int]int{}
	// Backtick runs, and for each the next run of the same length
	// (CommonMark 6.1: a code span ends at the next run of equal length).
	type run struct{ pos, n int }
	var runs []run
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '\\':
			if i+1 < len(s) && isASCIIPunct(s[i+1]) {
				i++
			}
		case '`':
			n := runLen(s, i, '`')
			runs = append(runs, run{i, n})
			i += n - 1
		}
	}
	nextSame := make([]int, len(runs))
	last := map[int]int{}
	for k := len(runs) - 1; k >= 0; k-- {
		nextSame[k] = -1
		if j, ok := last[runs[k].n]; ok {
			nextSame[k] = j
		}
		last[runs[k].n] = k
	}
	var squares, parens []int
	k := 0
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '\\':
			if i+1 < len(s) && isASCIIPunct(s[i+1]) {
				i++
			}
		case '`':
			for runs[k].pos != i {
				k++
			}
			if j := nextSame[k]; j >= 0 {
				mt.code[i] = runs[j].pos
				i = runs[j].pos + runs[j].n - 1
				k = j + 1
			} else {
				i += runs[k].n - 1
				k++
			}
		case '[':
			squares = append(squares, i)
		case ']':
			if n := len(squares); n > 0 {
				mt.partner[squares[n-1]] = i
				squares = squares[:n-1]
			}
		case '(':
			parens = append(parens, i)
		case ')':
			if n := len(parens); n > 0 {
				mt.partner[parens[n-1]] = i
				parens = parens[:n-1]
			}
		}
	}
	return mt
}

// skip is the tail of a recognized link, "](dest)" or "][label]", to drop
// when the scan reaches its "]".
type skip struct{ from, to int }

func (m *mdReader) scan(s string) []piece {
	mt := matchLine(s)
	var ps []piece
	var skips []skip // innermost link on top
	textStart := 0
	flush := func(end int) {
		if end > textStart {
			ps = append(ps, piece{text: s[textStart:end]})
		}
	}
	for i := 0; i < len(s); {
		for n := len(skips); n > 0 && i >= skips[n-1].from; n = len(skips) {
			sk := skips[n-1]
			skips = skips[:n-1]
			if i == sk.from {
				flush(i)
				i = sk.to
				textStart = i
			}
		}
		if i >= len(s) {
			break
		}
		c := s[i]
		switch c {
		case '\\':
			if i+1 < len(s) && isASCIIPunct(s[i+1]) {
				flush(i)
				ps = append(ps, piece{text: s[i+1 : i+2]})
				i += 2
				textStart = i
				continue
			}
			if i+1 == len(s) { // hard line break
				flush(i)
				i++
				textStart = i
				continue
			}
		case '`':
			n := runLen(s, i, '`')
			if end, ok := mt.code[i]; ok {
				flush(i)
				code := s[i+n : end]
				if len(code) > 2 && code[0] == ' ' && code[len(code)-1] == ' ' && strings.TrimSpace(code) != "" {
					code = code[1 : len(code)-1]
				}
				ps = append(ps, piece{text: code})
				i = end + n
				textStart = i
				continue
			}
			i += n
			continue
		case '!', '[':
			open := i
			if c == '!' {
				if i+1 >= len(s) || s[i+1] != '[' {
					break
				}
				open = i + 1
			}
			if close, next, ok := m.link(s, open, mt); ok {
				flush(i)
				if s[open+1] == '^' { // footnote reference: dropped whole
					i = next
				} else {
					skips = append(skips, skip{close, next})
					i = open + 1
				}
				textStart = i
				continue
			}
		case '<':
			if strings.HasPrefix(s[i:], "<!--") {
				flush(i)
				if end := strings.Index(s[i+4:], "-->"); end >= 0 {
					i += 4 + end + 3
				} else {
					m.inComment = true
					i = len(s)
				}
				textStart = i
				continue
			}
			if loc := mdAutolink.FindStringSubmatchIndex(s[i:]); loc != nil {
				flush(i)
				ps = append(ps, piece{text: s[i+loc[2] : i+loc[3]]})
				i += loc[1]
				textStart = i
				continue
			}
			if loc := mdHTMLTag.FindStringIndex(s[i:]); loc != nil {
				flush(i)
				i += loc[1]
				textStart = i
				continue
			}
		case '&':
			if loc := mdEntity.FindStringIndex(s[i:]); loc != nil {
				flush(i)
				ps = append(ps, piece{text: cleanEntity(html.UnescapeString(s[i : i+loc[1]]))})
				i += loc[1]
				textStart = i
				continue
			}
		case '*', '_', '~':
			n := runLen(s, i, c)
			flush(i)
			before, _ := utf8.DecodeLastRuneInString(s[:i])
			after, _ := utf8.DecodeRuneInString(s[i+n:])
			if i == 0 {
				before = ' '
			}
			if i+n == len(s) {
				after = ' '
			}
			// Flanking rules of CommonMark 6.2.
			left := !unicode.IsSpace(after) && (!isPunct(after) || unicode.IsSpace(before) || isPunct(before))
			right := !unicode.IsSpace(before) && (!isPunct(before) || unicode.IsSpace(after) || isPunct(after))
			p := piece{text: s[i : i+n], delim: c, canOpen: left, canClo: right}
			if c == '_' {
				p.canOpen = left && (!right || isPunct(before))
				p.canClo = right && (!left || isPunct(after))
			}
			if c == '~' && n > 2 {
				p.delim = 0
			}
			ps = append(ps, p)
			i += n
			textStart = i
			continue
		}
		i++
	}
	flush(len(s))
	return ps
}

// link recognizes a link or image whose "[" is at s[open]: inline
// "[text](dest)", full or collapsed reference "[text][label]", a shortcut
// reference to a label the file defines, or a footnote reference "[^1]".
// It returns the index of the "]" closing the text and the index after
// the whole construct.
func (m *mdReader) link(s string, open int, mt matches) (close, next int, ok bool) {
	close, ok = mt.partner[open]
	if !ok {
		return 0, 0, false
	}
	text := s[open+1 : close]
	if strings.HasPrefix(text, "^") {
		return close, close + 1, true
	}
	if close+1 < len(s) {
		switch s[close+1] {
		case '(':
			if end, ok := mt.partner[close+1]; ok {
				return close, end + 1, true
			}
		case '[':
			if end, ok := mt.partner[close+1]; ok {
				label := s[close+2 : end]
				if label == "" {
					label = text
				}
				if m.refs[foldLabel(label)] {
					return close, end + 1, true
				}
			}
		}
	}
	if m.refs[foldLabel(text)] {
		return close, close + 1, true
	}
	return 0, 0, false
}

func runLen(s string, i int, c byte) int {
	n := 0
	for i+n < len(s) && s[i+n] == c {
		n++
	}
	return n
}

// pairDelims drops emphasis delimiter runs that open and close a span, in
// the manner of CommonMark's delimiter stack, simplified to stay linear:
// each kind of delimiter has its own stack and a closer pairs only with
// the opener on top of it (for ~, only of the same length); runs pair
// whole. Unpaired runs, like the "*" in "5 * 3", stay as text.
func pairDelims(ps []piece) {
	stacks := map[byte][]int{}
	for i := range ps {
		p := &ps[i]
		if p.delim == 0 {
			continue
		}
		st := stacks[p.delim]
		if p.canClo && len(st) > 0 {
			o := &ps[st[len(st)-1]]
			if p.delim != '~' || len(o.text) == len(p.text) {
				o.drop, p.drop = true, true
				stacks[p.delim] = st[:len(st)-1]
				continue
			}
		}
		if p.canOpen {
			stacks[p.delim] = append(st, i)
		}
	}
}

func isASCIIPunct(c byte) bool {
	return c < utf8.RuneSelf && unicode.IsPunct(rune(c)) || strings.IndexByte("$+<=>^`|~", c) >= 0
}

func isPunct(r rune) bool { return unicode.IsPunct(r) || unicode.IsSymbol(r) }

// cleanEntity keeps a decoded character reference from adding a line or
// paragraph break, which would shift line numbers or split a sentence.
func cleanEntity(s string) string {
	return strings.Map(func(r rune) rune {
		if r == '\n' || r == '\r' || r == '\u2028' || r == '\u2029' || r == '\u0085' || r == 0 {
			return ' '
		}
		return r
	}, s)
}
