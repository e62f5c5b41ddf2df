package colloc

import (
	"sort"

	"glossmith/extract/measure"
)

// Row is one ranked pair with its counts and every measure.
type Row struct {
	Relation string
	W1, W2   string
	Node     string // the word in the relation's @node slot (W1 or W2; empty for window pairs)
	F12      int64
	F1, F2   int64
	N        int64
	Scores   measure.Scores
}

// Table returns the pair's contingency table.
func (r Row) Table() measure.Table {
	return measure.Table{F12: float64(r.F12), F1: float64(r.F1), F2: float64(r.F2), N: float64(r.N)}
}

// RankOptions select and order rows.
type RankOptions struct {
	Measure   measure.Measure // sort key, descending
	MinFreq   int64           // pairs seen fewer times are left out (default 1)
	Relations []string        // keep only these relations (empty: all)
	Node      string          // keep only pairs whose @node word is this, or for window pairs either word (empty: all)
	Limit     int             // at most this many rows (0: all)
}

// Rank scores every pair that passes the filters and sorts the rows by the
// chosen measure, best first. Ties are broken by f(x,y) descending, then by
// relation, first word and second word in byte order, so the same counts
// always give the same order.
func (c *Counter) Rank(opt RankOptions) []Row {
	keep := map[string]bool{}
	for _, r := range opt.Relations {
		keep[r] = true
	}
	minFreq := max(opt.MinFreq, 1)
	var rows []Row
	for _, name := range c.Relations() {
		if len(keep) > 0 && !keep[name] {
			continue
		}
		r := c.rels[name]
		for k, f12 := range r.pairs {
			if f12 < minFreq {
				continue
			}
			row := Row{Relation: name, W1: c.words[k.w1], W2: c.words[k.w2], F12: f12,
				F1: r.first[k.w1], F2: r.second[k.w2], N: r.n}
			switch {
			case name == WindowRelation:
				// Window pairs have no node: a profile asks for either word.
				if opt.Node != "" && row.W1 != opt.Node && row.W2 != opt.Node {
					continue
				}
			case r.nodeW2[k]:
				row.Node = row.W2
			default:
				row.Node = row.W1
			}
			if opt.Node != "" && name != WindowRelation && row.Node != opt.Node {
				continue
			}
			row.Scores = row.Table().Scores()
			rows = append(rows, row)
		}
	}
	score := opt.Measure.Field
	if score == nil {
		m, _ := measure.Lookup("g2")
		score = m.Field
	}
	sort.Slice(rows, func(i, j int) bool {
		a, b := &rows[i], &rows[j]
		sa, sb := score(a.Scores), score(b.Scores)
		if sa != sb {
			return sa > sb
		}
		if a.F12 != b.F12 {
			return a.F12 > b.F12
		}
		if a.Relation != b.Relation {
			return a.Relation < b.Relation
		}
		if a.W1 != b.W1 {
			return a.W1 < b.W1
		}
		return a.W2 < b.W2
	})
	if opt.Limit > 0 && len(rows) > opt.Limit {
		rows = rows[:opt.Limit]
	}
	return rows
}
