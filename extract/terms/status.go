package terms

// hasStatus reports whether the list was labelled from a termbase.
func hasStatus(terms []*Term) bool {
	for _, t := range terms {
		if t.Status != "" {
			return true
		}
	}
	return false
}

// addStatusColumn appends a "status" column to the text table's rows (the
// header first): the label, and for a variant the entry it belongs to.
func addStatusColumn(rows [][]string, terms []*Term) {
	rows[0] = append(rows[0], "status")
	for i, t := range terms {
		s := t.Status
		if t.Entry != "" && t.Entry != t.Term {
			s += " of " + t.Entry
		}
		rows[i+1] = append(rows[i+1], s)
	}
}
