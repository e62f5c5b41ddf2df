package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// help man writes a section-1 page (roff, .TH header) for every command
// that --help lists, from the same text.
func TestManPages(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "man1")
	cmd := exec.Command(binary, "help", "man", "-o", dir)
	cmd.Env = append(os.Environ(), "SOURCE_DATE_EPOCH=86400")
	out, err := cmd.CombinedOutput()
	require.NoError(t, err, "%s", out)

	root := run(t, "", "--help")
	_, list, ok := strings.Cut(root.stdout, "Available Commands:")
	require.True(t, ok, root.stdout)
	list, _, _ = strings.Cut(list, "\n\n")
	names := regexp.MustCompile(`(?m)^\s+(\S+)`).FindAllStringSubmatch(list, -1)
	require.NotEmpty(t, names)
	for _, n := range append(names, []string{"", ""}) {
		page := "glossmith.1"
		if n[1] != "" && n[1] != "help" {
			page = "glossmith-" + n[1] + ".1"
		}
		b, err := os.ReadFile(filepath.Join(dir, page))
		if !assert.NoError(t, err, "no page for %q", n[1]) {
			continue
		}
		assert.True(t, strings.Contains(string(b), "\n"+`.TH "GLOSSMITH" "1" "Jan 1970"`), "%s: %.60q", page, b)
	}
	b, err := os.ReadFile(filepath.Join(dir, "glossmith-terms.1"))
	require.NoError(t, err)
	for _, flag := range []string{`\fB--sort\fP`, `\fB--to\fP`, `\fB--reference\fP`, `.SH EXAMPLE`} {
		assert.True(t, strings.Contains(string(b), flag), "glossmith-terms.1 lacks %s", flag)
	}
	r := run(t, "", "help", "man")
	assert.Equal(t, 2, r.code, "a directory is required")
}

// help COMMAND prints the command's help, as --help does.
func TestHelpCommand(t *testing.T) {
	a := run(t, "", "help", "terms")
	b := run(t, "", "terms", "--help")
	require.Equal(t, 0, a.code, a.stderr)
	assert.Equal(t, b.stdout, a.stdout)
	assert.Equal(t, 2, run(t, "", "help", "nonsense").code)
}

// Shell completion offers the values of flags that take one of a list,
// and the built-in rule sets for --rules (cobra's __complete protocol:
// one candidate per line, then ":directive").
func TestCompletionOfFlagValues(t *testing.T) {
	cases := []struct {
		args []string
		want []string
	}{
		{[]string{"terms", "--to", ""}, []string{"text", "tsv", "csv", "jsonl", "tbx"}},
		{[]string{"terms", "--sort", ""}, []string{"score", "cvalue", "keyness"}},
		{[]string{"terms", "--from", ""}, []string{"md", "html", "conllu"}},
		{[]string{"terms", "--rules", ""}, []string{"stock:terms", "stock:pairs"}},
		{[]string{"collocations", "--measure", ""}, []string{"g2", "logdice", "pmi"}},
		{[]string{"collocations", "--by", ""}, []string{"lemma", "word"}},
		{[]string{"find", "--to", ""}, []string{"text", "csv", "jsonl"}},
		{[]string{"find", "--color", ""}, []string{"auto", "always", "never"}},
		{[]string{"tag", "--tagset", ""}, []string{"xpos", "upos"}},
		{[]string{"rules", "show", ""}, []string{"stock:terms"}},
	}
	for _, c := range cases {
		r := run(t, "", append([]string{"__complete"}, c.args...)...)
		require.Equal(t, 0, r.code, r.stderr)
		got := strings.Split(strings.TrimSpace(r.stdout), "\n")
		for _, w := range c.want {
			assert.Contains(t, got, w, "%v", c.args)
		}
	}
	r := run(t, "", "completion", "bash")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "__glossmith_")
}
