package check

import (
	"bufio"
	"bytes"
	"encoding/json"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// sampleFindings are findings of each kind, with text that needs escaping
// in JSON and in a URI.
func sampleFindings() []Finding {
	return []Finding{
		{File: "manuals/pump guide.md", Line: 3, Column: 12, EndLine: 3, EndColumn: 20, Text: "setpoint", Kind: KindSpelling,
			Preferred: "set point", Entry: "e1", Message: `"setpoint" is a spelling of "set point": use "set point"`},
		{File: "bulletin.html", Line: 7, Column: 1, EndLine: 8, EndColumn: 6, Text: "magnet valve", Kind: KindDeprecated,
			Preferred: "solenoid valve", Entry: "e2", Message: `"magnet valve" is a deprecated term: use "solenoid valve"`},
		{File: "notes.txt", Line: 1, Column: 5, EndLine: 1, EndColumn: 14, Text: "flow-rate", Kind: KindMixed,
			Preferred: "flow rate", Entry: "flow rate", Message: `"flow-rate" <is> one of 2 spellings`},
		{File: "notes.txt", Line: 2, Column: 9, EndLine: 2, EndColumn: 18, Text: "set piont", Kind: KindMisspelt,
			Preferred: "set point", Entry: "e1", Message: `"set piont" looks like a misspelling of the term "set point"`},
	}
}

// TestSARIFValidates checks the SARIF output against the OASIS SARIF 2.1.0
// JSON schema (sarif-schema-2.1.0.json of the SARIF TC's repository).
func TestSARIFValidates(t *testing.T) {
	schemaPath := filepath.Join(testenv.SharedDir(t, "standards/sarif"), "sarif-schema-2.1.0.json")
	c := jsonschema.NewCompiler()
	sch, err := c.Compile(schemaPath)
	require.NoError(t, err)
	for _, fs := range [][]Finding{sampleFindings(), nil} {
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, "sarif", fs, WriteOptions{Version: "test"}))
		inst, err := jsonschema.UnmarshalJSON(bytes.NewReader(buf.Bytes()))
		require.NoError(t, err)
		assert.NoError(t, sch.Validate(inst), buf.String())
	}
	// The schema does reject a log that breaks it: a level SARIF lacks.
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, "sarif", sampleFindings(), WriteOptions{}))
	broken := strings.Replace(buf.String(), `"level": "warning"`, `"level": "severe"`, 1)
	inst, err := jsonschema.UnmarshalJSON(strings.NewReader(broken))
	require.NoError(t, err)
	assert.Error(t, sch.Validate(inst))
}

func TestJSONLFields(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, "jsonl", sampleFindings(), WriteOptions{}))
	sc := bufio.NewScanner(&buf)
	n := 0
	for sc.Scan() {
		var rec map[string]any
		require.NoError(t, json.Unmarshal(sc.Bytes(), &rec))
		for _, k := range []string{"file", "text", "kind", "level", "preferred", "entry", "message"} {
			assert.IsType(t, "", rec[k], k)
		}
		for _, k := range []string{"line", "column", "end_line", "end_column"} {
			assert.IsType(t, float64(0), rec[k], k)
		}
		n++
	}
	assert.Equal(t, 4, n)
}

func TestTextLines(t *testing.T) {
	var plain, colored bytes.Buffer
	require.NoError(t, Write(&plain, "text", sampleFindings(), WriteOptions{}))
	require.NoError(t, Write(&colored, "text", sampleFindings(), WriteOptions{Color: true}))
	lines := strings.Split(strings.TrimSuffix(plain.String(), "\n"), "\n")
	require.Len(t, lines, 4)
	compilerStyle := regexp.MustCompile(`^[^:]+:\d+:\d+: (error|warning|note): .+$`)
	for _, l := range lines {
		assert.Regexp(t, compilerStyle, l)
	}
	assert.Equal(t, "bulletin.html:7:1: error: \"magnet valve\" is a deprecated term: use \"solenoid valve\"", lines[1])
	assert.NotContains(t, plain.String(), "\x1b[")
	assert.Contains(t, colored.String(), "\x1b[31merror\x1b[0m")
}

func TestBaseline(t *testing.T) {
	for _, format := range []string{"jsonl", "sarif"} {
		t.Run(format, func(t *testing.T) {
			old := sampleFindings()
			var buf bytes.Buffer
			require.NoError(t, Write(&buf, format, old, WriteOptions{}))
			b, err := ReadBaseline(&buf, "old."+format)
			require.NoError(t, err)
			assert.Equal(t, 4, b.Findings)

			now := sampleFindings()
			now[0].Line, now[0].Column = 9, 2 // the text moved: still known
			now[1].Text = "Magnet valve"      // case alone: still known
			extra := now[0]
			extra.Line = 10 // a second use where the baseline had one: new
			now = append(now, extra)
			fresh, known := b.New(now)
			assert.Equal(t, 4, known)
			require.Len(t, fresh, 1)
			assert.Equal(t, 10, fresh[0].Line)
		})
	}
	_, err := ReadBaseline(strings.NewReader("{\"file\":\"a\",\"kind\":\"spelling\"}\nnot json\n"), "base.jsonl")
	assert.ErrorContains(t, err, "base.jsonl:2:")
}

// TestSARIFStreamedAsWhole checks that the log written one result at a
// time is, byte for byte, the one encoding/json writes for the whole log
// (indented by two spaces, HTML characters not escaped), with no result,
// one and several.
func TestSARIFStreamedAsWhole(t *testing.T) {
	for _, fs := range [][]Finding{nil, sampleFindings()[:1], sampleFindings()} {
		var streamed bytes.Buffer
		require.NoError(t, Write(&streamed, "sarif", fs, WriteOptions{Version: "1.2.3"}))
		run := sarifRun{ColumnKind: "unicodeCodePoints", Results: []sarifResult{}}
		run.Tool.Driver = sarifDriver{Name: "glossmith", Version: "1.2.3"}
		for k, d := range sarifRules {
			r := sarifRule{ID: Kind(k).String(), ShortDescription: sarifMessage{d}}
			r.DefaultConfig.Level = Kind(k).Level().String()
			run.Tool.Driver.Rules = append(run.Tool.Driver.Rules, r)
		}
		for _, f := range fs {
			var loc sarifLocation
			p := &loc.PhysicalLocation
			p.ArtifactLocation.URI = fileURI(f.File)
			p.Region.StartLine, p.Region.StartColumn, p.Region.EndLine, p.Region.EndColumn = f.Line, f.Column, f.EndLine, f.EndColumn
			p.Region.Snippet.Text = f.Text
			run.Results = append(run.Results, sarifResult{RuleID: f.Kind.String(), RuleIndex: int(f.Kind), Level: f.Level().String(),
				Message: sarifMessage{f.Message}, Locations: []sarifLocation{loc},
				PartialFingerprints: map[string]string{fingerprintKey: fingerprint(f.File, f.Kind.String(), f.Text, f.Entry)},
				Properties:          sarifProperties{f.Text, f.Preferred, f.Entry}})
		}
		var whole bytes.Buffer
		enc := json.NewEncoder(&whole)
		enc.SetEscapeHTML(false)
		enc.SetIndent("", "  ")
		require.NoError(t, enc.Encode(sarifLog{Schema: "https://json.schemastore.org/sarif-2.1.0.json", Version: "2.1.0", Runs: []sarifRun{run}}))
		assert.Equal(t, whole.String(), streamed.String(), "%d finding(s)", len(fs))
	}
}
