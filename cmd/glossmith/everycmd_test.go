package main

import (
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/spf13/cobra"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// commandPaths lists every runnable command of the tree with the path
// that names it ("terms", "eval terms", …).
func commandPaths(c *cobra.Command) [][]string {
	var out [][]string
	var walk func(c *cobra.Command, path []string)
	walk = func(c *cobra.Command, path []string) {
		if c.Runnable() && len(path) > 0 {
			out = append(out, path)
		}
		for _, sub := range c.Commands() {
			if sub.IsAvailableCommand() && sub.Name() != "help" && sub.Name() != "completion" {
				walk(sub, append(append([]string(nil), path...), sub.Name()))
			}
		}
	}
	walk(c, nil)
	return out
}

// Every command of the tree, whoever adds it, refuses a bad value of the
// shared flags it has (--to, --from, --workers, --limit) with exit status 2
// (a usage error) before it opens an input (a named pipe nobody writes to).
func TestEveryCommandValidatesFlags(t *testing.T) {
	fifo := fifoInput(t)
	bad := map[string]string{"to": "bogus-format", "from": "bogus-format", "workers": "0", "limit": "-1"}
	root := newRootCmd()
	for _, path := range commandPaths(root) {
		c, _, err := root.Find(path)
		require.NoError(t, err)
		for flag, value := range bad {
			if c.Flags().Lookup(flag) == nil {
				continue
			}
			args := append(append(append([]string(nil), path...), "--"+flag, value), "x", fifo)
			t.Run(strings.Join(args[:len(args)-2], " "), func(t *testing.T) {
				r, finished := runBounded(t, "", time.Minute, args...)
				require.True(t, finished, "the command opened its input instead of refusing --%s %s", flag, value)
				// The message may be about a required flag checked first.
				assert.Equal(t, 2, r.code, r.stderr)
			})
		}
	}
}

// Every -o of the tree is written whole or not at all (openOutput), and
// where a command also has --to, the extension of -o picks the format
// (outputFormat): their help says so on every command alike.
func TestOutputFlagsHelpAlike(t *testing.T) {
	root := newRootCmd()
	for _, path := range commandPaths(root) {
		c, _, err := root.Find(path)
		require.NoError(t, err)
		o := c.Flags().Lookup("output")
		if o == nil {
			continue
		}
		t.Run(strings.Join(path, " "), func(t *testing.T) {
			assert.Contains(t, o.Usage, "(complete or not at all)")
			if to := c.Flags().Lookup("to"); to != nil {
				assert.Regexp(t, `\(default: from the -o extension, else `+regexp.QuoteMeta(to.Value.String())+`[);]`, to.Usage)
				r := run(t, "", append(append([]string(nil), path...), "--help")...)
				line := regexp.MustCompile(`(?m)^\s+--to string.*$`).FindString(r.stdout)
				require.NotEmpty(t, line, "no --to in the help")
				assert.NotContains(t, line, `(default "`, "a second default after the one -o's extension gives")
			}
		})
	}
}
