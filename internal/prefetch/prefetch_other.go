//go:build !amd64

package prefetch

func lines(at *[Max]uintptr, n int) {}
