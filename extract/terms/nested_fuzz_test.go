package terms

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// fuzzWords are the tokens fuzzed sentences are made of: words the terms
// rules take (nouns, an adjective, a name), hyphens that join them, and
// words and punctuation that break a candidate.
var fuzzWords = []struct{ form, upos, xpos string }{
	{"valve", "NOUN", "NN"}, {"steel", "NOUN", "NN"}, {"hot", "ADJ", "JJ"}, {"-", "PUNCT", "HYPH"},
	{"of", "ADP", "IN"}, {"the", "DET", "DT"}, {",", "PUNCT", ","}, {"EC", "PROPN", "NNP"},
}

// fuzzDocument makes a one-sentence document from bytes: each byte picks a
// word (low three bits) and whether a space follows it (bit 3).
func fuzzDocument(data []byte) *doc.Document {
	var text strings.Builder
	var toks []doc.Token
	for _, c := range data {
		w := fuzzWords[c&7]
		start := int32(text.Len())
		text.WriteString(w.form)
		space := c&8 == 0
		if space {
			text.WriteByte(' ')
		}
		toks = append(toks, doc.Token{Form: w.form, Start: start, End: start + int32(len(w.form)), Line: 1,
			SpaceAfter: space, Lemma: strings.ToLower(w.form), UPOS: w.upos, XPOS: w.xpos})
	}
	return &doc.Document{Name: "fuzz", Text: text.String(), Sentences: []doc.Sentence{{Tokens: toks}}}
}

// referenceCounts counts candidates the plain way: every span the rules
// match (all of them, unbounded), kept when it starts and ends with a word,
// cuts no hyphenated compound, has at most maxWords words of at most
// maxWordTokens tokens each, and some rule that matches it matches no
// longer span around it that breaks those limits; counted under the
// lower-cased words without hyphens and spaces (the fuzzed words are their
// own lemmas).
func referenceCounts(m *pattern.Matcher, d *doc.Document, maxWords int) map[string]int {
	toks := d.Sentences[0].Tokens
	isWord := func(k int) bool { return toks[k].UPOS != "PUNCT" }
	joined := func(k int) bool { // token k continues the word of token k-1
		return k > 0 && glued(toks[k-1], toks[k]) && (isHyphen(toks[k].Form) || isHyphen(toks[k-1].Form))
	}
	tooLong := func(i, j int) bool {
		words, longest, cur := 0, 0, 0
		for k := i; k < j; k++ {
			if k > i && joined(k) {
				cur++
			} else {
				words, cur = words+1, 1
			}
			longest = max(longest, cur)
		}
		return words > maxWords || longest > maxWordTokens
	}
	all := m.FindNested(toks)
	// inside reports whether a span of rule mt.Rule lies inside a
	// too-long match of the same rule, of at most SpanLimit(maxWords+1)
	// tokens (the longest the collector looks at).
	inside := func(mt pattern.Match) bool {
		for _, o := range all {
			if o.Rule == mt.Rule && o.Start <= mt.Start && mt.End <= o.End &&
				o.End-o.Start <= SpanLimit(maxWords+1) && tooLong(o.Start, o.End) {
				return true
			}
		}
		return false
	}
	out := map[string]int{}
	seen := map[[2]int]bool{}
	for _, mt := range all {
		i, j := mt.Start, mt.End
		if seen[[2]int{i, j}] || !isWord(i) || !isWord(j-1) || inside(mt) {
			continue
		}
		seen[[2]int{i, j}] = true
		if i > 0 && joined(i) || j < len(toks) && joined(j) || tooLong(i, j) {
			continue
		}
		var key strings.Builder
		for k := i; k < j; k++ {
			if !isHyphen(toks[k].Form) {
				key.WriteString(strings.ToLower(toks[k].Form))
			}
		}
		out[key.String()]++
	}
	return out
}

// FuzzNestedCounts compares the collector, which never generates spans
// longer than a candidate can be, with referenceCounts, which looks at
// every nested span: the candidates and their counts must be the same.
func FuzzNestedCounts(f *testing.F) {
	f.Add([]byte{0, 1, 0}, uint8(3))
	f.Add([]byte{2, 8 | 0, 3 | 8, 1, 4, 5, 0, 6, 7}, uint8(2))
	f.Add([]byte{0 | 8, 3 | 8, 1 | 8, 3 | 8, 0 | 8, 3 | 8, 1 | 8, 3 | 8, 0 | 8, 3 | 8, 1 | 8, 3 | 8, 0 | 8, 3 | 8, 1 | 8, 3 | 8, 0, 1}, uint8(1))
	mt, err := pattern.CompileStock("terms")
	require.NoError(f, err)
	f.Fuzz(func(t *testing.T, data []byte, maxWords uint8) {
		if len(data) > 64 {
			data = data[:64]
		}
		mw := 1 + int(maxWords%5)
		d := fuzzDocument(data)
		want := referenceCounts(mt, d, mw)
		dc := NewCollector(mt, Options{MaxWords: mw}).Collect(d)
		got := map[string]int{}
		for _, c := range dc.cands {
			got[c.key] = int(c.freq)
		}
		require.Equal(t, want, got, "max words %d, text %q", mw, d.Text)
	})
}

// TestReferenceCountsNotEmpty keeps the fuzz reference honest: on "hot
// steel valve" and on a compound of nine parts it finds what a reader
// would list.
func TestReferenceCountsNotEmpty(t *testing.T) {
	mt, err := pattern.CompileStock("terms")
	require.NoError(t, err)
	got := referenceCounts(mt, fuzzDocument([]byte{2, 1, 0}), 3)
	require.Equal(t, map[string]int{"hotsteelvalve": 1, "hotsteel": 1, "steelvalve": 1, "steel": 1, "valve": 1}, got)
	nine := []byte{0} // valve-steel-…-valve, then a space
	for k := 1; k < 9; k++ {
		nine[len(nine)-1] |= 8
		nine = append(nine, 8|3, byte(k%2))
	}
	require.Empty(t, referenceCounts(mt, fuzzDocument(nine), 3), "a word of nine parts is no candidate")
}
