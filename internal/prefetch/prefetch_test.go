package prefetch

import (
	"testing"
	"unsafe"
)

// TestNeverFaults hands the kernel what callers may: addresses past the
// end of a small object and nil. A prefetch never faults on amd64 (and
// does nothing elsewhere); this crashes if the kernel loads instead.
func TestNeverFaults(t *testing.T) {
	small := make([]int16, 3)
	var l List
	l.AddBytes(unsafe.Pointer(&small[0]), 64*Max*2)
	if l.Len() != Max || l.at[1]-l.at[0] != lineSize {
		t.Fatalf("AddBytes gave %d lines, %d bytes apart", l.Len(), l.at[1]-l.at[0])
	}
	l.Start()
	if l.Len() != 0 {
		t.Fatalf("Start left %d lines", l.Len())
	}
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
	if l.Len() != Max {
		t.Fatalf("%d addresses, want %d", l.Len(), Max)
	}
}

// TestAddBytesCoversEveryLine checks that an object straddling lines gets
// all of them: 100 bytes from 40 bytes into a line span three lines.
func TestAddBytesCoversEveryLine(t *testing.T) {
	buf := make([]byte, 4*lineSize)
	base := (uintptr(unsafe.Pointer(&buf[0])) + lineSize - 1) &^ (lineSize - 1)
	off := int(base - uintptr(unsafe.Pointer(&buf[0])))
	var l List
	l.AddBytes(unsafe.Pointer(&buf[off+40]), 100)
	if l.Len() != 3 || l.at[0] != base || l.at[2] != base+2*lineSize {
		t.Fatalf("got %d lines from %#x, want 3 from %#x", l.Len(), l.at[0], base)
	}
}
