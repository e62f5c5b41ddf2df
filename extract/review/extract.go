package review

import (
	"fmt"

	"glossmith/extract/colloc"
	"glossmith/extract/terms"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// Extraction gathers a review dataset while the pipeline runs: per
// document (Map, on a worker) the term candidates and the pairs of the
// pair rules; in input order (Reduce) their merge. It keeps no token of a
// document, so the pipeline may reuse them.
type Extraction struct {
	col      *terms.Collector
	pairs    *pattern.Matcher
	Corpus   *terms.Corpus
	Pairs    *colloc.Counter
	contexts int
}

// DocPart is what one document contributes.
type DocPart struct {
	counts *terms.DocCounts
	pairs  *colloc.Counter
}

// NewExtraction collects candidates with the terms matcher and options,
// keeping contexts example sentences each, and counts the pairs that the
// pairs matcher (the stock pair rules; nil for none) finds.
func NewExtraction(termRules, pairRules *pattern.Matcher, opt terms.Options, contexts int) *Extraction {
	opt.Contexts = max(opt.Contexts, contexts)
	return &Extraction{col: terms.NewCollector(termRules, opt), pairs: pairRules,
		Corpus: terms.NewCorpus(contexts), Pairs: colloc.NewCounter(), contexts: contexts}
}

// Map collects one document.
func (x *Extraction) Map(d *doc.Document) DocPart {
	p := DocPart{counts: x.col.Collect(d)}
	if x.pairs != nil {
		p.pairs = colloc.NewCounter()
		for i := range d.Sentences {
			toks := d.Sentences[i].Tokens
			for _, m := range x.pairs.FindAll(toks) {
				if pr, ok := colloc.SlotPair(m.Rule, toks, m.Slots, colloc.ByLemma); ok {
					p.pairs.Add(pr)
				}
			}
		}
	}
	return p
}

// Reduce merges one document's part; call it in input order.
func (x *Extraction) Reduce(_ *doc.Document, p DocPart) {
	x.Corpus.Add(p.counts)
	p.counts.Release()
	if p.pairs != nil {
		x.Pairs.Merge(p.pairs)
	}
}

// Dataset ranks the candidates against the reference and builds the
// dataset.
func (x *Extraction) Dataset(ref terms.Reference, opt terms.RankOptions) (*Dataset, error) {
	return x.DatasetOf(x.Corpus.Terms(ref), opt)
}

// DatasetOf ranks candidates of the corpus (Corpus.Terms, labelled or
// filtered by the caller: a termbase's labels, only the new ones) and
// builds the dataset.
func (x *Extraction) DatasetOf(cands []*terms.Term, opt terms.RankOptions) (*Dataset, error) {
	ranked, err := terms.Rank(cands, opt)
	if err != nil {
		return nil, err
	}
	src := fmt.Sprintf("%d candidates from %d document(s), %d words", len(ranked), x.Corpus.Documents(), x.Corpus.Tokens())
	var pairs *colloc.Counter
	if x.pairs != nil {
		pairs = x.Pairs
	}
	return Build(x.Corpus, ranked, pairs, x.contexts, src), nil
}
