package hmm

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/docxtest"
	"glossmith/tagger/doc"
	"glossmith/tagger/read"
	"glossmith/tagger/tokenize"
)

// Headings in title case, as each reader marks them, are tagged as the
// words they are: the Universal Dependencies guidelines for UPOS
// (universaldependencies.org/u/pos/PROPN.html) tag a common noun
// capitalized in a title NOUN, not PROPN, and a name PROPN wherever it
// stands. "Aquavent" is an invented product name. The body sentence,
// with the same words, is tagged as if there were no heading at all.
func TestHeadingSentences(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	const (
		h1   = "Cleaning the Drip Emitters"
		h2   = "Installing the Aquavent Controller"
		body = "The Drip Emitters of the Aquavent line clog in hard water."
	)
	para := func(style, text string) string {
		return `<w:p><w:pPr><w:pStyle w:val="` + style + `"/></w:pPr><w:r><w:t>` + text + `</w:t></w:r></w:p>`
	}
	docx := docxtest.Zip(t, docxtest.Files(para("Heading1", h1)+para("Normal", body)+para("Heading2", h2)+para("Normal", body))...)
	files := []struct{ name, content string }{
		{"manual.md", "# " + h1 + "\n" + body + "\n\n## " + h2 + "\n\n" + body + "\n"},
		{"manual.html", "<h1>" + h1 + "</h1><p>" + body + "</p><h2>" + h2 + "</h2><p>" + body + "</p>"},
		{"manual.txt", h1 + "\n\n" + body + "\n\n" + h2 + "\n\n" + body + "\n"},
		{"manual.docx", string(docx)},
	}

	plain := tokenize.Sentences(body)
	require.Len(t, plain, 1)
	m.Tag(&plain[0])

	dir := t.TempDir()
	for _, f := range files {
		t.Run(f.name, func(t *testing.T) {
			p := filepath.Join(dir, f.name)
			require.NoError(t, os.WriteFile(p, []byte(f.content), 0o644))
			d, ps := read.Read(read.Input{Name: f.name, Path: p}, read.Options{})
			require.NotNil(t, d, "%v", ps)
			tokenize.Document(d)
			m.TagDocument(d)
			require.Len(t, d.Sentences, 4)
			heads, bodies := []*doc.Sentence{&d.Sentences[0], &d.Sentences[2]}, []*doc.Sentence{&d.Sentences[1], &d.Sentences[3]}
			for _, s := range heads {
				require.True(t, s.Heading, "%s: sentence %d is a heading", f.name, s.Index)
			}

			got := tagsOf(heads[0])
			assert.Equal(t, []string{"Cleaning", "the", "Drip", "Emitters"}, got.forms, "forms stay as read")
			assert.Equal(t, []string{"DET", "NOUN", "NOUN"}, got.upos[1:])
			assert.NotEqual(t, "PROPN", got.upos[0])
			assert.Equal(t, []string{"the", "drip", "emitter"}, got.lemmas[1:])

			got = tagsOf(heads[1])
			assert.Equal(t, "PROPN", got.upos[2], "Aquavent keeps its capital and is a name")
			assert.Equal(t, "Aquavent", got.lemmas[2])
			assert.Equal(t, "NOUN", got.upos[3])

			want := tagsOf(&plain[0])
			for _, s := range bodies {
				assert.False(t, s.Heading)
				assert.Equal(t, want, tagsOf(s), "a body sentence is tagged as running text")
			}
		})
	}
}

type sentenceTags struct{ forms, upos, xpos, lemmas []string }

func tagsOf(s *doc.Sentence) sentenceTags {
	var st sentenceTags
	for _, t := range s.Tokens {
		st.forms = append(st.forms, t.Form)
		st.upos = append(st.upos, t.UPOS)
		st.xpos = append(st.xpos, t.XPOS)
		st.lemmas = append(st.lemmas, t.Lemma)
	}
	return st
}
