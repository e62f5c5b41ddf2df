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
