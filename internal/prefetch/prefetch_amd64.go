package prefetch

// lines issues PREFETCHT0 for at[0:n].
//
//go:noescape
func lines(at *[Max]uintptr, n int)
