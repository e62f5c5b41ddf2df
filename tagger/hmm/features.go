package hmm

import (
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/wordnet"
)

// Feature templates of the perceptron model. Each feature is a 64-bit
// hash of its template and value; a collision between two kept features
// is possible in principle but has odds far below one in a million for
// the feature counts of a treebank.
const (
	fBias = iota + 1
	fForm
	fLower
	fSuf1 // fSuf1..fSuf1+4: suffixes of 1..5 bytes of the lower-cased word
	_
	_
	_
	_
	fPre1 // fPre1..fPre1+3: prefixes of 1..4 bytes
	_
	_
	_
	fShape
	fCapFirst    // capitalized word at the start of the sentence
	fCapInside   // capitalized word elsewhere
	fAllUpper    // every letter upper case (and more than one letter)
	fDigit       // contains a digit
	fHyphen      // contains a hyphen
	fNoLetter    // no letter at all
	fPrev1       // lower-cased word at i-1
	fNext1       // … at i+1
	fPrev2       // … at i-2
	fNext2       // … at i+2
	fPrevSuf3    // 3-byte suffix of the word at i-1
	fNextSuf3    // … at i+1
	fPrevWord    // word i-1 with word i
	fWordNext    // word i with word i+1
	fPrevShape   // shape at i-1
	fNextShape   // shape at i+1
	fNextPrefix1 // first byte of the next word, lower-cased
	fTagWord     // the lower-cased word with the previous tag (pair feature)
	// Word classes of the lower-cased word in WordNet (package wordnet),
	// for models that carry the table:
	fWNSig   // all it says: parts of speech as a lemma, as an inflection, the major one
	fWNLemma // one part of speech it is listed with
	fWNInfl  // one part of speech of a base form it inflects
	fWNMajor // the part of speech of most tagged senses
	fPrevWN  // WordNet classes (lemma and inflection) of the word at i-1
	fNextWN  // … at i+1
	fClass1  // fClass1..fClass1+3: prefixes of the word's learned class path, see classPrefixes
	_
	_
	_
	// How common the lower-cased word is in general English (package
	// genfreq), for models that carry the table:
	fFreqBand     // frequency band (0: not in the table)
	fFreqShare    // share of its occurrences written in lower case
	fFreqShareCap // the same with whether this token begins with a capital
)

// pairKey is the key of the feature "word w after tag prev", which scores
// a (previous tag, tag) state rather than a tag: it lets the word choose
// its tag by what came before ("that" after a verb, after a noun).
func pairKey(lower uint64, prev uint8) uint64 {
	return key2(fTagWord, lower, uint64(prev)+1)
}

const (
	fnvOffset = 14695981039346656037
	fnvPrime  = 1099511628211
)

func hashBytes(b []byte) uint64 {
	h := uint64(fnvOffset)
	for _, c := range b {
		h ^= uint64(c)
		h *= fnvPrime
	}
	return h
}

func hashString(s string) uint64 {
	h := uint64(fnvOffset)
	for i := 0; i < len(s); i++ {
		h ^= uint64(s[i])
		h *= fnvPrime
	}
	return h
}

// mix is the finalizer of splitmix64: it spreads the bits of a hash so that
// combined keys do not cluster in the open-addressing table.
func mix(x uint64) uint64 {
	x ^= x >> 30
	x *= 0xbf58476d1ce4e5b9
	x ^= x >> 27
	x *= 0x94d049bb133111eb
	x ^= x >> 31
	return x
}

func key(template int, h uint64) uint64 {
	k := mix(h ^ uint64(template)*0x9E3779B97F4A7C15)
	if k == 0 {
		k = 1 // 0 marks an empty slot
	}
	return k
}

func key2(template int, h1, h2 uint64) uint64 {
	return key(template, mix(h1)+h2)
}

// tokenInfo holds the per-token hashes that neighbouring tokens reuse.
type tokenInfo struct {
	lower, suf3, shape, pre1 uint64
	wn                       wordnet.Classes
	hasWN                    bool // the model has a word-class table
	freq                     genfreq.Code
	hasFreq                  bool // the model has a general-English table
}

// wnSig is the value of the neighbours' word-class features.
func (ti *tokenInfo) wnSig() uint64 { return uint64(ti.wn.Lemma) | uint64(ti.wn.Inflected)<<4 }

var (
	hStart = hashBytes([]byte("\x00<s>"))
	hEnd   = hashBytes([]byte("\x00</s>"))
)

// extractFeatures writes the feature keys of every token into fs.keys,
// those of token i at fs.keys[fs.keyOff[i]:fs.keyOff[i+1]]; the keys from
// fs.aloneEnd[i] on depend on the token's neighbours or position, those
// before on the word alone. Tokens marked false in fs.need (when set) get
// none. It allocates nothing once the scratch buffers have grown.
func extractFeatures(fs *featureScratch, toks []doc.Token, info []tokenInfo, wn *wordnet.Table, freq *genfreq.Table) []tokenInfo {
	n := len(toks)
	if cap(info) < n {
		info = make([]tokenInfo, n)
	}
	info = info[:n]
	buf := fs.buf[:0]
	for i := range toks {
		buf = info[i].fill(buf, toks[i].Form, wn, freq)
	}
	f := fs.keys[:0]
	fs.keyOff = append(fs.keyOff[:0], 0)
	fs.aloneEnd = fs.aloneEnd[:0]
	at := func(i int) *tokenInfo {
		if i < 0 || i >= n {
			return nil
		}
		return &info[i]
	}
	lowerAt := func(i int) uint64 {
		if t := at(i); t != nil {
			return t.lower
		}
		if i < 0 {
			return hStart
		}
		return hEnd
	}
	for i := range toks {
		if len(fs.need) > 0 && !fs.need[i] {
			fs.aloneEnd = append(fs.aloneEnd, int32(len(f)))
			fs.keyOff = append(fs.keyOff, int32(len(f)))
			continue
		}
		ti := &info[i]
		var upperFirst bool
		f, buf, upperFirst = appendAloneKeys(f, buf, toks[i].Form, ti, fs.classes)
		// Above: features of the word alone; below: of its context.
		fs.aloneEnd = append(fs.aloneEnd, int32(len(f)))
		if upperFirst {
			if i == 0 {
				f = append(f, key(fCapFirst, 0))
			} else {
				f = append(f, key(fCapInside, 0))
			}
		}

		p1, n1 := lowerAt(i-1), lowerAt(i+1)
		f = append(f, key(fPrev1, p1), key(fNext1, n1), key(fPrev2, lowerAt(i-2)), key(fNext2, lowerAt(i+2)),
			key2(fPrevWord, p1, ti.lower), key2(fWordNext, ti.lower, n1))
		if t := at(i - 1); t != nil {
			f = append(f, key(fPrevSuf3, t.suf3), key(fPrevShape, t.shape))
			if t.hasWN {
				f = append(f, key(fPrevWN, t.wnSig()))
			}
		}
		if t := at(i + 1); t != nil {
			f = append(f, key(fNextSuf3, t.suf3), key(fNextShape, t.shape), key(fNextPrefix1, t.pre1))
			if t.hasWN {
				f = append(f, key(fNextWN, t.wnSig()))
			}
		}
		fs.keyOff = append(fs.keyOff, int32(len(f)))
	}
	fs.keys = f
	fs.buf = buf
	return info
}

// fill computes the hashes of a word form and, when wn is not nil, its
// classes in WordNet, and when freq is not nil its general-English code;
// buf is scratch space, returned for reuse.
func (ti *tokenInfo) fill(buf []byte, form string, wn *wordnet.Table, freq *genfreq.Table) []byte {
	buf = lowerInto(buf[:0], form)
	ti.lower = hashBytes(buf)
	ti.wn, ti.hasWN = wordnet.Classes{}, wn != nil
	if wn != nil {
		ti.wn = wn.ClassesBytes(buf)
	}
	ti.freq, ti.hasFreq = 0, freq != nil
	if freq != nil {
		ti.freq = freq.LookupBytes(buf)
	}
	ti.suf3 = hashBytes(buf[max(0, len(buf)-3):])
	ti.pre1 = hashBytes(buf[:min(1, len(buf))])
	buf = shapeInto(buf[:0], form)
	ti.shape = hashBytes(buf)
	return buf
}

// appendAloneKeys appends the keys of the features of the word by itself
// (identity, affixes, shape, character classes) in their fixed order, and
// reports whether the word begins with an upper-case letter, which the
// context features need. ti holds the word's hashes (see fill); buf is
// scratch space, returned for reuse. A model with a word-class table adds
// the word's classes (ti.wn); cf, when not nil, adds the word's learned
// class features.
func appendAloneKeys(f []uint64, buf []byte, form string, ti *tokenInfo, cf *classFeatures) ([]uint64, []byte, bool) {
	buf = lowerInto(buf[:0], form)
	f = append(f, key(fBias, 0), key(fForm, hashString(form)), key(fLower, ti.lower), key(fShape, ti.shape))
	if ti.hasWN {
		f = appendClassKeys(f, ti.wn)
	}
	if ti.hasFreq {
		var capital uint64
		if form != "" && 'A' <= form[0] && form[0] <= 'Z' {
			capital = 1
		}
		f = append(f, key(fFreqBand, uint64(ti.freq.Band())), key(fFreqShare, uint64(ti.freq.Share())),
			key2(fFreqShareCap, uint64(ti.freq.Share()), capital))
	}
	if cf != nil {
		if c := cf.table.Class(buf); c >= 0 {
			f = append(f, cf.keys[c][:]...)
		}
	}
	for k := 1; k <= 5 && k < len(buf); k++ {
		f = append(f, key(fSuf1+k-1, hashBytes(buf[len(buf)-k:])))
	}
	for k := 1; k <= 4 && k < len(buf); k++ {
		f = append(f, key(fPre1+k-1, hashBytes(buf[:k])))
	}
	var upperFirst, hasLetter, hasLower, digit, hyphen bool
	letters := 0
	for j, r := range form {
		switch {
		case unicode.IsUpper(r):
			hasLetter = true
			letters++
			if j == 0 {
				upperFirst = true
			}
		case unicode.IsLetter(r):
			hasLetter, hasLower = true, true
			letters++
		case r >= '0' && r <= '9':
			digit = true
		case r == '-':
			hyphen = true
		}
	}
	if hasLetter && !hasLower && letters > 1 {
		f = append(f, key(fAllUpper, 0))
	}
	if digit {
		f = append(f, key(fDigit, 0))
	}
	if hyphen {
		f = append(f, key(fHyphen, 0))
	}
	if !hasLetter {
		f = append(f, key(fNoLetter, 0))
	}
	return f, buf, upperFirst
}

// appendClassKeys appends the keys of a word's WordNet classes: one for
// the whole answer (an unlisted word has one too: function words and
// names are not in WordNet) and one per part of speech.
func appendClassKeys(f []uint64, c wordnet.Classes) []uint64 {
	f = append(f, key(fWNSig, uint64(c.Lemma)|uint64(c.Inflected)<<4|uint64(c.Major)<<8))
	for p := wordnet.Noun; p <= wordnet.Adv; p <<= 1 {
		if c.Lemma&p != 0 {
			f = append(f, key(fWNLemma, uint64(p)))
		}
		if c.Inflected&p != 0 {
			f = append(f, key(fWNInfl, uint64(p)))
		}
	}
	if c.Major != 0 {
		f = append(f, key(fWNMajor, uint64(c.Major)))
	}
	return f
}

// lowerInto appends the lower-cased form to buf without allocating.
func lowerInto(buf []byte, s string) []byte {
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			if 'A' <= c && c <= 'Z' {
				c += 'a' - 'A'
			}
			buf = append(buf, c)
			i++
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		buf = utf8.AppendRune(buf, unicode.ToLower(r))
		i += size
	}
	return buf
}

// shapeInto appends the word's shape: X for upper-case letters, x for
// lower-case, d for digits, other characters as they are, runs of the same
// class folded into one, at most 6 symbols ("Valve-3A" → "Xx-dX").
func shapeInto(buf []byte, s string) []byte {
	var last byte
	for _, r := range s {
		var c byte
		switch {
		case unicode.IsUpper(r):
			c = 'X'
		case unicode.IsLetter(r):
			c = 'x'
		case unicode.IsDigit(r):
			c = 'd'
		case r < utf8.RuneSelf:
			c = byte(r)
		default:
			c = '*'
		}
		if c == last {
			continue
		}
		last = c
		buf = append(buf, c)
		if len(buf) >= 6 {
			break
		}
	}
	return buf
}
