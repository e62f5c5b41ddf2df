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
	ctx, cancel := context.WithTimeout(context.Background(), limit)
	defer cancel()
	cmd := exec.CommandContext(ctx, binary, args...)
	cmd.Dir = "../.."
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
	if r.code != 0 || !strings.HasPrefix(r.stdout, "glossmith ") {
		t.Fatalf("--version: %+v", r)
	}
	r = run(t, "", "--help")
	for _, c := range []string{"terms", "collocations", "find", "tag", "rules", "eval", "train"} {
		if !strings.Contains(r.stdout, c) {
			t.Errorf("--help does not list %q:\n%s", c, r.stdout)
		}
	}
}

// The demo corpus gives a stable top 20: a golden file keeps it, and the
// same input gives the same bytes on every run.
func TestDemoTermsGolden(t *testing.T) {
	r := run(t, "", "terms", "--limit", "20", "testdata/demo")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	again := run(t, "", "terms", "--limit", "20", "--workers", "1", "testdata/demo")
	if again.stdout != r.stdout {
		t.Fatalf("two runs (default workers and one worker) differ:\n%s\n---\n%s", r.stdout, again.stdout)
	}
	golden := filepath.Join("..", "..", "testdata", "golden", "demo-terms.txt")
	if *update {
		if err := os.WriteFile(golden, []byte(r.stdout), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/glossmith -run Golden -update to create it)", err)
	}
	if r.stdout != string(want) {
		t.Errorf("terms on the demo corpus changed; if intended, run with -update.\ngot:\n%s\nwant:\n%s", r.stdout, want)
	}
}

// TBX output parses as XML with one conceptEntry per candidate, each with a
// langSec holding the canonical term first (TBX v3 core structure).
func TestTermsTBX(t *testing.T) {
	r := run(t, "", "terms", "--to", "tbx", "--limit", "15", "testdata/demo")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
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
	if err := xml.Unmarshal([]byte(r.stdout), &tbx); err != nil {
		t.Fatalf("TBX does not parse: %v\n%s", err, r.stdout)
	}
	if tbx.Type != "TBX-Core" || len(tbx.Entries) != 15 {
		t.Fatalf("type %q, %d entries", tbx.Type, len(tbx.Entries))
	}
	e := tbx.Entries[0]
	if len(e.Langs) != 1 || e.Langs[0].Lang != "en" || len(e.Langs[0].Terms) == 0 || e.Langs[0].Terms[0].Term == "" {
		t.Fatalf("first entry malformed: %+v", e)
	}
	contexts := 0
	for _, n := range e.Langs[0].Terms[0].Notes {
		if strings.HasPrefix(n, "context: ") && strings.Contains(n, "(source: testdata/demo/") {
			contexts++
		}
	}
	if contexts == 0 {
		t.Errorf("the first term carries no context note: %+v", e.Langs[0].Terms[0])
	}
}

func TestTermsFormats(t *testing.T) {
	for _, f := range []string{"tsv", "csv", "jsonl"} {
		r := run(t, "", "terms", "--to", f, "--limit", "5", "testdata/demo")
		lines := strings.Split(strings.TrimSpace(r.stdout), "\n")
		if r.code != 0 {
			t.Fatalf("%s: exit %d: %s", f, r.code, r.stderr)
		}
		switch f {
		case "jsonl":
			if len(lines) != 5 || !strings.Contains(lines[0], `"term":`) || !strings.Contains(lines[0], `"variants":`) {
				t.Errorf("jsonl: %s", r.stdout)
			}
		default:
			if len(lines) != 6 || !strings.HasPrefix(lines[0], "rank") {
				t.Errorf("%s: want a header and 5 rows:\n%s", f, r.stdout)
			}
		}
	}
}

// An output file appears whole or not at all.
func TestOutputFileAtomic(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "list.tsv")
	r := run(t, "", "terms", "--to", "tsv", "-o", out, "testdata/demo")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	b, err := os.ReadFile(out)
	if err != nil || !strings.HasPrefix(string(b), "rank\tterm") {
		t.Fatalf("output file: %v %q", err, b)
	}
	r = run(t, "", "terms", "--to", "nonsense", "-o", filepath.Join(dir, "bad.txt"), "testdata/demo")
	if r.code == 0 {
		t.Fatal("an unknown format was accepted")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Fatalf("a failed run left files behind: %v", ents)
	}
}

// Bad inputs: each gets a message naming it, the other inputs are still
// processed, and the exit status says something was skipped.
func TestBadInputsGoOn(t *testing.T) {
	dir := t.TempDir()
	empty := filepath.Join(dir, "empty.txt")
	binaryFile := filepath.Join(dir, "blob.txt")
	emptyDir := filepath.Join(dir, "nothing")
	os.WriteFile(empty, nil, 0o644)
	os.WriteFile(binaryFile, []byte("\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR\x00\x00"), 0o644)
	os.Mkdir(emptyDir, 0o755)
	missing := filepath.Join(dir, "missing.md")
	r := run(t, "", "tag", "--to", "text", empty, binaryFile, missing, emptyDir, "testdata/demo/maintenance-schedule.txt")
	if r.code != 1 {
		t.Errorf("exit status %d, want 1", r.code)
	}
	for _, name := range []string{empty, binaryFile, missing, emptyDir} {
		if !strings.Contains(r.stderr, name) {
			t.Errorf("no message names %s:\n%s", name, r.stderr)
		}
	}
	if !strings.Contains(r.stdout, "/NN") {
		t.Errorf("the good file was not tagged:\n%s", r.stdout)
	}
	if strings.Contains(r.stderr, "panic") {
		t.Fatalf("panic:\n%s", r.stderr)
	}
}

// The CoNLL-U writer: # sent_id and # text for every sentence, ten columns
// per token, SpaceAfter=No where no space follows.
func TestTagConllu(t *testing.T) {
	r := run(t, "Don't over-tighten the union nut.\n", "tag", "--to", "conllu", "-")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	var ids, texts, rows int
	for _, line := range strings.Split(r.stdout, "\n") {
		switch {
		case strings.HasPrefix(line, "# sent_id = "):
			ids++
		case strings.HasPrefix(line, "# text = "):
			texts++
			if line != "# text = Don't over-tighten the union nut." {
				t.Errorf("text line %q", line)
			}
		case line == "" || strings.HasPrefix(line, "#"):
		default:
			rows++
			if n := len(strings.Split(line, "\t")); n != 10 {
				t.Errorf("%d columns: %q", n, line)
			}
		}
	}
	if ids != 1 || texts != 1 || rows < 8 {
		t.Errorf("ids %d texts %d rows %d:\n%s", ids, texts, rows, r.stdout)
	}
	if !strings.Contains(r.stdout, "\tnut\tnut\tNOUN\tNN\t_\t_\t_\t_\tSpaceAfter=No") {
		t.Errorf("the last word is not tagged as expected or lacks SpaceAfter=No:\n%s", r.stdout)
	}
}

// Pre-tagged CoNLL-U input is used as given: its tags come out unchanged.
func TestTagPretagged(t *testing.T) {
	in := "# sent_id = x\n1\tFlush\tflush\tVERB\tVB\t_\t_\t_\t_\t_\n2\tlines\tline\tNOUN\tNNS\t_\t_\t_\t_\tSpaceAfter=No\n3\t.\t.\tPUNCT\t.\t_\t_\t_\t_\t_\n\n"
	r := run(t, in, "tag", "--from", "conllu", "--to", "text", "-")
	if r.code != 0 || strings.TrimSpace(r.stdout) != "Flush/VB lines/NNS ./." {
		t.Fatalf("%+v", r)
	}
	in2 := strings.ReplaceAll(in, "\tNOUN\tNNS\t", "\tVERB\tVBZ\t")
	r = run(t, in2, "tag", "--from", "conllu", "--to", "text", "-")
	if strings.TrimSpace(r.stdout) != "Flush/VB lines/VBZ ./." {
		t.Fatalf("hand annotation was re-tagged: %q", r.stdout)
	}
}

func TestFind(t *testing.T) {
	r := run(t, "", "find", "--to", "jsonl", `"union" "nut"`, "testdata/demo")
	if r.code != 0 || !strings.Contains(r.stdout, `"start":`) || !strings.Contains(r.stdout, `"rule":`) {
		t.Fatalf("%+v", r)
	}
	r = run(t, "", "find", "--count", `ADJ NOUN`, "testdata/demo")
	if r.code != 0 || len(strings.Split(r.stdout, "\n")) < 10 {
		t.Fatalf("%+v", r)
	}
	r = run(t, "", "find", "NUON", "testdata/demo")
	if r.code == 0 || !strings.Contains(r.stderr, "NOUN") {
		t.Fatalf("a misspelt tag gave no suggestion: %+v", r)
	}
}

func TestRulesCheckReportsPosition(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "bad.gsr")
	os.WriteFile(f, []byte("# a rule\ngood = ADJ NOUN ;\nbad = ADJ NUON ;\n"), 0o644)
	r := run(t, "", "rules", "check", f)
	if r.code == 0 {
		t.Fatal("a bad rule file passed")
	}
	if !strings.Contains(r.stderr, "bad.gsr:3:11") || !strings.Contains(r.stderr, `did you mean "NOUN"`) || !strings.Contains(r.stderr, "^") {
		t.Errorf("error without position, suggestion or caret:\n%s", r.stderr)
	}
}

func TestCollocations(t *testing.T) {
	r := run(t, "", "collocations", "--to", "jsonl", "--relation", "verb_obj", "--min-freq", "2", "testdata/demo")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	for _, k := range []string{`"w1":`, `"w2":`, `"relation":"verb_obj"`, `"f12":`, `"f1":`, `"f2":`, `"n":`, `"g2":`, `"pmi":`, `"t":`, `"chi2":`, `"dice":`, `"logdice":`, `"mi3":`} {
		if !strings.Contains(r.stdout, k) {
			t.Errorf("jsonl lacks %s:\n%s", k, r.stdout)
		}
	}
	if strings.Contains(r.stdout, "NaN") || strings.Contains(r.stdout, "Inf") {
		t.Errorf("non-finite value printed")
	}
}
