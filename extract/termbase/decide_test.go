package termbase

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// What a decision makes of a term, by what its entry holds before. The
// statuses are those of TBX-Basic (ISO 30042, administrativeStatus):
// accepting gives a concept its preferred term, or an admitted one beside
// the preferred term it has; a reviewer's "admitted" is admitted.
func TestDecisionStatuses(t *testing.T) {
	for _, c := range []struct {
		name    string
		setup   func(s *Store) error
		verdict Status
		want    Status
		other   Status // the status of "door heater" after, when set up
	}{
		{"accept a new term", nil, Preferred, Preferred, ""},
		{"admit a new term", nil, Admitted, Admitted, ""},
		{"accept an admitted term of an entry without a preferred one",
			func(s *Store) error {
				_, err := s.Edit("door heater", Edit{Admitted: []string{"frame heater"}})
				return err
			},
			Preferred, Preferred, Candidate},
		{"accept an admitted term beside a preferred one",
			func(s *Store) error {
				if _, err := s.Accept("door heater"); err != nil {
					return err
				}
				_, err := s.Edit("door heater", Edit{Admitted: []string{"frame heater"}})
				return err
			},
			Preferred, Admitted, Preferred},
		{"admit a candidate beside nothing preferred",
			func(s *Store) error { _, err := s.Merge("door heater", "frame heater"); return err },
			Admitted, Admitted, Candidate},
		{"accept a candidate beside a preferred term",
			func(s *Store) error {
				if _, err := s.Accept("door heater"); err != nil {
					return err
				}
				_, err := s.Merge("door heater", "frame heater")
				return err
			},
			Preferred, Admitted, Preferred},
		{"admit a preferred term", func(s *Store) error { _, err := s.Accept("frame heater"); return err }, Admitted, Admitted, ""},
	} {
		t.Run(c.name, func(t *testing.T) {
			s := openTemp(t)
			if c.setup != nil {
				require.NoError(t, c.setup(s))
			}
			_, err := s.Review("sheet.xlsx", []Verdict{{Term: "frame heater", Status: c.verdict}})
			require.NoError(t, err)
			assert.Equal(t, c.want, termStatus(t, s, "frame heater"))
			assert.Equal(t, c.other, termStatus(t, s, "door heater"))
		})
	}
}

// A term decided after the run that found it was recorded gets what that
// run saw of it — forms, contexts, part of speech — as a term decided
// before the run does: the latest run that has it, whether the decision
// comes from the command line or a review sheet; a decision that brings
// its own forms (the review page) keeps them.
func TestDecisionsTakeWhatTheLatestRunSaw(t *testing.T) {
	ctx := func(doc, text string) Context { return Context{Text: text, Doc: doc, Line: 3} }
	s := openTemp(t)
	_, err := s.RecordRun(Run{Label: "v1", Tokens: 900}, []RunTerm{
		{Term: "door switch", POS: "noun", Freq: 2, Docs: 1, Forms: []Form{{"door switch", 2}},
			Contexts: []Context{ctx("manual-v1.md", "Wire the door switch.")}},
		{Term: "defrost heater", POS: "noun", Freq: 1, Docs: 1, Forms: []Form{{"defrost heater", 1}},
			Contexts: []Context{ctx("manual-v1.md", "Replace the defrost heater.")}},
	})
	require.NoError(t, err)
	_, err = s.RecordRun(Run{Label: "v2", Tokens: 1000}, []RunTerm{
		{Term: "door switch", POS: "noun", Freq: 3, Docs: 2, Forms: []Form{{"door switch", 2}, {"door-switch", 1}},
			Contexts: []Context{ctx("manual-v2.md", "Wire the door switch."), ctx("notes-v2.md", "The door-switch alarm.")}},
	})
	require.NoError(t, err)

	_, err = s.Accept("door switch", "drip tray")
	require.NoError(t, err)
	_, err = s.Review("sheet.xlsx", []Verdict{{Term: "defrost heater", Status: Rejected}})
	require.NoError(t, err)
	_, err = s.Decide(Preferred, Proposal{Text: "room probe", Forms: []string{"room probes"}})
	require.NoError(t, err)

	term := func(text string) *Term {
		es, err := s.Lookup(text)
		require.NoError(t, err)
		require.Len(t, es, 1, text)
		return es[0].Term(s.Lang, text)
	}
	ds := term("door switch")
	assert.ElementsMatch(t, []string{"door switch", "door-switch"}, ds.Forms, "the latest run's forms")
	assert.Equal(t, []Context{ctx("manual-v2.md", "Wire the door switch."), ctx("notes-v2.md", "The door-switch alarm.")}, ds.Contexts)
	assert.Equal(t, "noun", ds.POS)
	dh := term("defrost heater")
	assert.Equal(t, Rejected, dh.Status)
	assert.Equal(t, []Context{ctx("manual-v1.md", "Replace the defrost heater.")}, dh.Contexts, "an earlier run, when the latest lacks it")
	assert.Empty(t, term("drip tray").Contexts, "in no run")
	assert.Equal(t, []string{"room probes"}, term("room probe").Forms)

	// A form given a status of its own is a form of its siblings no more
	// (what RecordRun keeps of forms); undo brings it back.
	_, err = s.Edit("door switch", Edit{Deprecated: []string{"door-switch"}})
	require.NoError(t, err)
	assert.Equal(t, []string{"door switch"}, term("door switch").Forms)
	assert.Equal(t, Deprecated, term("door-switch").Status)
	_, err = s.Undo(1)
	require.NoError(t, err)
	assert.ElementsMatch(t, []string{"door switch", "door-switch"}, term("door switch").Forms)
}
