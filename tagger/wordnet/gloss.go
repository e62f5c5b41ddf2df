package wordnet

import (
	"bufio"
	"fmt"
	"os"
	"strings"
)

// DataFiles are WordNet's data files, whose synset lines carry the
// glosses, in the order readers take them.
var DataFiles = []string{"data.noun", "data.verb", "data.adj", "data.adv"}

// EachGloss calls fn with the gloss of every synset line of a WordNet data
// file (wndb(5WN): the text after " | ", a definition often followed by
// quoted examples), trimmed. Lines that start with a space are the file's
// license header. An error names the file and line.
func EachGloss(path string, fn func(gloss string)) error {
	f, err := os.Open(path)
	if err != nil {
		return err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(nil, 1<<20)
	line := 0
	for sc.Scan() {
		line++
		text := sc.Text()
		if strings.HasPrefix(text, " ") {
			continue
		}
		_, gloss, ok := strings.Cut(text, " | ")
		if !ok {
			return fmt.Errorf("%s:%d: no gloss (\" | \") on a synset line", path, line)
		}
		fn(strings.TrimSpace(gloss))
	}
	if err := sc.Err(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	return nil
}
