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
// mostly occurs in (Term.Within) is a note of the entry and, under
// TBX-Basic when it is listed, a cross-reference to its entry. A full form and
// the acronym the documents define for it are one entry, its id that of
// the full form, the terms typed fullForm and acronym; an acronym whose
// full form is not in the list still gets the full form as a term. Under TBX-Basic the contexts
// are context data categories with their document and line as source;
// under TBX-Core, notes.
//
// With a termbase (opt.TermStatus), every term written carries the
// administrative status the termbase holds for its text (none for a text
// it holds no decision on), a candidate's label that the status does not
// say — new, variant, acronym, full form, or an entry known by another
// term — is a note "termbase: LABEL", and a text the termbase rejected is
// not written at all (it is not a term; the header counts the candidates
// left out).
func writeTBX(w io.Writer, terms []*Term, opt WriteOptions, dialect string) error {
	doc := &tbx.Document{Dialect: dialect, Lang: opt.Lang, Source: strings.TrimSpace("Term candidates for review, extracted by glossmith. " + opt.Source)}
	lang := opt.Lang
	if lang == "" {
		lang = "en"
	}
	doc.Lang = lang
	status, labelled := opt.TermStatus, opt.TermStatus != nil
	if !labelled {
		status = func(string) (string, bool) { return "", false }
	}
	rejected := func(text string) bool { _, r := status(text); return r }
	byTerm := make(map[string]*Term, len(terms))
	left := 0
	for _, t := range terms {
		if rejected(t.Term) {
			left++
			continue
		}
		byTerm[t.Term] = t
	}
	if left > 0 {
		doc.Source += fmt.Sprintf(" %d candidate(s) the termbase rejected are left out.", left)
	}
	for _, t := range terms {
		if rejected(t.Term) {
			continue
		}
		full, short := t, (*Term)(nil)
		fullText := entryText(t)
		switch {
		case t.FullForm != "":
			// An acronym whose full form is listed is a term of that entry.
			if lf := byTerm[t.FullForm]; lf != nil && lf.Acronym == t.Term {
				continue
			}
			full, short = nil, t
		case t.Acronym != "":
			short = byTerm[t.Acronym]
		}
		e := tbx.Entry{
			ID:    tbx.StableID(Key(fullText)),
			Notes: []string{fmt.Sprintf("candidate rank %d; score %s; frequency %d in %d document(s)", t.Rank, num(t.Score), t.Freq, t.Docs)},
		}
		if t.Within != "" {
			e.Notes = append(e.Notes, fmt.Sprintf("at least %d%% of its occurrences within the longer candidate %q", WithinPercent, t.Within))
			if c := byTerm[t.Within]; c != nil {
				e.CrossRefs = append(e.CrossRefs, tbx.CrossRef{Target: tbx.StableID(Key(entryText(c))), Text: t.Within})
			}
		}
		add := func(x tbx.Term, cand *Term) {
			if rejected(x.Text) {
				return
			}
			x.Status, _ = status(x.Text)
			if cand != nil && labelled {
				x.Notes = append(labelNote(cand, x.Status), x.Notes...)
			}
			e.Terms = append(e.Terms, x)
		}
		main := tbx.Term{Lang: lang, Text: fullText}
		if full != nil {
			main.POS, main.Contexts = t.POS, tbxContexts(t)
		}
		if t.Acronym != "" || t.FullForm != "" {
			main.Type = "fullForm"
		}
		add(main, full)
		if full != nil {
			for _, s := range SpellingVariants(t) {
				add(tbx.Term{Lang: lang, Text: s.Form, POS: t.POS,
					Notes: []string{fmt.Sprintf("spelling variant; %d occurrence(s)", s.Count)}}, nil)
			}
		}
		switch {
		case short != nil:
			add(tbx.Term{Lang: lang, Text: short.Term, POS: short.POS, Type: "acronym", Contexts: tbxContexts(short),
				Notes: []string{fmt.Sprintf("candidate rank %d; frequency %d in %d document(s)", short.Rank, short.Freq, short.Docs)}}, short)
		case t.Acronym != "":
			add(tbx.Term{Lang: lang, Text: t.Acronym, Type: "acronym"}, nil)
		}
		doc.Entries = append(doc.Entries, e)
	}
	return tbx.Write(w, doc)
}

// labelNote is the note of a candidate's termbase label (Term.Status) where
// the administrative status written does not say it all: none for a term
// accepted or deprecated under its own entry.
func labelNote(t *Term, adminStatus string) []string {
	if t.Status == "" || adminStatus != "" && (t.Entry == "" || t.Entry == t.Term) {
		return nil
	}
	return []string{"termbase: " + statusText(t)}
}

// entryText is the text of the term an entry is known by: the full form
// of an acronym, else the term.
func entryText(t *Term) string {
	if t.FullForm != "" {
		return t.FullForm
	}
	return t.Term
}

// tbxContexts returns a term's contexts with their document and line as
// source.
func tbxContexts(t *Term) []tbx.Context {
	var out []tbx.Context
	for _, cx := range t.Contexts {
		out = append(out, tbx.Context{Text: cx.Text, Source: cx.Doc + ", line " + strconv.Itoa(cx.Line)})
	}
	return out
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
