// Package review gathers what a reviewer of term candidates looks at — the
// ranked candidates with their measures, and for each its variants, its
// spread over the documents, its contexts, its collocates and the
// candidates nested in it — and the decisions taken on them, kept in a
// termbase behind the Store interface. The web page and the static report
// (package review/web) show a Dataset; they compute nothing of their own.
package review

import (
	"math"
	"strings"

	"glossmith/extract/colloc"
	"glossmith/extract/measure"
	"glossmith/extract/terms"
)

// Dataset is one run's candidates and what the detail view shows of each.
// Its JSON form is what the page's script reads.
type Dataset struct {
	Source     string      `json:"source"` // what the run read, for the page's heading
	Docs       []string    `json:"docs"`
	DocSizes   []int       `json:"docSizes"` // word tokens per document
	Candidates []Candidate `json:"cands"`
	Details    []Detail    `json:"-"` // by candidate id; served one at a time or inlined in the report
}

// Candidate is one row of the table. Field names are short: a report of
// thousands of rows carries them once per row.
type Candidate struct {
	ID        int     `json:"id"` // index in Dataset.Candidates
	Rank      int     `json:"rank"`
	Term      string  `json:"term"`
	POS       string  `json:"pos"`
	Words     int     `json:"words"`
	Freq      int     `json:"freq"`
	Docs      int     `json:"docs"`
	Score     float64 `json:"score"`
	Keyness   float64 `json:"key"`
	Weirdness float64 `json:"weird"`
	CValue    float64 `json:"cval"`
	DP        float64 `json:"dp"`
	// Acronym, FullForm and Within are those of terms.Term: the acronym
	// the documents define for it, the full form it stands for, the
	// longer candidate it mostly occurs in.
	Acronym  string `json:"acr,omitempty"`
	FullForm string `json:"full,omitempty"`
	Within   string `json:"in,omitempty"`
	// Status and Entry are the termbase's label of the candidate when the
	// dataset was built from labelled candidates (terms.Term.Status; the
	// report of terms --termbase), and the preferred term of the entry it
	// belongs to when another. The live page reads decisions from its
	// Store instead.
	Status string `json:"status,omitempty"`
	Entry  string `json:"entry,omitempty"`
}

// Detail is what the detail pane shows of one candidate.
type Detail struct {
	Variants    []terms.Variant `json:"variants"`
	PerDoc      [][2]int        `json:"perDoc"`      // (document index, count) pairs in document order
	Contexts    []Context       `json:"contexts"`    // example sentences, one per document first
	Collocates  []Collocate     `json:"collocates"`  // pairs of the stock pair rules around the head word
	Contains    []int           `json:"contains"`    // ids of candidates nested in this one
	ContainedIn []int           `json:"containedIn"` // ids of candidates this one is nested in
}

// Context is an example sentence; the page marks the candidate's forms in it.
type Context struct {
	Doc  int    `json:"doc"` // index in Dataset.Docs
	Line int    `json:"line"`
	Text string `json:"text"`
}

// Collocate is a word that forms a pair of a relation with the candidate's
// head word, with the pair's frequency and logDice (Rychlý 2008).
type Collocate struct {
	Relation string  `json:"rel"`
	Word     string  `json:"word"`
	Head     string  `json:"head"` // the candidate's word the pair was counted on
	Freq     int64   `json:"freq"`
	LogDice  float64 `json:"logDice"`
}

// MaxCollocates and MaxNested bound the lists of a detail view: the strongest
// collocates and the first nested candidates in rank order are what a
// reviewer reads; the rest would only weigh on a report.
const (
	MaxCollocates = 8
	MaxNested     = 12
)

// Build makes the dataset of ranked candidates of a corpus. pairs holds the
// counts of the stock pair rules over the same documents (nil: no
// collocates); contexts caps the example sentences kept per candidate.
func Build(corpus *terms.Corpus, ranked []*terms.Term, pairs *colloc.Counter, contexts int, source string) *Dataset {
	ds := &Dataset{Source: source, Docs: corpus.DocNames(), DocSizes: corpus.DocSizes()}
	ds.Candidates = make([]Candidate, len(ranked))
	ds.Details = make([]Detail, len(ranked))
	docIndex := make(map[string]int, len(ds.Docs))
	for i, d := range ds.Docs {
		if _, dup := docIndex[d]; !dup {
			docIndex[d] = i
		}
	}
	for i, t := range ranked {
		ds.Candidates[i] = Candidate{ID: i, Rank: t.Rank, Term: t.Term, POS: t.POS, Words: t.Words, Freq: t.Freq,
			Docs: t.Docs, Score: finite(t.Score), Keyness: finite(t.Keyness), Weirdness: finite(t.Weirdness),
			CValue: finite(t.CValue), DP: finite(t.DP), Acronym: t.Acronym, FullForm: t.FullForm, Within: t.Within, Status: t.Status}
		if terms.Key(t.Entry) != terms.Key(t.Term) {
			ds.Candidates[i].Entry = t.Entry
		}
		d := &ds.Details[i]
		d.Variants = t.Variants
		for _, dc := range corpus.PerDoc(t) {
			d.PerDoc = append(d.PerDoc, [2]int{dc.Doc, dc.Count})
		}
		for k, cx := range t.Contexts {
			if contexts > 0 && k >= contexts {
				break
			}
			di, ok := docIndex[cx.Doc]
			if !ok {
				di = -1
			}
			d.Contexts = append(d.Contexts, Context{Doc: di, Line: cx.Line, Text: cx.Text})
		}
	}
	nest(ranked, ds.Details)
	if pairs != nil {
		addCollocates(ranked, ds.Details, pairs)
	}
	return ds
}

// finite keeps JSON encodable numbers (the measures are finite by
// construction; this is the last guard).
func finite(x float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	return x
}

// lowerWords returns a candidate's words lower-cased.
func lowerWords(t *terms.Term) []string {
	ws := t.WordList()
	if len(ws) == 0 {
		ws = strings.Fields(t.Term)
	}
	out := make([]string, len(ws))
	for i, w := range ws {
		out[i] = strings.ToLower(w)
	}
	return out
}

// nest fills Contains and ContainedIn: candidate A contains B when B's
// words, lower-cased, are a contiguous run of A's. Candidates are a few
// words long, so every run of every candidate is looked up in a map.
func nest(ranked []*terms.Term, details []Detail) {
	words := make([][]string, len(ranked))
	for i, t := range ranked {
		words[i] = lowerWords(t)
	}
	nestWords(words, details)
}

// nestWords is nest over each candidate's lower-cased words.
func nestWords(words [][]string, details []Detail) {
	byWords := make(map[string]int, len(words))
	for i := range words {
		k := strings.Join(words[i], " ")
		if _, dup := byWords[k]; !dup {
			byWords[k] = i
		}
	}
	for i, ws := range words {
		seen := map[int]bool{}
		for n := len(ws) - 1; n >= 1; n-- {
			for s := 0; s+n <= len(ws); s++ {
				j, ok := byWords[strings.Join(ws[s:s+n], " ")]
				if !ok || j == i || seen[j] {
					continue
				}
				seen[j] = true
				if len(details[i].Contains) < MaxNested {
					details[i].Contains = append(details[i].Contains, j)
				}
				if len(details[j].ContainedIn) < MaxNested {
					details[j].ContainedIn = append(details[j].ContainedIn, i)
				}
			}
		}
	}
}

// addCollocates gives each candidate the strongest pairs (by logDice) its
// head word — the last word, the head of an English noun phrase — forms in
// the counted relations, leaving out pairs made of the candidate's own
// words ("valve" + "irrigation" inside "irrigation valve" says nothing new).
func addCollocates(ranked []*terms.Term, details []Detail, pairs *colloc.Counter) {
	ld, _ := measure.Lookup("logdice")
	rows := pairs.Rank(colloc.RankOptions{Measure: ld, MinFreq: 2})
	byWord := map[string][]int{}
	for i, r := range rows {
		byWord[r.W1] = append(byWord[r.W1], i)
		if r.W2 != r.W1 {
			byWord[r.W2] = append(byWord[r.W2], i)
		}
	}
	for i, t := range ranked {
		ws := lowerWords(t)
		if len(ws) == 0 {
			continue
		}
		head := ws[len(ws)-1]
		own := map[string]bool{}
		for _, w := range ws {
			own[w] = true
		}
		idx := byWord[head]
		if len(idx) == 0 {
			// Proper nouns and acronyms are counted with their case.
			orig := t.WordList()
			if len(orig) > 0 {
				head = orig[len(orig)-1]
				idx = byWord[head]
			}
		}
		for _, ri := range idx {
			r := rows[ri]
			other := r.W2
			if r.W2 == head {
				other = r.W1
			}
			if own[strings.ToLower(other)] {
				continue
			}
			details[i].Collocates = append(details[i].Collocates, Collocate{Relation: r.Relation, Word: other, Head: head,
				Freq: r.F12, LogDice: finite(r.Scores.LogDice)})
			if len(details[i].Collocates) == MaxCollocates {
				break
			}
		}
	}
}

// Listed is a candidate as a recorded run keeps it: totals, forms and a
// few contexts, no measures and no counts per document.
type Listed struct {
	Term     string
	POS      string
	Freq     int
	Docs     int
	Variants []terms.Variant
	Contexts []terms.Context
	// Acronym and FullForm link the candidate to its acronym or full form
	// (as Candidate's), for the termbase's labels.
	Acronym, FullForm string
}

// FromList makes the dataset of candidates recorded earlier, in the order
// given (ranked 1, 2, …). The documents are those the contexts name.
func FromList(source string, list []Listed) *Dataset {
	ds := &Dataset{Source: source, Candidates: make([]Candidate, len(list)), Details: make([]Detail, len(list))}
	docIdx := map[string]int{}
	words := make([][]string, len(list))
	for i, c := range list {
		ws := strings.Fields(c.Term)
		ds.Candidates[i] = Candidate{ID: i, Rank: i + 1, Term: c.Term, POS: c.POS, Words: len(ws), Freq: c.Freq, Docs: c.Docs,
			Acronym: c.Acronym, FullForm: c.FullForm}
		for k, w := range ws {
			ws[k] = strings.ToLower(w)
		}
		words[i] = ws
		d := &ds.Details[i]
		d.Variants = c.Variants
		for _, cx := range c.Contexts {
			di, ok := docIdx[cx.Doc]
			if !ok {
				di = len(ds.Docs)
				docIdx[cx.Doc] = di
				ds.Docs = append(ds.Docs, cx.Doc)
				ds.DocSizes = append(ds.DocSizes, 0)
			}
			d.Contexts = append(d.Contexts, Context{Doc: di, Line: cx.Line, Text: cx.Text})
		}
	}
	nestWords(words, ds.Details)
	return ds
}
