package atomicfile

import (
	"bufio"
	"errors"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// entries lists the names in dir, hidden temporary files included.
func entries(t *testing.T, dir string) []string {
	t.Helper()
	ents, err := os.ReadDir(dir)
	require.NoError(t, err)
	var names []string
	for _, e := range ents {
		names = append(names, e.Name())
	}
	return names
}

func write(t *testing.T, path, text string) error {
	t.Helper()
	f, err := Create(path)
	if err != nil {
		return err
	}
	_, err = f.Write([]byte(text))
	return f.Finish(err)
}

func TestNewFileGetsUmaskMode(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	path := filepath.Join(t.TempDir(), "list.tsv")
	require.NoError(t, write(t, path, "new\n"))
	fi, err := os.Stat(path)
	require.NoError(t, err)
	assert.Equal(t, fs.FileMode(0o640), fi.Mode().Perm(), "0666 less the umask 027")
}

func TestReplacedFileKeepsMode(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "list.tsv")
	require.NoError(t, os.WriteFile(path, []byte("old\n"), 0o600))
	require.NoError(t, os.Chmod(path, 0o604))
	require.NoError(t, write(t, path, "new\n"))
	fi, err := os.Stat(path)
	require.NoError(t, err)
	assert.Equal(t, fs.FileMode(0o604), fi.Mode().Perm())
	b, _ := os.ReadFile(path)
	assert.Equal(t, "new\n", string(b))
	assert.Equal(t, []string{"list.tsv"}, entries(t, dir), "no temporary file left")
}

func TestSymlinkTargetReplaced(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "real.txt")
	link := filepath.Join(dir, "link.txt")
	require.NoError(t, os.WriteFile(target, []byte("old\n"), 0o644))
	require.NoError(t, os.Symlink("real.txt", link))
	require.NoError(t, write(t, link, "new\n"))
	fi, err := os.Lstat(link)
	require.NoError(t, err)
	assert.True(t, fi.Mode()&fs.ModeSymlink != 0, "the link is still a link")
	b, _ := os.ReadFile(target)
	assert.Equal(t, "new\n", string(b))

	// A dangling link names the file to create.
	dangling := filepath.Join(dir, "dangling.txt")
	require.NoError(t, os.Symlink("later.txt", dangling))
	require.NoError(t, write(t, dangling, "made\n"))
	b, err = os.ReadFile(filepath.Join(dir, "later.txt"))
	require.NoError(t, err)
	assert.Equal(t, "made\n", string(b))

	loop := filepath.Join(dir, "loop")
	require.NoError(t, os.Symlink("loop", loop))
	assert.Error(t, write(t, loop, "x"))
}

func TestDeviceWrittenThrough(t *testing.T) {
	before, err := os.Lstat(os.DevNull)
	require.NoError(t, err)
	require.True(t, before.Mode()&fs.ModeDevice != 0, "%s is a device", os.DevNull)
	require.NoError(t, write(t, os.DevNull, "discarded\n"))
	after, err := os.Lstat(os.DevNull)
	require.NoError(t, err)
	assert.Equal(t, before.Mode(), after.Mode(), "/dev/null is still the device")

	// A full device's error reaches the writer (Linux's /dev/full).
	if _, err := os.Stat("/dev/full"); err == nil {
		err := write(t, "/dev/full", "no room\n")
		assert.ErrorIs(t, err, syscall.ENOSPC)
	}
}

func TestFIFOWrittenThrough(t *testing.T) {
	path := filepath.Join(t.TempDir(), "pipe")
	require.NoError(t, syscall.Mkfifo(path, 0o600))
	got := make(chan string, 1)
	go func() {
		b, _ := os.ReadFile(path)
		got <- string(b)
	}()
	require.NoError(t, write(t, path, "through\n"))
	select {
	case s := <-got:
		assert.Equal(t, "through\n", s)
	case <-time.After(20 * time.Second):
		t.Fatal("the reader of the FIFO got nothing")
	}
	fi, err := os.Lstat(path)
	require.NoError(t, err)
	assert.True(t, fi.Mode()&fs.ModeNamedPipe != 0, "the FIFO is still a FIFO")
}

func TestReadOnlyRefused(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "keep.tbx")
	require.NoError(t, os.WriteFile(path, []byte("precious\n"), 0o444))
	err := write(t, path, "new\n")
	assert.ErrorIs(t, err, ErrReadOnly)
	b, _ := os.ReadFile(path)
	assert.Equal(t, "precious\n", string(b))
	assert.Equal(t, []string{"keep.tbx"}, entries(t, dir))
}

func TestDirectoryRefused(t *testing.T) {
	assert.Error(t, write(t, t.TempDir(), "x"))
}

// A missing directory is named in the error, not the hidden temporary
// file that could not be created in it.
func TestMissingDirectoryNamed(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "reports")
	path := filepath.Join(dir, "terms.tsv")
	err := write(t, path, "x")
	require.Error(t, err)
	assert.ErrorIs(t, err, fs.ErrNotExist)
	assert.Equal(t, "cannot write "+path+": no directory "+dir, err.Error())
	assert.NotContains(t, err.Error(), ".tmp")
}

func TestAbortKeepsOld(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "list.csv")
	require.NoError(t, os.WriteFile(path, []byte("old\n"), 0o644))
	f, err := Create(path)
	require.NoError(t, err)
	_, err = f.Write([]byte("half"))
	require.NoError(t, err)
	assert.Len(t, entries(t, dir), 2, "the temporary file exists while writing")
	failure := errors.New("the run failed")
	assert.Equal(t, failure, f.Finish(failure))
	f.Abort() // a second call does nothing
	b, _ := os.ReadFile(path)
	assert.Equal(t, "old\n", string(b))
	assert.Equal(t, []string{"list.csv"}, entries(t, dir))
	assert.Error(t, f.Commit(), "a finished file cannot be committed")
}

// TestSignalRemovesTemporary runs a child process that starts writing and
// waits; SIGTERM and SIGINT must end it and leave no temporary file.
func TestSignalRemovesTemporary(t *testing.T) {
	if dir := os.Getenv("ATOMICFILE_HELPER_DIR"); dir != "" {
		f, err := Create(filepath.Join(dir, "out.txt"))
		if err != nil {
			os.Exit(3)
		}
		f.Write([]byte("partial"))
		os.Stdout.WriteString("ready\n")
		time.Sleep(time.Minute)
		os.Exit(4)
	}
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT} {
		dir := t.TempDir()
		cmd := exec.Command(os.Args[0], "-test.run=^TestSignalRemovesTemporary$")
		cmd.Env = append(os.Environ(), "ATOMICFILE_HELPER_DIR="+dir)
		out, err := cmd.StdoutPipe()
		require.NoError(t, err)
		require.NoError(t, cmd.Start())
		line, err := bufio.NewReader(out).ReadString('\n')
		require.NoError(t, err)
		require.Equal(t, "ready\n", line)
		require.Len(t, entries(t, dir), 1, "the temporary file exists")
		require.NoError(t, cmd.Process.Signal(sig))
		err = cmd.Wait()
		var ee *exec.ExitError
		require.ErrorAs(t, err, &ee, "the child ended by the signal")
		assert.Empty(t, entries(t, dir), "after %v", sig)
	}
}
