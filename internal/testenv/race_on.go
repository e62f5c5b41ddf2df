//go:build race

package testenv

// Race reports whether the race detector is on: it slows tests about
// tenfold, so long single-threaded checks may skip under it.
const Race = true
