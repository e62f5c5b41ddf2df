package wordnet

import (
	"bufio"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// TaggedCount is the sum of the tag counts of a lemma's senses in WordNet
// 3.0's cntlist.rev (sense key, sense number, tag count), read here from
// the database itself. TaggedTotal is nearly that sum over the single-word
// lemmas the table lists: the table counts a sense only under a part of
// speech the index files list for the lemma (Generate), which leaves out
// 0.2 % of the tags.
func TestTaggedCountsAreTheConcordanceCounts(t *testing.T) {
	path := testenv.Installed(t, filepath.Join(DefaultDir, "cntlist.rev"), "wordnet-base")
	tab := committedTable(t)
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	sums := map[string]int{}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		fields := strings.Fields(sc.Text())
		require.Len(t, fields, 3, "cntlist.rev line %q", sc.Text())
		lemma, _, _ := strings.Cut(fields[0], "%")
		n, err := strconv.Atoi(fields[2])
		require.NoError(t, err)
		sums[lemma] += n
	}
	require.NoError(t, sc.Err())
	total := 0
	for lemma, n := range sums {
		if tab.find(lemma) != nil {
			total += n
		}
	}
	for _, lemma := range []string{"convention", "instrument", "turbine", "valve", "bribery"} {
		assert.Equal(t, sums[lemma], tab.TaggedCount(lemma), lemma)
	}
	assert.Positive(t, tab.TaggedCount("instrument"))
	assert.Zero(t, tab.TaggedCount("ratification"), "listed, never tagged")
	assert.Zero(t, tab.TaggedCount("glossmith"), "not listed")
	assert.LessOrEqual(t, tab.TaggedTotal(), total)
	assert.InEpsilon(t, total, tab.TaggedTotal(), 0.01)
	var none *Table
	assert.Zero(t, none.TaggedCount("valve"))
	assert.Zero(t, none.TaggedTotal())
}
