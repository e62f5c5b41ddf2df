package hmm

import (
	"bytes"
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"
	"sync"
	"testing"
	"time"

	"glossmith/internal/testenv"
	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The accuracy checks read UD English EWT 2.15 (Silveira et al. 2014,
// Universal Dependencies release 2.15, CC BY-SA 4.0) from the shared
// folder; under CI=true its absence is a failure, elsewhere a skip.

var treebank struct {
	once             sync.Once
	train, dev, test []*conllu.Sentence
	err              error
}

func ewt(t testing.TB) (train, dev, test []*conllu.Sentence) {
	t.Helper()
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	treebank.once.Do(func() {
		read := func(name string) []*conllu.Sentence {
			p := filepath.Join(dir, name)
			f, err := os.Open(p)
			if err != nil {
				treebank.err = err
				return nil
			}
			defer f.Close()
			s, err := conllu.ReadAll(f, p)
			if err != nil {
				treebank.err = err
			}
			return s
		}
		treebank.train = read("en_ewt-ud-train.conllu")
		treebank.dev = read("en_ewt-ud-dev.conllu")
		treebank.test = read("en_ewt-ud-test.conllu")
	})
	if treebank.err != nil {
		t.Fatal(treebank.err)
	}
	return treebank.train, treebank.dev, treebank.test
}

// The generative model is trained once per test run: counting takes a
// couple of seconds.
var hmmModel struct {
	once sync.Once
	m    *Model
	err  error
}

func trainedHMM(t testing.TB) *Model {
	t.Helper()
	train, _, _ := ewt(t)
	hmmModel.once.Do(func() {
		hmmModel.m, hmmModel.err = Train(train, TrainOptions{Method: MethodHMM, Source: "en_ewt-ud-train.conllu"})
	})
	if hmmModel.err != nil {
		t.Fatal(hmmModel.err)
	}
	return hmmModel.m
}

// mostFrequentTag is the baseline of common practice: every known word
// gets the UPOS it had most often in training, every unknown word NOUN.
func mostFrequentTag(train, gold []*conllu.Sentence) float64 {
	counts := map[string]map[string]int{}
	for _, s := range train {
		for _, t := range s.Tokens {
			if counts[t.Form] == nil {
				counts[t.Form] = map[string]int{}
			}
			counts[t.Form][t.UPOS]++
		}
	}
	best := map[string]string{}
	for w, m := range counts {
		best[w] = argmaxString(m)
	}
	right, total := 0, 0
	for _, s := range gold {
		for _, t := range s.Tokens {
			p, ok := best[t.Form]
			if !ok {
				p = "NOUN"
			}
			if p == t.UPOS {
				right++
			}
			total++
		}
	}
	return 100 * float64(right) / float64(total)
}

func TestDefaultModelAccuracy(t *testing.T) {
	train, _, test := ewt(t)
	m, err := Default()
	require.NoError(t, err)
	if m.Info().Method != MethodPerceptron {
		t.Fatalf("default model method %q, want %q", m.Info().Method, MethodPerceptron)
	}
	r := Evaluate(m, test)
	base := mostFrequentTag(train, test)
	t.Logf("EWT test, default model: UPOS %.2f%% (known %.2f, unknown %.2f), XPOS %.2f%%, lemma %.2f%%; most-frequent-tag baseline %.2f%%",
		r.UPOS.Accuracy, r.UPOS.Known.Accuracy, r.UPOS.Unknown.Accuracy, r.XPOS.Accuracy, r.Lemma.Accuracy, base)
	// Thresholds of the glossmith tagger specification, measured on the
	// EWT test set with gold tokens.
	if r.UPOS.Accuracy < 95.0 {
		t.Errorf("UPOS accuracy %.2f%% < 95.0%%", r.UPOS.Accuracy)
	}
	if r.XPOS.Accuracy < 94.5 {
		t.Errorf("XPOS accuracy %.2f%% < 94.5%%", r.XPOS.Accuracy)
	}
	if r.Lemma.Accuracy < 98.0 {
		t.Errorf("lemma accuracy %.2f%% < 98.0%% (case-insensitive)", r.Lemma.Accuracy)
	}
	// Common practice: a most-frequent-tag baseline is far below an HMM
	// tagger (about 90% against 94–97% on edited news text). On EWT test it
	// measures 86.2% UPOS (../shared/README.md); the default model must
	// beat it by 5 points.
	if base < 85.7 || base > 86.7 {
		t.Errorf("most-frequent-tag baseline %.2f%%, expected 86.2%%", base)
	}
	if r.UPOS.Accuracy < base+5 {
		t.Errorf("UPOS %.2f%% does not beat the baseline %.2f%% by 5 points", r.UPOS.Accuracy, base)
	}
	if r.UPOS.Known.Total+r.UPOS.Unknown.Total != r.Tokens || r.UPOS.Unknown.Total == 0 {
		t.Errorf("known/unknown split %d+%d of %d tokens", r.UPOS.Known.Total, r.UPOS.Unknown.Total, r.Tokens)
	}
}

func TestGenerativeAccuracy(t *testing.T) {
	train, _, test := ewt(t)
	m := trainedHMM(t)
	r := Evaluate(m, test)
	base := mostFrequentTag(train, test)
	t.Logf("EWT test, generative model: UPOS %.2f%% (known %.2f, unknown %.2f), XPOS %.2f%%, lemma %.2f%%; baseline %.2f%%",
		r.UPOS.Accuracy, r.UPOS.Known.Accuracy, r.UPOS.Unknown.Accuracy, r.XPOS.Accuracy, r.Lemma.Accuracy, base)
	if r.UPOS.Accuracy < 92.5 { // glossmith tagger specification
		t.Errorf("UPOS accuracy %.2f%% < 92.5%%", r.UPOS.Accuracy)
	}
	if r.UPOS.Accuracy < base+4 {
		t.Errorf("UPOS %.2f%% does not beat the baseline %.2f%% by 4 points", r.UPOS.Accuracy, base)
	}
	if r.Lemma.Accuracy < 98.0 {
		t.Errorf("lemma accuracy %.2f%% < 98.0%%", r.Lemma.Accuracy)
	}
}

// The embedded model must be the one the recipe builds: its header names
// the treebank it came from.
func TestDefaultModelInfo(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	in := m.Info()
	assert.Contains(t, in.Source, "EWT")
	assert.NotZero(t, in.States)
	assert.NotZero(t, in.Features)
	assert.Equal(t, 17, in.UPOSTags, "UPOS tags of UD v2")
	// Reference counts are those of the training file the model names
	// (tagger/model/build trains on en_ewt-ud-train.conllu), counted here
	// again: its tokens, and the forms of "the" in any case.
	train, _, _ := ewt(t)
	tokens, the := 0, 0
	for _, s := range train {
		for _, tk := range s.Tokens {
			tokens++
			if strings.EqualFold(tk.Form, "the") {
				the++
			}
		}
	}
	assert.Equal(t, tokens, m.RefSize(), "tokens of the training file")
	assert.Equal(t, the, m.RefFreq("The"), `"the" in any case in the training file`)
	assert.Greater(t, m.RefLemmaFreq("be"), m.RefFreq("is"), "the lemma be counts more than the form is")
}

// small is a slice of the treebank for quick training tests.
func small(t *testing.T) []*conllu.Sentence {
	train, _, _ := ewt(t)
	return train[:1500]
}

func TestTrainingIsDeterministic(t *testing.T) {
	for _, method := range []string{MethodHMM, MethodPerceptron} {
		var files [2][]byte
		for i := range files {
			m, err := Train(small(t), TrainOptions{Method: method, Epochs: 2})
			require.NoError(t, err)
			var b bytes.Buffer
			require.NoError(t, m.Save(&b))
			files[i] = b.Bytes()
		}
		if !bytes.Equal(files[0], files[1]) {
			t.Errorf("%s: two trainings on the same data gave different files (%d and %d bytes)", method, len(files[0]), len(files[1]))
		}
	}
}

func TestSaveLoadRoundTrip(t *testing.T) {
	_, dev, _ := ewt(t)
	for _, method := range []string{MethodHMM, MethodPerceptron} {
		for _, tagset := range []string{TagsetJoint, TagsetXPOS} {
			m, err := Train(small(t), TrainOptions{Method: method, Tagset: tagset, Epochs: 2})
			require.NoError(t, err)
			path := filepath.Join(t.TempDir(), "m.glsm")
			var b bytes.Buffer
			require.NoError(t, m.Save(&b))
			require.NoError(t, os.WriteFile(path, b.Bytes(), 0o644))
			m2, err := Load(path)
			if err != nil {
				t.Fatalf("%s/%s: %v", method, tagset, err)
			}
			var b2 bytes.Buffer
			m2.Save(&b2)
			if !bytes.Equal(b.Bytes(), b2.Bytes()) {
				t.Errorf("%s/%s: saving a loaded model changed its bytes", method, tagset)
			}
			r1, r2 := Evaluate(m, dev[:300]), Evaluate(m2, dev[:300])
			if r1.UPOS != r2.UPOS || r1.XPOS != r2.XPOS || r1.Lemma != r2.Lemma {
				t.Errorf("%s/%s: loaded model tags differently: %+v vs %+v", method, tagset, r1.UPOS, r2.UPOS)
			}
			if r1.UPOS.Accuracy < 80 {
				t.Errorf("%s/%s: UPOS %.2f%% after training on 1500 sentences", method, tagset, r1.UPOS.Accuracy)
			}
		}
	}
}

func TestLoadRefusesBadFiles(t *testing.T) {
	m, err := Train(small(t)[:300], TrainOptions{Method: MethodHMM})
	require.NoError(t, err)
	var b bytes.Buffer
	require.NoError(t, m.Save(&b))
	good := b.Bytes()
	newer := bytes.Clone(good)
	newer[len(fileMagic)] = fileVersion + 1
	corrupt := bytes.Clone(good)
	corrupt[len(good)/2] ^= 0x40
	cases := []struct {
		name string
		data []byte
		want string
	}{
		{"truncated", good[:len(good)-100], "truncated"},
		{"header only", good[:headerSize-3], "truncated"},
		{"corrupt", corrupt, "checksum mismatch"},
		{"newer", newer, "newer than this glossmith"},
		{"not a model", []byte("# sent_id = 1\n1\tValve\tvalve\tNOUN\tNN\t_\t0\troot\t_\t_\n"), "not a glossmith tagger model"},
		{"empty", nil, "not a glossmith tagger model"},
	}
	for _, c := range cases {
		path := filepath.Join(t.TempDir(), "bad.glsm")
		require.NoError(t, os.WriteFile(path, c.data, 0o644))
		_, err := Load(path)
		if !assert.Error(t, err, c.name) {
			continue
		}
		assert.Contains(t, err.Error(), c.want, c.name)
		assert.Contains(t, err.Error(), path, c.name)
	}
}

func TestTagFillsTokensAndKeepsPretagged(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	words := strings.Fields("Check the pressure sensors and clean the filter housing .")
	s := &doc.Sentence{}
	for _, w := range words {
		s.Tokens = append(s.Tokens, doc.Token{Form: w})
	}
	m.Tag(s)
	for _, tok := range s.Tokens {
		if tok.UPOS == "" || tok.XPOS == "" || tok.Lemma == "" {
			t.Fatalf("token %q left untagged: %+v", tok.Form, tok)
		}
	}
	// Checked by hand against the Penn and UD guidelines.
	want := []string{"VB/VERB/check", "DT/DET/the", "NN/NOUN/pressure", "NNS/NOUN/sensor", "CC/CCONJ/and",
		"VB/VERB/clean", "DT/DET/the", "NN/NOUN/filter", "NN/NOUN/housing", "./PUNCT/."}
	for i, w := range want {
		tok := s.Tokens[i]
		if got := tok.XPOS + "/" + tok.UPOS + "/" + tok.Lemma; got != w {
			t.Errorf("%s: got %s, want %s", tok.Form, got, w)
		}
	}
	// A fully tagged sentence is left alone.
	pre := &doc.Sentence{Tokens: []doc.Token{{Form: "Valves", UPOS: "X", XPOS: "Y", Lemma: "z"}}}
	m.Tag(pre)
	if pre.Tokens[0].UPOS != "X" {
		t.Errorf("pre-tagged token changed: %+v", pre.Tokens[0])
	}
	// Concurrent use gives the same tags as sequential use.
	var wg sync.WaitGroup
	for g := 0; g < 8; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c := &doc.Sentence{}
			for _, w := range words {
				c.Tokens = append(c.Tokens, doc.Token{Form: w})
			}
			m.Tag(c)
			for i := range c.Tokens {
				if c.Tokens[i] != s.Tokens[i] {
					t.Errorf("concurrent tagging differs at %d: %+v vs %+v", i, c.Tokens[i], s.Tokens[i])
				}
			}
		}()
	}
	wg.Wait()
}

func TestTrainRejectsBadInput(t *testing.T) {
	if _, err := Train(nil, TrainOptions{}); err == nil {
		t.Error("training on nothing succeeded")
	}
	if _, err := Train(small(t)[:10], TrainOptions{Method: "crf"}); err == nil || !strings.Contains(err.Error(), "crf") {
		t.Errorf("unknown method: %v", err)
	}
}

// tokensOf flattens sentences into bare tokens for the tagging benchmarks.
func tokensOf(sents []*conllu.Sentence) ([]doc.Sentence, int) {
	out := make([]doc.Sentence, len(sents))
	n := 0
	for i, s := range sents {
		for _, t := range s.Tokens {
			out[i].Tokens = append(out[i].Tokens, doc.Token{Form: t.Form})
		}
		n += len(s.Tokens)
	}
	return out, n
}

func benchTag(b *testing.B, m *Model) {
	_, dev, _ := ewt(b)
	sents, n := tokensOf(dev)
	b.ResetTimer()
	start := time.Now()
	for i := 0; i < b.N; i++ {
		for j := range sents {
			for k := range sents[j].Tokens {
				sents[j].Tokens[k].UPOS = ""
			}
			m.Tag(&sents[j])
		}
	}
	b.ReportMetric(float64(n*b.N)/time.Since(start).Seconds(), "tokens/s")
}

// Run with -cpu 1 for the one-core figure of the specification.
func BenchmarkTagHMM(b *testing.B) { benchTag(b, trainedHMM(b)) }

func BenchmarkTagPerceptron(b *testing.B) {
	m, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	benchTag(b, m)
}

func BenchmarkTrainHMM(b *testing.B) {
	train, _, _ := ewt(b)
	for i := 0; i < b.N; i++ {
		if _, err := Train(train, TrainOptions{Method: MethodHMM}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkTrainPerceptron trains the default configuration on the whole
// treebank; it takes tens of seconds per iteration.
func BenchmarkTrainPerceptron(b *testing.B) {
	train, _, _ := ewt(b)
	for i := 0; i < b.N; i++ {
		if _, err := Train(train, TrainOptions{Method: MethodPerceptron}); err != nil {
			b.Fatal(err)
		}
	}
}

// payloadOf returns the payload of a saved model (the bytes the checksum
// covers after the header).
func payloadOf(t testing.TB, m *Model) []byte {
	var b bytes.Buffer
	require.NoError(t, m.Save(&b))
	return b.Bytes()[headerSize : b.Len()-4]
}

// A payload damaged behind the checksum's back (as a bug or a hand-made
// file with a recomputed checksum could) gives an error, never a panic.
func TestDecodeDamagedPayload(t *testing.T) {
	for _, method := range []string{MethodHMM, MethodPerceptron} {
		m, err := Train(small(t)[:200], TrainOptions{Method: method, Epochs: 1})
		require.NoError(t, err)
		p := payloadOf(t, m)
		rng := uint64(1)
		for i := 0; i < 300; i++ {
			q := bytes.Clone(p)
			for j := 0; j < 1+i%4; j++ {
				rng = rng*6364136223846793005 + 1442695040888963407
				q[int(rng>>33)%len(q)] ^= byte(rng >> 17)
			}
			if i%50 == 0 {
				q = q[:len(q)*(i%300)/300]
			}
			func() {
				defer func() {
					if r := recover(); r != nil {
						t.Fatalf("%s: damaged payload %d panicked: %v\n%s", method, i, r, debug.Stack())
					}
				}()
				decodePayload(q, fileVersion)
			}()
		}
	}
}
