package termio

import (
	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
	"glossmith/extract/terms"
)

// Label sets each candidate's Status and Entry from the index (one map
// look-up per form; see LabelOf).
func Label(ix *termbase.Index, cands []*terms.Term) {
	var forms []string
	for _, t := range cands {
		forms = forms[:0]
		for _, v := range t.Variants {
			forms = append(forms, v.Form)
		}
		t.Status, t.Entry = LabelOf(ix, t.Term, forms, t.Acronym, t.FullForm)
	}
}

// LabelOf is the label of one candidate — its canonical form term, its
// surface forms, and the acronym or full form the documents link it to
// (terms.Term.Acronym, FullForm; "" for none) — and the preferred term of
// the entry it belongs to. It is the one labelling of candidates: terms
// --termbase, its HTML report and the review page all call it.
//
// It is termbase.Index.Label, except for a candidate linked to an acronym
// or a full form the termbase has accepted: the acronym of an accepted
// full form, the full form of an accepted acronym, with that entry — not
// new, and not a variant, which it would otherwise be for the acronym's
// spellings pooled among its forms. A candidate the termbase holds
// itself, or holds as a form of another entry, keeps its label.
func LabelOf(ix *termbase.Index, term string, forms []string, acronym, fullForm string) (label, entry string) {
	label, entry = ix.Label(term, forms)
	partner, pair := acronym, termbase.LabelFullForm
	if partner == "" {
		partner, pair = fullForm, termbase.LabelAcronym
	}
	if partner == "" || label != termbase.LabelNew && label != termbase.LabelVariant {
		return label, entry
	}
	st, pe := ix.Label(partner, nil)
	if st != termbase.LabelAccepted || label == termbase.LabelVariant && entry != pe {
		return label, entry
	}
	return pair, pe
}

// TermStatus is terms.WriteOptions.TermStatus from the index: the TBX-Basic
// administrative status of a text the termbase holds as a preferred,
// admitted or deprecated term ("" otherwise: no decision, a candidate, a
// surface form only), and whether it holds the text rejected.
func TermStatus(ix *termbase.Index) func(text string) (string, bool) {
	return func(text string) (string, bool) {
		st, ok := ix.Status(text)
		return adminStatus(st), ok && st == termbase.Rejected
	}
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
// part of speech is the TBX-Basic one of the candidate's head. The
// acronym / full-form link is kept, so that LabelOf labels a recorded
// run's pair as it labels the live run's.
func RunTerms(cands []*terms.Term) []termbase.RunTerm {
	out := make([]termbase.RunTerm, len(cands))
	for i, t := range cands {
		r := termbase.RunTerm{Term: t.Term, POS: tbx.BasicPOS(t.POS), Freq: t.Freq, Docs: t.Docs, Acronym: t.Acronym, FullForm: t.FullForm}
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
