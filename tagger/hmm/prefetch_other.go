//go:build !amd64

package hmm

func prefetch(at *[maxPrefetch]uintptr, n int) {}
