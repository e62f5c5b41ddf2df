package main

import (
	"compress/gzip"
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The hidden --cpuprofile writes a whole profile however the command ends:
// check exits 1 when it finds an error-level term, and the profile used to
// be left empty then. A pprof file is gzip-compressed protocol buffers; a
// whole one decompresses to its end (the gzip trailer's checksum matches).
func TestCPUProfileWrittenOnNonZeroExit(t *testing.T) {
	tb := pumpsTermbase(t)
	path := filepath.Join(t.TempDir(), "check.prof")
	r := run(t, "", "check", "--termbase", tb, "-q", "--cpuprofile", path, pumpsDir)
	require.Equal(t, 1, r.code, r.stderr)
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	z, err := gzip.NewReader(f)
	require.NoError(t, err, "the profile must be a gzip stream")
	n, err := io.Copy(io.Discard, z)
	require.NoError(t, err, "the profile must be whole")
	assert.Positive(t, n)
}
