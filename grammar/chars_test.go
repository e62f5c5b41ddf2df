package grammar

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestCharClasses checks the character-class alphabet on the examples the
// language guide gives, and on the cases at its edges.
func TestCharClasses(t *testing.T) {
	for in, want := range map[string]string{
		"Valve": "Aa+", "PLC-12": "A+-9+", "kPa": "aAa", "24V": "9+A",
		"EC": "A+", "a": "a", "2024": "9+", "A/B": "A/A", "": "", "--": "-+", "...": ".+",
		"C++": `A\+\+`, `a\b`: `a\\a`, "Größe": "Aa+", "ÅNGSTRÖM": "A+", "٣٤": "9+", "水": "a",
	} {
		assert.Equal(t, want, CharClasses(in), "%q", in)
	}
}

func TestCharsValues(t *testing.T) {
	for _, ok := range []string{"Aa+", "A+-9+", "aAa", "9+A", `A\+\+`, "-+", "a/a", `\\`} {
		assert.Empty(t, checkChars(ok), ok)
	}
	for bad, why := range map[string]string{
		"Xx-d": "letters and digits are written A",
		"Aa1":  "letters and digits are written A",
		"AA":   "written once with '+'",
		"A+A":  "written once with '+'",
		"--":   "written once with '+'",
		"+A":   "follows no class",
		"A++":  "follows no class",
		`a\`:   "escapes neither",
	} {
		assert.Contains(t, checkChars(bad), why, bad)
	}
	// Every word's classes are a valid value: CharClasses and checkChars
	// agree on the alphabet.
	for _, w := range []string{"Valve", "PLC-12", "C++", `x\\y`, "A--B", "ÅNGSTRÖM", "a+b"} {
		assert.Empty(t, checkChars(CharClasses(w)), w)
	}
	_, err := ParseString("c.gsr", "r = chars:Xx ;\n")
	require.Error(t, err)
	assert.Contains(t, err.Error(), "c.gsr:1:11: chars:Xx can never match")
}

// The field names of earlier versions are errors that name today's; there
// are no aliases.
func TestRenamedFields(t *testing.T) {
	_, err := ParseString("old.gsr", "a = tag:NN ;\nb = prefix:un suffix:ing ;\nc = shape:Xx ;\n")
	var list ErrorList
	require.ErrorAs(t, err, &list)
	var got []string
	for _, e := range list {
		got = append(got, e.Error())
	}
	assert.Equal(t, []string{
		`old.gsr:1:5: unknown test tag: — did you mean "xpos:"?`,
		`old.gsr:2:5: unknown test prefix: — did you mean "begins:"?`,
		`old.gsr:2:15: unknown test suffix: — did you mean "ends:"?`,
		`old.gsr:3:5: unknown test shape: — did you mean "chars:"?`,
	}, got)
	f, err := ParseString("new.gsr", "a = xpos:NN begins:un ends:ing chars:Aa+ ;\n")
	require.NoError(t, err)
	assert.Equal(t, `(xpos:NN begins:"un" ends:"ing" chars:"Aa+")`, Format(f.Rules[0].Expr))
}
