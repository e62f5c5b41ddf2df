package colloc

import (
	"bytes"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/measure"
)

// The text table shows the measure the rows are sorted by, first among the
// measures, beside the four it always shows and without repeating one: a
// list sorted by dice or chi2 showed g2, logdice, pmi and t only.
func TestTextShowsTheSortMeasureFirst(t *testing.T) {
	c := NewCounter()
	for _, p := range []struct {
		w1, w2 string
		n      int
	}{{"solenoid", "valve", 6}, {"faulty", "valve", 2}, {"faulty", "sensor", 3}, {"drip", "emitter", 4}} {
		for i := 0; i < p.n; i++ {
			c.Add(Pair{Relation: "noun_noun", W1: p.w1, W2: p.w2, NodeIsW2: true})
		}
	}
	for _, m := range measure.All() {
		t.Run(m.Name, func(t *testing.T) {
			rows := c.Rank(RankOptions{Measure: m})
			require.NotEmpty(t, rows)
			var b bytes.Buffer
			require.NoError(t, Write(&b, "text", rows, m.Name))
			lines := strings.Split(strings.TrimSpace(b.String()), "\n")
			require.Len(t, lines, len(rows)+2, "header, rows, footer")
			head := strings.Fields(lines[0])
			require.GreaterOrEqual(t, len(head), 6)
			assert.Equal(t, []string{"pair", "relation", "f12", "f1", "f2", m.Name}, head[:6])
			for _, always := range textMeasures {
				assert.Contains(t, head[5:], always)
			}
			seen := map[string]bool{}
			for _, h := range head {
				assert.False(t, seen[h], "column %s twice", h)
				seen[h] = true
			}
			// The first row: a two-word pair, then relation, counts, and
			// the sort measure's value as the table prints it.
			first := strings.Fields(lines[1])
			require.Len(t, first, len(head)+1)
			d, ok := textDecimals[m.Name]
			if !ok {
				d = 2
			}
			assert.Equal(t, strconv.FormatFloat(m.Field(rows[0].Scores), 'f', d, 64), first[6])
			assert.Equal(t, "(4 pairs, sorted by "+m.Name+")", lines[len(lines)-1])
		})
	}
}
