package selftrain

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"glossmith/internal/testenv"
	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/wordnet"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The gloss format is that of WordNet 3.0's data files (wndb(5WN),
// "gloss"): after a vertical bar, a definition, example sentences in
// double quotes, or both, separated by semicolons.
func TestAppendPartsSplitsDefinitionAndExamples(t *testing.T) {
	tests := []struct {
		name, gloss string
		want        []string
	}{
		{"definition only", "a valve that opens when the soil is dry  ", []string{"a valve that opens when the soil is dry"}},
		{"definition and example", `open slowly; "the vent opened at noon"  `, []string{"open slowly", "the vent opened at noon"}},
		{"two examples", `warm; "a warm bench"; "warm air rose"`, []string{"warm", "a warm bench", "warm air rose"}},
		{"examples joined by a comma", `damp; "damp soil", "a damp cloth"`, []string{"damp", "damp soil", "a damp cloth"}},
		{"attribution dropped", `a grower; "the grower waters at dawn" - A. Gardener  `, []string{"a grower", "the grower waters at dawn"}},
		{"example only", `"Close the valve"`, []string{"Close the valve"}},
		{"unclosed quote dropped", `shut; "the valve shut`, []string{"shut"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			assert.Equal(t, tc.want, appendParts(nil, tc.gloss))
		})
	}
}

func TestGlossesReadsEverySynset(t *testing.T) {
	dir := filepath.Dir(testenv.Installed(t, "/usr/share/wordnet/data.noun", "wordnet-base"))
	texts, err := Glosses(dir)
	require.NoError(t, err)
	// WordNet 3.0 has 117,659 synsets (its statistics page, wnstats(7WN)),
	// each with a gloss; about a third add example sentences.
	assert.GreaterOrEqual(t, len(texts), 117659)
	assert.Less(t, len(texts), 2*117659)
	for _, s := range texts {
		if strings.ContainsRune(s, '"') || strings.Contains(s, " | ") {
			t.Fatalf("gloss part %q keeps a quote or the gloss bar", s)
		}
	}
}

func TestGlossesNamesTheBadLine(t *testing.T) {
	dir := t.TempDir()
	for _, name := range wordnet.DataFiles {
		require.NoError(t, os.WriteFile(filepath.Join(dir, name), []byte("  1 license text\n00000001 03 n 01 valve 0 000 | a device\n"), 0o644))
	}
	require.NoError(t, os.WriteFile(filepath.Join(dir, "data.adj"), []byte("  1 license text\n00000002 00 a 01 warm 0 000 no gloss\n"), 0o644))
	_, err := Glosses(dir)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "data.adj:2")
}

func TestSpreadKeepsTheBudgetsShareEvenly(t *testing.T) {
	var sents []*conllu.Sentence
	for range 1000 {
		sents = append(sents, &conllu.Sentence{Sentence: doc.Sentence{Tokens: make([]doc.Token, 10)}})
	}
	got := spread(sents, 10000, 2500)
	assert.Len(t, got, 250)
	assert.Same(t, sents[3], got[0], "every fourth sentence")
	assert.Same(t, sents[999], got[249])
}

func TestSelectKeepsAgreedSentencesWithNewWords(t *testing.T) {
	train := treebankTrain(t)
	first, err := hmm.Default()
	require.NoError(t, err)
	gen, err := hmm.Train(train, hmm.TrainOptions{Method: hmm.MethodHMM})
	require.NoError(t, err)
	texts := []string{
		"The valve opens.", // no word outside the treebank
		"The solenoid valve opens when the substrate dries.", // new words
		"a vent", // too short
	}
	got, st := Select(texts, first, gen, Options{})
	assert.Equal(t, 2, st.Sentences)
	assert.Equal(t, 1, st.New)
	assert.LessOrEqual(t, st.Agreed, 1)
	assert.Len(t, got, st.Kept)
	for _, s := range got {
		assert.True(t, hasNewWord(first, s.Tokens))
		again := doc.Sentence{Tokens: append([]doc.Token(nil), s.Tokens...)}
		for i := range again.Tokens {
			again.Tokens[i].UPOS, again.Tokens[i].XPOS = "", ""
		}
		gen.Tag(&again)
		assert.True(t, sameTags(s.Tokens, again.Tokens), "the second model tags the kept sentence alike")
	}
	// The same model twice agrees with itself on every sentence with a new word.
	_, st = Select(texts, first, first, Options{})
	assert.Equal(t, 1, st.Agreed)
}

// treebankTrain reads UD English EWT 2.15's training file (CC BY-SA 4.0).
func treebankTrain(t *testing.T) []*conllu.Sentence {
	p := filepath.Join(testenv.SharedDir(t, "data/ud-en-ewt"), "en_ewt-ud-train.conllu")
	f, err := os.Open(p)
	require.NoError(t, err)
	defer f.Close()
	s, err := conllu.ReadAll(f, p)
	require.NoError(t, err)
	return s
}
