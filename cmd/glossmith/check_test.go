package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/santhosh-tekuri/jsonschema/v6"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/encoding/japanese"

	"glossmith/extract/termbase"
	"glossmith/internal/testenv"
)

// pumpsDir is the check's planted test corpus (an invented maker of solar
// water pumps), relative to the repository root where run starts.
const pumpsDir = "extract/check/testdata/pumps"

// pumpsTermbase stores the corpus's glossary (glossary.tsv: entry, term,
// status, pos) in a new termbase and returns its path; "forbidden" terms
// are stored as rejected terms of their entry.
func pumpsTermbase(t *testing.T) string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("../..", pumpsDir, "glossary.tsv"))
	require.NoError(t, err)
	byID := map[string]*termbase.Entry{}
	var entries []*termbase.Entry
	for i, line := range strings.Split(strings.TrimSpace(string(data)), "\n") {
		if i == 0 {
			continue
		}
		c := strings.Split(line, "\t")
		e := byID[c[0]]
		if e == nil {
			e = &termbase.Entry{ExtID: c[0]}
			byID[c[0]] = e
			entries = append(entries, e)
		}
		st := termbase.Status(c[2])
		if st == "forbidden" {
			st = termbase.Rejected
		}
		e.Terms = append(e.Terms, &termbase.Term{Text: c[1], Status: st, POS: c[3], Lang: "en"})
	}
	path := filepath.Join(t.TempDir(), "pumps.termbase")
	s, err := termbase.Open(path)
	require.NoError(t, err)
	_, err = s.Import("test", entries)
	require.NoError(t, err)
	require.NoError(t, s.Close())
	return path
}

func pumpsInputs() []string {
	return []string{pumpsDir + "/installation-guide.md", pumpsDir + "/field-notes.txt", pumpsDir + "/service-bulletin.html", pumpsDir + "/commissioning-report.docx"}
}

func TestCheckCommand(t *testing.T) {
	tb := pumpsTermbase(t)
	r := run(t, "", append([]string{"check", "--termbase", tb}, pumpsInputs()...)...)
	assert.Equal(t, 1, r.code, r.stderr)
	lines := strings.Split(strings.TrimSuffix(r.stdout, "\n"), "\n")
	assert.Len(t, lines, 24)
	line := regexp.MustCompile(`^[^:]+:\d+:\d+: (error|warning|note): `)
	for _, l := range lines {
		assert.Regexp(t, line, l)
	}
	assert.Contains(t, r.stdout, pumpsDir+`/installation-guide.md:7:33: error: "magnet valve" is a deprecated term: use "solenoid valve"`)
	assert.Contains(t, r.stderr, "24 finding(s) in 4 document(s): 12 error(s), 12 warning(s), 0 note(s)")
	assert.NotContains(t, r.stdout, "\x1b[", "no colour off a terminal")

	r = run(t, "", "check", "--termbase", tb, "--color", "always", pumpsDir+"/field-notes.txt")
	assert.Contains(t, r.stdout, "\x1b[31merror\x1b[0m")
}

func TestCheckFailOn(t *testing.T) {
	tb := pumpsTermbase(t)
	// Spellings only: warnings, below the default --fail-on error.
	text := "Adjust the setpoint of the pump inverter.\n"
	for _, tc := range []struct {
		failOn string
		code   int
	}{{"", 0}, {"error", 0}, {"warning", 1}, {"note", 1}} {
		args := []string{"check", "--termbase", tb, "--from", "txt", "-q"}
		if tc.failOn != "" {
			args = append(args, "--fail-on", tc.failOn)
		}
		r := run(t, text, append(args, "-")...)
		assert.Equal(t, tc.code, r.code, "--fail-on %q: %s", tc.failOn, r.stderr)
		assert.Contains(t, r.stdout, `-:1:12: warning: "setpoint" is a spelling of "set point"`)
	}
	r := run(t, "The pump inverter is fine.\n", "check", "--termbase", tb, "--fail-on", "note", "-")
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Empty(t, r.stdout)
}

func TestCheckFormatsAndBaseline(t *testing.T) {
	tb := pumpsTermbase(t)
	dir := t.TempDir()
	for _, name := range []string{"base.jsonl", "base.sarif"} {
		out := filepath.Join(dir, name)
		r := run(t, "", append([]string{"check", "--termbase", tb, "-q", "-o", out}, pumpsInputs()...)...)
		require.Equal(t, 1, r.code, r.stderr)
		data, err := os.ReadFile(out)
		require.NoError(t, err)
		if strings.HasSuffix(name, ".jsonl") {
			sc := bufio.NewScanner(strings.NewReader(string(data)))
			n := 0
			for sc.Scan() {
				var rec map[string]any
				require.NoError(t, json.Unmarshal(sc.Bytes(), &rec))
				assert.Contains(t, []any{"deprecated", "spelling"}, rec["kind"])
				n++
			}
			assert.Equal(t, 24, n)
		} else {
			var log struct {
				Version string
				Runs    []struct{ Results []json.RawMessage }
			}
			require.NoError(t, json.Unmarshal(data, &log))
			assert.Equal(t, "2.1.0", log.Version)
			require.Len(t, log.Runs, 1)
			assert.Len(t, log.Runs[0].Results, 24)
		}
		// The same documents against their own result: nothing new.
		r = run(t, "", append([]string{"check", "--termbase", tb, "--baseline", out}, pumpsInputs()...)...)
		assert.Equal(t, 0, r.code, r.stderr)
		assert.Empty(t, r.stdout)
		assert.Contains(t, r.stderr, "24 already in the baseline")
	}
	// One more use than the baseline holds is new.
	extra := filepath.Join(dir, "more.txt")
	require.NoError(t, os.WriteFile(extra, []byte("Fit the magnet valve.\n"), 0o644))
	r := run(t, "", "check", "--termbase", tb, "-q", "--baseline", filepath.Join(dir, "base.jsonl"), extra)
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stdout, `more.txt:1:9: error: "magnet valve"`)
}

// TestCheckSameForAnyWorkerCount checks that every format, with the mixed
// spellings, misspelt terms and a baseline that covers some findings,
// comes out byte for byte the same with one worker as with several.
func TestCheckSameForAnyWorkerCount(t *testing.T) {
	tb := pumpsTermbase(t)
	base := filepath.Join(t.TempDir(), "base.jsonl")
	r := run(t, "", "check", "--termbase", tb, "-q", "-o", base, pumpsDir+"/field-notes.txt")
	require.Equal(t, 1, r.code, r.stderr)
	inputs := append(pumpsInputs(), pumpsDir+"/maintenance-log.md", "testdata/demo")
	for _, format := range []string{"text", "jsonl", "sarif"} {
		var first string
		for _, workers := range []string{"1", "3"} {
			r := run(t, "", append([]string{"check", "--termbase", tb, "--variants", "--baseline", base, "--to", format, "--workers", workers}, inputs...)...)
			require.Equal(t, 1, r.code, r.stderr)
			require.Contains(t, r.stdout, "spellings of a term", "mixed spellings among the findings")
			require.Contains(t, r.stdout, "looks like a misspelling", "misspelt terms among the findings")
			assert.NotContains(t, r.stderr, "problem")
			if first == "" {
				first = r.stdout
				assert.Contains(t, r.stderr, "already in the baseline")
				continue
			}
			assert.Equal(t, first, r.stdout, "%s with %s workers", format, workers)
		}
	}
}

// TestCheckMisspeltTerms runs the check over the planted misspellings of
// the test corpus (maintenance-log.md) to SARIF, validates the log against
// the OASIS SARIF 2.1.0 JSON schema (sarif-schema-2.1.0.json of the SARIF
// TC's repository), and finds each misspelt term as a warning of its own
// rule at its place; the same run as JSON Lines names the kind, and a
// baseline of the run leaves nothing new.
func TestCheckMisspeltTerms(t *testing.T) {
	schemaPath := filepath.Join(testenv.SharedDir(t, "standards/sarif"), "sarif-schema-2.1.0.json")
	sch, err := jsonschema.NewCompiler().Compile(schemaPath)
	require.NoError(t, err)
	tb := pumpsTermbase(t)
	input := pumpsDir + "/maintenance-log.md"
	out := filepath.Join(t.TempDir(), "check.sarif")
	r := run(t, "", "check", "--termbase", tb, "--to", "sarif", "-o", out, "--fail-on", "warning", input)
	require.Equal(t, 1, r.code, r.stderr)
	assert.Contains(t, r.stderr, "15 finding(s) in 1 document(s): 1 error(s), 14 warning(s)")
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	inst, err := jsonschema.UnmarshalJSON(bytes.NewReader(data))
	require.NoError(t, err)
	require.NoError(t, sch.Validate(inst))

	var log struct {
		Runs []struct {
			Tool struct {
				Driver struct {
					Rules []struct {
						ID            string
						DefaultConfig struct{ Level string } `json:"defaultConfiguration"`
					}
				}
			}
			Results []struct {
				RuleID    string
				RuleIndex int
				Level     string
				Message   struct{ Text string }
				Locations []struct {
					PhysicalLocation struct {
						Region struct{ StartLine, StartColumn, EndColumn int }
					}
				}
			}
		}
	}
	require.NoError(t, json.Unmarshal(data, &log))
	require.Len(t, log.Runs, 1)
	run0 := log.Runs[0]
	type place struct {
		line, col, end int
		message        string
	}
	var got []place
	for _, res := range run0.Results {
		if res.RuleID != "misspelt" {
			continue
		}
		assert.Equal(t, "warning", res.Level)
		require.Less(t, res.RuleIndex, len(run0.Tool.Driver.Rules))
		assert.Equal(t, "misspelt", run0.Tool.Driver.Rules[res.RuleIndex].ID)
		assert.Equal(t, "warning", run0.Tool.Driver.Rules[res.RuleIndex].DefaultConfig.Level)
		reg := res.Locations[0].PhysicalLocation.Region
		got = append(got, place{reg.StartLine, reg.StartColumn, reg.EndColumn, res.Message.Text})
	}
	// Lines and columns as a reader of maintenance-log.md counts them.
	assert.Equal(t, []place{
		{3, 5, 19, `"solenoid vavle" looks like a misspelling of the term "solenoid valve"`},
		{4, 6, 21, `"solenoid vavles" looks like a misspelling of the term "solenoid valve"`},
		{5, 9, 21, `"magnet vavle" looks like a misspelling of the deprecated term "magnet valve": use "solenoid valve"`},
		{6, 15, 24, `"set piont" looks like a misspelling of the term "set point"`},
		{7, 5, 14, `"thermistr" looks like a misspelling of the term "thermistor"`},
		{8, 7, 19, `"flaot switch" looks like a misspelling of the term "float switch"`},
		{8, 51, 62, `"check vlave" looks like a misspelling of the term "check valve"`},
		{9, 9, 26, `"dry running gaurd" looks like a misspelling of the forbidden term "dry running guard": use "dry-run protection"`},
		{9, 32, 45, `"pump invertre" looks like a misspelling of the term "pump inverter"`},
		{9, 50, 67, `"dry-run protecton" looks like a misspelling of the term "dry-run protection"`},
		{27, 18, 32, `"Solenoid Vavle" looks like a misspelling of the term "solenoid valve"`},
		{29, 1, 10, `"Thermistr" looks like a misspelling of the term "thermistor"`},
		{30, 1, 14, `"Magnte valves" looks like a misspelling of the deprecated term "magnet valve": use "solenoid valve"`},
		{32, 4, 17, `"PUMP INVERTRE" looks like a misspelling of the term "pump inverter"`},
	}, got)

	r = run(t, "", "check", "--termbase", tb, "--to", "jsonl", "--fail-on", "warning", input)
	require.Equal(t, 1, r.code, r.stderr)
	assert.Equal(t, 14, strings.Count(r.stdout, `"kind":"misspelt","level":"warning"`))
	r = run(t, "", "check", "--termbase", tb, "--baseline", out, "--fail-on", "warning", input)
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stderr, "15 already in the baseline")

	// A misspelt term is a warning: below the default --fail-on error.
	text := "Fit the solenoid vavle first.\n"
	r = run(t, text, "check", "--termbase", tb, "--from", "txt", "-")
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Equal(t, "-:1:9: warning: \"solenoid vavle\" looks like a misspelling of the term \"solenoid valve\"\n", r.stdout)
	r = run(t, text, "check", "--termbase", tb, "--from", "txt", "--fail-on", "warning", "-q", "-")
	assert.Equal(t, 1, r.code, r.stderr)
	// The termbase's terms are English: checked in another language, none.
	r = run(t, text, "check", "--termbase", tb, "--from", "txt", "--lang", "de", "--fail-on", "note", "-")
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Empty(t, r.stdout)
}

func TestCheckUsageErrors(t *testing.T) {
	tb := pumpsTermbase(t)
	bad := filepath.Join(t.TempDir(), "bad.jsonl")
	require.NoError(t, os.WriteFile(bad, []byte("not json\n"), 0o644))
	for _, args := range [][]string{
		{"check", pumpsDir},
		{"check", "--termbase", filepath.Join(t.TempDir(), "none.termbase"), pumpsDir},
		{"check", "--termbase", tb, "--fail-on", "fatal", pumpsDir},
		{"check", "--termbase", tb, "--to", "xml", pumpsDir},
		{"check", "--termbase", tb, "-o", "x.tbx", pumpsDir},
		{"check", "--termbase", tb, "--baseline", bad, pumpsDir},
		{"check", "--termbase", tb},
	} {
		r := run(t, "", args...)
		assert.Equal(t, 2, r.code, "%v: %s", args, r.stderr)
		assert.Empty(t, r.stdout, "%v", args)
	}
}

func TestCheckVariantsDemo(t *testing.T) {
	r := run(t, "", "check", "--variants", "testdata/demo")
	assert.Equal(t, 0, r.code, "mixed spellings are notes, below --fail-on error: %s", r.stderr)
	assert.Regexp(t, `(?m)^testdata/demo/[^:]+:\d+:\d+: note: "setpoint" is one of 3 spellings of a term: .* use "set point"$`, r.stdout)
	r = run(t, "", "check", "--variants", "--fail-on", "note", "-q", "testdata/demo")
	assert.Equal(t, 1, r.code)
}

func TestCheckBadInputGoesOn(t *testing.T) {
	tb := pumpsTermbase(t)
	r := run(t, "", "check", "--termbase", tb, "-q", "no-such-file.md", pumpsDir+"/field-notes.txt")
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stderr, "no-such-file.md")
	assert.Contains(t, r.stdout, "field-notes.txt:3:53: error:")
}

// A SARIF region of a finding in an HTML page is where the page's file has
// the term (here "magnet valve" in the bulletin's body, after the one in
// its title), whether the page is a named file or standard input (no file
// to read again); tag's offsets slice the page's own bytes.
func TestHTMLPositionsInTheFile(t *testing.T) {
	tb := pumpsTermbase(t)
	page := pumpsDir + "/service-bulletin.html"
	src, err := os.ReadFile(filepath.Join("../..", page))
	require.NoError(t, err)
	at := strings.Index(string(src), "magnet valve")
	at += len("magnet valve") + strings.Index(string(src[at+len("magnet valve"):]), "magnet valve")
	lineStart := strings.LastIndexByte(string(src[:at]), '\n') + 1
	line, col := strings.Count(string(src[:at]), "\n")+1, utf8.RuneCount(src[lineStart:at])+1

	r := run(t, "", "check", "--termbase", tb, "-q", "--to", "sarif", page)
	require.Equal(t, 1, r.code, r.stderr)
	var log struct {
		Runs []struct {
			Results []struct {
				Locations []struct {
					PhysicalLocation struct {
						Region struct{ StartLine, StartColumn, EndColumn int }
					}
				}
			}
		}
	}
	require.NoError(t, json.Unmarshal([]byte(r.stdout), &log))
	require.Len(t, log.Runs, 1)
	var regions [][3]int
	for _, res := range log.Runs[0].Results {
		reg := res.Locations[0].PhysicalLocation.Region
		regions = append(regions, [3]int{reg.StartLine, reg.StartColumn, reg.EndColumn})
	}
	assert.Contains(t, regions, [3]int{line, col, col + len("magnet valve")})

	r = run(t, string(src), "check", "--termbase", tb, "-q", "--from", "html", "-")
	assert.Contains(t, r.stdout, fmt.Sprintf("-:%d:%d: error: \"magnet valve\"", line, col))

	r = run(t, "", "tag", "--to", "jsonl", page)
	require.Equal(t, 0, r.code, r.stderr)
	words, word := 0, regexp.MustCompile(`^[A-Za-z]+$`)
	for _, l := range strings.Split(strings.TrimSpace(r.stdout), "\n") {
		var s struct {
			Tokens []struct {
				Form       string
				Start, End int
			}
		}
		require.NoError(t, json.Unmarshal([]byte(l), &s))
		for _, tok := range s.Tokens {
			if word.MatchString(tok.Form) {
				assert.Equal(t, tok.Form, string(src[tok.Start:tok.End]))
				words++
			}
		}
	}
	assert.Greater(t, words, 50)
}

// TestCheckStdinSameAsFile: a document piped in on standard input (an
// editor's or a pre-commit hook's way) has the findings of the same file
// named on the command line — code, inline code, pre elements and skip
// comments left out alike — only under the name "-".
func TestCheckStdinSameAsFile(t *testing.T) {
	tb := pumpsTermbase(t)
	for _, tc := range []struct{ file, from string }{
		{"installation-guide.md", "md"},
		{"maintenance-log.md", "md"},
		{"service-bulletin.html", "html"},
		{"repair-sheet.html", "html"},
		{"field-notes.txt", "txt"},
	} {
		path := pumpsDir + "/" + tc.file
		data, err := os.ReadFile(filepath.Join("../..", path))
		require.NoError(t, err)
		fromFile := run(t, "", "check", "-q", "--termbase", tb, "--from", tc.from, path)
		require.NotEmpty(t, fromFile.stdout, "%s has findings", tc.file)
		fromStdin := run(t, string(data), "check", "-q", "--termbase", tb, "--from", tc.from, "-")
		assert.Equal(t, fromFile.code, fromStdin.code, "%s: exit status; %s", tc.file, fromStdin.stderr)
		assert.Equal(t, strings.ReplaceAll(fromFile.stdout, path+":", "-:"), fromStdin.stdout, tc.file)
	}
}

// TestCheckEncodingLeavesCodeOut: a Markdown file in the encoding named by
// --encoding (Shift_JIS here) has its code spans and skip comments left
// out as in UTF-8.
func TestCheckEncodingLeavesCodeOut(t *testing.T) {
	tb := pumpsTermbase(t)
	text := "日本語 `magnet valve` と magnet valve。\n<!-- glossmith:skip-next-line -->\nmagnet valve\n"
	sjis, err := japanese.ShiftJIS.NewEncoder().String(text)
	require.NoError(t, err)
	path := filepath.Join(t.TempDir(), "sj.md")
	require.NoError(t, os.WriteFile(path, []byte(sjis), 0o644))
	r := run(t, "", "check", "-q", "--termbase", tb, "--encoding", "shift_jis", path)
	assert.Equal(t, path+`:1:22: error: "magnet valve" is a deprecated term: use "solenoid valve"`+"\n", r.stdout, r.stderr)
}
