package wordnet

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// tablePath is the table the tagger model carries.
var tablePath = filepath.Join("..", "model", "wordnet-classes.tsv")

// The committed table is what the generator writes from the WordNet 3.0
// database of Debian's package wordnet-base (required under CI, where
// .ci/run installs it).
func TestGenerateReproducesTable(t *testing.T) {
	if _, err := os.Stat(filepath.Join(DefaultDir, "index.noun")); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("WordNet database %s is missing (required under CI; Debian package wordnet-base): %v", DefaultDir, err)
		}
		t.Skipf("WordNet database %s is missing (Debian package wordnet-base); skipping", DefaultDir)
	}
	got, err := Generate(DefaultDir)
	require.NoError(t, err)
	want, err := os.ReadFile(tablePath)
	require.NoError(t, err)
	assert.True(t, string(got) == string(want), "go run ./tagger/model/lexicon writes a different table: regenerate it and retrain the model")
}

func committedTable(t *testing.T) *Table {
	t.Helper()
	b, err := os.ReadFile(tablePath)
	require.NoError(t, err)
	tab, err := Parse(string(b))
	require.NoError(t, err)
	return tab
}

// The parts of speech of WordNet 3.0's index files (index.noun …), its
// exception lists (noun.exc, verb.exc) and its detachment rules (morphy).
func TestClasses(t *testing.T) {
	tab := committedTable(t)
	tests := []struct {
		form             string
		lemma, inflected POS
	}{
		{"union", Noun | Adj, 0},              // index.noun, index.adj
		{"close", Noun | Verb | Adj | Adv, 0}, // all four index files
		{"closes", 0, Noun | Verb},            // close + "s", noun and verb rules
		{"vortices", 0, Noun},                 // noun.exc: vortices vortex
		{"went", 0, Verb},                     // verb.exc: went go
		{"nuts", Adj, Noun | Verb},            // index.adj "nuts"; nut (noun and verb) + "s"
		{"valves", 0, Noun},                   // valve (a noun only) + "s"
		{"the", 0, 0},                         // function words are not listed
		{"controllers", 0, Noun},              // controller + "s"
		{"irrigated", 0, Verb},                // irrigate + "d" (rule "ed" → "e")
	}
	for _, tt := range tests {
		c := tab.Classes(tt.form)
		assert.Equal(t, tt.lemma.String(), c.Lemma.String(), "%s as a lemma", tt.form)
		assert.Equal(t, tt.inflected.String(), c.Inflected.String(), "%s as an inflection", tt.form)
		assert.Equal(t, tt.lemma|tt.inflected != 0, c.Listed(), tt.form)
	}
	// cntlist.rev: the verb senses of "close" were tagged 86 times, the
	// noun, adjective and adverb senses fewer.
	assert.Equal(t, Verb, tab.Classes("closes").Major)
}

func TestBases(t *testing.T) {
	tab := committedTable(t)
	tests := []struct {
		form string
		pos  POS
		want []string
	}{
		{"won", Verb, []string{"win"}},                // verb.exc
		{"closest", Adj, []string{"close"}},           // rule "est" → "e"
		{"smelled", Verb, []string{"smell"}},          // rule "ed" → ""
		{"axes", Noun, []string{"ax", "axis", "axe"}}, // noun.exc, then rule "s" → ""
		{"vortices", Noun, []string{"vortex"}},
		{"statistics", Noun, []string{"statistics", "statistic"}}, // listed itself
		{"glossmith", Noun, nil},
	}
	for _, tt := range tests {
		assert.Equal(t, tt.want, tab.Bases(tt.form, tt.pos), tt.form)
	}
}

func TestParseErrorsNameTheLine(t *testing.T) {
	for _, tt := range []struct{ text, msg string }{
		{"# c\nzebra\tn1\n", "line 2: want 3 tab-separated fields"},
		{"b\tn1\t\na\tn1\t\n", "line 2: \"a\" is out of order"},
		{"a\tq1\t\n", "line 1: bad part of speech and count \"q1\""},
		{"a\tn1\tn-b\n", "line 1: bad exception \"n-b\""},
		{"a\t\t\n", "line 1: \"a\" has neither"},
	} {
		_, err := Parse(tt.text)
		require.Error(t, err, tt.text)
		assert.Contains(t, err.Error(), tt.msg)
	}
	var zero Table
	assert.False(t, zero.Classes("valve").Listed(), "the zero table knows no words")
}
