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
		rows[i+1] = append(rows[i+1], statusText(t))
	}
}

// statusText is a candidate's label as the text formats show it: for one
// that belongs to an entry known by another term, "LABEL of ENTRY".
func statusText(t *Term) string {
	if t.Entry != "" && t.Entry != t.Term {
		return t.Status + " of " + t.Entry
	}
	return t.Status
}
