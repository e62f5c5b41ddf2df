//go:build unix

package pattern

import "syscall"

// cpuSeconds returns the CPU time the process has used (user + system).
// Benchmarks report throughput per CPU-second next to the wall-clock
// figure, because on a shared machine wall-clock time also counts the time
// other processes held the cores.
func cpuSeconds() float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return float64(ru.Utime.Sec+ru.Stime.Sec) + float64(ru.Utime.Usec+ru.Stime.Usec)/1e6
}
