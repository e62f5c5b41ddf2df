package review

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/extract/terms"
)

func TestNestFindsContainedCandidates(t *testing.T) {
	ranked := []*terms.Term{{Term: "valve"}, {Term: "solenoid valve"}, {Term: "HV solenoid valve"}, {Term: "solenoid"}, {Term: "valve box"}}
	details := make([]Detail, len(ranked))
	nest(ranked, details)
	for _, c := range []struct {
		id                    int
		contains, containedIn []int
	}{
		{0, nil, []int{1, 2, 4}},
		{1, []int{3, 0}, []int{2}},
		{2, []int{1, 3, 0}, nil},
		{3, nil, []int{1, 2}},
		{4, []int{0}, nil},
	} {
		assert.ElementsMatch(t, c.contains, details[c.id].Contains, "%s contains", ranked[c.id].Term)
		assert.ElementsMatch(t, c.containedIn, details[c.id].ContainedIn, "%s is contained in", ranked[c.id].Term)
	}
}

func TestActionCheck(t *testing.T) {
	for _, c := range []struct {
		a  Action
		ok bool
	}{
		{Action{Kind: Accept, Term: "valve"}, true},
		{Action{Kind: "delete", Term: "valve"}, false},
		{Action{Kind: Accept}, false},
		{Action{Kind: Prefer, Term: "valve"}, false},
		{Action{Kind: Prefer, Term: "valve", Form: "valves"}, true},
		{Action{Kind: Merge, Term: "valve", Other: "valve"}, false},
		{Action{Kind: Merge, Term: "valve", Other: "valve body"}, true},
		{Action{Kind: Note, Term: "valve", Text: string(make([]byte, MaxText+1))}, false},
	} {
		assert.Equal(t, c.ok, c.a.Check() == nil, "%+v", c.a)
	}
}

// The page shows a candidate's acronym, full form and the longer
// candidate it mostly occurs in: they are in its row.
func TestBuildCarriesAcronymAndWithin(t *testing.T) {
	ranked := []*terms.Term{{Rank: 1, Term: "drip", Within: "drip emitter"},
		{Rank: 2, Term: "VPD", FullForm: "vapour pressure deficit"}, {Rank: 3, Term: "vapour pressure deficit", Acronym: "VPD"}}
	ds := Build(terms.NewCorpus(0), ranked, nil, 0, "demo")
	assert.Equal(t, "drip emitter", ds.Candidates[0].Within)
	assert.Equal(t, "vapour pressure deficit", ds.Candidates[1].FullForm)
	assert.Equal(t, "VPD", ds.Candidates[2].Acronym)
}
