package main

import (
	"bufio"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/spf13/pflag"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A session is a README code block (text or console) that shows commands
// after "$ " and, under each, what it prints: the user's manual promises
// that output, so TestReadmeSessions runs it.
type sessionStep struct {
	line     int    // README line of the command
	command  string // after "$ "
	expected []string
}

// readmeSessions returns the steps of every text or console block of doc
// that holds a line starting with "$ ", in the order of the document.
func readmeSessions(doc string) []sessionStep {
	var steps []sessionStep
	inBlock, session := false, false
	var block []sessionStep
	sc := bufio.NewScanner(strings.NewReader(doc))
	for n := 1; sc.Scan(); n++ {
		l := sc.Text()
		switch {
		case !inBlock && strings.HasPrefix(l, "```"):
			info := strings.TrimSpace(strings.TrimPrefix(l, "```"))
			inBlock, session, block = true, info == "text" || info == "console", nil
		case inBlock && strings.TrimSpace(l) == "```":
			inBlock = false
			steps = append(steps, block...)
		case !inBlock || !session:
		case strings.HasPrefix(l, "$ "):
			block = append(block, sessionStep{line: n, command: strings.TrimPrefix(l, "$ ")})
		case len(block) > 0:
			s := &block[len(block)-1]
			s.expected = append(s.expected, l)
		default:
			session = false // output before any command: not a session
		}
	}
	return steps
}

// shellWords splits a command line as a POSIX shell does for the plain
// words and the single- and double-quoted strings a README session uses.
// Anything a shell would expand or redirect is refused, so a session line
// this test cannot run as written fails it instead of running otherwise.
func shellWords(line string) ([]string, bool) {
	var words []string
	var w strings.Builder
	inWord := false
	for i := 0; i < len(line); i++ {
		c := line[i]
		switch {
		case c == ' ' || c == '\t':
			if inWord {
				words = append(words, w.String())
				w.Reset()
				inWord = false
			}
		case c == '\'' || c == '"':
			end := strings.IndexByte(line[i+1:], c)
			if end < 0 {
				return nil, false
			}
			quoted := line[i+1 : i+1+end]
			if c == '"' && strings.ContainsAny(quoted, "$`\\") {
				return nil, false
			}
			w.WriteString(quoted)
			inWord = true
			i += end + 1
		case strings.IndexByte("|&;<>()$`\\*?[#~{", c) >= 0:
			return nil, false
		default:
			w.WriteByte(c)
			inWord = true
		}
	}
	if inWord {
		words = append(words, w.String())
	}
	return words, len(words) > 0
}

// outputMatches reports whether got (the lines a command printed) is what
// the README shows in want. A line "…" alone stands for any number of
// lines left out; a "…" inside a line for any text there (a date, the end
// of a long line). Trailing spaces do not count.
func outputMatches(want, got []string) bool {
	if len(want) == 0 {
		return len(got) == 0
	}
	if strings.TrimSpace(want[0]) == "…" {
		for k := 0; k <= len(got); k++ {
			if outputMatches(want[1:], got[k:]) {
				return true
			}
		}
		return false
	}
	return len(got) > 0 && lineMatches(want[0], got[0]) && outputMatches(want[1:], got[1:])
}

func lineMatches(want, got string) bool {
	want, got = strings.TrimRight(want, " "), strings.TrimRight(got, " ")
	if !strings.Contains(want, "…") {
		return want == got
	}
	parts := strings.Split(want, "…")
	for i, p := range parts {
		parts[i] = regexp.QuoteMeta(p)
	}
	return regexp.MustCompile("^" + strings.Join(parts, ".*") + "$").MatchString(got)
}

func TestOutputMatches(t *testing.T) {
	for _, c := range []struct {
		name      string
		want, got []string
		match     bool
	}{
		{"same", []string{"a", "b"}, []string{"a", "b"}, true},
		{"a number drifted", []string{"1  solenoid  48.29"}, []string{"1  solenoid  48.30"}, false},
		{"a line more", []string{"a"}, []string{"a", "b"}, false},
		{"a line fewer", []string{"a", "b"}, []string{"a"}, false},
		{"lines left out", []string{"a", "…", "z"}, []string{"a", "b", "c", "z"}, true},
		{"none left out", []string{"a", "…", "z"}, []string{"a", "z"}, true},
		{"left out, then a wrong last line", []string{"a", "…", "z"}, []string{"a", "b", "y"}, false},
		{"a date left out", []string{"#2 … mara accept"}, []string{"#2 2026-12-03 18:56 mara accept"}, true},
		{"the wrong name around a gap", []string{"#2 … mara accept"}, []string{"#2 2026-12-03 18:56 lena accept"}, false},
		{"an ellipsis the program printed", []string{"valves, …"}, []string{"valves, …"}, true},
		{"trailing spaces", []string{"8  AC"}, []string{"8  AC   "}, true},
		{"nothing printed", nil, nil, true},
		{"something printed where nothing is shown", nil, []string{"a"}, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			assert.Equal(t, c.match, outputMatches(c.want, c.got))
		})
	}
}

func TestShellWords(t *testing.T) {
	for _, c := range []struct {
		line  string
		words []string
		ok    bool
	}{
		{`glossmith terms --limit 8 testdata/demo`, []string{"glossmith", "terms", "--limit", "8", "testdata/demo"}, true},
		{`glossmith termbase accept "solenoid valve" drip`, []string{"glossmith", "termbase", "accept", "solenoid valve", "drip"}, true},
		{`glossmith find --width 30 'ADJ "valve"' testdata/demo`, []string{"glossmith", "find", "--width", "30", `ADJ "valve"`, "testdata/demo"}, true},
		{`glossmith terms x --set="a b"c`, []string{"glossmith", "terms", "x", "--set=a bc"}, true},
		{`glossmith terms testdata/demo | head`, nil, false},
		{`glossmith terms testdata/*.md`, nil, false},
		{`glossmith terms "$HOME"`, nil, false},
		{`glossmith terms "open`, nil, false},
		{`echo $?`, nil, false},
	} {
		t.Run(c.line, func(t *testing.T) {
			w, ok := shellWords(c.line)
			assert.Equal(t, c.ok, ok)
			if c.ok {
				assert.Equal(t, c.words, w)
			}
		})
	}
}

// TestReadmeSessions runs every session of the README, in order, in one
// scratch directory (testdata linked into it, so documents keep their
// names; termbases and output files land there), and compares what each
// command prints — standard output, then standard error — with the lines
// the README shows. "export NAME=VALUE" and "unset NAME" set the
// environment of the commands after them and "echo $?" shows the exit
// status of the one before.
func TestReadmeSessions(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	require.NoError(t, err)
	steps := readmeSessions(string(readme))
	require.GreaterOrEqual(t, len(steps), 10, "the README's sessions were not found")

	dir := t.TempDir()
	testdata, err := filepath.Abs(filepath.Join("..", "..", "testdata"))
	require.NoError(t, err)
	require.NoError(t, os.Symlink(testdata, filepath.Join(dir, "testdata")))
	var env []string
	for _, kv := range os.Environ() {
		if !strings.HasPrefix(kv, "GLOSSMITH_") {
			env = append(env, kv)
		}
	}
	last := -1
	for _, s := range steps {
		if s.command == "echo $?" {
			require.NotEqual(t, -1, last, "README.md:%d: echo $? before any command", s.line)
			assert.Equal(t, s.expected, []string{strconv.Itoa(last)}, "README.md:%d: the exit status", s.line)
			continue
		}
		words, ok := shellWords(s.command)
		require.True(t, ok, "README.md:%d: %q: this test runs only plain words and quoted strings", s.line, s.command)
		switch {
		case words[0] == "export" && len(words) == 2 && strings.Contains(words[1], "="):
			env = append(env, words[1])
			continue
		case words[0] == "unset" && len(words) == 2:
			env = slices.DeleteFunc(env, func(kv string) bool { return strings.HasPrefix(kv, words[1]+"=") })
			continue
		}
		require.Equal(t, "glossmith", words[0], "README.md:%d: a session runs glossmith, export, unset or echo $?", s.line)
		r, finished := runIn(t, dir, env, "", 5*time.Minute, words[1:]...)
		require.True(t, finished, "README.md:%d: %s did not finish", s.line, s.command)
		last = r.code
		got := strings.Split(strings.TrimSuffix(r.stdout+r.stderr, "\n"), "\n")
		if r.stdout+r.stderr == "" {
			got = nil
		}
		assert.True(t, outputMatches(s.expected, got),
			"README.md:%d: $ %s\nthe README shows:\n%s\nthe program prints:\n%s", s.line, s.command,
			strings.Join(s.expected, "\n"), strings.Join(got, "\n"))
	}
}

// The README names every flag of every command (the user's manual is where
// a flag is explained beyond its one line of --help), and every flag it
// names exists.
func TestReadmeNamesEveryFlag(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	require.NoError(t, err)
	doc := string(readme)
	root := newRootCmd()
	known := map[string]bool{"help": true, "version": true} // cobra adds these when it runs
	root.PersistentFlags().VisitAll(func(f *pflag.Flag) { known[f.Name] = true })
	for _, path := range commandPaths(root) {
		c, _, err := root.Find(path)
		require.NoError(t, err)
		c.Flags().VisitAll(func(f *pflag.Flag) {
			known[f.Name] = true
			if f.Hidden || f.Name == "help" {
				return
			}
			named := regexp.MustCompile(`--` + regexp.QuoteMeta(f.Name) + `\b`).MatchString(doc)
			assert.True(t, named, "glossmith %s --%s is not in the README", strings.Join(path, " "), f.Name)
		})
	}
	for _, m := range regexp.MustCompile(`(?:^|[\s(\x60])--([a-z][a-z0-9-]*)`).FindAllStringSubmatch(doc, -1) {
		assert.True(t, known[m[1]], "the README names --%s, which no command has", m[1])
	}
}
