package hmm

import (
	"errors"
	"fmt"
	"maps"
	"slices"
	"sort"
	"strings"
	"unicode"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/lemma"
	"glossmith/tagger/wordnet"
)

// TrainOptions control training. The zero value of a field means its
// default, so TrainOptions{Method: MethodPerceptron} is a sensible call.
type TrainOptions struct {
	// Method is MethodHMM or MethodPerceptron (the default).
	Method string
	// Tagset is TagsetJoint (the default) or TagsetXPOS.
	Tagset string
	// Source names the training data in the model (shown by Info).
	Source string
	// Epochs of perceptron training (default 10).
	Epochs int
	// Dev, when given, is tagged after each epoch and its accuracy passed
	// to Progress.
	Dev []*conllu.Sentence
	// Progress is called after each epoch (perceptron) or once (HMM) with
	// the dev accuracies in percent (0 without Dev).
	Progress func(epoch int, devUPOS, devXPOS float64)
	// Seed of the sentence shuffling between epochs (default 1).
	Seed uint64
	// Shuffles is the number of perceptrons trained, each on the
	// sentences shuffled from its own seed (Seed, Seed+1, …), whose
	// averaged weights the model averages (default 1). Three, with
	// PruneWeight 0.5, measured better on UD English EWT dev than one
	// (UPOS / XPOS 95.55 / 94.86 against 95.51 / 94.80) with fewer weights;
	// training takes that many times longer.
	Shuffles int

	// DictMin: when tagging, words seen at least this often in training
	// may only take tags they were seen with (the tag dictionary); rarer
	// words may take any tag (default 10). The dictionary shrinks the
	// lattice, which is where the speed comes from.
	DictMin int
	// TrainDictMin is the same threshold during perceptron training; 0
	// trains without the dictionary, which measured better on EWT dev:
	// every word then competes against all tags and teaches the weights
	// that unknown words need.
	TrainDictMin int
	// MaxCands is the number of best-scoring tags a word outside the tag
	// dictionary keeps as candidates in the lattice (default 8).
	MaxCands int
	// MinFeatureCount prunes features seen fewer times in training
	// (default 2); PruneWeight drops weights of smaller magnitude
	// (default 0). Negative values disable the pruning.
	MinFeatureCount int
	PruneWeight     float64
	// LearnedClasses adds the features of the words' classes learned
	// from unlabeled text (package wordclass, the embedded table). The
	// default model is trained without them: on UD English EWT dev they
	// did not add to the WordNet classes (see the README).
	LearnedClasses bool

	// Beam is the state pruning threshold of Viterbi: states scoring more
	// than Beam below the best state of their position are dropped. The
	// default is ln 1000 for HMM (Brants' threshold of 1000) and 50 for the
	// perceptron, where it applies when tagging, not while learning.
	// Negative disables it. On UD English EWT dev 30 lost the best path of
	// some sentences (UPOS / XPOS 95.57 / 94.97 against 95.60 / 94.99 with
	// none) and 50 nearly none (95.60 / 94.99) for 2.5% more instructions
	// per tagging pass; no beam costs 25% more.
	Beam float64

	// FactoredTransitions adds perceptron transition weights shared by
	// states of the same XPOS and of the same UPOS to those of the joint
	// states. Off by default: it measured 0.1 points worse on EWT dev and
	// trains four times slower.
	FactoredTransitions bool

	// WordClasses is a table of word classes written by
	// wordnet.Generate; the perceptron reads it as features of every word,
	// and the model stores it. Empty: no such features.
	WordClasses string

	// GeneralFrequencies is a table of general-English frequency bands
	// written by genfreq.Generate; the perceptron reads it as features of
	// every word, and the model stores it. Empty: no such features.
	GeneralFrequencies string

	// HMM suffix model: longest suffix (default 10) and highest frequency
	// of the words it learns from (default 10), after Brants (2000).
	SuffixLen, SuffixMaxFreq int
}

func (o *TrainOptions) defaults() error {
	if o.Method == "" {
		o.Method = MethodPerceptron
	}
	if o.Method != MethodHMM && o.Method != MethodPerceptron {
		return fmt.Errorf("unknown training method %q (want %q or %q)", o.Method, MethodHMM, MethodPerceptron)
	}
	if o.Tagset == "" {
		o.Tagset = TagsetJoint
	}
	if o.Tagset != TagsetJoint && o.Tagset != TagsetXPOS {
		return fmt.Errorf("unknown tag set %q (want %q or %q)", o.Tagset, TagsetJoint, TagsetXPOS)
	}
	if o.Epochs <= 0 {
		o.Epochs = 10
	}
	if o.Seed == 0 {
		o.Seed = 1
	}
	if o.DictMin == 0 {
		o.DictMin = 10
	}
	if o.MaxCands <= 0 {
		o.MaxCands = 8
	}
	if o.MinFeatureCount == 0 {
		o.MinFeatureCount = 2
	}
	if o.Beam == 0 {
		if o.Method == MethodHMM {
			o.Beam = 6.907755 // ln 1000
		} else {
			o.Beam = 50
		}
	}
	if o.SuffixLen <= 0 {
		o.SuffixLen = 10
	}
	if o.SuffixMaxFreq <= 0 {
		o.SuffixMaxFreq = 10
	}
	return nil
}

// Train builds a model from annotated sentences.
func Train(sents []*conllu.Sentence, opt TrainOptions) (*Model, error) {
	if err := opt.defaults(); err != nil {
		return nil, err
	}
	m, gold, err := newBase(sents, &opt)
	if err != nil {
		return nil, err
	}
	if opt.Method == MethodHMM {
		trainGenerative(m, sents, gold, &opt)
		if opt.Progress != nil {
			var u, x float64
			if len(opt.Dev) > 0 {
				r := Evaluate(m, opt.Dev)
				u, x = r.UPOS.Accuracy, r.XPOS.Accuracy
			}
			opt.Progress(1, u, x)
		}
		return m, nil
	}
	if opt.WordClasses != "" {
		if err := m.setWordClasses(opt.WordClasses); err != nil {
			return nil, err
		}
	}
	if opt.GeneralFrequencies != "" {
		if err := m.setGeneralFrequencies(opt.GeneralFrequencies); err != nil {
			return nil, err
		}
	}
	trainPerceptron(m, sents, gold, &opt)
	return m, nil
}

// WordClasses returns the model's table of word classes as stored (see
// TrainOptions.WordClasses), or "" when it has none.
func (m *Model) WordClasses() string { return m.wnText }

// setWordClasses parses and keeps a word-class table (see
// TrainOptions.WordClasses).
func (m *Model) setWordClasses(text string) error {
	t, err := wordnet.Parse(text)
	if err != nil {
		return err
	}
	m.wn, m.wnText = t, text
	return nil
}

// setGeneralFrequencies parses and keeps a table of general-English
// frequency bands (see TrainOptions.GeneralFrequencies).
func (m *Model) setGeneralFrequencies(text string) error {
	t, err := genfreq.Parse(text)
	if err != nil {
		return err
	}
	m.freq, m.freqText = t, text
	return nil
}

// CheckGold reports the first reason a sentence cannot be training or
// evaluation data: a token with neither UPOS nor XPOS, a UPOS that is not
// one of the 17 Universal Dependencies tags (doc.UPOSTags), or an XPOS
// that is not one word of printable characters (a model keeps a state's
// tags as one tab-separated name). file, when not empty, starts the
// message, which names the token's line.
func CheckGold(s *conllu.Sentence, file string) error {
	where := func(t *doc.Token) string {
		if file == "" {
			return fmt.Sprintf("line %d", t.Line)
		}
		return fmt.Sprintf("%s:%d", file, t.Line)
	}
	for i := range s.Tokens {
		t := &s.Tokens[i]
		switch {
		case t.UPOS == "" && t.XPOS == "":
			return fmt.Errorf("%s: token %q has neither UPOS nor XPOS", where(t), t.Form)
		case t.UPOS != "" && !slices.Contains(doc.UPOSTags, t.UPOS):
			return fmt.Errorf("%s: token %q: UPOS %q is not a Universal Dependencies tag (%s)", where(t), t.Form, t.UPOS, strings.Join(doc.UPOSTags, " "))
		case strings.IndexFunc(t.XPOS, func(r rune) bool { return unicode.IsSpace(r) || !unicode.IsPrint(r) }) >= 0:
			return fmt.Errorf("%s: token %q: XPOS %q has a space or a control character", where(t), t.Form, t.XPOS)
		}
	}
	return nil
}

// goldTags returns the XPOS and UPOS a training token stands for: a
// missing XPOS is taken from UPOS, so treebanks without fine tags work.
func goldTags(x, u string) (string, string) {
	if x == "" {
		x = u
	}
	if u == "" {
		u = "X"
	}
	return x, u
}

// newBase builds what both methods share: states, lexicon, UPOS choice,
// lemmatizer and reference counts. It returns the gold states of every
// sentence.
func newBase(sents []*conllu.Sentence, opt *TrainOptions) (*Model, [][]uint8, error) {
	m := &Model{method: opt.Method, tagset: opt.Tagset, source: opt.Source,
		refForm: map[string]int32{}, refLemma: map[string]int32{}}
	names := map[string]bool{}
	var examples []lemma.Example
	for _, s := range sents {
		if err := CheckGold(s, ""); err != nil {
			return nil, nil, err
		}
		for _, t := range s.Tokens {
			x, u := goldTags(t.XPOS, t.UPOS)
			names[m.stateName(x, u)] = true
			examples = append(examples, lemma.Example{Form: t.Form, Lemma: t.Lemma, UPOS: u, XPOS: x})
			m.refForm[strings.ToLower(t.Form)]++
			if t.Lemma != "" {
				m.refLemma[strings.ToLower(t.Lemma)]++
			}
			m.refSize++
		}
	}
	if m.refSize == 0 {
		return nil, nil, errors.New("no annotated tokens to train on")
	}
	if len(names) > maxTags {
		return nil, nil, fmt.Errorf("%d distinct tags; at most %d are supported", len(names), maxTags)
	}
	for n := range names {
		m.tags = append(m.tags, n)
	}
	sort.Strings(m.tags)
	m.splitTags()
	id := map[string]uint8{}
	for i, n := range m.tags {
		id[n] = uint8(i)
	}

	gold := make([][]uint8, len(sents))
	wordTags := map[string]map[uint8]int32{}
	uposCount := map[string]map[uint8]map[string]int{} // lower form → xpos state → upos
	for si, s := range sents {
		g := make([]uint8, len(s.Tokens))
		for i, t := range s.Tokens {
			x, u := goldTags(t.XPOS, t.UPOS)
			st := id[m.stateName(x, u)]
			g[i] = st
			wt := wordTags[t.Form]
			if wt == nil {
				wt = map[uint8]int32{}
				wordTags[t.Form] = wt
			}
			wt[st]++
			if m.tagset == TagsetXPOS {
				lw := strings.ToLower(t.Form)
				for _, key := range []string{t.Form, lw} {
					byX := uposCount[key]
					if byX == nil {
						byX = map[uint8]map[string]int{}
						uposCount[key] = byX
					}
					if byX[st] == nil {
						byX[st] = map[string]int{}
					}
					byX[st][u]++
					if lw == t.Form {
						break
					}
				}
			}
		}
		gold[si] = g
	}
	forms := slices.Sorted(maps.Keys(wordTags))
	m.lex = make(map[string]int32, len(forms))
	for _, f := range forms {
		e := wordEntry{first: int32(len(m.wtags))}
		sts := make([]int, 0, len(wordTags[f]))
		for st := range wordTags[f] {
			sts = append(sts, int(st))
		}
		sort.Ints(sts)
		for _, st := range sts {
			c := wordTags[f][uint8(st)]
			m.wtags = append(m.wtags, uint8(st))
			m.wcount = append(m.wcount, c)
			e.count += c
		}
		e.ntags = int32(len(sts))
		m.lex[f] = int32(len(m.words))
		m.words = append(m.words, e)
	}
	if m.tagset == TagsetXPOS {
		byTag := make([]map[string]int, len(m.tags))
		for _, byX := range uposCount {
			for st, us := range byX {
				if byTag[st] == nil {
					byTag[st] = map[string]int{}
				}
				for u, c := range us {
					byTag[st][u] += c
				}
			}
		}
		m.uposByTag = make([]string, len(m.tags))
		for st := range m.tags {
			m.uposByTag[st] = argmaxString(byTag[st])
		}
		m.uposByWord = map[string][]uposChoice{}
		for w, byX := range uposCount {
			var cs []uposChoice
			for st, us := range byX {
				if u := argmaxString(us); u != m.uposByTag[st] {
					cs = append(cs, uposChoice{st, u})
				}
			}
			if len(cs) > 0 {
				sort.Slice(cs, func(i, j int) bool { return cs[i].xpos < cs[j].xpos })
				m.uposByWord[w] = cs
			}
		}
	}
	m.lem = lemma.Train(examples)
	m.prepareLexicon()
	m.beam = float32(opt.Beam)
	return m, gold, nil
}

// splitTags fills tagX and tagU from the state names.
func (m *Model) splitTags() {
	m.tagX = make([]string, len(m.tags))
	m.tagU = make([]string, len(m.tags))
	for i, n := range m.tags {
		x, u, _ := strings.Cut(n, "\t")
		m.tagX[i], m.tagU[i] = x, u
	}
}

func argmaxString(m map[string]int) string {
	best, bc := "", -1
	for s, c := range m {
		if c > bc || (c == bc && s < best) {
			best, bc = s, c
		}
	}
	return best
}
