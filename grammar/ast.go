package grammar

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
)

// Node is one element of a rule body. The tree is the rule as written, after
// syntax sugar is removed: quantifiers become Repeat, a quoted string with
// spaces becomes a Seq of word tests, `_` becomes a Test of kind Any.
// Rule references are left as Ref; the pattern compiler inlines them.
type Node interface {
	Position() Pos
	node()
}

// Alt matches any one of its alternatives (`a | b`).
type Alt struct {
	Pos  Pos
	Alts []Node
}

// Seq matches its items one after the other (`a b c`).
type Seq struct {
	Pos   Pos
	Items []Node
}

// Repeat matches Sub between Min and Max times; Max is -1 for no upper bound.
type Repeat struct {
	Pos      Pos
	Sub      Node
	Min, Max int
}

// Label names the span Sub matched (`@node NOUN`) so that commands can read
// its words.
type Label struct {
	Pos  Pos
	Name string
	Sub  Node
}

// Anchor matches no token: at the sentence start (`^`) or end (`$`).
type Anchor struct {
	Pos Pos
	End bool
}

// Ref stands for the rule called Name.
type Ref struct {
	Pos  Pos
	Name string
}

// Not matches one token that Sub does not match (`!t`).
type Not struct {
	Pos Pos
	Sub Node
}

// And matches one token that every operand matches (`a & b`).
type And struct {
	Pos  Pos
	Subs []Node
}

// TestKind says which property of a token a Test looks at.
type TestKind int

// The kinds of token test.
const (
	Any       TestKind = iota // _
	UPOS                      // NOUN
	XPOS                      // xpos:NNS
	XPOSRe                    // xpos:/^VB/
	Word                      // "valve" (case-insensitive)
	WordExact                 // 'Valve'
	WordRe                    // /^[A-Z]+$/
	Lemma                     // lemma:valve (case-insensitive)
	LemmaRe                   // lemma:/^valv/
	Begins                    // begins:un (case-insensitive)
	Ends                      // ends:ing (case-insensitive)
	Chars                     // chars:Aa+ (see CharClasses)
	CharsRe                   // chars:/^A\+$/
)

// Test is a test about one token. Value holds the name, word or pattern as
// written (for Word, Lemma, Begins and Ends: lower-cased); Re is the
// compiled expression of the *Re kinds.
type Test struct {
	Pos   Pos
	Kind  TestKind
	Value string
	Re    *regexp.Regexp
}

func (n *Alt) Position() Pos    { return n.Pos }
func (n *Seq) Position() Pos    { return n.Pos }
func (n *Repeat) Position() Pos { return n.Pos }
func (n *Label) Position() Pos  { return n.Pos }
func (n *Anchor) Position() Pos { return n.Pos }
func (n *Ref) Position() Pos    { return n.Pos }
func (n *Not) Position() Pos    { return n.Pos }
func (n *And) Position() Pos    { return n.Pos }
func (n *Test) Position() Pos   { return n.Pos }

func (*Alt) node()    {}
func (*Seq) node()    {}
func (*Repeat) node() {}
func (*Label) node()  {}
func (*Anchor) node() {}
func (*Ref) node()    {}
func (*Not) node()    {}
func (*And) node()    {}
func (*Test) node()   {}

// Key returns a canonical text of the test, equal for equal tests; the
// compiler uses it to evaluate each distinct test once per token.
func (t *Test) Key() string {
	switch t.Kind {
	case Any:
		return "_"
	case UPOS:
		return t.Value
	case XPOS:
		return "xpos:" + t.Value
	case XPOSRe:
		return "xpos:/" + t.Value + "/"
	case Word:
		return strconv.Quote(t.Value)
	case WordExact:
		q := strconv.Quote(t.Value)
		return "'" + strings.ReplaceAll(q[1:len(q)-1], "'", `\'`) + "'"
	case WordRe:
		return "/" + t.Value + "/"
	case Lemma:
		return "lemma:" + strconv.Quote(t.Value)
	case LemmaRe:
		return "lemma:/" + t.Value + "/"
	case Begins:
		return "begins:" + strconv.Quote(t.Value)
	case Ends:
		return "ends:" + strconv.Quote(t.Value)
	case Chars:
		return "chars:" + strconv.Quote(t.Value)
	case CharsRe:
		return "chars:/" + t.Value + "/"
	}
	return fmt.Sprintf("test(%d)", t.Kind)
}

// Format renders a node fully parenthesized, one pair of parentheses per
// operator, so that the structure (and thus precedence) is visible:
// `ADJ | VERB & xpos:VBN` formats as `(ADJ | (VERB & xpos:VBN))`.
func Format(n Node) string {
	var b strings.Builder
	format(&b, n)
	return b.String()
}

func format(b *strings.Builder, n Node) {
	switch n := n.(type) {
	case *Alt:
		b.WriteByte('(')
		for i, a := range n.Alts {
			if i > 0 {
				b.WriteString(" | ")
			}
			format(b, a)
		}
		b.WriteByte(')')
	case *Seq:
		b.WriteByte('(')
		for i, a := range n.Items {
			if i > 0 {
				b.WriteByte(' ')
			}
			format(b, a)
		}
		b.WriteByte(')')
	case *And:
		b.WriteByte('(')
		for i, a := range n.Subs {
			if i > 0 {
				b.WriteString(" & ")
			}
			format(b, a)
		}
		b.WriteByte(')')
	case *Not:
		b.WriteByte('!')
		format(b, n.Sub)
	case *Repeat:
		b.WriteByte('(')
		format(b, n.Sub)
		b.WriteByte(')')
		switch {
		case n.Min == 0 && n.Max == 1:
			b.WriteByte('?')
		case n.Min == 0 && n.Max < 0:
			b.WriteByte('*')
		case n.Min == 1 && n.Max < 0:
			b.WriteByte('+')
		case n.Max < 0:
			fmt.Fprintf(b, "{%d,}", n.Min)
		case n.Min == n.Max:
			fmt.Fprintf(b, "{%d}", n.Min)
		default:
			fmt.Fprintf(b, "{%d,%d}", n.Min, n.Max)
		}
	case *Label:
		b.WriteString("@" + n.Name + " ")
		format(b, n.Sub)
	case *Anchor:
		if n.End {
			b.WriteByte('$')
		} else {
			b.WriteByte('^')
		}
	case *Ref:
		b.WriteString(n.Name)
	case *Test:
		b.WriteString(n.Key())
	default:
		fmt.Fprintf(b, "%T", n)
	}
}

// Walk calls f for n and every node below it, parents first. Ref nodes are
// not followed into the rules they name.
func Walk(n Node, f func(Node)) {
	f(n)
	switch n := n.(type) {
	case *Alt:
		for _, a := range n.Alts {
			Walk(a, f)
		}
	case *Seq:
		for _, a := range n.Items {
			Walk(a, f)
		}
	case *And:
		for _, a := range n.Subs {
			Walk(a, f)
		}
	case *Not:
		Walk(n.Sub, f)
	case *Repeat:
		Walk(n.Sub, f)
	case *Label:
		Walk(n.Sub, f)
	}
}

var kindNames = [...]string{"any", "upos", "xpos", "xpos-re", "word", "word-exact", "word-re", "lemma", "lemma-re", "begins", "ends", "chars", "chars-re"}

// String names the kind, for messages and keys.
func (k TestKind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return "kind?"
}
