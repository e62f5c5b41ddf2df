package lemma

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
	"glossmith/tagger/conllu"
)

func TestRulesGeneralize(t *testing.T) {
	ex := []Example{
		{"companies", "company", "NOUN", "NNS"}, {"batteries", "battery", "NOUN", "NNS"},
		{"valves", "valve", "NOUN", "NNS"}, {"sensors", "sensor", "NOUN", "NNS"}, {"pumps", "pump", "NOUN", "NNS"},
		{"stopped", "stop", "VERB", "VBD"}, {"opened", "open", "VERB", "VBD"}, {"closed", "close", "VERB", "VBD"},
		{"pressed", "press", "VERB", "VBD"}, {"filled", "fill", "VERB", "VBD"},
		{"went", "go", "VERB", "VBD"}, {"I", "I", "PRON", "PRP"}, {"Americans", "American", "PROPN", "NNPS"},
		{"Tuesday", "Tuesday", "PROPN", "NNP"}, {"The", "the", "DET", "DT"},
	}
	l := Train(ex)
	cases := []struct{ form, upos, xpos, want string }{
		{"went", "VERB", "VBD", "go"},           // exception from training
		{"I", "PRON", "PRP", "I"},               // exception keeps the case
		{"nurseries", "NOUN", "NNS", "nursery"}, // -ies → -y, unseen word
		{"heaters", "NOUN", "NNS", "heater"},
		{"Heaters", "NOUN", "NNS", "heater"},           // common nouns are lower-cased
		{"Greenhouses", "PROPN", "NNPS", "Greenhouse"}, // proper nouns keep case
		{"Fernhill", "PROPN", "NNP", "Fernhill"},
		{"watered", "VERB", "VBD", "water"},
		{"valve", "NOUN", "NN", "valve"}, // tag never seen: word as is
		// An acronym's plural loses its "s" and nothing else; suffix rules
		// would read the capitals as a word ("RMSs" gave "rme").
		{"RMSs", "NOUN", "NNS", "rms"},
		{"PLCs", "PROPN", "NNPS", "PLC"},
		{"EC-3s", "NOUN", "NNS", "ec-3"},
		{"RMS", "NOUN", "NN", "rms"}, // not plural
	}
	for _, c := range cases {
		assert.Equal(t, c.want, l.Lemma(c.form, c.upos, c.xpos), "Lemma(%q, %s)", c.form, c.xpos)
	}
}

// TestAcronymPlural: what reads as an acronym's plural and what does not.
func TestAcronymPlural(t *testing.T) {
	cases := []struct {
		form, xpos, stem string
		ok               bool
	}{
		{"RMSs", "NNS", "RMS", true},
		{"HAWTs", "NNPS", "HAWT", true},
		{"EC-3s", "NNS", "EC-3", true},
		{"RMSs", "NN", "", false},  // not a plural tag
		{"Ss", "NNS", "", false},   // one capital is no acronym
		{"ABCS", "NNS", "", false}, // a capital S is no plural mark
		{"Valves", "NNS", "", false},
		{"kPas", "NNS", "", false}, // a unit, lower case inside
		{"AB-s", "NNS", "", false},
		{"-ABs", "NNS", "", false},
	}
	for _, c := range cases {
		stem, ok := acronymPlural(c.form, c.xpos)
		assert.Equal(t, c.ok, ok, "acronymPlural(%q, %s)", c.form, c.xpos)
		assert.Equal(t, c.stem, stem, "acronymPlural(%q, %s)", c.form, c.xpos)
	}
}

func TestMarshalRoundTrip(t *testing.T) {
	l := Train([]Example{{"valves", "valve", "NOUN", "NNS"}, {"went", "go", "VERB", "VBD"}, {"ran", "run", "VERB", "VBD"}})
	b, err := l.MarshalBinary()
	require.NoError(t, err)
	var l2 Lemmatizer
	require.NoError(t, l2.UnmarshalBinary(b))
	b2, _ := l2.MarshalBinary()
	assert.Equal(t, b, b2, "re-encoding changed the bytes")
	assert.Equal(t, "go", l2.Lemma("went", "VERB", "VBD"), "decoded lemmatizer")
	assert.Equal(t, "gasket", l2.Lemma("gaskets", "NOUN", "NNS"), "decoded lemmatizer")
	// Every truncation is an error, never a panic.
	for n := 0; n < len(b); n++ {
		var l3 Lemmatizer
		assert.Error(t, l3.UnmarshalBinary(b[:n]), "truncated to %d of %d bytes", n, len(b))
	}
}

// Trained on UD English EWT 2.15 train and given the gold tags of dev, the
// lemmatizer must reach the 98% (case-insensitive) the tagger specification
// asks of the whole tagger.
func TestEWTGoldTags(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	read := func(name string) []*conllu.Sentence {
		f, err := os.Open(filepath.Join(dir, name))
		require.NoError(t, err)
		defer f.Close()
		s, err := conllu.ReadAll(f, name)
		require.NoError(t, err)
		return s
	}
	var ex []Example
	for _, s := range read("en_ewt-ud-train.conllu") {
		for _, tok := range s.Tokens {
			ex = append(ex, Example{tok.Form, tok.Lemma, tok.UPOS, tok.XPOS})
		}
	}
	l := Train(ex)
	right, total, unseen, unseenRight := 0, 0, 0, 0
	seen := map[string]bool{}
	for _, e := range ex {
		seen[e.Form] = true
	}
	for _, s := range read("en_ewt-ud-dev.conllu") {
		for _, tok := range s.Tokens {
			ok := strings.EqualFold(l.Lemma(tok.Form, tok.UPOS, tok.XPOS), tok.Lemma)
			total++
			if ok {
				right++
			}
			if !seen[tok.Form] {
				unseen++
				if ok {
					unseenRight++
				}
			}
		}
	}
	acc := 100 * float64(right) / float64(total)
	t.Logf("EWT dev with gold tags: lemma %.2f%% (unseen words %.2f%% of %d)", acc, 100*float64(unseenRight)/float64(unseen), unseen)
	assert.GreaterOrEqual(t, acc, 98.0, "lemma accuracy (case-insensitive) on EWT dev with gold tags")
}

// siUnitSymbols are symbols of the SI units with special names (SI
// Brochure, BIPM, 9th edition 2019, Table 4) written with SI prefixes
// (Table 7) so that a capital follows the first letter: the shape whose
// case carries meaning ("mS" millisiemens, "ms" millisecond, "MS" no unit).
var siUnitSymbols = []string{
	"mS", "µS", "kPa", "MPa", "hPa", "MHz", "kHz", "GHz", "mV", "kV", "mW", "kWb",
	"kJ", "mJ", "kN", "mN", "nF", "µF", "kΩ", "mΩ", "mT", "µH", "mC", "kBq", "mGy", "µSv",
}

// TestUnitSymbolLemma: a prefixed SI unit symbol is its own lemma, case and
// all, whatever its tag, where the "-s" rule made "mS" the metre "m" and
// "µS" the prefix "µ".
func TestUnitSymbolLemma(t *testing.T) {
	l := Train([]Example{
		{"valves", "valve", "NOUN", "NNS"}, {"pumps", "pump", "NOUN", "NNS"}, {"cms", "cm", "NOUN", "NNS"},
		{"Greenhouses", "Greenhouse", "PROPN", "NNPS"},
	})
	require.Equal(t, "m", l.Lemma("ms", "NOUN", "NNS"), "precondition: the rule strips a final s")
	for _, sym := range siUnitSymbols {
		for _, tag := range [][2]string{{"NOUN", "NN"}, {"NOUN", "NNS"}, {"PROPN", "NNP"}, {"PROPN", "NNPS"}} {
			assert.Equal(t, sym, l.Lemma(sym, tag[0], tag[1]), "Lemma(%q, %s)", sym, tag[1])
		}
	}
	cases := []struct{ form, upos, xpos, want string }{
		{"PCs", "NOUN", "NNS", "pc"}, // an acronym's plural
		{"MS", "NOUN", "NN", "ms"},   // all capitals: an acronym
		{"Valves", "NOUN", "NNS", "valve"},
		{"Hz", "NOUN", "NN", "hz"},  // capital first: no case to keep by shape
		{"aS", "VERB", "VBZ", "as"}, // not a noun: the rules as before
	}
	for _, c := range cases {
		assert.Equal(t, c.want, l.Lemma(c.form, c.upos, c.xpos), "Lemma(%q, %s)", c.form, c.xpos)
	}
}

func TestIsUnitSymbol(t *testing.T) {
	for _, sym := range siUnitSymbols {
		assert.True(t, isUnitSymbol(sym), "isUnitSymbol(%q)", sym)
	}
	for _, s := range []string{
		"", "m", "ms", "Hz", "Pa", "MW", "MΩ", "MS", "LEDS", // no capital after the first letter, or no lower-case one
		"PCs", "IDs", "UFOs", // an acronym's plural
		"kPa2", "k-Pa", "MegaHz", "iPhones", // a digit, a hyphen, more than four letters
	} {
		assert.False(t, isUnitSymbol(s), "isUnitSymbol(%q)", s)
	}
}
