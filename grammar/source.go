package grammar

// Source returns rule r as written in its file, from its name to the ";"
// that ends it (comments and line breaks inside kept), so that a rule can
// be shown as its author wrote it rather than re-rendered; "" when r's
// file is not one of the set's.
func (rs *RuleSet) Source(r *Rule) string {
	for _, f := range rs.Files {
		if f.Name != r.Pos.File {
			continue
		}
		start, end := r.Pos.Offset, r.End.Offset
		if start < 0 || end <= start || end > len(f.Src) {
			return ""
		}
		return f.Src[start:end]
	}
	return ""
}

// Uses returns the rules that the rule called name refers to, directly or
// through other rules, each once, in the order they are first met (depth
// first); nil for a rule that refers to none or does not exist.
func (rs *RuleSet) Uses(name string) []string {
	var out []string
	seen := map[string]bool{name: true}
	var visit func(r *Rule)
	visit = func(r *Rule) {
		Walk(r.Expr, func(n Node) {
			ref, ok := n.(*Ref)
			if !ok || seen[ref.Name] {
				return
			}
			seen[ref.Name] = true
			out = append(out, ref.Name)
			if sub := rs.Rule(ref.Name); sub != nil {
				visit(sub)
			}
		})
	}
	if r := rs.Rule(name); r != nil {
		visit(r)
	}
	return out
}
