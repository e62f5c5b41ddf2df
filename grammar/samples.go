package grammar

import "strings"

// SampleFence is the info string that marks a fenced code block of a
// Markdown document as a whole rule file (```gsr). Documents mark every
// rule sample so, and other blocks (commands, output, error reports) with
// another info string, so that a test can check each sample as
// `glossmith rules check` would.
const SampleFence = "gsr"

// Sample is a rule file quoted in a Markdown document.
type Sample struct {
	Line int    // 1-based line of the document where the sample's text starts
	Text string // the block's text, each line ending in "\n"
}

// RuleSamples returns the fenced blocks of markdown whose info string is
// SampleFence, in order. Fences are lines of three or more backticks,
// indented by at most three spaces (CommonMark 0.31, section 4.5); a block
// ends at a fence of at least as many backticks.
func RuleSamples(markdown string) []Sample {
	var out []Sample
	lines := strings.SplitAfter(markdown, "\n")
	for i := 0; i < len(lines); i++ {
		n, info, ok := fence(lines[i])
		if !ok {
			continue
		}
		var b strings.Builder
		j := i + 1
		for ; j < len(lines); j++ {
			if m, rest, ok := fence(lines[j]); ok && m >= n && rest == "" {
				break
			}
			b.WriteString(strings.TrimSuffix(strings.TrimSuffix(lines[j], "\n"), "\r") + "\n")
		}
		if info == SampleFence {
			out = append(out, Sample{Line: i + 2, Text: b.String()})
		}
		i = j
	}
	return out
}

// fence reports whether line opens or closes a backtick fence, with the
// number of backticks and the first word of the info string.
func fence(line string) (int, string, bool) {
	line = strings.TrimRight(line, "\r\n")
	trimmed := strings.TrimLeft(line, " ")
	if len(line)-len(trimmed) > 3 {
		return 0, "", false
	}
	n := len(trimmed) - len(strings.TrimLeft(trimmed, "`"))
	if n < 3 {
		return 0, "", false
	}
	info := strings.Fields(trimmed[n:])
	if len(info) == 0 {
		return n, "", true
	}
	return n, info[0], true
}
