package termbase

// Labels a candidate gets from an Index.
const (
	LabelNew        = "new"        // no decision (also a deferred candidate)
	LabelAccepted   = "accepted"   // a preferred or admitted term
	LabelVariant    = "variant"    // a surface form or spelling of an entry's term
	LabelDeprecated = "deprecated" // a deprecated term
	LabelRejected   = "rejected"   // rejected: not a term
	// A candidate that is not a stored term itself but that the documents
	// define as the acronym of an accepted term, or whose acronym is one:
	// the other term of that concept, not a spelling of it.
	LabelAcronym  = "acronym"
	LabelFullForm = "full form"
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

// Status returns the status of the term the termbase holds with text's
// key, and whether it holds one (a surface form alone is no term).
func (ix *Index) Status(text string) (Status, bool) {
	x, ok := ix.terms[Key(text)]
	return x.status, ok
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

// Index builds the Index of lang's terms ("" for every language) straight
// from the terms and forms tables — two queries and no Entry values, so
// that labelling a run's candidates costs little beside the run. It gives
// the same labels as NewIndex over Entries.
func (s *Store) Index(lang string) (*Index, error) {
	type row struct {
		entry, id int64
		key, text string
		status    Status
	}
	rows, err := s.db.Query("SELECT entry_id, id, key, text, status FROM terms WHERE ? = '' OR lang = ? ORDER BY entry_id, id", lang, lang)
	if err != nil {
		return nil, s.errf(err)
	}
	var all []row
	for rows.Next() {
		var r row
		if err := rows.Scan(&r.entry, &r.id, &r.key, &r.text, &r.status); err != nil {
			rows.Close()
			return nil, s.errf(err)
		}
		all = append(all, r)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, s.errf(err)
	}
	ix := &Index{terms: make(map[string]indexed, len(all)), forms: map[string]indexed{}}
	byTerm := make(map[int64]indexed, len(all))
	for i := 0; i < len(all); {
		j := i
		best := i
		for j < len(all) && all[j].entry == all[i].entry {
			if statusRank(all[j].status) < statusRank(all[best].status) {
				best = j
			}
			j++
		}
		for _, r := range all[i:j] {
			x := indexed{r.status, all[best].text}
			if _, ok := ix.terms[r.key]; !ok {
				ix.terms[r.key] = x
			}
			byTerm[r.id] = x
		}
		i = j
	}
	frows, err := s.db.Query("SELECT term_id, key FROM forms ORDER BY term_id, form")
	if err != nil {
		return nil, s.errf(err)
	}
	defer frows.Close()
	for frows.Next() {
		var id int64
		var key string
		if err := frows.Scan(&id, &key); err != nil {
			return nil, s.errf(err)
		}
		if x, ok := byTerm[id]; ok {
			if _, seen := ix.forms[key]; !seen {
				ix.forms[key] = x
			}
		}
	}
	return ix, s.errf(frows.Err())
}
