package grammar

import (
	"glossmith/internal/suggest"
)

// CheckTags checks the fine-tag tests of every rule of the set against
// xpos, the fine tags the tagging model assigns (hmm.Model.XPOSTags): a
// test `xpos:NNQ` of a tag the model never assigns can never match and is
// an error, with a suggestion when a tag is near; a regular expression
// `xpos:/…/` that matches none of the tags is a warning (it may be written
// for another model). With no tags (a model that tags no XPOS) nothing is
// checked.
func (rs *RuleSet) CheckTags(xpos []string) (errs, warnings ErrorList) {
	if len(xpos) == 0 {
		return nil, nil
	}
	known := make(map[string]bool, len(xpos))
	for _, t := range xpos {
		known[t] = true
	}
	for _, r := range rs.Rules {
		Walk(r.Expr, func(n Node) {
			t, ok := n.(*Test)
			if !ok {
				return
			}
			switch {
			case t.Kind == XPOS && !known[t.Value]:
				msg := "unknown fine tag xpos:" + t.Value + ": the tagging model never assigns it"
				if h := suggest.Hint(t.Value, xpos); h != "" {
					msg += " — " + h
				}
				errs.Add(t.Pos, rs.SourceLine(t.Pos), "%s", msg)
			case t.Kind == XPOSRe && t.Re != nil && !matchesAny(t, xpos):
				warnings.Add(t.Pos, rs.SourceLine(t.Pos), "xpos:/%s/ matches none of the %d fine tags of the tagging model", t.Value, len(xpos))
			}
		})
	}
	errs.Sort()
	warnings.Sort()
	return errs, warnings
}

func matchesAny(t *Test, tags []string) bool {
	for _, tag := range tags {
		if t.Re.MatchString(tag) {
			return true
		}
	}
	return false
}
