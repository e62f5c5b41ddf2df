//go:build !unix

package pipeline_test

import "time"

// cpuTime is unknown here; rates per CPU second are left out.
func cpuTime() time.Duration { return 0 }
