package hmm

import (
	"bytes"
	"compress/flate"
	"encoding/binary"
	"hash/crc32"
	"os"
	"path/filepath"
	"runtime"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// craftModel builds a model file of the given version around a stored
// payload, with a valid checksum; size is the inflated size a version 3
// header declares.
func craftModel(version uint16, stored []byte, size uint64) []byte {
	var b bytes.Buffer
	b.WriteString(fileMagic)
	b.Write(binary.LittleEndian.AppendUint16(nil, version))
	b.Write(binary.LittleEndian.AppendUint64(nil, uint64(len(stored))))
	if version >= 3 {
		b.Write(binary.LittleEndian.AppendUint64(nil, size))
	}
	b.Write(stored)
	b.Write(binary.LittleEndian.AppendUint32(nil, crc32.ChecksumIEEE(b.Bytes())))
	return b.Bytes()
}

// deflateZeros compresses n zero bytes: a stream of about n/1000 bytes
// that inflates to n.
func deflateZeros(t *testing.T, n int) []byte {
	var z bytes.Buffer
	w, err := flate.NewWriter(&z, flate.BestSpeed)
	require.NoError(t, err)
	zero := make([]byte, 1<<20)
	for left := n; left > 0; left -= len(zero) {
		_, err := w.Write(zero[:min(left, len(zero))])
		require.NoError(t, err)
	}
	require.NoError(t, w.Close())
	return z.Bytes()
}

// allocated returns the bytes f allocates on the heap.
func allocated(f func()) uint64 {
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	f()
	runtime.ReadMemStats(&after)
	return after.TotalAlloc - before.TotalAlloc
}

// A payload that inflates past what its header declares is refused
// without inflating it: the reader allocates the declared size, not what
// the stream would give.
func TestDecodeBoundsInflationByDeclaredSize(t *testing.T) {
	bomb := deflateZeros(t, 200<<20)
	require.Less(t, len(bomb), 1<<20, "the crafted file is small")
	data := craftModel(3, bomb, 1<<20)
	var err error
	n := allocated(func() { _, err = Decode(data) })
	require.Error(t, err)
	assert.Contains(t, err.Error(), "inflates beyond the 1048576 bytes the header announces")
	assert.Less(t, n, uint64(8<<20), "bytes allocated while refusing the file")
}

// A header may not declare more than MaxPayloadSize inflated, and a
// version 2 file, which declares nothing, is cut at that cap.
func TestDecodeCapsPayload(t *testing.T) {
	_, err := Decode(craftModel(3, deflateZeros(t, 1000), 1<<40))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "at most 67108864")

	_, err = Decode(craftModel(2, deflateZeros(t, MaxPayloadSize+(8<<20)), 0))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "payload inflates beyond 67108864 bytes")
}

// Load reads no more of a file than its header announces: a device that
// never ends and a file whose header announces more than MaxFileSize are
// refused after the header.
func TestLoadReadsNoMoreThanTheHeaderAnnounces(t *testing.T) {
	if _, err := os.Stat("/dev/zero"); err == nil {
		_, err := Load("/dev/zero")
		require.Error(t, err)
		assert.Contains(t, err.Error(), "/dev/zero: tagger model: not a glossmith tagger model")
	}

	// A sparse file of 256 MiB behind a header that announces all of it.
	path := filepath.Join(t.TempDir(), "huge.glsm")
	size := int64(256 << 20)
	head := craftModel(3, nil, 0)[:headerSize]
	binary.LittleEndian.PutUint64(head[len(fileMagic)+2:], uint64(size)-uint64(headerSize)-4)
	require.NoError(t, os.WriteFile(path, head, 0o644))
	require.NoError(t, os.Truncate(path, size))
	var err error
	n := allocated(func() { _, err = Load(path) })
	require.Error(t, err)
	assert.Contains(t, err.Error(), "a model file may have at most 67108864 bytes")
	assert.Contains(t, err.Error(), path)
	assert.Less(t, n, uint64(1<<20), "bytes allocated while refusing the file")

	// A header that announces little, followed by much more: refused as
	// trailing data after reading one byte past the announced end.
	good := craftModel(3, deflateZeros(t, 10), 10)
	require.NoError(t, os.WriteFile(path, good, 0o644))
	require.NoError(t, os.Truncate(path, size))
	n = allocated(func() { _, err = Load(path) })
	require.Error(t, err)
	assert.Contains(t, err.Error(), "1 bytes of unexpected data after the model")
	assert.Less(t, n, uint64(1<<20), "bytes allocated while refusing the file")
}
