package hmm

import (
	"maps"
	"math"
	"slices"
	"sort"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// generative is the TnT model of Brants (2000). Only counts are stored;
// probabilities are derived from them when the model is built or loaded.
type generative struct {
	suffixLen int
	// Tag n-gram counts over the padded sequence <s> <s> t1 … tn </s>; the
	// boundary is tag index nt.
	uni  []int32         // uni[c]: c as event (</s> once per sentence)
	bi   []int32         // bi[b*t1+c]
	tri  map[int32]int32 // tri[(a*t1+b)*t1+c]
	ctx2 []int32         // (a,b) as trigram context
	suf  [2]*suffixTable // [0] lower-case initial, [1] upper-case initial
	lam  [3]float64      // λ1 (unigram), λ2 (bigram), λ3 (trigram)
	logP []float32       // log P(t), for Bayes inversion of the suffix model
	emit []float32       // log P(word|tag) per lexicon entry (Model.wtags)
	tot  float64         // N: events counted in uni
}

// suffixTable counts the tags of rare words by their endings.
type suffixTable struct {
	entries map[string]suffixEntry
	prior   []float64 // P(t) among the table's words (suffix of length 0)
	theta   float64   // weight of the shorter suffix in successive abstraction
}

type suffixEntry struct {
	total int32
	tags  []uint8
	count []int32
}

func trainGenerative(m *Model, sents []*conllu.Sentence, gold [][]uint8, opt *TrainOptions) {
	nt := len(m.tags)
	t1 := nt + 1
	b := int32(nt)
	g := &generative{suffixLen: opt.SuffixLen,
		uni: make([]int32, t1), bi: make([]int32, t1*t1), ctx2: make([]int32, t1*t1),
		tri: map[int32]int32{}}
	for _, seq := range gold {
		a1, a2 := b, b // tags at i-2, i-1
		for i := 0; i <= len(seq); i++ {
			c := b
			if i < len(seq) {
				c = int32(seq[i])
			}
			g.uni[c]++
			g.bi[a2*int32(t1)+c]++
			g.ctx2[a1*int32(t1)+a2]++
			g.tri[(a1*int32(t1)+a2)*int32(t1)+c]++
			a1, a2 = a2, c
		}
	}
	// Suffix tables from the tokens of rare words.
	counts := [2]map[string]map[uint8]int32{{}, {}}
	for si, s := range sents {
		for i, t := range s.Tokens {
			e, _ := m.entry(t.Form)
			if int(e.count) > opt.SuffixMaxFreq {
				continue
			}
			tab := counts[capIndex(t.Form)]
			for _, suf := range suffixes(t.Form, g.suffixLen) {
				mm := tab[suf]
				if mm == nil {
					mm = map[uint8]int32{}
					tab[suf] = mm
				}
				mm[gold[si][i]]++
			}
		}
	}
	for k := range counts {
		st := &suffixTable{entries: map[string]suffixEntry{}}
		for _, s := range slices.Sorted(maps.Keys(counts[k])) {
			var e suffixEntry
			tags := make([]int, 0, len(counts[k][s]))
			for t := range counts[k][s] {
				tags = append(tags, int(t))
			}
			sort.Ints(tags)
			for _, t := range tags {
				c := counts[k][s][uint8(t)]
				e.tags = append(e.tags, uint8(t))
				e.count = append(e.count, c)
				e.total += c
			}
			st.entries[s] = e
		}
		g.suf[k] = st
	}
	m.gen = g
	g.finish(m)
}

// capIndex selects the suffix table of a word: 1 when it starts with an
// upper-case letter.
func capIndex(form string) int {
	r, _ := utf8.DecodeRuneInString(form)
	if unicode.IsUpper(r) {
		return 1
	}
	return 0
}

// suffixes returns the word's endings of 0 to max bytes, cut at rune
// boundaries, shortest first.
func suffixes(form string, maxLen int) []string {
	out := []string{""}
	for i := len(form) - 1; i >= 0 && len(form)-i <= maxLen; i-- {
		if utf8.RuneStart(form[i]) {
			out = append(out, form[i:])
		}
	}
	return out
}

// finish derives the interpolation weights, the transition table, the
// tag priors and the suffix model parameters from the counts.
func (g *generative) finish(m *Model) {
	nt := len(m.tags)
	t1 := nt + 1
	g.tot = 0
	for _, c := range g.uni {
		g.tot += float64(c)
	}
	// Deleted interpolation (Brants 2000, Figure 1).
	var lam [3]float64
	keys := slices.Sorted(maps.Keys(g.tri))
	ratio := func(num, den int32) float64 {
		if den <= 1 {
			return 0
		}
		return float64(num-1) / float64(den-1)
	}
	for _, k := range keys {
		f := g.tri[k]
		c := k % int32(t1)
		ab := k / int32(t1)
		b := ab % int32(t1)
		v3 := ratio(f, g.ctx2[ab])
		v2 := ratio(g.bi[b*int32(t1)+c], g.uni[b])
		v1 := float64(g.uni[c]-1) / (g.tot - 1)
		switch {
		case v3 >= v2 && v3 >= v1:
			lam[2] += float64(f)
		case v2 >= v1:
			lam[1] += float64(f)
		default:
			lam[0] += float64(f)
		}
	}
	sum := lam[0] + lam[1] + lam[2]
	for i := range lam {
		lam[i] /= sum
	}
	g.lam = lam
	tri := padTri(t1)
	for a := 0; a < t1; a++ {
		for b := 0; b < t1; b++ {
			ab := a*t1 + b
			for c := 0; c < t1; c++ {
				p := lam[0] * float64(g.uni[c]) / g.tot
				if g.uni[b] > 0 {
					p += lam[1] * float64(g.bi[b*t1+c]) / float64(g.uni[b])
				}
				if g.ctx2[ab] > 0 {
					p += lam[2] * float64(g.tri[int32(ab*t1+c)]) / float64(g.ctx2[ab])
				}
				tri[ab*t1+c] = float32(math.Log(p))
			}
		}
	}
	m.trans = transitions{t1: t1, tri: tri}
	g.emit = make([]float32, len(m.wtags))
	for j, t := range m.wtags {
		g.emit[j] = float32(math.Log(float64(m.wcount[j]) / float64(g.uni[t])))
	}
	g.logP = make([]float32, nt)
	for t := 0; t < nt; t++ {
		g.logP[t] = float32(math.Log(float64(g.uni[t]) / g.tot))
	}
	for _, st := range g.suf {
		st.prior = make([]float64, nt)
		if e, ok := st.entries[""]; ok && e.total > 0 {
			for j, t := range e.tags {
				st.prior[t] = float64(e.count[j]) / float64(e.total)
			}
		}
		// θ: standard deviation of the unconditional tag probabilities.
		var mean, v float64
		for _, p := range st.prior {
			mean += p
		}
		mean /= float64(nt)
		for _, p := range st.prior {
			v += (p - mean) * (p - mean)
		}
		if nt > 1 {
			v /= float64(nt - 1)
		}
		st.theta = math.Sqrt(v)
	}
}

// unknownCap bounds the candidate tags of an unknown word; tags below a
// thousandth of the best one's suffix probability are dropped as well.
const unknownCap = 10

func (g *generative) buildLattice(m *Model, ws *workspace, toks []doc.Token) {
	ws.reset(len(toks))
	nt := len(m.tags)
	for i := range toks {
		form := toks[i].Form
		e, ok := m.lookup(&ws.featureScratch, form)
		if !ok {
			e, ok = m.variant(&ws.featureScratch, form)
		}
		if ok {
			for j := e.first; j < e.first+e.ntags; j++ {
				ws.add(m.wtags[j], g.emit[j])
			}
			ws.closePos()
			continue
		}
		g.suffixScores(ws.score[:nt], form)
		selectSuffixCands(&ws.lattice, ws.score[:nt], g.logP)
	}
}

// variant looks up the lower-cased, then the capitalized form of an
// unknown word ("Valve" → "valve", "VALVE" → "Valve").
func (m *Model) variant(fs *featureScratch, form string) (*wordEntry, bool) {
	buf := lowerInto(fs.buf[:0], form)
	fs.buf = buf
	if string(buf) != form {
		if i, ok := m.lex[string(buf)]; ok {
			return &m.words[i], true
		}
	}
	if len(buf) > 0 {
		r, size := utf8.DecodeRune(buf)
		if u := unicode.ToUpper(r); u != r {
			capd := string(utf8.AppendRune(nil, u)) + string(buf[size:])
			if capd != form {
				if i, ok := m.lex[capd]; ok {
					return &m.words[i], true
				}
			}
		}
	}
	return nil, false
}

// suffixScores fills p with P(t | longest known suffix of form) by the
// successive abstraction of Brants (2000, eq. 8).
func (g *generative) suffixScores(p []float32, form string) {
	st := g.suf[capIndex(form)]
	for t := range p {
		p[t] = float32(st.prior[t])
	}
	th := float32(st.theta)
	norm := 1 / (1 + th)
	n := 0
	for i := len(form) - 1; i >= 0 && n < g.suffixLen; i-- {
		if !utf8.RuneStart(form[i]) {
			continue
		}
		e, ok := st.entries[form[i:]]
		if !ok {
			break
		}
		n = len(form) - i
		for t := range p {
			p[t] *= th * norm
		}
		inv := norm / float32(e.total)
		for j, t := range e.tags {
			p[t] += float32(e.count[j]) * inv
		}
	}
}

// selectSuffixCands keeps the most probable tags of an unknown word (by
// P(t|suffix)) with emission score log P(t|suffix) - log P(t).
func selectSuffixCands(l *lattice, p []float32, logP []float32) {
	var best float32
	for _, v := range p {
		best = max(best, v)
	}
	start := len(l.cands)
	if best > 0 {
		// Tags below a thousandth of the best (and so every tag of
		// probability 0) are not candidates.
		insertTop(l, p, unknownCap, best/1000)
	}
	if len(l.cands) == start { // cannot happen with a non-empty table
		l.add(0, 1)
	}
	for j := start; j < len(l.cands); j++ {
		l.emit[j] = float32(math.Log(float64(l.emit[j]))) - logP[l.cands[j]]
	}
	l.closePos()
}
