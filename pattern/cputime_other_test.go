//go:build !unix

package pattern

func cpuSeconds() float64 { return 0 }
