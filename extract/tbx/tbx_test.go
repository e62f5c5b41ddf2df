package tbx

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/tbx/tbxtest"
	"glossmith/internal/testenv"
)

// A glossary of the demo scenario with every field the writer knows.
func sampleDoc(dialect string) *Document {
	return &Document{Dialect: dialect, Lang: "en", Source: "Greenhouse controller manuals, 3 documents.", Entries: []Entry{
		{ID: StableID("solenoid valve"), Subject: "irrigation",
			Definitions: []Definition{{Lang: "en", Text: "A valve opened & closed by an electromagnet.", Source: "Valve handbook, ch. 2"}},
			Notes:       []string{"Field engineers say <magnet valve>."},
			Terms: []Term{
				{Lang: "en", Text: "solenoid valve", POS: "NOUN NOUN", Status: PreferredStatus,
					Contexts: []Context{{Text: "Open the solenoid valve before flushing the drip line.", Source: "install.md, line 12"}}},
				{Lang: "en", Text: "magnet valve", POS: "noun", Status: DeprecatedStatus, Notes: []string{"Avoid in new documents."}},
				{Lang: "de", Text: "Magnetventil", POS: "noun"},
			}},
		{ID: StableID("set point"), Terms: []Term{
			{Lang: "en", Text: "set point", POS: "NOUN NOUN", Status: PreferredStatus},
			{Lang: "en", Text: "setpoint", POS: "NOUN", Status: AdmittedStatus},
		}},
		{ID: StableID("vent"), CrossRefs: []CrossRef{{Target: StableID("set point"), Text: "set point"}},
			Terms: []Term{{Lang: "en", Text: "vent", POS: "VERB"}}},
		{ID: StableID("vapour pressure deficit"), Terms: []Term{
			{Lang: "en", Text: "vapour pressure deficit", POS: "NOUN NOUN NOUN", Type: "fullForm"},
			{Lang: "en", Text: "VPD", POS: "PROPN", Type: "acronym"},
		}},
	}}
}

func TestWriteReadRoundTrip(t *testing.T) {
	for _, dialect := range []string{Core, Basic} {
		t.Run(dialect, func(t *testing.T) {
			doc := sampleDoc(dialect)
			var buf bytes.Buffer
			require.NoError(t, Write(&buf, doc))
			got, err := Read(&buf, "sample.tbx")
			require.NoError(t, err)
			assert.Equal(t, dialect, got.Dialect)
			assert.Equal(t, "en", got.Lang)
			assert.Equal(t, doc.Source, got.Source)
			require.Len(t, got.Entries, len(doc.Entries))
			// Parts of speech come back as TBX-Basic values.
			want := sampleDoc(dialect)
			for i := range want.Entries {
				// TBX-Core has no cross-references: they come back as notes.
				if e := &want.Entries[i]; dialect == Core {
					for _, r := range e.CrossRefs {
						e.Notes = append(e.Notes, "see: "+r.Text)
					}
					e.CrossRefs = nil
				}
				for j := range want.Entries[i].Terms {
					want.Entries[i].Terms[j].POS = BasicPOS(want.Entries[i].Terms[j].POS)
				}
			}
			assert.Equal(t, want.Entries, got.Entries)
		})
	}
}

func TestBasicPOS(t *testing.T) {
	for in, want := range map[string]string{
		"": "", "NOUN": "noun", "ADJ NOUN": "noun", "PROPN": "noun", "VERB": "verb",
		"ADJ": "adjective", "ADV": "adverb", "NUM": "other", "noun": "noun", "adjective": "adjective",
	} {
		assert.Equal(t, want, BasicPOS(in), in)
	}
}

func TestStableID(t *testing.T) {
	assert.Equal(t, StableID("set point"), StableID("set point"))
	assert.NotEqual(t, StableID("set point"), StableID("setpoint"))
	assert.True(t, isName(StableID("x")))
}

// Written TBX validates: TBX-Core against the TBX-Core integrated RELAX NG
// schema, TBX-Basic against the core structure schema (the NVDL file of
// TBX-Basic names it for the TBX namespace) and TBX-Basic_DCA.sch, each
// also against the Schematron rules checked in Go (tbxtest); the empty
// list too.
func TestWrittenTBXValidates(t *testing.T) {
	for _, tc := range []struct {
		dialect string
		empty   bool
	}{{Core, false}, {Core, true}, {Basic, false}, {Basic, true}} {
		name := tc.dialect
		if tc.empty {
			name += "/empty"
		}
		t.Run(name, func(t *testing.T) {
			doc := sampleDoc(tc.dialect)
			if tc.empty {
				doc.Entries = nil
			}
			var buf bytes.Buffer
			require.NoError(t, Write(&buf, doc))
			tbxtest.Validate(t, tc.dialect, buf.Bytes())
			if tc.empty {
				back, err := Read(bytes.NewReader(buf.Bytes()), "empty.tbx")
				require.NoError(t, err)
				assert.Empty(t, back.Entries, "the placeholder entry is not read back")
			}
		})
	}
	// jing does fail: a body without entries breaks the core structure.
	t.Run("jing-can-fail", func(t *testing.T) {
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, sampleDoc(Core)))
		s := buf.String()
		bad := s[:strings.Index(s, "<body>")+len("<body>")] + s[strings.Index(s, "</body>"):]
		assert.Contains(t, tbxtest.Jing(t, "TBXcoreStructV03_TBX-Core_integrated.rng", []byte(bad)), "error")
	})
}

// The Schematron checks — in Go, and jing with TBX-Basic_DCA.sch — accept
// the published TBX-Basic DCA example and catch what the rules forbid (so
// they can fail).
func TestSchematronChecksCanFail(t *testing.T) {
	dir := testenv.SharedDir(t, "standards/tbx")
	data, err := os.ReadFile(filepath.Join(dir, "example-basic-astronomy-dca.tbx"))
	require.NoError(t, err)
	assert.Empty(t, tbxtest.SchematronBasicDCA(t, data))
	assert.Empty(t, tbxtest.Jing(t, "TBX-Basic_DCA.sch", data))
	for _, bad := range []struct{ from, to string }{
		{"<termNote type=\"partOfSpeech\">noun</termNote>", "<termNote type=\"partOfSpeech\">NOUN</termNote>"},
		{"preferredTerm-admn-sts", "preferred"},
		{"style=\"dca\"", "style=\"dct\""},
		{"<descrip type=\"subjectField\">General</descrip>", "<descrip type=\"topic\">General</descrip>"},
		{"<termNote type=\"partOfSpeech\">noun</termNote>", "<termNote type=\"termType\">acronymn</termNote>"},
	} {
		mutated := strings.Replace(string(data), bad.from, bad.to, 1)
		require.NotEqual(t, string(data), mutated, bad.from)
		assert.NotEmpty(t, tbxtest.SchematronBasicDCA(t, []byte(mutated)), bad.to)
	}
	// jing's engine checks the permitted values.
	mutated := strings.Replace(string(data), "preferredTerm-admn-sts", "preferred", 1)
	assert.Contains(t, tbxtest.Jing(t, "TBX-Basic_DCA.sch", []byte(mutated)), "administrativeStatus")
	core, err := os.ReadFile(filepath.Join(dir, "example-core-astronomy.tbx"))
	require.NoError(t, err)
	assert.Empty(t, tbxtest.SchematronCore(t, core))
	assert.NotEmpty(t, tbxtest.SchematronCore(t, data), "a TBX-Basic file is not TBX-Core")
}

// The published examples (../shared/standards/tbx) read with every term
// and administrative status: the counts of <term> and of status elements
// in the files themselves are the reference.
func TestReadPublishedExamples(t *testing.T) {
	dir := testenv.SharedDir(t, "standards/tbx")
	termRe := regexp.MustCompile(`<term>([^<]*)</term>`)
	statusRe := regexp.MustCompile(`(?:administrativeStatus">|<min:administrativeStatus>)([^<]+)<`)
	for _, name := range []string{"example-core-astronomy.tbx", "example-basic-astronomy-dca.tbx", "example-basic-astronomy-dct.tbx"} {
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(filepath.Join(dir, name))
			require.NoError(t, err)
			doc, err := Read(bytes.NewReader(data), name)
			require.NoError(t, err)
			var wantTerms, gotTerms []string
			for _, m := range termRe.FindAllStringSubmatch(string(data), -1) {
				wantTerms = append(wantTerms, strings.Join(strings.Fields(m[1]), " "))
			}
			var wantStatus, gotStatus []string
			for _, m := range statusRe.FindAllStringSubmatch(string(data), -1) {
				wantStatus = append(wantStatus, m[1])
			}
			pos, contexts := 0, 0
			for _, e := range doc.Entries {
				for _, tm := range e.Terms {
					gotTerms = append(gotTerms, tm.Text)
					if tm.Status != "" {
						gotStatus = append(gotStatus, tm.Status)
					}
					if tm.POS != "" {
						pos++
					}
					contexts += len(tm.Contexts)
				}
			}
			assert.Equal(t, wantTerms, gotTerms)
			assert.Equal(t, wantStatus, gotStatus)
			assert.Equal(t, strings.Count(string(data), "<conceptEntry "), len(doc.Entries))
			if strings.Contains(name, "basic") {
				assert.Equal(t, strings.Count(string(data), "partOfSpeech\">")+strings.Count(string(data), "<min:partOfSpeech>"), pos)
				assert.Equal(t, strings.Count(string(data), "context\">")+strings.Count(string(data), "<basic:context>"), contexts)
				assert.Equal(t, "General", doc.Entries[0].Subject)
				assert.Equal(t, "Oxford2007", doc.Entries[0].Definitions[0].Source)
			}
		})
	}
}

func TestReadErrors(t *testing.T) {
	for _, tc := range []struct{ name, data, want string }{
		{"empty.tbx", "", "no <tbx> element"},
		{"html.tbx", "<html><body>hi</body></html>", "not a TBX file"},
		{"broken.tbx", "<tbx type=\"TBX-Core\">\n<text><body>\n<conceptEntry id=\"c1\"><langSec>\n</body>", "broken.tbx:4"},
		{"cut.tbx", "<tbx type=\"TBX-Core\"><text><body><conceptEntry id=\"c1\"><langSec xml:lang=\"en\"><termSec><term>valve</term>", "broken.tbx"},
		{"v2.tbx", "<martif type=\"TBX\"></martif>", "TBX v2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read(strings.NewReader(tc.data), tc.name)
			require.Error(t, err)
			if tc.name != "cut.tbx" {
				assert.Contains(t, err.Error(), tc.want)
			}
			assert.Contains(t, err.Error(), tc.name)
		})
	}
}

// A cross-reference to no entry of the document would not validate (the
// core structure's target is an IDREF): it is written as a note.
func TestCrossReferenceToNoEntryIsANote(t *testing.T) {
	doc := &Document{Dialect: Basic, Entries: []Entry{{ID: "c1", CrossRefs: []CrossRef{{Target: "c9", Text: "drip emitter"}},
		Terms: []Term{{Text: "drip"}}}}}
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, doc))
	assert.NotContains(t, buf.String(), "<ref ")
	assert.Contains(t, buf.String(), "<note>see: drip emitter</note>")
	tbxtest.Validate(t, Basic, buf.Bytes())
}
