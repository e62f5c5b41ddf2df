package pattern

import (
	"fmt"
	"math/rand"
	"regexp"
	"strings"
	"testing"

	"glossmith/tagger/doc"
)

// The differential test checks the matcher against a general-purpose
// reference: Go's regexp package in leftmost-longest mode
// (regexp.Longest), run over a string with one letter per token. For
// random rules built from coarse tags, token-level negation and
// conjunction, alternation, grouping, repetition and anchors, both must find
// the same non-empty matches on random tag sequences.

// diffTags are the tags random rules and sentences draw from; few, so that
// matches are frequent. Each maps to one letter.
var diffTags = []string{"ADJ", "NOUN", "VERB", "DET", "ADP"}

func letter(tag string) byte {
	for i, t := range diffTags {
		if t == tag {
			return byte('a' + i)
		}
	}
	return 'z'
}

type ruleGen struct {
	r       *rand.Rand
	anchors bool
	hasEnd  bool
}

// tokenSet returns a one-token test in our language and the set of tags it
// accepts.
func (g *ruleGen) tokenSet(depth int) (string, map[string]bool) {
	switch k := g.r.Intn(10); {
	case k < 5 || depth > 2:
		t := diffTags[g.r.Intn(len(diffTags))]
		return t, map[string]bool{t: true}
	case k < 6:
		all := map[string]bool{}
		for _, t := range diffTags {
			all[t] = true
		}
		return "_", all
	case k < 8:
		s, set := g.tokenSet(depth + 1)
		neg := map[string]bool{}
		for _, t := range diffTags {
			if !set[t] {
				neg[t] = true
			}
		}
		return "!" + s, neg
	case k < 9:
		a, sa := g.tokenSet(depth + 1)
		b, sb := g.tokenSet(depth + 1)
		both := map[string]bool{}
		for t := range sa {
			if sb[t] {
				both[t] = true
			}
		}
		return "(" + a + " & " + b + ")", both
	default:
		a, sa := g.tokenSet(depth + 1)
		b, sb := g.tokenSet(depth + 1)
		either := map[string]bool{}
		for t := range sa {
			either[t] = true
		}
		for t := range sb {
			either[t] = true
		}
		return "(" + a + " | " + b + ")", either
	}
}

func classOf(set map[string]bool) string {
	var b strings.Builder
	for _, t := range diffTags {
		if set[t] {
			b.WriteByte(letter(t))
		}
	}
	if b.Len() == 0 {
		return `[^\x00-\x{10FFFF}]`
	}
	return "[" + b.String() + "]"
}

// expr returns a random rule body and the equivalent Go regexp.
func (g *ruleGen) expr(depth int) (string, string) {
	k := g.r.Intn(12)
	if depth > 3 {
		k = 0
	}
	switch {
	case k < 4:
		s, set := g.tokenSet(0)
		return s, classOf(set)
	case k < 6: // sequence
		return g.group(depth, " ", "")
	case k < 8: // alternation
		return g.group(depth, " | ", "|")
	case k < 11:
		o, t := g.expr(depth + 1)
		if o == "^" || o == "$" { // anchors cannot repeat
			return o, t
		}
		q := []string{"*", "+", "?", "{2}", "{1,3}", "{2,}", "{0,2}"}[g.r.Intn(7)]
		return "(" + o + ")" + q, "(?:" + t + ")" + q
	default:
		if !g.anchors {
			s, set := g.tokenSet(0)
			return s, classOf(set)
		}
		if g.r.Intn(2) == 0 {
			return "^", "^"
		}
		g.hasEnd = true
		return "$", "$"
	}
}

func randomSentence(r *rand.Rand) ([]doc.Token, string) {
	return randomSentenceN(r, r.Intn(25))
}

func randomSentenceN(r *rand.Rand, n int) ([]doc.Token, string) {
	var toks []doc.Token
	var b strings.Builder
	for i := 0; i < n; i++ {
		t := diffTags[r.Intn(len(diffTags))]
		toks = append(toks, doc.Token{Form: "w", UPOS: t})
		b.WriteByte(letter(t))
	}
	return toks, b.String()
}

func TestDifferentialAgainstGoRegexp(t *testing.T) {
	r := rand.New(rand.NewSource(20261201))
	rules, sentences := 3000, 8
	if raceEnabled {
		rules = 300
	}
	checked, withMatches := 0, 0
	for c := 0; c < rules; c++ {
		g := &ruleGen{r: r, anchors: c%3 == 0}
		ours, theirs := g.expr(0)
		re := regexp.MustCompile(theirs)
		re.Longest()
		m := mustCompile(t, "r = "+ours+" ;")
		pre := map[int]*regexp.Regexp{}
		for s := 0; s < sentences; s++ {
			toks, text := randomSentence(r)
			var want []string
			for _, loc := range re.FindAllStringIndex(text, -1) {
				if loc[1] > loc[0] { // we never report empty matches
					want = append(want, fmt.Sprintf("[%d,%d)", loc[0], loc[1]))
				}
			}
			var got []string
			for _, mt := range m.FindAll(toks) {
				got = append(got, fmt.Sprintf("[%d,%d)", mt.Start, mt.End))
			}
			if strings.Join(got, " ") != strings.Join(want, " ") {
				t.Fatalf("rule %s (regexp %s) on %q:\n got %v\nwant %v", ours, theirs, text, got, want)
			}
			checked++
			if len(want) > 0 {
				withMatches++
			}
			// Nested mode against brute force: span [i,j) matches when the
			// regexp, anchored at i by a prefix of i any-letters, matches
			// text[:j] exactly. Rules with $ are skipped since cutting
			// the text would move the sentence end.
			if g.hasEnd {
				continue
			}
			want = want[:0]
			for i := 0; i < len(text); i++ {
				if pre[i] == nil {
					pre[i] = regexp.MustCompile(fmt.Sprintf("^.{%d}(?:%s)$", i, theirs))
				}
				for j := i + 1; j <= len(text); j++ {
					if pre[i].MatchString(text[:j]) {
						want = append(want, fmt.Sprintf("[%d,%d)", i, j))
					}
				}
			}
			got = got[:0]
			for _, mt := range m.FindNested(toks) {
				got = append(got, fmt.Sprintf("[%d,%d)", mt.Start, mt.End))
			}
			if strings.Join(got, " ") != strings.Join(want, " ") {
				t.Fatalf("nested: rule %s (regexp %s) on %q:\n got %v\nwant %v", ours, theirs, text, got, want)
			}
		}
	}
	t.Logf("%d rule/sentence pairs checked, %d with matches", checked, withMatches)
	if withMatches < checked/5 {
		t.Fatalf("too few cases with matches (%d of %d): the test would prove little", withMatches, checked)
	}
}

// TestDifferentialSeveralRules compiles several random rules into one
// Matcher (shared atoms, classes and caches, merged results) and checks each
// rule's matches against its own regexp.
func TestDifferentialSeveralRules(t *testing.T) {
	r := rand.New(rand.NewSource(42))
	for c := 0; c < 300; c++ {
		var src strings.Builder
		var res []*regexp.Regexp
		for k := 0; k < 4; k++ {
			g := &ruleGen{r: r, anchors: k == 3}
			ours, theirs := g.expr(0)
			fmt.Fprintf(&src, "r%d = %s ;\n", k, ours)
			re := regexp.MustCompile(theirs)
			re.Longest()
			res = append(res, re)
		}
		m := mustCompile(t, src.String())
		for s := 0; s < 10; s++ {
			toks, text := randomSentence(r)
			if s == 0 { // long enough for many matches (the sort path for big results)
				toks, text = randomSentenceN(r, 150)
			}
			var want []Match
			for k, re := range res {
				for _, loc := range re.FindAllStringIndex(text, -1) {
					if loc[1] > loc[0] {
						want = append(want, Match{Rule: fmt.Sprintf("r%d", k), Start: loc[0], End: loc[1]})
					}
				}
			}
			// Expected order: by start, then rule order (stable).
			for i := 1; i < len(want); i++ {
				for j := i; j > 0 && want[j].Start < want[j-1].Start; j-- {
					want[j], want[j-1] = want[j-1], want[j]
				}
			}
			if got := render(m.FindAll(toks)); got != render(want) {
				t.Fatalf("rules\n%son %q:\n got %s\nwant %s", src.String(), text, got, render(want))
			}
		}
	}
}

// group builds 2 or 3 sub-expressions joined by sep in our syntax and by
// theirSep in Go's.
func (g *ruleGen) group(depth int, sep, theirSep string) (string, string) {
	n := 2 + g.r.Intn(2)
	var ours, theirs []string
	for i := 0; i < n; i++ {
		o, t := g.expr(depth + 1)
		ours, theirs = append(ours, o), append(theirs, t)
	}
	return "(" + strings.Join(ours, sep) + ")", "(?:" + strings.Join(theirs, theirSep) + ")"
}
