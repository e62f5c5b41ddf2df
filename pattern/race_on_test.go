//go:build race

package pattern

// raceEnabled shrinks the randomized tests under the race detector, which
// slows them tenfold; the full runs happen without it.
const raceEnabled = true
