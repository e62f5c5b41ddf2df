package hmm

// prefetch asks the processor to start loading the cache lines at
// at[0:n]. A prefetch never faults, so an address past an object's end
// is harmless; the addresses are uintptrs so that the garbage collector
// never sees them (the objects are kept alive by their owners).
//
//go:noescape
func prefetch(at *[maxPrefetch]uintptr, n int)
