// Package prefetch asks the processor to start loading memory that code
// will read soon, so that several cache misses overlap instead of each
// stopping the code in turn. A plain load used as a "touch" does not do
// this: a load that misses holds up the instructions behind it, and
// touching data that was in cache anyway only added work (measured in
// the tagger's decoder). A prefetch is a hint: it never faults, so an
// address past an object's end is harmless, and on architectures without
// the kernel it does nothing.
package prefetch

import "unsafe"

// Max is the number of addresses a List holds.
const Max = 32

// List gathers the addresses of cache lines to prefetch. Addresses are
// uintptrs so that the garbage collector never sees them: an address past
// an object's end is fine for a prefetch, not for a pointer. The objects
// must be kept alive by their owners until they are read.
type List struct {
	at [Max]uintptr
	n  int
}

// Add appends the address of the cache line at p, if there is room.
func (l *List) Add(p unsafe.Pointer) {
	if l.n < Max {
		l.at[l.n] = uintptr(p)
		l.n++
	}
}

// AddBytes appends the addresses of the cache lines that hold size bytes
// from p on, as many as there is room for. An object need not start on
// a line: the first address is p's line.
func (l *List) AddBytes(p unsafe.Pointer, size int) {
	for a, end := uintptr(p)&^(lineSize-1), uintptr(p)+uintptr(size); a < end && l.n < Max; a += lineSize {
		l.at[l.n] = a
		l.n++
	}
}

// Len reports the number of addresses gathered.
func (l *List) Len() int { return l.n }

// Start asks for every line gathered and empties the list.
func (l *List) Start() {
	lines(&l.at, l.n)
	l.n = 0
}

// lineSize is the cache line size of the processors glossmith runs on
// (x86-64 and most arm64); a smaller real line only means fewer lines
// fetched ahead.
const lineSize = 64
