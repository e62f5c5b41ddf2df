package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
	"glossmith/tagger/wordclass"
)

// The committed table is what the generator makes of its sources: UD
// English EWT 2.15's training file and WordNet 3.0's glosses (Debian
// package wordnet-base). The tables are compared as text, so that the
// check does not depend on the compressor's bytes.
func TestCommittedTableIsReproduced(t *testing.T) {
	if testing.Short() {
		t.Skip("learns the whole table (about ten seconds)")
	}
	data := testenv.SharedDir(t, "data/ud-en-ewt")
	wordnet := testenv.Installed(t, "/usr/share/wordnet/data.noun", "wordnet-base")
	sents, err := readSources(data, filepath.Dir(wordnet))
	require.NoError(t, err)
	got, _ := wordclass.Learn(sents, defaultOptions)

	root := testenv.Root(t)
	z, err := os.ReadFile(filepath.Join(root, "tagger", "model", "en-wordclasses.txt.gz"))
	require.NoError(t, err)
	want, err := wordclass.ParseCompressed(z, "en-wordclasses.txt.gz")
	require.NoError(t, err)
	var a, b bytes.Buffer
	require.NoError(t, got.WriteText(&a))
	require.NoError(t, want.WriteText(&b))
	assert.True(t, bytes.Equal(a.Bytes(), b.Bytes()), "tagger/model/en-wordclasses.txt.gz differs from what go run ./tagger/model/wordclasses makes (%d words made, %d committed)", got.Len(), want.Len())
}

// A gloss line of a WordNet data file becomes sentences of lower-cased
// tokens; the license header is skipped, a synset line without a gloss is
// an error naming the file and line. (The synset line is that of
// "physical entity" in WordNet 3.0's data.noun.)
func TestAppendGlosses(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "data.noun")
	require.NoError(t, os.WriteFile(p, []byte("  1 This software and database is being provided\n"+
		"00001930 03 n 01 physical_entity 0 007 @ 00001740 n 0000 | an entity that has Physical existence  \n"), 0o644))
	sents, err := appendGlosses(nil, p)
	require.NoError(t, err)
	assert.Equal(t, [][]string{{"an", "entity", "that", "has", "physical", "existence"}}, sents)

	require.NoError(t, os.WriteFile(p, []byte("00001930 03 n 01 physical_entity 0 000\n"), 0o644))
	_, err = appendGlosses(nil, p)
	assert.ErrorContains(t, err, "data.noun:1: no gloss")
}
