package terms

import (
	"bytes"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A candidate seen at least 90 % of the time inside one longer candidate
// names it in Within; one seen often on its own does not; the longer
// candidate names none. Counted on invented greenhouse text: "drip" occurs
// 10 times, 9 of them in "drip emitter" (90 %: within); "zone" 10 times,
// 8 of them in "irrigation zone" (80 %: not within).
func TestWithinNamesTheContainingCandidate(t *testing.T) {
	var b strings.Builder
	for range 9 {
		b.WriteString("Clean the drip emitter of the irrigation zone. ")
	}
	b.WriteString("Drip is slow. Every zone is dry. Each zone has a valve.")
	ts := extractTexts(t, b.String())
	drip, zone, emitter := find(ts, "drip"), find(ts, "zone"), find(ts, "drip emitter")
	require.NotNil(t, drip, names(ts))
	require.NotNil(t, zone, names(ts))
	require.NotNil(t, emitter, names(ts))
	require.Equal(t, 10, drip.Freq)
	require.Equal(t, 11, zone.Freq)
	assert.Equal(t, "drip emitter", drip.Within)
	assert.Empty(t, zone.Within, "zone alone 2 of 11 times")
	assert.Empty(t, emitter.Within)
}

// Of several longer candidates, Within names the most frequent one, and
// ties go to the one whose words come first: "valve" is in "solenoid
// valve", "valve seat" and "solenoid valve seat" 10 times each, never
// alone; with "valve seat" once more on its own, that one is the most
// frequent.
func TestWithinTieByText(t *testing.T) {
	text := strings.Repeat("Replace the solenoid valve seat now. ", 10)
	ts := extractTexts(t, text)
	v := find(ts, "valve")
	require.NotNil(t, v, names(ts))
	require.Equal(t, 10, v.Freq)
	assert.Equal(t, "solenoid valve", v.Within, "three containers of 10: the first by its words")
	ts = extractTexts(t, text+"Grease the valve seat now.")
	v = find(ts, "valve")
	require.NotNil(t, v, names(ts))
	assert.Equal(t, "valve seat", v.Within, "11 in valve seat")
}

// Within is a column of TSV and CSV and a field of JSON Lines.
func TestWithinWritten(t *testing.T) {
	ts := []*Term{{Rank: 1, Term: "drip", Within: "drip emitter"}, {Rank: 2, Term: "drip emitter"}}
	var tsv, jl, txt bytes.Buffer
	require.NoError(t, Write(&tsv, "tsv", ts, WriteOptions{}))
	require.NoError(t, Write(&jl, "jsonl", ts, WriteOptions{}))
	require.NoError(t, Write(&txt, "text", ts, WriteOptions{}))
	lines := strings.Split(tsv.String(), "\n")
	col := slices.Index(strings.Split(lines[0], "\t"), "within")
	require.Positive(t, col, lines[0])
	assert.Equal(t, "drip emitter", strings.Split(lines[1], "\t")[col])
	assert.Empty(t, strings.Split(lines[2], "\t")[col])
	assert.Contains(t, jl.String(), `"within":"drip emitter"`)
	assert.NotContains(t, strings.Split(jl.String(), "\n")[1], "within")
	assert.Contains(t, strings.Split(txt.String(), "\n")[0], "within")
}
