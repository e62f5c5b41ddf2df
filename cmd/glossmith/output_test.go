package main

import (
	"bytes"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// -o never damages what the path names: a device is written through, a
// symbolic link's target is replaced (the link stays), a read-only file is
// refused, a new file gets the umask's mode and a replaced one keeps its.
func TestOutputNeverDamages(t *testing.T) {
	before, err := os.Lstat(os.DevNull)
	require.NoError(t, err)
	r := run(t, "", "terms", "--limit", "3", "-o", os.DevNull, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	after, err := os.Lstat(os.DevNull)
	require.NoError(t, err)
	assert.Equal(t, before.Mode(), after.Mode(), "%s is still the device", os.DevNull)

	dir := t.TempDir()
	target := filepath.Join(dir, "real.tsv")
	link := filepath.Join(dir, "link.tsv")
	require.NoError(t, os.WriteFile(target, []byte("old\n"), 0o640))
	require.NoError(t, os.Symlink("real.tsv", link))
	r = run(t, "", "terms", "--limit", "3", "-o", link, "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	fi, err := os.Lstat(link)
	require.NoError(t, err)
	assert.NotZero(t, fi.Mode()&fs.ModeSymlink, "the link is still a link")
	b, _ := os.ReadFile(target)
	assert.True(t, strings.HasPrefix(string(b), "rank\tterm"), "%q", b)
	fi, _ = os.Stat(target)
	assert.Equal(t, fs.FileMode(0o640), fi.Mode().Perm(), "the replaced file keeps its mode")

	ro := filepath.Join(dir, "keep.tsv")
	require.NoError(t, os.WriteFile(ro, []byte("precious\n"), 0o444))
	r = run(t, "", "terms", "--limit", "3", "-o", ro, "testdata/demo")
	assert.NotEqual(t, 0, r.code)
	assert.Contains(t, r.stderr, "read-only")
	b, _ = os.ReadFile(ro)
	assert.Equal(t, "precious\n", string(b))

	old := syscall.Umask(0o077)
	r = run(t, "", "terms", "--limit", "3", "-o", filepath.Join(dir, "new.tsv"), "testdata/demo")
	syscall.Umask(old)
	require.Equal(t, 0, r.code, r.stderr)
	fi, err = os.Stat(filepath.Join(dir, "new.tsv"))
	require.NoError(t, err)
	assert.Equal(t, fs.FileMode(0o600), fi.Mode().Perm(), "0666 less the umask 077")
}

// When no input can be read, every command keeps the old output file.
func TestNothingProducedKeepsOutput(t *testing.T) {
	dir := t.TempDir()
	missing := filepath.Join(dir, "missing.txt")
	for _, c := range [][]string{
		{"terms", "--to", "tsv"},
		{"collocations", "--to", "tsv"},
		{"tag", "--to", "tsv"},
		{"find", "--to", "tsv", "NOUN"},
		{"find", "--count", "--to", "tsv", "NOUN"},
	} {
		out := filepath.Join(dir, "good.tsv")
		require.NoError(t, os.WriteFile(out, []byte("a good table\n"), 0o644))
		r := run(t, "", append(c, "-o", out, missing)...)
		assert.Equal(t, 1, r.code, "%v: %s", c, r.stderr)
		b, _ := os.ReadFile(out)
		assert.Equal(t, "a good table\n", string(b), "%v overwrote the old output", c)
		ents, _ := os.ReadDir(dir)
		assert.Len(t, ents, 1, "%v left a temporary file", c)
	}
}

// A full disk (Linux's /dev/full) is an error for every command that
// writes to standard output, never a silent exit 0.
func TestFullDiskIsAnError(t *testing.T) {
	if _, err := os.Stat("/dev/full"); err != nil {
		t.Skip("no /dev/full on this system")
	}
	gold := filepath.Join(t.TempDir(), "gold.tsv")
	require.NoError(t, os.WriteFile(gold, []byte("solenoid valve\nirrigation zone\n"), 0o644))
	for _, args := range [][]string{
		{"eval", "tagging", "testdata/formats/tagged.conllu"},
		{"eval", "tagging", "--to", "json", "testdata/formats/tagged.conllu"},
		{"eval", "terms", "--gold", gold, "testdata/demo"},
		{"rules", "list"},
		{"rules", "check", "stock:terms"},
		{"terms", "testdata/demo"},
		{"collocations", "testdata/demo"},
		{"find", "NOUN", "testdata/demo"},
		{"find", "--count", "NOUN", "testdata/demo"},
		{"tag", "testdata/demo"},
	} {
		full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
		require.NoError(t, err)
		cmd := exec.Command(binary, args...)
		cmd.Dir = "../.."
		cmd.Stdout = full
		var stderr bytes.Buffer
		cmd.Stderr = &stderr
		err = cmd.Run()
		full.Close()
		assert.Error(t, err, "%v exited 0 on a full disk", args)
		assert.Contains(t, stderr.String(), "no space left", "%v", args)
	}
}

// --reference with an unreadable file reports it and goes on.
func TestReferenceProblemGoesOn(t *testing.T) {
	r := run(t, "", "terms", "--limit", "3", "--reference", "testdata/demo/maintenance-schedule.txt",
		"--reference", "testdata/no-such-reference.txt", "testdata/demo")
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stderr, "no-such-reference.txt")
	assert.Len(t, strings.Split(strings.TrimSpace(r.stdout), "\n"), 4, "a header and three terms")
}

// A reference of which nothing could be read stops the run, and the
// closing line says it was the reference (the message lost its
// "reference:" and read as if the inputs were unreadable).
func TestReferenceUnreadableNamed(t *testing.T) {
	empty := filepath.Join(t.TempDir(), "empty.txt")
	require.NoError(t, os.WriteFile(empty, nil, 0o644))
	for _, ref := range []string{"testdata/no-such-reference.txt", empty} {
		r := run(t, "", "terms", "--reference", ref, "testdata/demo/maintenance-schedule.txt")
		assert.Equal(t, 1, r.code, r.stderr)
		assert.Contains(t, r.stderr, ref)
		assert.Regexp(t, `(?m)^glossmith: reference: `, r.stderr)
		assert.Empty(t, r.stdout)
	}
}

// tag -o writes the file whole.
func TestTagOutputFile(t *testing.T) {
	out := filepath.Join(t.TempDir(), "demo.conllu")
	r := run(t, "", "tag", "-o", out, "testdata/demo/maintenance-schedule.txt")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Empty(t, r.stdout)
	b, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.Contains(t, string(b), "# sent_id = ")
}

// The note that counts are approximate is a warning: --quiet keeps it.
func TestPrunedWarningSurvivesQuiet(t *testing.T) {
	r, w, err := os.Pipe()
	require.NoError(t, err)
	saved := os.Stderr
	os.Stderr = w
	f := inputFlags{quiet: true, memory: defaultMemory}
	f.warnPruned("candidates", 12, 1)
	os.Stderr = saved
	w.Close()
	var b bytes.Buffer
	_, _ = b.ReadFrom(r)
	assert.True(t, strings.HasPrefix(b.String(), "warning: memory budget: dropped 12 candidates seen once"), "%q", b.String())
}

// SIGINT or SIGTERM while an output file is being written removes its
// temporary file: find opens -o before reading, and then blocks on a named
// pipe nobody writes to.
func TestSignalLeavesNoTemporaryFile(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		dir := t.TempDir()
		out := filepath.Join(dir, "hits.tsv")
		cmd := exec.Command(binary, "find", "-o", out, "NOUN", fifoInput(t))
		require.NoError(t, cmd.Start())
		require.Eventually(t, func() bool {
			ents, _ := os.ReadDir(dir)
			return len(ents) == 1
		}, time.Minute, 20*time.Millisecond, "the temporary file appears")
		require.NoError(t, cmd.Process.Signal(sig))
		err := cmd.Wait()
		assert.Error(t, err, "ended by %v", sig)
		ents, _ := os.ReadDir(dir)
		assert.Empty(t, ents, "after %v", sig)
	}
}

// A failed write stops the reading: tag and find on a full disk end
// before the named pipe that follows 20 documents.
func TestFullDiskStopsReading(t *testing.T) {
	if _, err := os.Stat("/dev/full"); err != nil {
		t.Skip("no /dev/full on this system")
	}
	inputs := append(copies(t, 20), fifoInput(t))
	for _, args := range [][]string{{"tag", "--workers", "1"}, {"find", "--workers", "1", "--to", "tsv", "NOUN"}} {
		r, finished := runBounded(t, "", 2*time.Minute, append(append(args, "-o", "/dev/full"), inputs...)...)
		require.True(t, finished, "%v went on reading after a failed write", args)
		assert.NotEqual(t, 0, r.code)
		assert.Contains(t, r.stderr, "no space left")
	}
}
