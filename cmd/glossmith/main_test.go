package main

import (
	"bytes"
	"context"
	"encoding/xml"
	"flag"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// binary is the glossmith executable built once for these tests: the
// commands are tested as users run them, exit status and streams included.
var binary string

func TestMain(m *testing.M) {
	flag.Parse()
	dir, err := os.MkdirTemp("", "glossmith-test")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	binary = filepath.Join(dir, "glossmith")
	out, err := exec.Command("go", "build", "-o", binary, ".").CombinedOutput()
	if err != nil {
		fmt.Fprintf(os.Stderr, "building glossmith: %v\n%s", err, out)
		os.Exit(1)
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

type result struct {
	stdout, stderr string
	code           int
}

// run runs glossmith from the repository root with the given arguments.
func run(t *testing.T, stdin string, args ...string) result {
	t.Helper()
	r, finished := runBounded(t, stdin, 10*time.Minute, args...)
	if !finished {
		t.Fatalf("glossmith %v did not finish", args)
	}
	return r
}

// runBounded runs glossmith with stdin and kills it after limit (a bound
// that only catches a hang, not a timing); it reports whether the command
// finished by itself.
func runBounded(t *testing.T, stdin string, limit time.Duration, args ...string) (result, bool) {
	t.Helper()
	return runIn(t, "../..", nil, stdin, limit, args...)
}

// runIn is runBounded in directory dir with environment env (nil: this
// process's).
func runIn(t *testing.T, dir string, env []string, stdin string, limit time.Duration, args ...string) (result, bool) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), limit)
	defer cancel()
	cmd := exec.CommandContext(ctx, binary, args...)
	cmd.Dir, cmd.Env = dir, env
	cmd.Stdin = strings.NewReader(stdin)
	var o, e bytes.Buffer
	cmd.Stdout, cmd.Stderr = &o, &e
	err := cmd.Run()
	code := 0
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatalf("running glossmith %v: %v", args, err)
	}
	return result{o.String(), e.String(), code}, ctx.Err() == nil
}

func TestVersionAndHelp(t *testing.T) {
	r := run(t, "", "--version")
	require.Equal(t, 0, r.code, r.stderr)
	assert.True(t, strings.HasPrefix(r.stdout, "glossmith "), "--version: %q", r.stdout)
	r = run(t, "", "--help")
	for _, c := range []string{"terms", "collocations", "find", "tag", "rules", "eval", "train", "termbase", "review", "check"} {
		assert.Contains(t, r.stdout, c, "--help does not list %q", c)
	}
	// The description names every input and output format of the README's
	// tables and both exit statuses.
	desc := strings.Join(strings.Fields(r.stdout[:strings.Index(r.stdout, "Usage:")]), " ")
	for _, w := range []string{"Markdown", "DOCX", "PDF", "CoNLL-U", "gzipped", "TSV", "CSV", "JSON Lines", "TBX", "HTML report", "termbase", "exit status is 1", "2 on a usage error"} {
		assert.Contains(t, desc, w, "the description of --help")
	}
}

// A mistyped subcommand of a command group is a usage error (exit status 2
// naming the word), as a mistyped command is: "rules chek FILE" printed the
// group's help and exited 0, so a script or CI job passed without checking.
func TestUnknownSubcommandRefused(t *testing.T) {
	tests := []struct {
		args []string
		want string // in the message
	}{
		{[]string{"rules", "chek", "x.gsr"}, `unknown command "chek" for "glossmith rules": did you mean "check"?`},
		{[]string{"eval", "taging", "gold.conllu"}, `unknown command "taging" for "glossmith eval": did you mean "tagging"?`},
		{[]string{"termbase", "--termbase", "tb.db", "lst"}, `unknown command "lst" for "glossmith termbase": did you mean "list"?`},
		{[]string{"completion", "tcsh"}, `unknown command "tcsh" for "glossmith completion"`},
	}
	for _, tt := range tests {
		t.Run(strings.Join(tt.args, " "), func(t *testing.T) {
			r := run(t, "", tt.args...)
			assert.Equal(t, 2, r.code, r.stderr)
			assert.Contains(t, r.stderr, tt.want)
			assert.Empty(t, r.stdout)
		})
	}
	// A group alone, or asked for help, still shows its help.
	for _, args := range [][]string{{"rules"}, {"rules", "--help"}, {"termbase", "help"}, {"completion"}} {
		r := run(t, "", args...)
		assert.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
		assert.Contains(t, r.stdout, "Usage:", "%v", args)
	}
	r := run(t, "", "completion", "bash")
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "bash completion")
}

// A pattern error in --include or --exclude is shown as find shows it: at
// its column in the pattern as typed, with a caret, not at a column of the
// anchored form the filter compiles ("NOUN (" was reported at column 10
// of a pattern six characters long).
func TestTermsFilterPatternErrorsAtTheirColumn(t *testing.T) {
	for _, flag := range []string{"--include", "--exclude"} {
		r := run(t, "", "terms", flag, "NOUN (", "testdata/demo/maintenance-schedule.txt")
		assert.Equal(t, 2, r.code, r.stderr)
		assert.Contains(t, r.stderr, "pattern:1:7: unexpected end of pattern\n    NOUN (\n          ^\n", flag)
		assert.Contains(t, r.stderr, "glossmith: "+flag+": the pattern did not compile", flag)
		assert.Empty(t, r.stdout)
	}
}

// The demo corpus gives a stable top 20: a golden file keeps it, and the
// same input gives the same bytes on every run.
func TestDemoTermsGolden(t *testing.T) {
	r := run(t, "", "terms", "--limit", "20", "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	again := run(t, "", "terms", "--limit", "20", "--workers", "1", "testdata/demo")
	require.Equal(t, r.stdout, again.stdout, "two runs (default workers and one worker) differ")
	golden := filepath.Join("..", "..", "testdata", "golden", "demo-terms.txt")
	if *update {
		require.NoError(t, os.WriteFile(golden, []byte(r.stdout), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test ./cmd/glossmith -run Golden -update to create it")
	assert.Equal(t, string(want), r.stdout, "terms on the demo corpus changed; if intended, run with -update")
}

// TBX output parses as XML with one conceptEntry per candidate, each with a
// langSec holding the canonical term first (TBX v3 core structure).
func TestTermsTBX(t *testing.T) {
	r := run(t, "", "terms", "--to", "tbx", "--limit", "15", "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	var tbx struct {
		XMLName xml.Name `xml:"urn:iso:std:iso:30042:ed-2 tbx"`
		Type    string   `xml:"type,attr"`
		Entries []struct {
			ID    string `xml:"id,attr"`
			Langs []struct {
				Lang  string `xml:"http://www.w3.org/XML/1998/namespace lang,attr"`
				Terms []struct {
					Term  string   `xml:"term"`
					Notes []string `xml:"note"`
				} `xml:"termSec"`
			} `xml:"langSec"`
		} `xml:"text>body>conceptEntry"`
	}
	require.NoError(t, xml.Unmarshal([]byte(r.stdout), &tbx), "TBX does not parse")
	require.Equal(t, "TBX-Core", tbx.Type)
	require.Len(t, tbx.Entries, 15)
	e := tbx.Entries[0]
	if len(e.Langs) != 1 || e.Langs[0].Lang != "en" || len(e.Langs[0].Terms) == 0 || e.Langs[0].Terms[0].Term == "" {
		require.Fail(t, "first entry malformed", "%+v", e)
	}
	contexts := 0
	for _, n := range e.Langs[0].Terms[0].Notes {
		if strings.HasPrefix(n, "context: ") && strings.Contains(n, "(source: testdata/demo/") {
			contexts++
		}
	}
	assert.NotZero(t, contexts, "the first term carries no context note: %+v", e.Langs[0].Terms[0])
}

func TestTermsFormats(t *testing.T) {
	for _, f := range []string{"tsv", "csv", "jsonl"} {
		r := run(t, "", "terms", "--to", f, "--limit", "5", "testdata/demo")
		require.Equal(t, 0, r.code, "%s: %s", f, r.stderr)
		lines := strings.Split(strings.TrimSpace(r.stdout), "\n")
		if f == "jsonl" {
			require.Len(t, lines, 5)
			assert.Contains(t, lines[0], `"term":`)
			assert.Contains(t, lines[0], `"variants":`)
			continue
		}
		require.Len(t, lines, 6, "%s: a header and 5 rows", f)
		assert.True(t, strings.HasPrefix(lines[0], "rank"), "%s header %q", f, lines[0])
	}
}

// An output file appears whole or not at all.
func TestOutputFileAtomic(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "list.tsv")
	r := run(t, "", "terms", "--to", "tsv", "-o", out, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	b, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.True(t, strings.HasPrefix(string(b), "rank\tterm"), "%q", firstLine(string(b)))
	r = run(t, "", "terms", "--to", "nonsense", "-o", filepath.Join(dir, "bad.txt"), "testdata/demo")
	assert.NotEqual(t, 0, r.code, "an unknown format was accepted")
	ents, _ := os.ReadDir(dir)
	assert.Len(t, ents, 1, "a failed run left files behind")
}

// Bad inputs: each gets a message naming it, the other inputs are still
// processed, and the exit status says something was skipped.
func TestBadInputsGoOn(t *testing.T) {
	dir := t.TempDir()
	empty := filepath.Join(dir, "empty.txt")
	binaryFile := filepath.Join(dir, "blob.txt")
	emptyDir := filepath.Join(dir, "nothing")
	require.NoError(t, os.WriteFile(empty, nil, 0o644))
	require.NoError(t, os.WriteFile(binaryFile, []byte("\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR\x00\x00"), 0o644))
	require.NoError(t, os.Mkdir(emptyDir, 0o755))
	missing := filepath.Join(dir, "missing.md")
	r := run(t, "", "tag", "--to", "text", empty, binaryFile, missing, emptyDir, "testdata/demo/maintenance-schedule.txt")
	assert.Equal(t, 1, r.code)
	for _, name := range []string{empty, binaryFile, missing, emptyDir} {
		assert.Contains(t, r.stderr, name, "no message names %s", name)
	}
	assert.Contains(t, r.stdout, "/NN", "the good file was not tagged")
	assert.NotContains(t, r.stderr, "panic")
}

// When every input failed, the closing line says so rather than that "the
// rest was processed".
func TestNoInputReadSaysSo(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "missing.md")
	for _, cmd := range [][]string{{"terms"}, {"find", "NOUN"}, {"tag"}} {
		r := run(t, "", append(cmd, missing)...)
		assert.Equal(t, 1, r.code, "%v", cmd)
		assert.Contains(t, r.stderr, missing, "%v", cmd)
		assert.Contains(t, r.stderr, "1 problem(s) with the inputs; no input could be read", "%v", cmd)
		assert.NotContains(t, r.stderr, "the rest was processed", "%v", cmd)
	}
}

// The CoNLL-U writer: # sent_id and # text for every sentence, ten columns
// per token, SpaceAfter=No where no space follows.
func TestTagConllu(t *testing.T) {
	r := run(t, "Don't over-tighten the union nut.\n", "tag", "--to", "conllu", "-")
	require.Equal(t, 0, r.code, r.stderr)
	var ids, texts, rows int
	for _, line := range strings.Split(r.stdout, "\n") {
		switch {
		case strings.HasPrefix(line, "# sent_id = "):
			ids++
		case strings.HasPrefix(line, "# text = "):
			texts++
			assert.Equal(t, "# text = Don't over-tighten the union nut.", line)
		case line == "" || strings.HasPrefix(line, "#"):
		default:
			rows++
			assert.Len(t, strings.Split(line, "\t"), 10, "%q", line)
		}
	}
	assert.Equal(t, 1, ids)
	assert.Equal(t, 1, texts)
	assert.GreaterOrEqual(t, rows, 8)
	assert.Contains(t, r.stdout, "\tnut\tnut\tNOUN\tNN\t_\t_\t_\t_\tSpaceAfter=No",
		"the last word is not tagged as expected or lacks SpaceAfter=No")
}

// Pre-tagged CoNLL-U input is used as given: its tags come out unchanged.
func TestTagPretagged(t *testing.T) {
	in := "# sent_id = x\n1\tFlush\tflush\tVERB\tVB\t_\t_\t_\t_\t_\n2\tlines\tline\tNOUN\tNNS\t_\t_\t_\t_\tSpaceAfter=No\n3\t.\t.\tPUNCT\t.\t_\t_\t_\t_\t_\n\n"
	r := run(t, in, "tag", "--from", "conllu", "--to", "text", "-")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Equal(t, "Flush/VB lines/NNS ./.", strings.TrimSpace(r.stdout))
	in2 := strings.ReplaceAll(in, "\tNOUN\tNNS\t", "\tVERB\tVBZ\t")
	r = run(t, in2, "tag", "--from", "conllu", "--to", "text", "-")
	assert.Equal(t, "Flush/VB lines/VBZ ./.", strings.TrimSpace(r.stdout), "hand annotation was re-tagged")
}

func TestFind(t *testing.T) {
	r := run(t, "", "find", "--to", "jsonl", `"union" "nut"`, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, `"start":`)
	assert.Contains(t, r.stdout, `"rule":`)
	r = run(t, "", "find", "--count", `ADJ NOUN`, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	assert.GreaterOrEqual(t, len(strings.Split(r.stdout, "\n")), 10)
	r = run(t, "", "find", "NUON", "testdata/demo")
	assert.NotEqual(t, 0, r.code)
	assert.Contains(t, r.stderr, "NOUN", "a misspelt tag gave no suggestion")
}

func TestRulesCheckReportsPosition(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "bad.gsr")
	require.NoError(t, os.WriteFile(f, []byte("# a rule\ngood = ADJ NOUN ;\nbad = ADJ NUON ;\n"), 0o644))
	r := run(t, "", "rules", "check", f)
	assert.NotEqual(t, 0, r.code, "a bad rule file passed")
	for _, want := range []string{"bad.gsr:3:11", `did you mean "NOUN"`, "^"} {
		assert.Contains(t, r.stderr, want, "error without position, suggestion or caret")
	}
}

func TestCollocations(t *testing.T) {
	r := run(t, "", "collocations", "--to", "jsonl", "--relation", "verb_obj", "--min-freq", "2", "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	for _, k := range []string{`"w1":`, `"w2":`, `"relation":"verb_obj"`, `"f12":`, `"f1":`, `"f2":`, `"n":`, `"g2":`, `"pmi":`, `"t":`, `"chi2":`, `"dice":`, `"logdice":`, `"mi3":`} {
		assert.Contains(t, r.stdout, k)
	}
	assert.NotContains(t, r.stdout, "NaN", "non-finite value printed")
	assert.NotContains(t, r.stdout, "Inf", "non-finite value printed")
}
