package hmm

import (
	"sync"

	"glossmith/tagger/model"
	"glossmith/tagger/wordclass"
)

// classPrefixes are the lengths of the class path prefixes that are
// features of a word (a path shorter than a length is taken whole): the
// prefixes of Turian et al. (2010, "Word representations: a simple and
// general method for semi-supervised learning"), which generalize from a
// word seen in training to the unseen and rare words of its class, and of
// its coarser classes.
var classPrefixes = [...]int{4, 6, 10, 20}

// classFeatures holds a word class table with the feature keys of each of
// its classes, computed once, so that a word's class features cost one
// map look-up.
type classFeatures struct {
	table *wordclass.Table
	keys  [][len(classPrefixes)]uint64 // by class
}

func newClassFeatures(t *wordclass.Table) *classFeatures {
	cf := &classFeatures{table: t, keys: make([][len(classPrefixes)]uint64, t.Classes())}
	for c := range cf.keys {
		path := t.Path(int32(c))
		for i, n := range classPrefixes {
			cf.keys[c][i] = key(fClass1+i, hashString(path[:min(n, len(path))]))
		}
	}
	return cf
}

// learnedClasses returns the class features the weights were trained
// with: the embedded table's if the weights hold a feature of a class path
// prefix of classPrefixes[0] bits or fewer (every table has such a
// prefix, and training keeps the frequent features, which the short
// prefixes are), else nil, so that a model trained without them does not
// look words up in the table, nor parse it.
func (p *perceptron) learnedClasses() *classFeatures {
	var path [8]byte
	for n := 1; n <= classPrefixes[0]; n++ {
		for bits := range 1 << n {
			for i := range n {
				path[i] = '0' + byte(bits>>(n-1-i)&1)
			}
			if p.row(key(fClass1, hashBytes(path[:n]))) >= 0 {
				return englishClasses()
			}
		}
	}
	return nil
}

// englishClasses returns the class features of the embedded table
// (model.EnglishWordClasses), or nil when the binary has none or it does
// not parse (TestEmbeddedClasses checks that it does).
var englishClasses = sync.OnceValue(func() *classFeatures {
	if len(model.EnglishWordClasses) == 0 {
		return nil
	}
	t, err := wordclass.ParseCompressed(model.EnglishWordClasses, "embedded "+model.WordClassesName)
	if err != nil {
		return nil
	}
	return newClassFeatures(t)
})
