package check

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"iter"
	"maps"
	"net/url"
	"slices"
	"strings"
)

// Baseline holds the findings of an earlier run, so that a team can adopt
// the check gradually: only findings beyond them are new. A finding is
// matched by its file, kind, text (in any case) and entry, not by its
// position, which moves as the documents are edited; each earlier finding
// covers one later one.
type Baseline struct {
	counts map[string]int
	// Findings is the number of findings read.
	Findings int
}

func baselineKey(file, kind, text, entry string) string {
	return file + "\x00" + kind + "\x00" + strings.ToLower(text) + "\x00" + entry
}

// ReadBaseline reads a result the check wrote before, as JSON Lines or
// SARIF (told apart by the content). name is for errors, which give the
// line of JSON Lines that could not be read.
func ReadBaseline(r io.Reader, name string) (*Baseline, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	b := &Baseline{counts: map[string]int{}}
	trimmed := bytes.TrimSpace(data)
	if len(trimmed) == 0 {
		return b, nil
	}
	var log sarifLog
	if err := json.Unmarshal(trimmed, &log); err == nil && log.Version != "" {
		if log.Version != "2.1.0" {
			return nil, fmt.Errorf("%s: SARIF version %q, want 2.1.0", name, log.Version)
		}
		for _, run := range log.Runs {
			for _, res := range run.Results {
				if len(res.Locations) == 0 {
					continue
				}
				p := res.Locations[0].PhysicalLocation
				file := p.ArtifactLocation.URI
				if u, err := url.Parse(file); err == nil {
					file = u.Path
				}
				text := res.Properties.Text
				if text == "" {
					text = p.Region.Snippet.Text
				}
				b.add(baselineKey(file, res.RuleID, text, res.Properties.Entry))
			}
		}
		return b, nil
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 64<<10), 16<<20)
	for n := 1; sc.Scan(); n++ {
		line := bytes.TrimSpace(sc.Bytes())
		if len(line) == 0 {
			continue
		}
		var rec record
		if err := json.Unmarshal(line, &rec); err != nil || rec.File == "" || rec.Kind == "" {
			return nil, fmt.Errorf("%s:%d: not a finding of glossmith check (JSON Lines with file, kind, text, entry, or SARIF 2.1.0)", name, n)
		}
		b.add(baselineKey(rec.File, rec.Kind, rec.Text, rec.Entry))
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return b, nil
}

func (b *Baseline) add(key string) {
	b.counts[key]++
	b.Findings++
}

// New returns the findings the baseline does not cover, in their order, and
// how many it did cover.
func (b *Baseline) New(fs []Finding) (fresh []Finding, known int) {
	fresh = slices.Collect(b.Filter(slices.Values(fs), &known))
	return fresh, known
}

// Filter yields the findings of fs the baseline does not cover, in their
// order, and counts in *known those it does.
func (b *Baseline) Filter(fs iter.Seq[Finding], known *int) iter.Seq[Finding] {
	return func(yield func(Finding) bool) {
		left := maps.Clone(b.counts)
		for f := range fs {
			k := baselineKey(f.File, f.Kind.String(), f.Text, f.Entry)
			if left[k] > 0 {
				left[k]--
				*known++
				continue
			}
			if !yield(f) {
				return
			}
		}
	}
}
