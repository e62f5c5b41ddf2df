package termbase

// Labels a candidate gets from an Index.
const (
	LabelNew        = "new"        // no decision (also a deferred candidate)
	LabelAccepted   = "accepted"   // a preferred or admitted term
	LabelVariant    = "variant"    // a surface form or spelling of an entry's term
	LabelDeprecated = "deprecated" // a deprecated term
	LabelRejected   = "rejected"   // rejected: not a term
)

// Index answers "what does the termbase say about this candidate" from
// memory: built once from all entries, then one map look-up per form.
type Index struct {
	terms map[string]indexed // Key of a term's text
	forms map[string]indexed // Key of a surface form (not itself a term)
}

type indexed struct {
	status Status
	entry  string // the entry's preferred term
}

// NewIndex builds the index of lang's terms ("" for every language). A key
// held by two entries takes the first entry's term.
func NewIndex(entries []*Entry, lang string) *Index {
	ix := &Index{terms: map[string]indexed{}, forms: map[string]indexed{}}
	for _, e := range entries {
		p := e.Preferred(lang)
		if p == nil {
			continue
		}
		for _, t := range e.Terms {
			if lang != "" && t.Lang != lang {
				continue
			}
			if _, ok := ix.terms[t.Key]; !ok {
				ix.terms[t.Key] = indexed{t.Status, p.Text}
			}
			for _, f := range t.Forms {
				k := Key(f)
				if _, ok := ix.forms[k]; !ok {
					ix.forms[k] = indexed{t.Status, p.Text}
				}
			}
		}
	}
	return ix
}

// Len returns how many term keys the index holds.
func (ix *Index) Len() int { return len(ix.terms) }

// Label returns the label of a candidate with canonical form term and
// surface forms forms, and the preferred term of the entry it belongs to
// ("" for new ones). The canonical form decides when it is a stored term:
// accepted when preferred or admitted (variant when another term of its
// entry is the preferred one and the candidate is not), deprecated,
// rejected, or new when undecided. A candidate that is not a stored term
// but one of whose forms is a stored term or surface form is a variant of
// that entry.
func (ix *Index) Label(term string, forms []string) (label, entry string) {
	if x, ok := ix.terms[Key(term)]; ok {
		switch x.status {
		case Preferred, Admitted:
			return LabelAccepted, x.entry
		case Deprecated:
			return LabelDeprecated, x.entry
		case Rejected:
			return LabelRejected, x.entry
		}
		return LabelNew, ""
	}
	if x, ok := ix.forms[Key(term)]; ok && x.status != Rejected && x.status != Candidate {
		return LabelVariant, x.entry
	}
	for _, f := range forms {
		k := Key(f)
		x, ok := ix.terms[k]
		if !ok {
			x, ok = ix.forms[k]
		}
		if ok && x.status != Rejected && x.status != Candidate {
			return LabelVariant, x.entry
		}
	}
	return LabelNew, ""
}
