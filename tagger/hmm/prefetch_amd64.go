package hmm

import "unsafe"

// prefetch3 asks the processor to start loading lines cache lines from
// each of a, b and c; it never faults (a prefetch of a bad address is
// dropped), so pointers past an object's end are harmless.
//
//go:noescape
func prefetch3(a, b, c unsafe.Pointer, lines int)
