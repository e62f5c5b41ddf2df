package main

import (
	"glossmith/extract/review"
	"glossmith/extract/review/web"
	"glossmith/extract/terms"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/hmm"
)

// runExtraction runs the pipeline with the terms matcher and the stock
// pair rules and builds the dataset; nil when nothing was read.
func runExtraction(in *inputFlags, args []string, model *hmm.Model, tm *pattern.Matcher, opt terms.Options,
	ref terms.Reference, contexts int, rank terms.RankOptions) (*review.Dataset, error) {
	pairRules, err := grammar.LoadStock("pairs")
	if err != nil {
		return nil, err
	}
	pm, err := pattern.Compile(pairRules)
	if err != nil {
		return nil, err
	}
	x := review.NewExtraction(tm, pm, opt, contexts)
	x.Corpus.SetBudget(in.tableBudget())
	in.reuseTokens = true // the extraction keeps strings, not tokens
	_, runErr := runDocs(in, args, model, x.Map, x.Reduce)
	if p := x.Corpus.Pruned(); p.Candidates > 0 {
		in.warnPruned("candidates", p.Candidates, int64(p.MaxFreq))
	}
	if x.Corpus.Documents() == 0 {
		return nil, runErr
	}
	ds, err := x.Dataset(ref, rank)
	if err != nil {
		return nil, err
	}
	return ds, runErr
}

// writeHTMLReport is `terms --to html`: the candidates as terms ranks
// them, with what the review page's detail view shows, as one static page.
func writeHTMLReport(in *inputFlags, args []string, model *hmm.Model, tm *pattern.Matcher, opt terms.Options,
	ref terms.Reference, rank terms.RankOptions, outPath string) error {
	ds, runErr := runExtraction(in, args, model, tm, opt, ref, web.ReportContexts, rank)
	if ds == nil {
		return runErr
	}
	out, err := openOutput(outPath)
	if err != nil {
		return err
	}
	if err := out.commit(web.WriteReport(out, ds)); err != nil {
		return err
	}
	return runErr
}
