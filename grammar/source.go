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
		start := r.Pos.Offset
		if start < 0 || start >= len(f.Src) {
			return ""
		}
		return f.Src[start:ruleEnd(f.Src, start)]
	}
	return ""
}

// ruleEnd returns the offset just past the ";" that ends the rule starting
// at start: quoted words, regular expressions (each with backslash
// escapes) and comments are skipped, since they may hold a ";".
func ruleEnd(src string, start int) int {
	for i := start; i < len(src); i++ {
		switch c := src[i]; c {
		case ';':
			return i + 1
		case '#':
			for i < len(src) && src[i] != '\n' {
				i++
			}
		case '"', '\'', '/':
			for i++; i < len(src) && src[i] != c && src[i] != '\n'; i++ {
				if src[i] == '\\' {
					i++
				}
			}
		}
	}
	return len(src)
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
