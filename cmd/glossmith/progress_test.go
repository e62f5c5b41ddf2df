package main

import (
	"strings"
	"testing"
	"time"

	"glossmith/tagger/pipeline"
)

func TestProgressStatus(t *testing.T) {
	p := &progress{width: 120}
	st := pipeline.Stats{Inputs: 3167, Done: 922, Tokens: 5_800_000, InputBytes: 100 << 20, DoneBytes: 29 << 20}
	got := p.status(st, 25*time.Second)
	// 29 of 100 MiB in 25 s leaves 71 MiB: 25 s · 71/29 ≈ 61 s.
	want := "922/3167 docs, 29.0/100.0 MiB, 232k tokens/s, 1m1s left"
	if got != want {
		t.Errorf("status = %q, want %q", got, want)
	}
	if got := p.status(st, time.Second/2); strings.Contains(got, "left") || strings.Contains(got, "tokens/s") {
		t.Errorf("guesses rate and time left after half a second: %q", got)
	}
	narrow := &progress{width: 40}
	if got := narrow.status(st, 25*time.Second); len(got) > 40-24 {
		t.Errorf("status of %d bytes for a 40-column terminal: %q", len(got), got)
	}
}

func TestTimeLeftWithoutSizes(t *testing.T) {
	// standard input: no sizes, so documents are the measure
	st := pipeline.Stats{Inputs: 10, Done: 4, Documents: 4}
	if left, ok := timeLeft(st, 8*time.Second); !ok || left != "12s" {
		t.Errorf("timeLeft = %q, %v; want 12s", left, ok)
	}
	st.Done = 10
	if _, ok := timeLeft(st, 8*time.Second); ok {
		t.Error("time left when everything is done")
	}
}

func TestShortCount(t *testing.T) {
	for x, want := range map[float64]string{950: "950", 231_999: "232k", 1_250_000: "1.2M"} {
		if got := shortCount(x); got != want {
			t.Errorf("shortCount(%v) = %q, want %q", x, got, want)
		}
	}
}
