package termbase

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A term given in decomposed form (NFD: "a" U+0061 then the combining
// diaeresis U+0308) is stored and found as the composed form the
// documents are read in (NFC, Unicode Standard Annex #15: U+00E4), by
// every way a term comes in; looking it up in either form finds it.
func TestTermsAreStoredInNFC(t *testing.T) {
	const composed, decomposed = "K\u00e4ltemittel", "Ka\u0308ltemittel"
	for _, c := range []struct {
		name string
		add  func(s *Store) error
	}{
		{"accept", func(s *Store) error { _, err := s.Accept(decomposed); return err }},
		{"review sheet", func(s *Store) error {
			_, err := s.Review("sheet.xlsx", []Verdict{{Term: decomposed, Status: Admitted}})
			return err
		}},
		{"set --deprecated", func(s *Store) error {
			_, err := s.Edit("refrigerant", Edit{Deprecated: []string{decomposed}})
			return err
		}},
		{"set status", func(s *Store) error { _, err := s.SetStatus("refrigerant", decomposed, Admitted); return err }},
		{"merge", func(s *Store) error { _, err := s.Merge("refrigerant", decomposed); return err }},
		{"definition", func(s *Store) error { _, err := s.SetDefinition(decomposed, "Fluid of the circuit.", ""); return err }},
		{"import", func(s *Store) error {
			_, err := s.Import("g.csv", []*Entry{{Terms: []*Term{{Text: decomposed, Status: Preferred}}}})
			return err
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			s := openTemp(t)
			require.NoError(t, c.add(s))
			for _, look := range []string{composed, decomposed} {
				es, err := s.Lookup(look)
				require.NoError(t, err)
				require.Len(t, es, 1, "looked up as %q", look)
				assert.NotNil(t, es[0].Term(s.Lang, composed), "stored composed")
				assert.Nil(t, es[0].Term(s.Lang, decomposed), "not stored decomposed")
			}
			// Said again in the other form, it is the same term.
			_, err := s.Accept(composed)
			require.NoError(t, err)
			es, err := s.Entries()
			require.NoError(t, err)
			n := 0
			for _, e := range es {
				for _, x := range e.Terms {
					if Key(x.Text) == Key(composed) {
						n++
					}
				}
			}
			assert.Equal(t, 1, n)
		})
	}
}
