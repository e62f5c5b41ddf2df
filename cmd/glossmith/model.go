package main

import (
	"fmt"

	"glossmith/tagger/hmm"
)

// loadModel returns the tagging model: the embedded English model, or the
// file given with --model.
func loadModel(path string) (*hmm.Model, error) {
	if path == "" {
		m, err := hmm.Default()
		if err != nil {
			return nil, fmt.Errorf("embedded model: %w", err)
		}
		return m, nil
	}
	return hmm.Load(path)
}

// loadTagger is loadModel for commands that only tag.
func loadTagger(path string) (*hmm.Model, error) { return loadModel(path) }
