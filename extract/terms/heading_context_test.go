package terms

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/read"
	"glossmith/tagger/tokenize"
)

// extractMarkdown runs the default extraction over Markdown documents
// read as the commands read them, so that their headings are marked;
// they are named 1.md, 2.md, … in order.
func extractMarkdown(t *testing.T, texts ...string) []*Term {
	t.Helper()
	m, col := stockSetup(t, Options{})
	c := NewCorpus(3)
	dir := t.TempDir()
	for i, text := range texts {
		name := fmt.Sprintf("%d.md", i+1)
		path := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
		d, probs := read.Read(read.Input{Name: name, Path: path}, read.Options{})
		require.Empty(t, probs)
		require.NotNil(t, d)
		tokenize.Document(d)
		m.TagDocument(d)
		c.Add(col.Collect(d))
	}
	return c.Terms(ModelReference(m))
}

// A heading makes a poor example sentence: the first context of a term
// is a sentence of running text when a document offers one, even when
// the heading reads as a full sentence, and even when the documents
// before name the term only in headings.
func TestContextsPreferSentencesToHeadings(t *testing.T) {
	body := "Calibrate the flow sensor before the irrigation season starts."
	t.Run("in one document", func(t *testing.T) {
		ts := extractMarkdown(t, "# The flow sensor reads low after a firmware update.\n\n"+body+"\n")
		x := find(ts, "flow sensor")
		require.NotNil(t, x)
		require.Len(t, x.Contexts, 2)
		assert.Equal(t, body, x.Contexts[0].Text)
		assert.Equal(t, 3, x.Contexts[0].Line)
		assert.Equal(t, "The flow sensor reads low after a firmware update.", x.Contexts[1].Text, "the heading is still a context")
	})
	t.Run("across documents", func(t *testing.T) {
		verbs := []string{"Replacing", "Cleaning", "Testing"}
		heading := func(n int) string { return fmt.Sprintf("# %s the Flow Sensor\n\nSee the table.\n", verbs[n-1]) }
		ts := extractMarkdown(t, heading(1), heading(2), "Some notes.\n\n"+body+"\n")
		x := find(ts, "flow sensor")
		require.NotNil(t, x)
		require.Len(t, x.Contexts, 3)
		assert.Equal(t, []string{"3.md", "1.md", "2.md"}, docsOf(x.Contexts), "the sentence first, then the headings in document order")
		assert.Equal(t, body, x.Contexts[0].Text)

		// With every place of the quota taken by a heading, the sentence
		// takes the last heading's place.
		ts = extractMarkdown(t, heading(1), heading(2), heading(3), "Some notes.\n\n"+body+"\n")
		x = find(ts, "flow sensor")
		require.NotNil(t, x)
		assert.Equal(t, []string{"4.md", "1.md", "2.md"}, docsOf(x.Contexts))
	})
}

func docsOf(cs []Context) []string {
	var out []string
	for _, c := range cs {
		out = append(out, c.Doc)
	}
	return out
}
