package terms

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"glossmith/extract/tbx"
)

// writeTBX writes the candidates as TBX (dialect tbx.Core or tbx.Basic):
// one concept entry per candidate, its id derived from the canonical form
// (stable across runs, whatever the rank); the canonical form and its
// spelling variants as terms, each with its part of speech; inflected and
// case-only forms are not terms of their own; the longer candidate it
// mostly occurs in (Term.Within) is a note of the entry. Under TBX-Basic the contexts
// are context data categories with their document and line as source;
// under TBX-Core, notes.
func writeTBX(w io.Writer, terms []*Term, opt WriteOptions, dialect string) error {
	doc := &tbx.Document{Dialect: dialect, Lang: opt.Lang, Source: strings.TrimSpace("Term candidates for review, extracted by glossmith. " + opt.Source)}
	lang := opt.Lang
	if lang == "" {
		lang = "en"
	}
	doc.Lang = lang
	for _, t := range terms {
		e := tbx.Entry{
			ID:    tbx.StableID(Key(t.Term)),
			Notes: []string{fmt.Sprintf("candidate rank %d; score %s; frequency %d in %d document(s)", t.Rank, num(t.Score), t.Freq, t.Docs)},
		}
		if t.Within != "" {
			e.Notes = append(e.Notes, fmt.Sprintf("at least %d%% of its occurrences within the longer candidate %q", WithinPercent, t.Within))
		}
		main := tbx.Term{Lang: lang, Text: t.Term, POS: t.POS}
		for _, cx := range t.Contexts {
			main.Contexts = append(main.Contexts, tbx.Context{Text: cx.Text, Source: cx.Doc + ", line " + strconv.Itoa(cx.Line)})
		}
		e.Terms = append(e.Terms, main)
		for _, s := range SpellingVariants(t) {
			e.Terms = append(e.Terms, tbx.Term{Lang: lang, Text: s.Form, POS: t.POS,
				Notes: []string{fmt.Sprintf("spelling variant; %d occurrence(s)", s.Count)}})
		}
		doc.Entries = append(doc.Entries, e)
	}
	return tbx.Write(w, doc)
}

// Key is the key a canonical form is known by across runs: lower case,
// single spaces.
func Key(s string) string {
	return strings.Join(strings.Fields(strings.ToLower(s)), " ")
}

// SpellingVariants returns the surface forms of a candidate that spell it
// differently — with a hyphen, a space or closed up ("set-point",
// "setpoint" for "set point") — rather than inflect it ("set points") or
// capitalize it ("Set point"). Forms that differ from the canonical form
// only in case are one spelling; one form per spelling is kept, with the
// counts of its case variants summed, in the order of the variants.
func SpellingVariants(t *Term) []Variant {
	squash := func(s string) string {
		return strings.NewReplacer("-", "", " ", "", "\u2010", "", "\u2011", "").Replace(strings.ToLower(s))
	}
	base := squash(t.Term)
	canon := strings.ToLower(t.Term)
	lowerCanon := t.Term == canon
	var out []Variant
	at := map[string]int{}
	for _, v := range t.Variants {
		low := strings.ToLower(v.Form)
		if low == canon || squash(v.Form) != base {
			continue
		}
		form := v.Form
		if lowerCanon {
			form = low
		}
		if i, ok := at[low]; ok {
			out[i].Count += v.Count
			continue
		}
		at[low] = len(out)
		out = append(out, Variant{Form: form, Count: v.Count})
	}
	return out
}
