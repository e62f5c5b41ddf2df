package check

import (
	"cmp"
	"slices"
	"strings"

	"glossmith/extract/terms"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// Options select what Check looks for.
type Options struct {
	// Glossary is the compiled glossary; nil checks no terms.
	Glossary *Matcher
	// Misspellings, when set, also finds the Glossary's terms written with
	// a word misspelt (made by NewMisspellings for the same glossary).
	Misspellings *Misspellings
	// Candidates, when set, are the rules (normally the stock "terms"
	// set) whose matches are grouped into variants as the terms command
	// groups them, for the mixed-spelling report (see Mixed).
	Candidates *pattern.Matcher
	// Encoding is the encoding the documents were read in when the reader
	// was told one (the CLI's --encoding), by its WHATWG label; empty when
	// it detected it. The check reads a Markdown source again for its
	// code spans and skip comments, in the same encoding.
	Encoding string
}

// DocResult is what one document contributes: its glossary findings in
// text order and, when asked, the spellings of its variant groups.
type DocResult struct {
	Name     string
	Findings []Finding
	// Suppressed counts the findings left out as code, addresses or
	// silenced lines.
	Suppressed int
	spellings  []docSpelling
}

// docSpelling is one spelling of a variant group in a document: what the
// report keeps of it, no more (a document has one for nearly every
// candidate, and they wait in the pipeline for the documents before).
type docSpelling struct {
	key, spelling string // group key; spelling as first written, case folded for comparison
	n             int
	// where it is first used: positions and text as written
	line, col, endLine, endCol int32
	text                       string
}

// Check checks one annotated document. src is its source file as read
// from disk (nil when there is none, as for standard input), from which
// code and skip comments are worked out; positions come from the
// document's own maps (doc.Document.SourcePosition). It is safe to call
// on several documents at once.
func Check(d *doc.Document, src []byte, opt Options) *DocResult {
	res := &DocResult{Name: d.Name}
	l := newLayout(d, src, opt.Encoding)
	if opt.Glossary != nil {
		sc := &scanner{m: opt.Glossary}
		var spans []span
		var miss []misspelt
		var fixed []doc.Token
		ms := opt.Misspellings
		if ms != nil && ms.m != opt.Glossary {
			ms = nil
		}
		dc := docCapitals{sents: d.Sentences, sentence: -1, keep: opt.Glossary.hasSingular}
		if ms != nil {
			dc.keep = func(w []byte) bool { return ms.mayBeMisspelt(w) || opt.Glossary.hasSingular(w) }
		}
		add := func(f *Finding) {
			f.File = d.Name
			l.span(f)
			if l.suppressed(f) {
				res.Suppressed++
				return
			}
			res.Findings = append(res.Findings, *f)
		}
		for si := range d.Sentences {
			toks := d.Sentences[si].Tokens
			read := sc.readSingulars(&dc, si)
		scan:
			spans = sc.find(spans[:0], read)
			n, suppressed := len(res.Findings), res.Suppressed
			for _, sp := range spans {
				f, ok := opt.Glossary.classify(d, read, sp)
				if !ok {
					continue
				}
				if len(sc.singulars) > 0 && sc.dropNames(&dc, si, sp) {
					// a name read as a term's plural: the sentence is
					// scanned again without that reading
					res.Findings, res.Suppressed = res.Findings[:n], suppressed
					goto scan
				}
				add(&f)
			}
			if ms != nil {
				miss = ms.find(miss[:0], sc, &dc, si, spans, &fixed)
				for _, sp := range miss {
					if f := opt.Glossary.classifyMisspelt(d, toks, sp); f != nil {
						add(f)
					}
				}
			}
		}
	}
	if opt.Candidates != nil {
		res.spellings = spellings(d, l, opt.Candidates)
	}
	return res
}

// suppressed reports whether a finding is in code, in a URL, e-mail
// address or file path, or on a silenced line.
func (l *layout) suppressed(f *Finding) bool {
	return l.skip[f.Line] || l.inCode(f) || inAddress(l.d.Text, f.Start, f.End)
}

// spellings collects the spellings of the document's variant groups: how
// often each is used outside code, addresses and silenced lines, and where
// first.
func spellings(d *doc.Document, l *layout, rules *pattern.Matcher) []docSpelling {
	type use struct {
		key, spelling string
		start, end    int32
	}
	var uses []use
	c := terms.NewCollector(rules, terms.Options{Keep: func(toks []doc.Token) bool {
		key, spelling := terms.SpellingOf(toks)
		if key != "" {
			uses = append(uses, use{key, spelling, toks[0].Start, toks[len(toks)-1].End})
		}
		return false // counted here, not by the collector
	}})
	c.Collect(d).Release()
	var out []docSpelling
	index := map[string]int{}
	for _, u := range uses {
		f := Finding{File: d.Name, Start: int(u.start), End: int(u.end), Text: foldSpace(d.Text[u.start:u.end])}
		l.span(&f)
		if l.suppressed(&f) {
			continue
		}
		k := u.key + "\x00" + strings.ToLower(u.spelling)
		if at, ok := index[k]; ok {
			out[at].n++
			continue
		}
		index[k] = len(out)
		out = append(out, docSpelling{key: u.key, spelling: u.spelling, n: 1,
			line: int32(f.Line), col: int32(f.Column), endLine: int32(f.EndLine), endCol: int32(f.EndColumn), text: f.Text})
	}
	return out
}

// sortFindings orders findings by line, column and kind.
func sortFindings(fs []Finding) {
	slices.SortStableFunc(fs, func(a, b Finding) int {
		if c := cmp.Compare(a.Line, b.Line); c != 0 {
			return c
		}
		if c := cmp.Compare(a.Column, b.Column); c != 0 {
			return c
		}
		return cmp.Compare(a.Kind, b.Kind)
	})
}
