package termbase

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Diff's G² is Dunning's (1993) log-likelihood ratio of the 2×2 table
// [term count, other words] × [later run, earlier run]:
// G² = 2 Σ O·ln(O/E). The expected values below are that formula worked
// out for each table (40 vs 10 occurrences in 10,000 words each: 19.3196;
// 12 vs 10: 0.1823; 0 vs 30: 41.6339).
func TestDiffLogLikelihood(t *testing.T) {
	s := openTemp(t)
	_, err := s.RecordRun(Run{Label: "v2", Tokens: 10000}, []RunTerm{
		{Term: "set point", Freq: 10}, {Term: "valve", Freq: 10}, {Term: "magnet valve", Freq: 30}, {Term: "vent", Freq: 1},
	})
	require.NoError(t, err)
	_, err = s.RecordRun(Run{Label: "v3", Tokens: 10000}, []RunTerm{
		{Term: "set point", Freq: 40}, {Term: "valve", Freq: 12}, {Term: "flow sensor", Freq: 7}, {Term: "pulse factor", Freq: 1},
	})
	require.NoError(t, err)
	_, err = s.RecordRun(Run{Label: "v3", Tokens: 1}, nil)
	assert.ErrorIs(t, err, ErrRunExists)

	rows, err := s.Diff("v2", "v3", DefaultDiffThreshold, 2)
	require.NoError(t, err)
	require.Len(t, rows, 3, "valve's change is not significant; vent and pulse factor are below --min-freq")
	assert.Equal(t, DiffRow{Term: "flow sensor", Kind: "new", Freq2: 7, Per2: 700, G2: rows[0].G2}, rows[0])
	assert.Equal(t, "magnet valve", rows[1].Term)
	assert.Equal(t, "gone", rows[1].Kind)
	assert.InDelta(t, -41.6339, rows[1].G2, 1e-3)
	assert.Equal(t, "set point", rows[2].Term)
	assert.Equal(t, "rose", rows[2].Kind)
	assert.InDelta(t, 19.3196, rows[2].G2, 1e-3)

	all, err := s.Diff("v2", "v3", 0.1, 1)
	require.NoError(t, err)
	var valve *DiffRow
	for i := range all {
		if all[i].Term == "valve" {
			valve = &all[i]
		}
	}
	require.NotNil(t, valve, "with a low threshold valve's change is listed")
	assert.InDelta(t, 0.1823, valve.G2, 1e-3)

	_, err = s.Diff("v2", "v9", DefaultDiffThreshold, 1)
	assert.ErrorContains(t, err, `no run labelled "v9"`)
}
