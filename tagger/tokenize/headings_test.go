package tokenize

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/doc"
)

// A sentence is a heading when all its lines are in one heading range.
func TestHeadingSentencesMarked(t *testing.T) {
	text := "Cleaning the Drip Emitters\n\nUse a soft brush. Rinse it.\n\nStep 1. Remove the Cap\n\nValves\nand Sensors\n\nEnd of\nthe text."
	heads := []doc.LineRange{{First: 1, Last: 1}, {First: 5, Last: 5}, {First: 7, Last: 8}, {First: 11, Last: 11}}
	for _, reuse := range []bool{false, true} {
		d := &doc.Document{Text: text, Headings: heads}
		if reuse {
			DocumentReusing(d, make([]doc.Token, 4))
		} else {
			Document(d)
		}
		var got []string
		var marked []bool
		for _, s := range d.Sentences {
			got = append(got, forms([]doc.Sentence{s}))
			marked = append(marked, s.Heading)
		}
		assert.Equal(t, []string{"Cleaning the Drip Emitters", "Use a soft brush .", "Rinse it .", "Step 1 .", "Remove the Cap", "Valves and Sensors", "End of the text ."}, got)
		// The last sentence starts before the range on its second line: not a heading.
		assert.Equal(t, []bool{true, false, false, true, true, true, false}, marked, "reuse %v", reuse)
	}
}
