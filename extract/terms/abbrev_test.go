package terms

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// findBoth returns the candidates a and b, which must be there.
func findBoth(t *testing.T, ts []*Term, a, b string) (*Term, *Term) {
	t.Helper()
	x, y := find(ts, a), find(ts, b)
	require.NotNil(t, x, "%s not in %v", a, names(ts))
	require.NotNil(t, y, "%s not in %v", b, names(ts))
	return x, y
}

// A full form and the acronym the documents define for it (Schwartz and
// Hearst 2003, package acronym) are linked: the full form's entry names
// the acronym and pools its evidence — frequency, documents, spellings —
// while the acronym keeps its own line and names its full form. Invented
// greenhouse text: "vapour pressure deficit" twice, "VPD" four times in
// two documents (one of them without the full form).
func TestAcronymPooledWithFullForm(t *testing.T) {
	ts := extractTexts(t,
		"The controller calculates the vapour pressure deficit (VPD). Keep the VPD low. Read the vapour pressure deficit on the display.",
		"Check the VPD daily. The VPD alarm is off.")
	full, short := findBoth(t, ts, "vapour pressure deficit", "VPD")
	assert.Equal(t, "VPD", full.Acronym)
	assert.Empty(t, full.FullForm)
	assert.Equal(t, "vapour pressure deficit", short.FullForm)
	assert.Empty(t, short.Acronym)
	assert.Equal(t, 4, short.Freq, "the acronym's own count")
	assert.Equal(t, 2, short.Docs)
	assert.Equal(t, 2+4, full.Freq, "the full form pools the acronym's occurrences")
	assert.Equal(t, 2, full.Docs, "documents of either")
	assert.Contains(t, forms(full), "VPD")
	sum := 0
	for _, v := range full.Variants {
		sum += v.Count
	}
	assert.Equal(t, full.Freq, sum, "the variants add up to the frequency")
}

// "SF (LF)" defines too, the long form is found as its candidate whatever
// its inflection, and an acronym never defined is left alone.
func TestAcronymShortFormFirst(t *testing.T) {
	ts := extractTexts(t,
		"Set the EC (electrical conductivities) limit of the drain water. The drain EC is high. Clean the PLC cabinet.")
	full := find(ts, "electrical conductivity")
	require.NotNil(t, full, names(ts))
	assert.Equal(t, "EC", full.Acronym)
	if plc := find(ts, "PLC"); assert.NotNil(t, plc, names(ts)) {
		assert.Empty(t, plc.FullForm)
	}
}

// One long form per acronym and one acronym per long form: the pair the
// documents use most wins; a single other definition does not.
func TestAcronymMostFrequentDefinition(t *testing.T) {
	ts := extractTexts(t,
		"The root-zone temperature (RZT) is measured. The RZT is logged.",
		"The root-zone temperature (RZT) rises. The RZT alarm sounds.",
		"A return zone temperature (RZT) is odd.")
	rz, other := findBoth(t, ts, "root-zone temperature", "return zone temperature")
	assert.Equal(t, "RZT", rz.Acronym)
	assert.Empty(t, other.Acronym)
	if rzt := find(ts, "RZT"); assert.NotNil(t, rzt) {
		assert.Equal(t, "root-zone temperature", rzt.FullForm)
	}
}

// The text format shows "full form (ACRONYM)" and "ACRONYM (full form)";
// TSV and CSV have acronym and full_form columns, JSON Lines the fields.
func TestAcronymWritten(t *testing.T) {
	ts := []*Term{{Rank: 1, Term: "VPD", FullForm: "vapour pressure deficit"}, {Rank: 2, Term: "vapour pressure deficit", Acronym: "VPD"}}
	var txt, tsv, jl bytes.Buffer
	require.NoError(t, Write(&txt, "text", ts, WriteOptions{}))
	require.NoError(t, Write(&tsv, "tsv", ts, WriteOptions{}))
	require.NoError(t, Write(&jl, "jsonl", ts, WriteOptions{}))
	assert.Contains(t, txt.String(), "VPD (vapour pressure deficit)")
	assert.Contains(t, txt.String(), "vapour pressure deficit (VPD)")
	lines := strings.Split(tsv.String(), "\n")
	assert.True(t, strings.HasSuffix(lines[0], "\tacronym\tfull_form"), lines[0])
	assert.True(t, strings.HasSuffix(lines[1], "\t\tvapour pressure deficit"), lines[1])
	assert.True(t, strings.HasSuffix(lines[2], "\tVPD\t"), lines[2])
	assert.Contains(t, jl.String(), `"full_form":"vapour pressure deficit"`)
	assert.Contains(t, jl.String(), `"acronym":"VPD"`)
}

// FuzzCollectAbbrevs runs the collector's acronym step on any text (real
// tokenizer, no tagger) and on the same tokens with their offsets shuffled:
// it never panics, and every pair it records names two different keys.
func FuzzCollectAbbrevs(f *testing.F) {
	f.Add("The vapour pressure deficit (VPD) rises. Set the EC (electrical conductivity).", uint8(0))
	f.Add("a (b) ((c)) d) (e", uint8(3))
	mt, err := pattern.CompileStock("terms")
	require.NoError(f, err)
	col := NewCollector(mt, Options{})
	f.Fuzz(func(t *testing.T, text string, shuffle uint8) {
		d := &doc.Document{Name: "fuzz", Text: text}
		tokenize.Document(d)
		for si := range d.Sentences {
			toks := d.Sentences[si].Tokens
			if k := int(shuffle); k > 0 && len(toks) > 1 {
				a, b := k%len(toks), (k/7)%len(toks)
				toks[a].Start, toks[b].End = toks[b].End, toks[a].Start
			}
		}
		dc := col.Collect(d)
		for _, a := range dc.abbrevs {
			assert.NotEqual(t, a.short, a.long)
		}
		dc.Release()
	})
}

// The counts per document of a full form (what the review page draws)
// are the pooled ones too, and add up to its frequency.
func TestAcronymPooledPerDoc(t *testing.T) {
	m, col := defaultSetup(t)
	c := NewCorpus(3)
	for i, text := range []string{
		"The controller calculates the vapour pressure deficit (VPD). Keep the VPD low.",
		"Check the VPD daily.",
	} {
		d := &doc.Document{Name: string(rune('a' + i)), Text: text}
		tokenize.Document(d)
		m.TagDocument(d)
		c.Add(col.Collect(d))
	}
	full := find(c.Terms(ModelReference(m)), "vapour pressure deficit")
	require.NotNil(t, full)
	require.Equal(t, "VPD", full.Acronym)
	assert.Equal(t, []DocCount{{0, 3}, {1, 1}}, c.PerDoc(full))
	assert.Equal(t, 4, full.Freq)
}
