package check

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/extract/termbase"
)

func TestFromTermbase(t *testing.T) {
	entries := []*termbase.Entry{
		{ID: 1, ExtID: "valve", Terms: []*termbase.Term{
			{Text: "solenoid valve", Status: termbase.Preferred, POS: "noun", Lang: "en"},
			{Text: "magnet valve", Status: termbase.Deprecated, Lang: "en"},
			{Text: "valve coil unit", Status: termbase.Rejected, Lang: "en"},
			{Text: "Magnetventil", Status: termbase.Preferred, Lang: "de"},
			{Text: "solenoid", Status: termbase.Candidate, Lang: "en"},
		}},
		// A rejected candidate alone: "not a term", nothing to check.
		{ID: 2, Terms: []*termbase.Term{{Text: "following section", Status: termbase.Rejected, Lang: "en"}}},
		{ID: 3, Terms: []*termbase.Term{{Text: "PLC", Status: termbase.Preferred, Lang: "en"}, {Text: "Pump", Status: termbase.Admitted, Lang: "en"}}},
		// Undecided candidates only: nothing to check.
		{ID: 4, Terms: []*termbase.Term{{Text: "drip line", Status: termbase.Candidate, Lang: "en"}}},
	}
	g := FromTermbase(entries, "en")
	assert.Equal(t, Glossary{Entries: []Entry{
		{ID: "valve", Forms: []Form{
			{Text: "solenoid valve", Status: Preferred, POS: "noun"},
			{Text: "magnet valve", Status: Deprecated},
			{Text: "valve coil unit", Status: Forbidden},
		}},
		{ID: "3", Forms: []Form{{Text: "PLC", Status: Preferred, CaseSensitive: true}, {Text: "Pump", Status: Admitted}}},
	}}, g)
	assert.Len(t, FromTermbase(entries, "").Entries[0].Forms, 4, "every language")
}
