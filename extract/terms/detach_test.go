package terms

import (
	"sort"
	"testing"
	"unsafe"

	"glossmith/grammar"
	"glossmith/internal/testenv"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
)

// A corpus must not keep any string that points into a document's text:
// one word form would keep the whole text in memory, and on a large corpus
// nearly every document would stay (see detach). The documents are kept
// alive here so that their memory is not reused while the strings are
// checked.
func TestCorpusKeepsNoDocumentText(t *testing.T) {
	model, err := hmm.Default()
	if err != nil {
		t.Fatal(err)
	}
	rs, err := grammar.LoadStock("terms")
	if err != nil {
		t.Fatal(err)
	}
	m, err := pattern.Compile(rs)
	if err != nil {
		t.Fatal(err)
	}
	type span struct{ lo, hi uintptr }
	var texts []span
	var docs []*doc.Document
	c := NewCorpus(3)
	col := NewCollector(m, Options{Contexts: 3})
	pipeline.Run([]string{testenv.Demo(t)}, pipeline.Options{Tagger: model}, col.Collect,
		func(d *doc.Document, dc *DocCounts) {
			p := uintptr(unsafe.Pointer(unsafe.StringData(d.Text)))
			texts = append(texts, span{p, p + uintptr(len(d.Text))})
			docs = append(docs, d)
			c.Add(dc)
		})
	if len(docs) == 0 {
		t.Fatal("no documents")
	}
	sort.Slice(texts, func(i, j int) bool { return texts[i].lo < texts[j].lo })
	inText := func(s string) bool {
		if s == "" {
			return false
		}
		p := uintptr(unsafe.Pointer(unsafe.StringData(s)))
		i := sort.Search(len(texts), func(i int) bool { return texts[i].hi > p })
		return i < len(texts) && texts[i].lo <= p
	}
	check := func(what, s string) {
		if inText(s) {
			t.Errorf("%s %q points into a document's text", what, s)
		}
	}
	for w := range c.words.Words {
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
			for _, w := range v.words {
				check("canonical word", w)
			}
			for _, w := range v.keys {
				check("content key", w)
			}
		}
		for _, cx := range append(append([]Context(nil), g.contexts...), g.spare...) {
			check("context", cx.Text)
		}
	}
	if t.Failed() {
		return
	}
	// The check must be able to fail: the per-document counts do point
	// into the texts.
	dc := col.Collect(docs[0])
	found := false
	for w := range dc.Words {
		if inText(w) {
			found = true
			break
		}
	}
	if !found {
		t.Error("no per-document word points into its text: the check cannot tell")
	}
}
