package titlecase

import (
	"strings"
	"testing"
	"unicode"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/tokenize"
	"glossmith/tagger/wordnet"
)

// A small frequency table in genfreq's format: form, band, lower-case
// share class (4: 80 % or more in lower case, 1: under 20 %), and a small
// WordNet table in wordnet's (form, parts of speech with counts,
// exceptions).
const (
	freqTable = "cleaning\t4\t4\ncontroller\t2\t4\ndrip\t3\t4\nemitters\t1\t4\nberlin\t4\t1\nthe\t7\t4\nled\t4\t4\nstrip\t3\t4\n" +
		"i\t7\t1\nstorm\t4\t4\nreport\t4\t4\nreplace\t4\t4\nreplaced\t3\t4\nvalve\t3\t4\nstep\t4\t4\nwhy\t6\t3\nmay\t6\t2\n" +
		"installing\t3\t4\nclimate\t4\t4\nmaster\t4\t4\nreports\t4\t4\nto\t7\t4\nof\t7\t4\nministry\t3\t3\nwater\t5\t4\n" +
		"supply\t4\t4\nnotices\t3\t4\nin\t7\t4\nofficial\t4\t4\njournal\t4\t4\nchecking\t3\t4\nsetting\t4\t4\nup\t6\t4\n" +
		"pan\t3\t4\nmodule\t3\t4\nplanning\t3\t4\nschedule\t4\t4\nform\t5\t4\nseries\t4\t4\nemissions\t3\t4\nby\t7\t4\nyear\t6\t4\n" +
		"filter\t4\t4\nmaintenance\t4\t4\ncare\t5\t4\nsetup\t3\t4\nwinter\t5\t4\nstorage\t4\t4\ndaily\t5\t4\nchecks\t4\t4\n"
	wnTable = "anti\tn0\t\ncorruption\tn3\t\nsensor\tn2\t\ntensiometer\tn0\t\n"
)

func viewer(t *testing.T) Viewer {
	f, err := genfreq.Parse(freqTable)
	require.NoError(t, err)
	w, err := wordnet.Parse(wnTable)
	require.NoError(t, err)
	return Viewer{Freq: f, WordNet: w}
}

func tokens(t *testing.T, text string) []doc.Token {
	sents := tokenize.Sentences(text)
	require.Len(t, sents, 1, text)
	return sents[0].Tokens
}

func forms(toks []doc.Token) string {
	var fs []string
	for _, tk := range toks {
		fs = append(fs, tk.Form)
	}
	return strings.Join(fs, " ")
}

func TestView(t *testing.T) {
	v := viewer(t)
	tests := []struct{ heading, want string }{
		{"Cleaning the Drip Emitters", "Cleaning the drip emitters"},
		{"CLEANING THE DRIP EMITTERS", "Cleaning the drip emitters"},
		{"Installing the Aquavent Controller", "Installing the Aquavent controller"}, // an invented name: in neither table
		{"Calibrating the Tensiometer", "Calibrating the tensiometer"},               // not in the frequency table, in WordNet
		{"Shipping to Berlin", "Shipping to Berlin"},                                 // mostly capitalized in general English
		{"Why I Replaced the Valve", "Why I replaced the valve"},                     // "I" is capitalized in general English
		{"Wiring the LED Strip", "Wiring the LED strip"},                             // capitals in a title-case heading are an acronym
		{"3.2 Drip Emitters", "3.2 Drip emitters"},                                   // the first word keeps its capital
		{"Step 3: Replace the Valve", "Step 3 : replace the valve"},
		{"GC-48 Drip Emitters", "GC - 48 drip emitters"},
		{"May Sensor", "May sensor"},
		{"Valve", "valve"}, // one word: no context to keep a name apart
		{"3 STORM", "3 storm"},
		{"Aquavent", "Aquavent"},
		{"The Anti-Corruption Report", "The anti-corruption report"}, // "anti-corruption" in neither table, its parts in WordNet
		{"The Anti-Aquavent Report", "The Anti-Aquavent report"},
		{"ANTI-CORRUPTION STORM", "Anti-corruption storm"},
		{"The Anti-corruption Valve", "The Anti-corruption valve"}, // each part in title case, or none
	}
	for _, tt := range tests {
		toks := tokens(t, tt.heading)
		before := forms(toks)
		got := v.View(nil, toks)
		assert.Equal(t, tt.want, forms(got), tt.heading)
		assert.Equal(t, before, forms(toks), "the tokens as read are not changed")
		if forms(got) == before {
			assert.Same(t, &toks[0], &got[0], "no copy when nothing changes: %s", tt.heading)
		}
	}
}

func TestViewReusesAndCopies(t *testing.T) {
	v := viewer(t)
	toks := tokens(t, "Cleaning the Drip Emitters")
	buf := make([]doc.Token, 0, 16)
	got := v.View(buf, toks)
	assert.Same(t, &buf[:1][0], &got[0], "the buffer is reused")
	for i := range toks {
		assert.Equal(t, toks[i].Start, got[i].Start)
		assert.Equal(t, toks[i].Line, got[i].Line)
	}

	got = Viewer{}.View(nil, toks)
	assert.Same(t, &toks[0], &got[0], "without tables a heading is seen as written")
}

// The view changes only the case of letters: the same tokens, offsets
// and lines, each form the same letters up to case; with the evidence of
// the text's own sentences too (lines starting "# " are headings).
func FuzzView(f *testing.F) {
	f.Add("Cleaning the Drip Emitters")
	f.Add("CLEANING THE ANTI-CORRUPTION STORM")
	f.Add("Storm")
	f.Add("İSTANBUL ǅemal Ǆ-Ǆ")
	f.Add("# REPORTS TO THE MINISTRY OF WATER SUPPLY\n\nSend the PAN report to the Ministry of Water Supply.")
	f.Add("# The İstanbul Pan Of\nthe İSTANBUL Pan Of, pan and ǅemal Ǆ")
	f.Add("# Filter Maintenance\n# Valve Care\nSee Filter Maintenance and Valve Care, in Section Filter Maintenance.")
	f.Add("# Filter Maintenance\n# Valve Care\nRefer to Filter Maintenance, the Valve Care or Filter Maintenance, Valve Care for it.")
	v := Viewer{}
	f.Fuzz(func(t *testing.T, text string) {
		if v.Freq == nil {
			v = viewer(t)
		}
		d := document(t, text)
		ev := Gather(d.Sentences)
		for _, s := range d.Sentences {
			got := (Viewer{Freq: v.Freq, WordNet: v.WordNet, Doc: ev}).View(nil, s.Tokens)
			require.Len(t, got, len(s.Tokens))
			for i, tk := range s.Tokens {
				sameUpToCase(t, tk.Form, got[i].Form)
			}
		}
		for _, s := range tokenize.Sentences(text) {
			got := v.View(nil, s.Tokens)
			require.Len(t, got, len(s.Tokens))
			for i, tk := range s.Tokens {
				g := got[i]
				require.Equal(t, []int32{tk.Start, tk.End, tk.Line}, []int32{g.Start, g.End, g.Line})
				sameUpToCase(t, tk.Form, g.Form)
			}
		}
	})
}

// sameUpToCase fails unless the view's form has the token's letters, each
// the same after Go's simple lower-case mapping ("İn" may be read "in",
// which strings.EqualFold, folding by Unicode's rules, tells apart).
func sameUpToCase(t *testing.T, form, view string) {
	t.Helper()
	a, b := []rune(form), []rune(view)
	require.Len(t, b, len(a), "%q → %q", form, view)
	for k := range a {
		require.Equal(t, unicode.ToLower(a[k]), unicode.ToLower(b[k]), "%q → %q", form, view)
	}
}
