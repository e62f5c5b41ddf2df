package terms

import (
	"glossmith/extract/wordshape"
	"strings"
	"unicode"
)

// foldCapitalPlurals merges a group whose canonical form keeps a capital
// plural head — a common noun the tagger read as a proper noun in a
// heading or at the start of a sentence ("Articles", "Valve Seats") — into
// the group of its singular when the corpus has that group too. The tagger
// keeps the case and the plural of proper nouns, so without this step the
// capitalized plural would stand apart from its own lemma. Groups of real
// names are untouched unless a singular lower-case-keyed group exists.
func (c *Corpus) foldCapitalPlurals() {
	kept := c.order[:0]
	for _, k := range c.order {
		g := c.groups[k]
		cn := g.canonical()
		into, ok := c.groups[strings.TrimSuffix(k, "s")]
		if !ok || !strings.HasSuffix(k, "s") || into == g || !capitalHead(cn) {
			kept = append(kept, k)
			continue
		}
		into.absorb(g)
		delete(c.groups, k)
	}
	c.order = kept
}

// capitalHead reports whether a canonical form's last word is a capitalized
// proper-noun plural.
func capitalHead(cn *canonical) bool {
	words := cn.words()
	if len(words) == 0 || !strings.HasSuffix(cn.pos, "PROPN") {
		return false
	}
	w := words[len(words)-1]
	r := []rune(w)
	return len(r) > 2 && unicode.IsUpper(r[0]) && strings.HasSuffix(w, "s") && !wordshape.IsAcronym(w)
}

// absorb adds the counts of group o to g.
func (g *group) absorb(o *group) {
	g.freq += o.freq
	g.kept += o.kept
	merged := make([]docFreq, 0, len(g.perDoc)+len(o.perDoc))
	i, j := 0, 0
	for i < len(g.perDoc) || j < len(o.perDoc) {
		switch {
		case j == len(o.perDoc) || i < len(g.perDoc) && g.perDoc[i].doc < o.perDoc[j].doc:
			merged = append(merged, g.perDoc[i])
			i++
		case i == len(g.perDoc) || o.perDoc[j].doc < g.perDoc[i].doc:
			merged = append(merged, o.perDoc[j])
			j++
		default:
			merged = append(merged, docFreq{g.perDoc[i].doc, g.perDoc[i].n + o.perDoc[j].n})
			i++
			j++
		}
	}
	g.perDoc = merged
	for _, v := range o.variants {
		g.variants = addSpelling(g.variants, v)
	}
	// The capitalized plural's canonical spelling is not kept: the group's
	// canonical form is its singular.
	g.contexts = append(g.contexts, o.contexts...) // as spare ones
}
