package tbstore

import (
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/review"
	"glossmith/extract/termbase"
	"glossmith/extract/terms"
)

func dataset(cands map[string][]string) *review.Dataset {
	ds := &review.Dataset{}
	for _, term := range []string{"solenoid valve", "magnet valve", "valve body", "drip line"} {
		d := review.Detail{}
		for _, f := range cands[term] {
			d.Variants = append(d.Variants, terms.Variant{Form: f, Count: 1})
		}
		ds.Candidates = append(ds.Candidates, review.Candidate{ID: len(ds.Candidates), Term: term})
		ds.Details = append(ds.Details, d)
	}
	return ds
}

// Each page action becomes the termbase change of the same name, and the
// page's statuses are the termbase's own labels (termbase.Index).
func TestActionsAndLabels(t *testing.T) {
	tb, err := termbase.Open(filepath.Join(t.TempDir(), "t.gtb"))
	require.NoError(t, err)
	defer tb.Close()
	ds := dataset(map[string][]string{"solenoid valve": {"solenoid valve", "solenoid valves", "Solenoid Valve"}})
	s := New(tb, ds)
	all := []string{"solenoid valve", "magnet valve", "valve body", "drip line"}
	look := func() map[string]review.Decision {
		got, err := s.Lookup(all)
		require.NoError(t, err)
		return got
	}
	assert.Empty(t, look(), "a new termbase knows nothing")

	for _, a := range []review.Action{
		{Kind: review.Accept, Term: "solenoid valve"},
		{Kind: review.Reject, Term: "valve body"},
		{Kind: review.Defer, Term: "drip line"},
		{Kind: review.Merge, Term: "solenoid valve", Other: "magnet valve"},
		{Kind: review.Deprecate, Term: "solenoid valve", Form: "magnet valve"},
		{Kind: review.Definition, Term: "solenoid valve", Text: "Valve opened by a coil."},
		{Kind: review.Note, Term: "solenoid valve", Text: "Seen in every manual."},
		{Kind: review.SetPOS, Term: "solenoid valve", Text: "noun"},
	} {
		require.NoError(t, s.Apply(a), "%+v", a)
	}
	got := look()
	sv := got["solenoid valve"]
	assert.Equal(t, review.Accepted, sv.Status)
	assert.Equal(t, "Valve opened by a coil.", sv.Definition)
	assert.Equal(t, "Seen in every manual.", sv.Note)
	assert.Equal(t, "noun", sv.POS)
	assert.Equal(t, "solenoid valve", sv.Preferred)
	assert.Equal(t, []string{"magnet valve"}, sv.Concept, "one concept after the merge")
	assert.Equal(t, "deprecated", sv.Forms["magnet valve"])
	assert.Equal(t, review.Deprecated, got["magnet valve"].Status)
	assert.Equal(t, review.Rejected, got["valve body"].Status)
	assert.Equal(t, review.Deferred, got["drip line"].Status)

	// Undo takes back the latest change (the part of speech), one at a time.
	undone, err := s.Undo()
	require.NoError(t, err)
	assert.True(t, undone)
	assert.Empty(t, look()["solenoid valve"].POS)

	// A form can be made the preferred term: the old one becomes admitted.
	require.NoError(t, s.Apply(review.Action{Kind: review.Prefer, Term: "solenoid valve", Form: "solenoid valves"}))
	sv = look()["solenoid valve"]
	assert.Equal(t, "solenoid valves", sv.Preferred)
	assert.Equal(t, "preferred", sv.Forms["solenoid valves"])
	assert.Equal(t, "admitted", sv.Forms["solenoid valve"])
	assert.Equal(t, review.Accepted, sv.Status)
}

// The many-candidate path of Lookup (the whole termbase read once) says
// the same as the few-candidate path (entries looked up one by one).
func TestLookupPathsAgree(t *testing.T) {
	tb, err := termbase.Open(filepath.Join(t.TempDir(), "t.gtb"))
	require.NoError(t, err)
	defer tb.Close()
	s := New(tb, dataset(nil))
	require.NoError(t, s.Apply(review.Action{Kind: review.Accept, Term: "drip line"}))
	require.NoError(t, s.Apply(review.Action{Kind: review.Reject, Term: "valve body"}))
	few, err := s.Lookup([]string{"drip line", "valve body"})
	require.NoError(t, err)
	many := make([]string, 0, smallLookup+2)
	for len(many) < smallLookup {
		many = append(many, "filler")
	}
	lots, err := s.Lookup(append(many, "drip line", "valve body"))
	require.NoError(t, err)
	assert.Equal(t, few["drip line"], lots["drip line"])
	assert.Equal(t, few["valve body"], lots["valve body"])
	assert.Equal(t, review.Accepted, lots["drip line"].Status)
}
