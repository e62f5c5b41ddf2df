package hmm

import (
	"bytes"
	"encoding/binary"
	"hash/crc32"
	"testing"

	"github.com/stretchr/testify/require"
)

// Files of format version 1 stored the payload uncompressed; they are still
// read, and decode to the same model as the current file, less the table
// of word classes, which came with version 4, and the general-English
// table, which came with version 5.
func TestReadVersion1(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	var e enc
	m.encodePayload(&e, 1)
	var v1 bytes.Buffer
	v1.WriteString(fileMagic)
	v1.Write(binary.LittleEndian.AppendUint16(nil, 1))
	v1.Write(binary.LittleEndian.AppendUint64(nil, uint64(len(e.b))))
	v1.Write(e.b)
	v1.Write(binary.LittleEndian.AppendUint32(nil, crc32.ChecksumIEEE(v1.Bytes())))
	old, err := Decode(v1.Bytes())
	if err != nil {
		t.Fatalf("version 1 file refused: %v", err)
	}
	require.Nil(t, old.wn, "a version 1 file holds no word-class table")
	require.Nil(t, old.freq, "a version 1 file holds no general-English table")
	old.wnText, old.freqText = m.wnText, m.freqText // Save writes the tables' text, nothing derived from them
	var a, b bytes.Buffer
	require.NoError(t, m.Save(&a))
	require.NoError(t, old.Save(&b))
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Fatal("the version 1 file decodes to a different model")
	}
}
