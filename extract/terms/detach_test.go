package terms

import (
	"runtime"
	"sort"
	"testing"
	"unsafe"

	"glossmith/internal/testenv"
	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
)

// A corpus must not keep any string that points into a document's text
// or into the memory of its per-document counts: one word form would keep
// the whole text (or arena block) in memory, and on a large corpus nearly
// every document would stay (see Corpus.Add). The documents and counts are
// kept alive here so that their memory is not reused while the strings are
// checked.
func TestCorpusKeepsNoDocumentText(t *testing.T) {
	model, col := stockSetup(t, Options{Contexts: 3})
	var texts, made spanSet // documents' texts; strings of their counts
	var docs []*doc.Document
	var counts []*DocCounts
	c := NewCorpus(3)
	pipeline.Run([]string{testenv.Demo(t)}, pipeline.Options{Tagger: model}, col.Collect,
		func(d *doc.Document, dc *DocCounts) {
			texts.add(d.Text)
			// every string of the counts, cut from the text or made up
			for _, w := range dc.words {
				made.add(w.word)
			}
			for _, x := range dc.cands {
				made.add(x.key)
			}
			for _, v := range dc.spells {
				made.add(v.text)
			}
			for _, v := range dc.canons {
				made.add(v.all)
			}
			for _, cx := range dc.contexts {
				made.add(cx.text)
			}
			docs = append(docs, d)
			counts = append(counts, dc)
			c.Add(dc)
		})
	if len(docs) == 0 {
		t.Fatal("no documents")
	}
	texts.finish()
	made.finish()
	runtime.KeepAlive(counts)
	check := func(what, s string) {
		if texts.holds(s) || made.holds(s) {
			t.Errorf("%s %q points into a document's text or counts", what, s)
		}
	}
	for w := range c.words.index {
		check("word count key", w)
	}
	for _, k := range c.order {
		g := c.groups[k]
		check("group key", k)
		for _, v := range g.variants {
			check("variant", v.text)
		}
		for _, v := range g.canon {
			check("canonical form", v.text)
			for _, w := range v.words() {
				check("canonical word", w)
			}
			for _, w := range v.keys() {
				check("content key", w)
			}
		}
		for _, cx := range g.contexts {
			check("context", cx.text)
		}
	}
	if t.Failed() {
		return
	}
	// The check must be able to fail: the per-document counts do point
	// into the texts (their spellings are slices of it; so were some word
	// keys, until the tagger came to copy every lemma it makes up).
	dc := col.Collect(docs[0])
	found := false
	for _, v := range dc.spells {
		if texts.holds(v.text) {
			found = true
			break
		}
	}
	if !found {
		t.Error("no per-document spelling points into its text: the check cannot tell")
	}
}

// spanSet is a set of memory ranges, for finding out whether a string
// shares memory with any of the strings added.
type spanSet []struct{ lo, hi uintptr }

// add adds the memory of s. One-byte strings are left out: Go makes them
// point into a static table of the runtime, shared by every string of
// that byte.
func (ss *spanSet) add(s string) {
	if len(s) > 1 {
		p := uintptr(unsafe.Pointer(unsafe.StringData(s)))
		*ss = append(*ss, struct{ lo, hi uintptr }{p, p + uintptr(len(s))})
	}
}

// finish sorts the ranges and merges those that overlap, so that holds
// can search them.
func (ss *spanSet) finish() {
	s := *ss
	sort.Slice(s, func(i, j int) bool { return s[i].lo < s[j].lo })
	out := s[:0]
	for _, r := range s {
		if n := len(out); n > 0 && r.lo < out[n-1].hi {
			out[n-1].hi = max(out[n-1].hi, r.hi)
			continue
		}
		out = append(out, r)
	}
	*ss = out
}

// holds reports whether s begins inside one of the ranges.
func (ss spanSet) holds(s string) bool {
	if s == "" {
		return false
	}
	p := uintptr(unsafe.Pointer(unsafe.StringData(s)))
	i := sort.Search(len(ss), func(i int) bool { return ss[i].hi > p })
	return i < len(ss) && ss[i].lo <= p
}
