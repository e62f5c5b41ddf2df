package titlecase

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

// FuzzGatherOnlyHeadingWords checks two promises of Gather on tokenized
// text (lines starting "# " are headings):
//   - only the headings' words are looked for: running text made of other
//     words, in lower case, capitals or title case, adds no evidence, so a
//     document gives the same Evidence with such a paragraph appended;
//   - running text is evidence of how the document writes its words, not
//     of how often: the same Evidence with the running text read twice.
//
// A second copy costs what the first did; Gather staying linear in the
// input follows from each sentence being read once.
func FuzzGatherOnlyHeadingWords(f *testing.F) {
	f.Add("# Climate Master Setup\nMount the Climate Master on the wall.\nThe climate in the house.")
	f.Add("# Filter Maintenance\n# Valve Care\nSee Filter Maintenance and Valve Care, or Winter Storage.\nRefer to Filter Maintenance: Daily Checks.")
	f.Add("# PAN SETTINGS\nThe PAN is set by the ME unit; a pan holds water.\n1. Ministry of Water Supply rules apply to the Ministry of Water Supply.")
	f.Add("# Official Journal of the Water Board\nsee the Official Journal of the Water Board, section “Board”.")
	f.Add("# A\n# A B\n# A B C\nsee A B C and A B, A or A B C.")
	f.Fuzz(func(t *testing.T, text string) {
		if len(text) > 4096 || strings.Contains(strings.ToLower(text), "qx") {
			return
		}
		d := document(t, text)
		want := Gather(d.Sentences)

		// Words of no heading: every form holds "qx", which text lacks (no
		// "see" or "the" either: a heading may have them).
		other := document(t, "Qxa qxb Qxc Qxd QXE qxf, qxg Qxh Qxi.\n- Qxj Qxk\nqxl QXM qxn.")
		var sents []doc.Sentence
		sents = append(sents, d.Sentences...)
		sents = append(sents, other.Sentences...)
		assert.Equal(t, want, Gather(sents), "with a paragraph of other words appended")

		sents = append(sents[:0], d.Sentences...)
		for _, s := range d.Sentences {
			if !s.Heading {
				sents = append(sents, s)
			}
		}
		got := Gather(sents)
		if want == nil {
			require.Nil(t, got)
			return
		}
		assert.Equal(t, want, got, "with the running text read twice")
	})
}
