//go:build !unix

package benchcorpus

import "time"

// CPUTime is unknown here; rates per CPU second are left out.
func CPUTime() time.Duration { return 0 }
