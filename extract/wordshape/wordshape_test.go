package wordshape

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestIsWord(t *testing.T) {
	for s, want := range map[string]bool{
		"valve": true, "3": true, "Ventil": true, "été": true, "Ω": true, "٣": true,
		"": false, ",": false, "--": false, "(": false, "…": false, "·": false,
	} {
		if got := IsWord(s); got != want {
			t.Errorf("IsWord(%q) = %v, want %v", s, got, want)
		}
	}
}

func TestIsAcronym(t *testing.T) {
	for s, want := range map[string]bool{
		"PLC": true, "EC-3": true, "NTC": true, "ÉDF": true,
		"A": false, "Valve": false, "pH": false, "3": false, "": false, "PLCs": false,
	} {
		if got := IsAcronym(s); got != want {
			t.Errorf("IsAcronym(%q) = %v, want %v", s, got, want)
		}
	}
}

func TestKeepsCase(t *testing.T) {
	for s, want := range map[string]bool{
		"PLC": true, "EC-3": true, "kPa": true, "pH": true, "MWh": true, "HAWTs": true, "3-MW": true, "ÉDF": true, "mΩ": true, "ÖKo": true,
		"A": false, "Valve": false, "Drip-Line": false, "valve": false, "": false, "X-Ray": false, "Émetteur": false,
		// Codes: a capital then a digit (error "E1", terminal "Q12", screw
		// "M6", "H2O") keep theirs; lower-cased, "e1" is no longer the code.
		"E1": true, "Q12": true, "M6": true, "H2O": true, "É2": true,
		"e1": false, "Valve1": false, "Step-1": false, "3D": false,
		// A capital after a degree sign is a unit (ISO 80000-5: "°C"),
		// which lower-cased reads as no unit at all.
		"°C": true, "°F": true, "°": false, "°c": false,
	} {
		assert.Equal(t, want, KeepsCase(s), "KeepsCase(%q)", s)
	}
}

func TestIsAddress(t *testing.T) {
	for s, want := range map[string]bool{
		"https://example.org/docs/valve.html": true, "www.example.org": true, "support@example.com": true,
		"/etc/glossmith/config.yaml": true, `C:\Users\grower\valve.cfg`: true, "docs/setup/valve.md": true, "~/notes": true,
		"and/or": false, "km/h": false, "ECB/2004/11": false, "(ECB/2014/17)": false, "/": false, "HAWT/HAWTs": false, "valve": false, "e.g.": false, "@home": false, "user@host": false,
	} {
		assert.Equal(t, want, IsAddress(s), "IsAddress(%q)", s)
	}
}

// TestKeepsCaseSIUnits: symbols of the SI units with special names (SI
// Brochure, BIPM, 9th edition 2019, Table 4), with the SI prefixes of
// Table 7. A prefixed symbol has a capital after a letter and keeps its
// case ("mS" millisiemens is not "ms" millisecond, "MW" megawatt not "mW"
// milliwatt). A symbol that starts with its only capital ("Hz", "Pa", "V")
// has the shape of any capitalized word ("Pa" as "Pa" at a sentence start):
// its shape alone does not decide.
func TestKeepsCaseSIUnits(t *testing.T) {
	cases := []struct {
		symbols []string
		want    bool
	}{
		{[]string{"mS", "µS", "kPa", "MPa", "MHz", "GHz", "mV", "kV", "MW", "mW", "kJ", "MJ", "kN", "nF", "kΩ", "MΩ", "mT", "µH", "mC", "kWb", "kBq", "mGy", "µSv", "°C"}, true},
		{[]string{"Hz", "Pa", "V", "N", "J", "W", "C", "F", "Ω", "S", "Wb", "T", "H", "Bq", "Gy", "Sv"}, false},
		{[]string{"rad", "sr", "lm", "lx", "kat", "ms", "mm", "klx"}, false}, // lower-case: nothing to keep
	}
	for _, c := range cases {
		for _, s := range c.symbols {
			assert.Equal(t, c.want, KeepsCase(s), "KeepsCase(%q)", s)
		}
	}
}
