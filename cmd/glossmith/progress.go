package main

import (
	"fmt"
	"os"
	"strings"
	"time"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"

	"glossmith/tagger/pipeline"
)

// progress shows one status line on standard error while documents are
// processed — only when standard error is a terminal and --quiet is off,
// so pipes, logs and CI output stay clean:
//
//	37% |██████      | 1203/3167 docs, 38.9/104.9 MiB, 1.2M tokens/s, 2m10s left
//
// The bar and the time left follow the bytes of the inputs, not their
// number: one large manual among short notes would otherwise stall both.
type progress struct {
	bar   *progressbar.ProgressBar
	start time.Time
	last  time.Time
	max   int64
	width int // terminal columns
}

func stderrIsTerminal() bool { return isTerminal(os.Stderr) }

func newProgress(quiet bool) *progress {
	p := &progress{start: time.Now()}
	if quiet || !stderrIsTerminal() {
		return p
	}
	p.width = 80
	if w, _, err := term.GetSize(int(os.Stderr.Fd())); err == nil && w > 0 {
		p.width = w
	}
	p.bar = progressbar.NewOptions64(-1,
		progressbar.OptionSetWriter(os.Stderr),
		progressbar.OptionSetWidth(12),
		progressbar.OptionSetPredictTime(false),
		progressbar.OptionSetElapsedTime(false),
		progressbar.OptionShowDescriptionAtLineEnd(),
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
	done := st.Done >= st.Inputs
	if now.Sub(p.last) < 100*time.Millisecond && !done {
		return
	}
	p.last = now
	// The bar runs over input bytes when their sizes are known, else over
	// documents (standard input).
	total, cur := int64(st.Inputs), int64(st.Done)
	if st.InputBytes > 0 {
		total, cur = st.InputBytes, st.DoneBytes
	}
	if total > 0 && p.max != total {
		p.bar.ChangeMax64(total)
		p.max = total
	}
	p.bar.Describe(p.status(st, now.Sub(p.start)))
	_ = p.bar.Set64(cur)
}

// status is the text after the bar, cut to fit the terminal.
func (p *progress) status(st pipeline.Stats, elapsed time.Duration) string {
	parts := []string{fmt.Sprintf("%d/%d docs", st.Done, st.Inputs)}
	if st.InputBytes > 0 {
		parts = append(parts, byteRatio(st.DoneBytes, st.InputBytes))
	}
	secs := elapsed.Seconds()
	if secs >= 1 {
		parts = append(parts, shortCount(float64(st.Tokens)/secs)+" tokens/s")
	}
	if left, ok := timeLeft(st, elapsed); ok {
		parts = append(parts, left+" left")
	}
	s := strings.Join(parts, ", ")
	// percentage, bar and separators take about 24 columns
	if room := p.width - 24; room > 10 && len(s) > room {
		s = s[:room]
	}
	return s
}

// timeLeft extrapolates the rate so far over what remains, by bytes when
// they are known; it waits for two seconds of data before guessing.
func timeLeft(st pipeline.Stats, elapsed time.Duration) (string, bool) {
	if elapsed < 2*time.Second {
		return "", false
	}
	var frac float64
	switch {
	case st.InputBytes > 0 && st.DoneBytes > 0:
		frac = float64(st.DoneBytes) / float64(st.InputBytes)
	case st.Inputs > 0 && st.Done > 0:
		frac = float64(st.Done) / float64(st.Inputs)
	default:
		return "", false
	}
	if frac >= 1 {
		return "", false
	}
	left := time.Duration(elapsed.Seconds() * (1 - frac) / frac * float64(time.Second))
	return left.Round(time.Second).String(), true
}

func (p *progress) finish() {
	if p.bar != nil {
		_ = p.bar.Finish()
		_ = p.bar.Clear()
	}
}

// byteRatio writes done/total in the unit of total: "38.9/104.9 MiB".
func byteRatio(done, total int64) string {
	unit, div := "B", 1.0
	switch {
	case total >= 1<<30:
		unit, div = "GiB", 1<<30
	case total >= 1<<20:
		unit, div = "MiB", 1<<20
	case total >= 1<<10:
		unit, div = "KiB", 1<<10
	}
	if unit == "B" {
		return fmt.Sprintf("%d/%d B", done, total)
	}
	return fmt.Sprintf("%.1f/%.1f %s", float64(done)/div, float64(total)/div, unit)
}

// shortCount writes a rate with a k or M suffix: 812k, 1.2M.
func shortCount(x float64) string {
	switch {
	case x >= 1e6:
		return fmt.Sprintf("%.1fM", x/1e6)
	case x >= 1e3:
		return fmt.Sprintf("%.0fk", x/1e3)
	}
	return fmt.Sprintf("%.0f", x)
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
