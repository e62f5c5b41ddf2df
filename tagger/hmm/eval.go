package hmm

import (
	"sort"
	"strings"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// Score is the accuracy of one annotation layer.
type Score struct {
	Correct  int     `json:"correct"`
	Total    int     `json:"total"`
	Accuracy float64 `json:"accuracy"` // percent
}

func (s *Score) add(ok bool) {
	s.Total++
	if ok {
		s.Correct++
	}
}

func (s *Score) done() {
	if s.Total > 0 {
		s.Accuracy = 100 * float64(s.Correct) / float64(s.Total)
	}
}

// Split is a layer's accuracy over all tokens and over the tokens whose
// form was (known) or was not (unknown) seen in training.
type Split struct {
	Score
	Known   Score `json:"known"`
	Unknown Score `json:"unknown"`
}

func (s *Split) add(ok, known bool) {
	s.Score.add(ok)
	if known {
		s.Known.add(ok)
	} else {
		s.Unknown.add(ok)
	}
}

func (s *Split) done() { s.Score.done(); s.Known.done(); s.Unknown.done() }

// Confusion counts one kind of tagging error.
type Confusion struct {
	Gold      string `json:"gold"`
	Predicted string `json:"predicted"`
	Count     int    `json:"count"`
}

// Report is the result of tagging gold-tokenized text and comparing.
// Lemma accuracy ignores case.
type Report struct {
	Sentences      int         `json:"sentences"`
	Tokens         int         `json:"tokens"`
	UnknownTokens  int         `json:"unknown_tokens"`
	UPOS           Split       `json:"upos"`
	XPOS           Split       `json:"xpos"`
	Lemma          Split       `json:"lemma"`
	UPOSConfusions []Confusion `json:"upos_confusions"`
	XPOSConfusions []Confusion `json:"xpos_confusions"`
}

// TopConfusions is how many of the most frequent confusions a report lists.
const TopConfusions = 10

// Evaluate tags the tokens of the gold sentences (their annotation hidden
// from the tagger) and compares the result with the gold annotation.
func Evaluate(m *Model, gold []*conllu.Sentence) Report {
	var r Report
	cu := map[[2]string]int{}
	cx := map[[2]string]int{}
	var s doc.Sentence
	for _, g := range gold {
		s.Tokens = s.Tokens[:0]
		for _, t := range g.Tokens {
			s.Tokens = append(s.Tokens, doc.Token{Form: t.Form, SpaceAfter: t.SpaceAfter, FusedNext: t.FusedNext})
		}
		m.Tag(&s)
		r.Sentences++
		for i, t := range g.Tokens {
			p := s.Tokens[i]
			known := m.Known(t.Form)
			r.Tokens++
			if !known {
				r.UnknownTokens++
			}
			gx, gu := goldTags(t.XPOS, t.UPOS)
			r.UPOS.add(p.UPOS == gu, known)
			r.XPOS.add(p.XPOS == gx, known)
			if t.Lemma != "" {
				r.Lemma.add(strings.EqualFold(p.Lemma, t.Lemma), known)
			}
			if p.UPOS != gu {
				cu[[2]string{gu, p.UPOS}]++
			}
			if p.XPOS != gx {
				cx[[2]string{gx, p.XPOS}]++
			}
		}
	}
	r.UPOS.done()
	r.XPOS.done()
	r.Lemma.done()
	r.UPOSConfusions = topConfusions(cu)
	r.XPOSConfusions = topConfusions(cx)
	return r
}

func topConfusions(m map[[2]string]int) []Confusion {
	out := make([]Confusion, 0, len(m))
	for k, c := range m {
		out = append(out, Confusion{Gold: k[0], Predicted: k[1], Count: c})
	}
	sort.Slice(out, func(i, j int) bool {
		a, b := out[i], out[j]
		if a.Count != b.Count {
			return a.Count > b.Count
		}
		if a.Gold != b.Gold {
			return a.Gold < b.Gold
		}
		return a.Predicted < b.Predicted
	})
	if len(out) > TopConfusions {
		out = out[:TopConfusions]
	}
	return out
}
