package main

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/pipeline"
)

func TestProgressStatus(t *testing.T) {
	p := &progress{width: 120}
	st := pipeline.Stats{Inputs: 3167, Done: 922, Tokens: 5_800_000, InputBytes: 100 << 20, DoneBytes: 29 << 20}
	got := p.status(st, 25*time.Second)
	// 29 of 100 MiB in 25 s leaves 71 MiB: 25 s · 71/29 ≈ 61 s.
	want := "922/3167 docs, 29.0/100.0 MiB, 232k tokens/s, 1m1s left"
	assert.Equal(t, want, got)
	early := p.status(st, time.Second/2)
	assert.NotContains(t, early, "left", "guesses the time left after half a second")
	assert.NotContains(t, early, "tokens/s", "guesses the rate after half a second")
	narrow := &progress{width: 40}
	assert.LessOrEqual(t, len(narrow.status(st, 25*time.Second)), 40-24, "status for a 40-column terminal")
}

func TestTimeLeftWithoutSizes(t *testing.T) {
	// standard input: no sizes, so documents are the measure
	st := pipeline.Stats{Inputs: 10, Done: 4, Documents: 4}
	left, ok := timeLeft(st, 8*time.Second)
	assert.True(t, ok)
	assert.Equal(t, "12s", left)
	st.Done = 10
	_, ok = timeLeft(st, 8*time.Second)
	assert.False(t, ok, "time left when everything is done")
}

func TestShortCount(t *testing.T) {
	for x, want := range map[float64]string{950: "950", 231_999: "232k", 1_250_000: "1.2M"} {
		assert.Equal(t, want, shortCount(x), "shortCount(%v)", x)
	}
}
