package hmm

import (
	"slices"
	"sort"
)

// XPOSTags returns the fine (XPOS) tags the model can assign, sorted, each
// once: the tag set that rules' xpos: tests are checked against.
func (m *Model) XPOSTags() []string {
	out := slices.Clone(m.tagX)
	sort.Strings(out)
	return slices.Compact(out)
}
