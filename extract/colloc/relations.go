package colloc

import (
	"strings"

	"glossmith/grammar"
	"glossmith/internal/suggest"
)

// oldSlots are the slot names of earlier versions, each with today's name.
var oldSlots = map[string]string{"head": NodeSlot, "dep": CollocateSlot}

// CheckRelations checks that every rule counted as a relation labels its
// two words @node and @collocate, so that a rule without them is an error
// and not an empty table. names are the rules to be counted; with none,
// every rule whose name does not start with "_" (as pattern.Compile
// takes). Only the rule's own labels count: labels inside a rule it refers
// to stay there. The error, if any, is a grammar.ErrorList with the
// position of each rule (or of an old-style label, @head or @dep, with the
// name to use instead). A name that is no rule is left to the compiler.
func CheckRelations(rs *grammar.RuleSet, names ...string) error {
	if len(names) == 0 {
		for _, r := range rs.Rules {
			if !strings.HasPrefix(r.Name, "_") {
				names = append(names, r.Name)
			}
		}
	}
	var errs grammar.ErrorList
	for _, name := range names {
		r := rs.Rule(name)
		if r == nil {
			continue
		}
		has := map[string]bool{}
		grammar.Walk(r.Expr, func(n grammar.Node) {
			l, ok := n.(*grammar.Label)
			if !ok {
				return
			}
			has[l.Name] = true
			if now, old := oldSlots[l.Name]; old {
				has[now] = true // reported here, not again as missing
				errs.Add(l.Pos, rs.SourceLine(l.Pos), "collocation slot @%s — %s", l.Name, suggest.Phrase([]string{"@" + now}))
			}
		})
		var missing []string
		for _, s := range []string{NodeSlot, CollocateSlot} {
			if !has[s] {
				missing = append(missing, "@"+s)
			}
		}
		if len(missing) > 0 {
			errs.Add(r.Pos, rs.SourceLine(r.Pos), "rule %s has no %s slot: a relation counted by collocations labels the word studied @%s and the word found with it @%s",
				name, strings.Join(missing, " and no "), NodeSlot, CollocateSlot)
		}
	}
	errs.Sort()
	return errs.Err()
}
