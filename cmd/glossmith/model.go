package main

import (
	"fmt"
	"os"

	"glossmith/grammar"
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

// checkTags checks the fine-tag tests of rs against the tags the model
// assigns, before any input is read: a tag the model never assigns
// (xpos:NNQ) stops the command with exit 2, a regexp over tags that can
// match none of them is a warning.
func checkTags(rs *grammar.RuleSet, model *hmm.Model) error {
	errs, warnings := rs.CheckTags(model.XPOSTags())
	printTagWarnings(warnings)
	if len(errs) == 0 {
		return nil
	}
	for _, e := range errs {
		printGrammarError(os.Stderr, e)
	}
	return exitError{2, "the rules name fine tags the model does not assign"}
}

// printTagWarnings prints CheckTags' warnings on standard error.
func printTagWarnings(warnings grammar.ErrorList) {
	for _, e := range warnings {
		printGrammarError(os.Stderr, &grammar.Error{Pos: e.Pos, Msg: "warning: " + e.Msg, Source: e.Source})
	}
}
