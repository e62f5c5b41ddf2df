package main

import (
	"fmt"
	"os"
	"time"

	"github.com/mattn/go-isatty"
	"github.com/schollz/progressbar/v3"

	"glossmith/tagger/pipeline"
)

// progress shows a bar on standard error while documents are processed —
// only when standard error is a terminal and --quiet is off, so pipes, logs
// and CI output stay clean.
type progress struct {
	bar   *progressbar.ProgressBar
	start time.Time
	last  time.Time
}

func stderrIsTerminal() bool {
	fd := os.Stderr.Fd()
	return isatty.IsTerminal(fd) || isatty.IsCygwinTerminal(fd)
}

func newProgress(quiet bool) *progress {
	p := &progress{start: time.Now()}
	if quiet || !stderrIsTerminal() {
		return p
	}
	p.bar = progressbar.NewOptions(-1,
		progressbar.OptionSetWriter(os.Stderr),
		progressbar.OptionSetDescription("reading"),
		progressbar.OptionShowCount(),
		progressbar.OptionSpinnerType(14),
		progressbar.OptionThrottle(100*time.Millisecond),
		progressbar.OptionClearOnFinish(),
	)
	return p
}

func (p *progress) update(st pipeline.Stats) {
	if p.bar == nil {
		return
	}
	now := time.Now()
	if now.Sub(p.last) < 100*time.Millisecond && st.Documents < st.Inputs {
		return
	}
	p.last = now
	if st.Inputs > 0 && p.bar.GetMax() != st.Inputs {
		p.bar.ChangeMax(st.Inputs)
	}
	secs := now.Sub(p.start).Seconds()
	rate := 0.0
	if secs > 0 {
		rate = float64(st.Tokens) / secs
	}
	left := ""
	if st.Documents > 0 && st.Inputs > st.Documents {
		eta := time.Duration(secs / float64(st.Documents) * float64(st.Inputs-st.Documents) * float64(time.Second))
		left = ", " + eta.Round(time.Second).String() + " left"
	}
	p.bar.Describe(fmt.Sprintf("%s, %d tokens, %.0f tokens/s%s", byteSize(st.Bytes), st.Tokens, rate, left))
	_ = p.bar.Set(st.Documents)
}

func (p *progress) finish() {
	if p.bar != nil {
		_ = p.bar.Finish()
		_ = p.bar.Clear()
	}
}

func byteSize(n int64) string {
	switch {
	case n >= 1<<30:
		return fmt.Sprintf("%.1f GiB", float64(n)/(1<<30))
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	case n >= 1<<10:
		return fmt.Sprintf("%.1f KiB", float64(n)/(1<<10))
	}
	return fmt.Sprintf("%d B", n)
}
