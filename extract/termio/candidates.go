package termio

import (
	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
	"glossmith/extract/terms"
)

// Label sets each candidate's Status and Entry from the index (one map
// look-up per form; see termbase.Index.Label).
func Label(ix *termbase.Index, cands []*terms.Term) {
	var forms []string
	for _, t := range cands {
		forms = forms[:0]
		for _, v := range t.Variants {
			forms = append(forms, v.Form)
		}
		t.Status, t.Entry = ix.Label(t.Term, forms)
		labelPair(ix, t)
	}
}

// labelPair labels a candidate that the documents link to an acronym or a
// full form (terms.Term.Acronym, FullForm) the termbase has accepted: the
// acronym of an accepted full form, the full form of an accepted acronym,
// with that entry — not new, and not a variant, which it would otherwise
// be for the acronym's spellings pooled among its forms. A candidate the
// termbase holds itself, or holds as a form of another entry, keeps its
// label.
func labelPair(ix *termbase.Index, t *terms.Term) {
	partner, label := t.Acronym, termbase.LabelFullForm
	if partner == "" {
		partner, label = t.FullForm, termbase.LabelAcronym
	}
	if partner == "" || t.Status != termbase.LabelNew && t.Status != termbase.LabelVariant {
		return
	}
	st, entry := ix.Label(partner, nil)
	if st != termbase.LabelAccepted || t.Status == termbase.LabelVariant && t.Entry != entry {
		return
	}
	t.Status, t.Entry = label, entry
}

// OnlyNew keeps the candidates without a decision.
func OnlyNew(cands []*terms.Term) []*terms.Term {
	out := cands[:0:0]
	for _, t := range cands {
		if t.Status == termbase.LabelNew {
			out = append(out, t)
		}
	}
	return out
}

// RunTerms turns candidates into what a recorded run keeps of them; the
// part of speech is the TBX-Basic one of the candidate's head.
func RunTerms(cands []*terms.Term) []termbase.RunTerm {
	out := make([]termbase.RunTerm, len(cands))
	for i, t := range cands {
		r := termbase.RunTerm{Term: t.Term, POS: tbx.BasicPOS(t.POS), Freq: t.Freq, Docs: t.Docs}
		for _, v := range t.Variants {
			r.Forms = append(r.Forms, termbase.Form{Text: v.Form, Count: v.Count})
		}
		for _, c := range t.Contexts {
			r.Contexts = append(r.Contexts, termbase.Context{Text: c.Text, Doc: c.Doc, Line: c.Line})
		}
		out[i] = r
	}
	return out
}
