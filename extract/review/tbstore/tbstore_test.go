package tbstore

import (
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/review"
	"glossmith/extract/termbase"
	"glossmith/extract/termio"
	"glossmith/extract/terms"
)

// openTermbase opens a new termbase, closed when the test ends.
func openTermbase(t *testing.T) *termbase.Store {
	t.Helper()
	tb, err := termbase.Open(filepath.Join(t.TempDir(), "t.gtb"))
	require.NoError(t, err)
	t.Cleanup(func() { tb.Close() })
	return tb
}

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
	tb := openTermbase(t)
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

// A part of speech typed on the page is refused as termbase set --pos
// refuses it (termbase.ValidPOS): nothing is saved and the page is told why.
func TestPageRefusesAnUnknownPartOfSpeech(t *testing.T) {
	tb := openTermbase(t)
	s := New(tb, dataset(nil))
	require.NoError(t, s.Apply(review.Action{Kind: review.Accept, Term: "drip line"}))
	err := s.Apply(review.Action{Kind: review.SetPOS, Term: "drip line", Text: "nuon"})
	assert.ErrorContains(t, err, `"nuon"`)
	got, err := s.Lookup([]string{"drip line"})
	require.NoError(t, err)
	assert.Empty(t, got["drip line"].POS)
	require.NoError(t, s.Apply(review.Action{Kind: review.SetPOS, Term: "drip line", Text: "noun"}))
	got, err = s.Lookup([]string{"drip line"})
	require.NoError(t, err)
	assert.Equal(t, "noun", got["drip line"].POS)
}

// The many-candidate path of Lookup (the whole termbase read once) says
// the same as the few-candidate path (entries looked up one by one).
func TestLookupPathsAgree(t *testing.T) {
	tb := openTermbase(t)
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

// The page labels a candidate linked to an accepted acronym or full form
// as terms --termbase does (termio.Label over the same candidates): with
// "RMS" accepted, "root zone moisture sensor" — whose forms hold the
// acronym's spellings — is its full form, not a variant; with the full
// form accepted, "RMS" is its acronym, not new. Both Lookup paths. The
// acronym is an invented one ("root zone moisture sensor (RMS)").
func TestAcronymPairLabels(t *testing.T) {
	const full, acr = "root zone moisture sensor", "RMS"
	cands := []*terms.Term{
		{Term: full, Acronym: acr, Variants: []terms.Variant{{Form: acr, Count: 3}, {Form: full, Count: 3}}},
		{Term: acr, FullForm: full, Variants: []terms.Variant{{Form: acr, Count: 3}}},
		{Term: "drip emitter", Variants: []terms.Variant{{Form: "drip emitter", Count: 1}}},
	}
	ds := &review.Dataset{}
	for i, c := range cands {
		ds.Candidates = append(ds.Candidates, review.Candidate{ID: i, Term: c.Term, Acronym: c.Acronym, FullForm: c.FullForm})
		ds.Details = append(ds.Details, review.Detail{Variants: c.Variants})
	}
	names := []string{full, acr, "drip emitter"}
	for _, tc := range []struct {
		accept    []string
		full, acr review.Decision // status and entry
	}{
		{[]string{acr}, review.Decision{Status: review.FullForm, Entry: acr}, review.Decision{Status: review.Accepted}},
		{[]string{full}, review.Decision{Status: review.Accepted}, review.Decision{Status: review.Acronym, Entry: full}},
		{[]string{acr, full}, review.Decision{Status: review.Accepted}, review.Decision{Status: review.Accepted}},
		// The page accepts a term with its forms, the acronym's spellings
		// among them: accepting "RMS" afterwards accepts the term it is a
		// form of (termbase.Store.Accept), and "RMS" stays its acronym.
		{[]string{full, acr}, review.Decision{Status: review.Accepted}, review.Decision{Status: review.Acronym, Entry: full}},
	} {
		tb, err := termbase.Open(filepath.Join(t.TempDir(), "t.gtb"))
		require.NoError(t, err)
		s := New(tb, ds)
		for _, a := range tc.accept {
			require.NoError(t, s.Apply(review.Action{Kind: review.Accept, Term: a}))
		}
		ix, err := tb.Index(tb.Lang)
		require.NoError(t, err)
		termio.Label(ix, cands)
		padded := append(make([]string, 0, smallLookup+len(names)), names...)
		for len(padded) <= smallLookup {
			padded = append(padded, "filler")
		}
		for _, ask := range [][]string{names, padded} {
			got, err := s.Lookup(ask)
			require.NoError(t, err)
			for _, want := range []struct {
				term string
				d    review.Decision
			}{{full, tc.full}, {acr, tc.acr}} {
				d := got[want.term]
				assert.Equal(t, want.d.Status, d.Status, "%s with %v accepted (%d names)", want.term, tc.accept, len(ask))
				assert.Equal(t, want.d.Entry, d.Entry, "%s with %v accepted (%d names)", want.term, tc.accept, len(ask))
				if want.d.Entry != "" {
					assert.Equal(t, want.d.Entry, d.Preferred, "the decision shows the partner's entry")
				}
			}
			assert.NotContains(t, got, "drip emitter", "a candidate without a decision")
		}
		for i, c := range cands[:2] {
			d := tc.full
			if i == 1 {
				d = tc.acr
			}
			assert.Equal(t, string(d.Status), c.Status, "terms --termbase labels %s alike", c.Term)
		}
		require.NoError(t, tb.Close())
	}
}

// A recorded run keeps the acronym / full-form links of its candidates,
// so the page of a recorded run (FromRun) labels a pair as the live page
// and terms --termbase do: with "RMS" accepted, "root zone moisture
// sensor" is its full form; with the full form accepted, "RMS" its
// acronym. The acronym is an invented one.
func TestRecordedRunLabelsAcronymPairs(t *testing.T) {
	const full, acr = "root zone moisture sensor", "RMS"
	for _, tc := range []struct {
		accept    string
		full, acr review.Decision // status and entry
	}{
		{acr, review.Decision{Status: review.FullForm, Entry: acr}, review.Decision{Status: review.Accepted}},
		{full, review.Decision{Status: review.Accepted}, review.Decision{Status: review.Acronym, Entry: full}},
	} {
		cands := []*terms.Term{
			{Term: full, Acronym: acr, Freq: 3, Docs: 2, Variants: []terms.Variant{{Form: acr, Count: 3}, {Form: full, Count: 3}}},
			{Term: acr, FullForm: full, Freq: 3, Docs: 2, Variants: []terms.Variant{{Form: acr, Count: 3}}},
			{Term: "drip emitter", Freq: 1, Docs: 1, Variants: []terms.Variant{{Form: "drip emitter", Count: 1}}},
		}
		tb, err := termbase.Open(filepath.Join(t.TempDir(), "t.gtb"))
		require.NoError(t, err)
		_, err = tb.RecordRun(termbase.Run{Label: "v1", Documents: 2, Tokens: 40}, termio.RunTerms(cands))
		require.NoError(t, err)
		_, err = tb.Accept(tc.accept)
		require.NoError(t, err)

		ds, err := FromRun(tb, "v1")
		require.NoError(t, err)
		got, err := New(tb, ds).Lookup([]string{full, acr, "drip emitter"})
		require.NoError(t, err)
		ix, err := tb.Index(tb.Lang)
		require.NoError(t, err)
		termio.Label(ix, cands)
		for i, want := range []review.Decision{tc.full, tc.acr} {
			term := cands[i].Term
			assert.Equal(t, want.Status, got[term].Status, "%s with %s accepted", term, tc.accept)
			assert.Equal(t, want.Entry, got[term].Entry, "%s with %s accepted", term, tc.accept)
			assert.Equal(t, string(got[term].Status), cands[i].Status, "terms --termbase labels %s alike", term)
		}
		assert.NotContains(t, got, "drip emitter", "a candidate without a decision")
		require.NoError(t, tb.Close())
	}
}

// The page's undo takes back its own latest change, and never a change
// made after it elsewhere (here termbase commands on the same file, as
// another person would): that one is named and nothing is undone.
func TestPageUndoesOnlyItsOwnChanges(t *testing.T) {
	path := filepath.Join(t.TempDir(), "t.gtb")
	tb, err := termbase.Open(path)
	require.NoError(t, err)
	t.Cleanup(func() { tb.Close() })
	other, err := termbase.Open(path)
	require.NoError(t, err)
	t.Cleanup(func() { other.Close() })
	other.User = "colleague"
	s := New(tb, dataset(nil))
	look := func(term string) review.Status {
		got, err := s.Lookup([]string{term})
		require.NoError(t, err)
		return got[term].Status
	}

	// The colleague undoes their latest change, then the page its own.
	otherUndoesThenPage := func() {
		t.Helper()
		_, err := other.Undo(1)
		require.NoError(t, err)
		undone, err := s.Undo()
		require.NoError(t, err)
		assert.True(t, undone)
		assert.Empty(t, look("drip line"), "undecided again")
	}

	undone, err := s.Undo()
	require.NoError(t, err)
	assert.False(t, undone, "nothing of the page's to undo")

	require.NoError(t, s.Apply(review.Action{Kind: review.Accept, Term: "drip line"}))
	_, err = other.Reject("valve body")
	require.NoError(t, err)
	_, err = s.Undo()
	assert.ErrorContains(t, err, `reject by colleague ("valve body"), came after`)
	assert.Equal(t, review.Accepted, look("drip line"))
	assert.Equal(t, review.Rejected, look("valve body"), "the colleague's decision stays")

	otherUndoesThenPage()

	// A change of the page's that was undone elsewhere is passed over.
	require.NoError(t, s.Apply(review.Action{Kind: review.Accept, Term: "drip line"}))
	require.NoError(t, s.Apply(review.Action{Kind: review.Reject, Term: "magnet valve"}))
	otherUndoesThenPage()
}
