package conllu

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// The UD English EWT dev file: every sentence's "# text" must come back
// from the forms and SpaceAfter flags alone (the UD format guarantees that
// the text comment equals the concatenation of surface tokens and spaces),
// and writing then reading must keep forms, tags, lemmas and spacing.
func TestRoundTripEWT(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	f, err := os.Open(filepath.Join(dir, "en_ewt-ud-dev.conllu"))
	require.NoError(t, err)
	defer f.Close()
	sents, err := ReadAll(f, "en_ewt-ud-dev.conllu")
	require.NoError(t, err, "reading the treebank")
	require.Len(t, sents, 2001, "UD EWT 2.15 dev has 2,001 sentences (../shared/README.md)")
	d := Document("dev", sents)
	mismatch := 0
	for i := range d.Sentences {
		s := &d.Sentences[i]
		for _, tok := range s.Tokens {
			if tok.Start < 0 || int(tok.End) > len(d.Text) || tok.Start > tok.End {
				t.Fatalf("sentence %s: token %q has offsets %d:%d outside the text", s.ID, tok.Form, tok.Start, tok.End)
			}
		}
		if got := d.Text[s.Start():s.End()]; got != sents[i].Text {
			mismatch++
			if mismatch < 5 {
				t.Errorf("sentence %s: rebuilt %q, # text %q", s.ID, got, sents[i].Text)
			}
		}
	}
	if mismatch > 0 {
		t.Errorf("%d sentences rebuilt differently from their # text", mismatch)
	}

	var buf bytes.Buffer
	w := NewWriter(&buf)
	require.NoError(t, w.WriteDocument(d))
	again, err := ReadAll(&buf, "written")
	require.NoError(t, err, "reading our own output")
	require.Len(t, again, len(sents))
	for i := range sents {
		a, b := sents[i].Tokens, again[i].Tokens
		if len(a) != len(b) {
			t.Fatalf("sentence %s: %d tokens, read back %d", sents[i].ID, len(a), len(b))
		}
		for j := range a {
			x, y := a[j], b[j]
			x.Line, y.Line = 0, 0
			if x != y {
				t.Fatalf("sentence %s token %d: wrote %+v, read back %+v", sents[i].ID, j+1, x, y)
			}
		}
		if again[i].Text != sents[i].Text {
			t.Fatalf("sentence %s: # text %q, read back %q", sents[i].ID, sents[i].Text, again[i].Text)
		}
	}
}

func TestMalformed(t *testing.T) {
	src := strings.Join([]string{
		"# sent_id = a",
		"1\tThe\tthe\tDET\tDT\t_\t_\t_\t_\t_",
		"2\tvalve\tvalve\tNOUN\tNN\t_\t_\t_\t_\t_",
		"",
		"# sent_id = b",
		"1\tbad\tline",
		"2\tx\tx\tX\tFW\t_\t_\t_\t_\t_",
		"",
		"# sent_id = c",
		"x\tbad\t_\t_\t_\t_\t_\t_\t_\t_",
		"",
		"# sent_id = d",
		"1\tOpen\topen\tVERB\tVB\t_\t_\t_\t_\t_",
		"",
	}, "\n")
	sents, err := ReadAll(strings.NewReader(src), "bad.conllu")
	require.Len(t, sents, 2, "the two good sentences a and d")
	assert.Equal(t, "a", sents[0].ID)
	assert.Equal(t, "d", sents[1].ID)
	var list ErrorList
	require.ErrorAs(t, err, &list)
	require.Len(t, list, 2)
	assert.Equal(t, 6, list[0].Line)
	assert.Contains(t, list[0].Error(), "bad.conllu:6:")
	assert.Contains(t, list[0].Msg, "columns")
	assert.Equal(t, 10, list[1].Line)
	assert.Contains(t, list[1].Msg, "bad ID")
}

func TestMultiwordToken(t *testing.T) {
	src := "1-2\tdon't\t_\t_\t_\t_\t_\t_\t_\t_\n1\tdo\tdo\tAUX\tVBP\t_\t_\t_\t_\t_\n2\tn't\tnot\tPART\tRB\t_\t_\t_\t_\t_\n3\tflush\tflush\tVERB\tVB\t_\t_\t_\t_\tSpaceAfter=No\n4\t!\t!\tPUNCT\t.\t_\t_\t_\t_\t_\n\n"
	sents, err := ReadAll(strings.NewReader(src), "m.conllu")
	require.NoError(t, err)
	d := Document("m", sents)
	require.Equal(t, "don't flush!", d.Text)
	toks := d.Sentences[0].Tokens
	assert.True(t, toks[0].FusedNext)
	assert.False(t, toks[1].FusedNext)
	assert.Equal(t, "n't", d.Text[toks[1].Start:toks[1].End])
	var buf bytes.Buffer
	w := NewWriter(&buf)
	require.NoError(t, w.WriteDocument(d))
	want := "1-2\tdon't\t_\t_\t_\t_\t_\t_\t_\t_\n1\tdo\tdo\tAUX\tVBP\t_\t_\t_\t_\t_\n"
	assert.Contains(t, buf.String(), want, "the range line")
}
