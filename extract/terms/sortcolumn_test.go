package terms

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The text table shows the measure a list is sorted by: sorted by C-value
// or weirdness, which the table does not show otherwise, the order looked
// arbitrary. Other sort keys are columns already and add none.
func TestTextShowsTheSortMeasure(t *testing.T) {
	ts := []*Term{
		{Rank: 1, Term: "drip emitter", Score: 9.5, Freq: 4, Docs: 2, CValue: 12.25, Weirdness: 310.4},
		{Rank: 2, Term: "valve", Score: 11.2, Freq: 9, Docs: 3, CValue: 9, Weirdness: 1200.75},
	}
	tests := []struct {
		sort   string
		header []string
		row1   []string
	}{
		{"cvalue", []string{"#", "term", "score", "freq", "docs", "cvalue", "keyness", "dp", "variants"},
			[]string{"1", "drip", "emitter", "9.50", "4", "2", "12.25", "0.0", "0.00"}},
		{"weirdness", []string{"#", "term", "score", "freq", "docs", "weirdness", "keyness", "dp", "variants"},
			[]string{"1", "drip", "emitter", "9.50", "4", "2", "310.4", "0.0", "0.00"}},
		{"score", []string{"#", "term", "score", "freq", "docs", "keyness", "dp", "variants"},
			[]string{"1", "drip", "emitter", "9.50", "4", "2", "0.0", "0.00"}},
		{"", []string{"#", "term", "score", "freq", "docs", "keyness", "dp", "variants"},
			[]string{"1", "drip", "emitter", "9.50", "4", "2", "0.0", "0.00"}},
	}
	for _, tt := range tests {
		t.Run(tt.sort, func(t *testing.T) {
			var b bytes.Buffer
			require.NoError(t, Write(&b, "text", ts, WriteOptions{Sort: tt.sort}))
			lines := strings.Split(b.String(), "\n")
			require.GreaterOrEqual(t, len(lines), 3, b.String())
			assert.Equal(t, tt.header, strings.Fields(lines[0]))
			assert.Equal(t, tt.row1, strings.Fields(lines[1]))
		})
	}
}
