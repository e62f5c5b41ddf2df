package acronym

import (
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// pairs returns the pairs of text as "SHORT=LONG" strings.
func pairs(text string) []string {
	var out []string
	for _, p := range Find(text) {
		out = append(out, text[p.Short.Start:p.Short.End]+"="+text[p.Long.Start:p.Long.End])
	}
	return out
}

// The case the algorithm of Schwartz and Hearst (2003), PSB 8:451–462, is
// built around, on an invented greenhouse term, in both patterns the paper
// reads: the letters of "RMS" matched right to left, "S" inside "sensor"
// (its last s, not its first letter), "M" and "R" at the start of a word,
// and the long form starting at "R"'s word, so "zone" is spanned without
// a letter of its own and "Calibrate the" stays out.
func TestSchwartzHearstExample(t *testing.T) {
	assert.Equal(t, []string{"RMS=Root zone moisture sensor"}, pairs("Root zone moisture sensor (RMS)"))
	assert.Equal(t, []string{"RMS=root zone moisture sensor"}, pairs("Calibrate the root zone moisture sensor (RMS) weekly."))
	assert.Equal(t, []string{"RMS=root zone moisture sensor"}, pairs("The RMS (root zone moisture sensor) reads."))
}

// The rules of the paper's definition, each on an invented greenhouse
// sentence: the short form's length and shape, the window of
// min(|A|+5, 2·|A|) words, the first letter at the start of a word, the
// long form not holding the short form, text after ", " or "; " left out.
func TestSchwartzHearstRules(t *testing.T) {
	for _, c := range []struct {
		text string
		want []string
		why  string
	}{
		{"The climate controller calculates the vapour pressure deficit (VPD) every minute.", []string{"VPD=vapour pressure deficit"}, "long form (short form)"},
		{"Connect the EC-7 sensor for electrical conductivity (EC) to input 3.", []string{"EC=electrical conductivity"}, "two letters"},
		{"Fit pressure-compensating (PC) drippers.", []string{"PC=pressure-compensating"}, "C after a hyphen"},
		{"It cuts the emission reductions (ERs) in half.", []string{"ERs=emission reductions"}, "lower-case letters of the short form match too"},
		{"It shows the vapour pressure deficit (VPD; see table 2).", []string{"VPD=vapour pressure deficit"}, "text after ; left out"},
		{"It shows the vapour pressure deficit (VPD, in kPa).", []string{"VPD=vapour pressure deficit"}, "text after , left out"},
		{"Set the VPD (vapour pressure deficit) limit.", []string{"VPD=vapour pressure deficit"}, "short form (long form)"},
		{"The controller has one Ethernet port (RJ45).", nil, "4 and 5 are not in the long form"},
		{"Supply 24 V AC (required: 21.6 to 26.4 V AC).", nil, "the long form holds the short form"},
		{"alpha one two three four beta (AB)", nil, "6 words, over the window of min(2+5, 2·2) = 4"},
		{"alpha beta gamma (ABG) and alpha one two beta gamma (ABG)", []string{"ABG=alpha beta gamma", "ABG=alpha one two beta gamma"}, "5 words in a window of min(3+5, 2·3) = 6"},
		{"The multiplexer (PX) switches.", nil, "P inside a word"},
		{"See valve (A) and valve (12).", nil, "one character; no letter"},
		{"The long name of it (ABCDEFGHIJK) here.", nil, "11 characters"},
		{"The deficit (-VPD) here.", nil, "first character not a letter or digit"},
		{"Open the valve (see below).", nil, "no match"},
		{"valves (three of them)", nil, "no capital in the short form of short form (long form)"},
		{"The filly Angelika (Angel) won.", nil, "the long form starts with the short form"},
		{"Valves of the HV25 (HV) series.", nil, "the long form starts with the short form, case aside"},
		{"((((VPD", nil, "unbalanced"},
		{"deficit) (VPD", nil, "unbalanced"},
	} {
		assert.Equal(t, c.want, pairs(c.text), "%s: %s", c.why, c.text)
	}
}

// Rules that the pairs found in the demo corpus and the ACTER texts called
// for, each on an invented greenhouse sentence: a wrong pair dropped and,
// where it helps, the right one beside it kept. The long form must not
// hold the short form as a word (the paper's rule, now also between
// punctuation), nor a parenthesis (it would cross another parenthetical),
// nor start with a function word; a two-character short form must be the
// initials of a two-word long form, unless it is a prefixed unit symbol
// beside its name (SI Brochure, 9th edition, table 7).
func TestPrecisionRules(t *testing.T) {
	for _, c := range []struct {
		text string
		want []string
		why  string
	}{
		{"The fans of the Climate Fan Maker (hereinafter the 'Maker') are quiet.", nil, "the long form holds the short form in quotes"},
		{"Suppliers: Vent Oy (Finland), Drip Oy (Finland), Fog AB (Sweden).", nil, "the long form holds the short form in parentheses"},
		{"Log the set point (SP) logging (SPL) daily.", []string{"SP=set point"}, "SPL's long form would cross (SP)"},
		{"Order the valves for Automatic Irrigation (FAI) now.", nil, "F matched on for"},
		{"Order the Fog And Mist Irrigation (FAMI) kit.", []string{"FAMI=Fog And Mist Irrigation"}, "a function word inside the long form is fine"},
		{"It does the tasks given to the EGB under Regulation (EU) No 12/2026.", nil, "U inside a word, three words for two letters"},
		{"Fit a standard valve (SV) here.", []string{"SV=standard valve"}, "two initials of two words"},
		{"Each heater draws 4 kilowatt (kW) at full load.", []string{"kW=kilowatt"}, "a unit's symbol and name: not initials, but right"},
		{"The loop holds 2 megapascals (MPa).", []string{"MPa=megapascals"}, "a unit's symbol and name"},
		{"Mount the Gutter Alarm (GA) on the wall.", []string{"GA=Gutter Alarm"}, "unit-shaped, but not a prefix's name"},
		{"Mount the Gutter alarm (GR) on the wall.", nil, "unit-shaped, not initials"},
	} {
		assert.Equal(t, c.want, pairs(c.text), "%s: %s", c.why, c.text)
	}
}

// Nested parentheses: the inner pair is read.
func TestNestedParentheses(t *testing.T) {
	assert.Equal(t, []string{"EC=electrical conductivity"}, pairs("Check (the electrical conductivity (EC) of the drain) daily."))
}

// Long text before a parenthesis is looked at only as far as a long form
// can reach, and a long form never starts inside a word cut by that bound.
func TestBoundedWindow(t *testing.T) {
	text := strings.Repeat("x", 1000) + "electrical conductivity (EC)"
	assert.Equal(t, []string(nil), pairs(text), "the word before the window's edge")
	text = strings.Repeat("x ", 500) + "electrical conductivity (EC)"
	assert.Equal(t, []string{"EC=electrical conductivity"}, pairs(text))
}

// Bad input gives no pair and no panic: invalid UTF-8, a window that would
// start inside a multi-byte character.
func TestBadInput(t *testing.T) {
	assert.Empty(t, pairs("\xff\xfe (\xff\xff)"))
	text := strings.Repeat("é", 400) + " electrical conductivity (EC)"
	assert.Equal(t, []string{"EC=electrical conductivity"}, pairs(text))
}

// FuzzFind checks that Find never panics and returns spans inside the
// text, a short form of 2 to 10 characters before or after its long form.
func FuzzFind(f *testing.F) {
	for _, s := range []string{
		"Root zone moisture sensor (RMS)",
		"The RMS (root zone moisture sensor) reads.",
		"vapour pressure deficit (VPD; see table 2)",
		"((a)(b)) x (", "é (É)", "\xff (\xfe)",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		var fd Finder
		for _, p := range fd.Append(nil, text) {
			for _, sp := range []Span{p.Short, p.Long} {
				require.True(t, 0 <= sp.Start && sp.Start < sp.End && sp.End <= len(text), "%+v in %q", p, text)
			}
			n := utf8.RuneCountInString(text[p.Short.Start:p.Short.End])
			assert.True(t, n >= 2 && n <= 10, "short form %q", text[p.Short.Start:p.Short.End])
			assert.True(t, p.Long.End <= p.Short.Start || p.Short.End <= p.Long.Start, "overlap %+v", p)
		}
	})
}
