//go:build race

package pipeline_test

// raceDetector is set when the tests run under the race detector, which
// makes them several times slower: they then compare fewer worker counts.
const raceDetector = true
