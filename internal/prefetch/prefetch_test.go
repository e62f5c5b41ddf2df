package prefetch

import (
	"testing"
	"unsafe"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestNeverFaults hands the kernel what callers may: addresses past the
// end of a small object and nil. A prefetch never faults on amd64 (and
// does nothing elsewhere); this crashes if the kernel loads instead.
func TestNeverFaults(t *testing.T) {
	small := make([]int16, 3)
	var l List
	l.AddBytes(unsafe.Pointer(&small[0]), 64*Max*2)
	require.Equal(t, Max, l.Len(), "AddBytes stops at Max lines")
	require.Equal(t, uintptr(lineSize), l.at[1]-l.at[0], "lines one line size apart")
	l.Start()
	require.Zero(t, l.Len(), "Start empties the list")
	l.Add(nil)
	l.Add(unsafe.Pointer(&small[2]))
	l.Start()
}

// TestAddStopsWhenFull checks the list's bound.
func TestAddStopsWhenFull(t *testing.T) {
	var l List
	x := 0
	for range Max + 5 {
		l.Add(unsafe.Pointer(&x))
	}
	assert.Equal(t, Max, l.Len())
}

// TestAddBytesCoversEveryLine checks that an object straddling lines gets
// all of them: 100 bytes from 40 bytes into a line span three lines.
func TestAddBytesCoversEveryLine(t *testing.T) {
	buf := make([]byte, 4*lineSize)
	base := (uintptr(unsafe.Pointer(&buf[0])) + lineSize - 1) &^ (lineSize - 1)
	off := int(base - uintptr(unsafe.Pointer(&buf[0])))
	var l List
	l.AddBytes(unsafe.Pointer(&buf[off+40]), 100)
	require.Equal(t, 3, l.Len())
	assert.Equal(t, base, l.at[0], "first line")
	assert.Equal(t, base+2*lineSize, l.at[2], "third line")
}
