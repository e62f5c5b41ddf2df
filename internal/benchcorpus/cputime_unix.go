//go:build unix

package benchcorpus

import (
	"syscall"
	"time"
)

// CPUTime returns the CPU time (user + system) the process has used, so
// that benchmarks can report rates per CPU second, which hold up on a
// machine shared with other work where wall-clock rates do not.
func CPUTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
