package main

import (
	"glossmith/extract/review"
	"glossmith/extract/review/web"
	"glossmith/extract/terms"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/hmm"
)

// prepareFunc labels or filters the candidates of a corpus before they
// are ranked (terms --termbase); nil leaves them as they are.
type prepareFunc func(corpus *terms.Corpus, cands []*terms.Term) ([]*terms.Term, error)

// runExtraction runs the pipeline with the terms matcher and the stock
// pair rules and builds the dataset; nil when nothing was read.
func runExtraction(in *inputFlags, args []string, model *hmm.Model, tm *pattern.Matcher, opt terms.Options,
	ref terms.Reference, contexts int, rank terms.RankOptions, prepare prepareFunc) (*review.Dataset, error) {
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
	cands := x.Corpus.Terms(ref)
	if prepare != nil {
		if cands, err = prepare(x.Corpus, cands); err != nil {
			return nil, err
		}
	}
	ds, err := x.DatasetOf(cands, rank)
	if err != nil {
		return nil, err
	}
	return ds, runErr
}

// writeHTMLReport is `terms --to html`: the candidates as terms ranks
// them (prepare: as its termbase flags label and keep them), with what the
// review page's detail view shows, as one static page.
func writeHTMLReport(in *inputFlags, args []string, model *hmm.Model, tm *pattern.Matcher, opt terms.Options,
	ref terms.Reference, rank terms.RankOptions, prepare prepareFunc, outPath string) error {
	ds, runErr := runExtraction(in, args, model, tm, opt, ref, web.ReportContexts, rank, prepare)
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
