package hmm

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
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
		body = "The drip emitters of the Aquavent line clog in hard water."
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

// A heading's capitalized words are read as the document's running text
// writes them (titlecase.Evidence): a name of common words keeps its
// capitals and is tagged PROPN, as UD tags names
// (universaldependencies.org/u/pos/PROPN.html); an acronym that is also
// a word ("ME") keeps its capitals in a heading in capitals; a word the
// running text writes in lower case is a common noun; a heading that
// running text refers to ("see Winter Storage") is read as if alone,
// the same words without a cue as a name. Each document is read as
// Markdown, as plain text, whose reader finds the headings by their
// layout, as a file without extension whose underlined headings make it
// Markdown, and as HTML. The organisations and products are invented.
func TestHeadingsReadWithDocumentEvidence(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	tests := []struct {
		name, heading, body string
		word                string // the heading word checked
		upos, lemma         string
		alone               bool // Model.Tag of the heading alone tags it so too
	}{
		{"a name with small words", "Reports to the Ministry of Water Supply",
			"Send the figures to the Ministry of Water Supply before March.", "Water", "PROPN", "Water", false},
		{"a name of two common words", "Testing Water with the Soil Board",
			"The Soil Board tests the water of every greenhouse.", "Soil", "PROPN", "Soil", false},
		{"an acronym that is a word, in capitals", "CONNECTING THE ME UNIT",
			"Wire the ME unit to the vent motor.", "ME", "PROPN", "ME", false},
		{"a word in lower case in running text", "Planning the Fertigation Schedule",
			"Plan fertigation by crop and season.", "Fertigation", "NOUN", "fertigation", false},
		{"common words, lower case in general English", "Cleaning the Drip Emitters",
			"Clean the drip emitters once a month.", "Emitters", "NOUN", "emitter", true},
		{"a reference to a section by its heading is no name", "Winter Storage",
			"Before the first frost, see Winter Storage.", "Storage", "NOUN", "storage", true},
		{"a heading repeated without a cue is a name", "Winter Storage",
			"Our partner Winter Storage keeps the spare valves.", "Storage", "PROPN", "Storage", false},
	}
	dir := t.TempDir()
	for _, tt := range tests {
		for _, f := range []struct{ name, content string }{
			{"manual.md", "# " + tt.heading + "\n\n" + tt.body + "\n"},
			{"manual.txt", tt.heading + "\n\n" + tt.body + "\n"},
			{"manual", tt.heading + "\n" + strings.Repeat("=", len(tt.heading)) + "\n\n" + tt.body + "\n"},
			{"manual.html", "<h2>" + tt.heading + "</h2>\n<p>" + tt.body + "</p>\n"},
		} {
			t.Run(tt.name+"/"+f.name, func(t *testing.T) {
				p := filepath.Join(dir, f.name)
				require.NoError(t, os.WriteFile(p, []byte(f.content), 0o644))
				d, ps := read.Read(read.Input{Name: f.name, Path: p}, read.Options{})
				require.NotNil(t, d, "%v", ps)
				tokenize.Document(d)
				require.Len(t, d.Sentences, 2)
				require.True(t, d.Sentences[0].Heading)
				alone := d.Sentences[0]
				alone.Tokens = slices.Clone(alone.Tokens)
				m.Tag(&alone)
				m.TagDocument(d)

				got, lone := tagsOf(&d.Sentences[0]), tagsOf(&alone)
				k := slices.Index(got.forms, tt.word)
				require.GreaterOrEqual(t, k, 0, "%v", got.forms)
				assert.Equal(t, tt.upos, got.upos[k], "%v", got.upos)
				assert.Equal(t, tt.lemma, got.lemmas[k], "%v", got.lemmas)
				if tt.alone {
					assert.Equal(t, got, lone, "no evidence needed")
				} else {
					assert.NotEqual(t, []string{tt.upos, tt.lemma}, []string{lone.upos[k], lone.lemmas[k]},
						"the heading alone, without its document, is read otherwise")
				}
			})
		}
	}
}
