package tokenize

import (
	_ "embed"
	"strconv"
	"strings"
	"unicode/utf8"
)

// abbrevText is the abbreviation list learned from UD EWT 2.15 training
// data by internal/mkabbrev (CC BY-SA 4.0; see the file header).
//
//go:embed abbrev.txt
var abbrevText string

// abbrevInfo says how an abbreviation behaves at a sentence end.
type abbrevInfo struct {
	// mayEnd: the treebank shows the word ending sentences often enough
	// ("etc.", "p.m.") that a following capital starts a new sentence.
	mayEnd bool
}

// abbrevs maps an abbreviation with its period ("Dr.", "etc.") to its info.
var abbrevs = func() map[string]abbrevInfo {
	m := parseAbbrevs(abbrevText)
	for _, a := range extraAbbrevs {
		if _, ok := m[a]; !ok {
			m[a] = abbrevInfo{}
		}
	}
	return m
}()

// abbrevShapes holds the shapes of the abbreviations without their
// period, in any case: isAbbrev tests it before looking a word up.
var abbrevShapes = func() (f shapeFilter) {
	for a := range abbrevs {
		if a != "" {
			f.add(a[:len(a)-1])
		}
	}
	return f
}()

// extraAbbrevs supplement the learned list with abbreviations common in
// technical and business English that the treebank happens to lack or has
// only in another case (abbreviations in common use in English technical
// and business writing, chosen by hand).
// None of them is taken to end a sentence before a capital, so words that
// often end one after a number ("5 min.", "10 sec.") are left out.
var extraAbbrevs = []string{
	"approx.", "Approx.", "appr.", "ca.", "cf.", "Cf.", "ch.", "Ch.", "dept.", "Dept.",
	"eds.", "eq.", "Eq.", "Eqn.", "Eqs.", "esp.", "excl.", "fig.", "Fig.", "figs.", "Figs.",
	"incl.", "Incl.", "Max.", "Min.", "nos.", "Nos.", "p.", "pp.", "ref.", "Ref.", "Refs.",
	"resp.", "Sec.", "tab.", "Tab.", "vol.", "Vol.", "vs.", "viz.",
	"Asst.", "Assoc.", "Capt.", "Cmdr.", "Col.", "Drs.", "Gen.", "Hon.", "Lt.", "Maj.",
	"Messrs.", "Mmes.", "Mr.", "Mrs.", "Ms.", "Prof.", "Profs.", "Rep.", "Sen.", "Sgt.",
	"Sr.", "Jr.", "St.", "Sts.", "Ave.", "Blvd.", "Rd.", "Mt.", "Ft.",
	"Bros.", "Co.", "Corp.", "Div.", "Inc.", "Ltd.", "LTD.", "Mgr.", "Pvt.", "PVT.", "Univ.",
	"Jan.", "Feb.", "Apr.", "Jun.", "Jul.", "Aug.", "Sep.", "Sept.", "Oct.", "Nov.", "Dec.",
	"Mon.", "Tue.", "Tues.", "Wed.", "Thu.", "Thurs.", "Fri.",
}

// mayEndRatio: an abbreviation may end a sentence when at least one in
// mayEndRatio of its treebank uses is sentence-final. On EWT dev, 2 to 5
// give the best sentence F1 (0.8664); 1 gives 0.8656, 10 0.8662, 100
// (almost no abbreviation ends a sentence) 0.8645.
const mayEndRatio = 5

func parseAbbrevs(text string) map[string]abbrevInfo {
	m := map[string]abbrevInfo{}
	for _, line := range strings.Split(text, "\n") {
		if line == "" || line[0] == '#' {
			continue
		}
		f := strings.Split(line, "\t")
		if len(f) != 3 {
			continue
		}
		inside, err1 := strconv.Atoi(f[1])
		final, err2 := strconv.Atoi(f[2])
		if err1 != nil || err2 != nil {
			continue
		}
		m[f[0]] = abbrevInfo{mayEnd: final > 0 && final*mayEndRatio >= inside}
	}
	return m
}

// hyphenPrefixes are the prefixes that UD EWT keeps joined to the rest of
// the word by a hyphen ("e-mail", "non-stop", "re-run"), while other
// hyphenated compounds are split ("search - engine"). Measured on EWT 2.15
// train+dev, times kept joined / split: e 45/2, non 30/0, anti 15/0,
// pre 15/0, re 14/0, mid 13/0, post 7/0, over 7/0, co 7/0, pro 5/0,
// multi 5/0, ex 4/0, semi 4/0, sub 3/1, cross, neo, counter, psycho 2/0,
// socio, arch, intra, un, mis 1/0, micro 1/1; not taken: vice 2/3,
// self 0/13, well 0/17. The remaining entries (inter, extra, ultra, bi, …)
// follow the same guideline and are common practice.
var hyphenPrefixes = map[string]bool{
	"e": true, "non": true, "anti": true, "pre": true, "re": true, "mid": true,
	"post": true, "over": true, "co": true, "pro": true, "multi": true, "ex": true,
	"semi": true, "sub": true, "cross": true, "neo": true, "counter": true,
	"psycho": true, "socio": true, "arch": true, "intra": true, "un": true,
	"mis": true, "inter": true, "extra": true, "ultra": true, "bi": true,
	"tri": true, "micro": true, "mega": true, "mini": true, "pseudo": true,
	"quasi": true, "macro": true, "hyper": true, "infra": true, "trans": true,
}

// contractions maps clitic spellings without an apostrophe that UD EWT
// splits into two syntactic words ("dont" = "do" + "nt", "cannot" = "can"
// + "not", "gonna" = "gon" + "na"), in lower case, to the byte length of
// their first word. Ambiguous spellings ("its", "lets", "hes", "ill") are
// left whole.
var contractions = map[string]int{
	"im": 1, "ive": 1,
	"dont": 2, "cant": 2, "wont": 2, "isnt": 2, "aint": 2,
	"didnt": 3, "wasnt": 3, "arent": 3, "hasnt": 3, "hadnt": 3, "youre": 3,
	"cannot": 3, "gonna": 3, "wanna": 3, "gotta": 3, "outta": 3,
	"doesnt": 4, "werent": 4, "havent": 4, "thats": 4, "whats": 4,
	"couldnt": 5, "wouldnt": 5, "theres": 5,
	"shouldnt": 6,
}

// contractionShapes rules out, for nearly every word, that it is one of
// the contractions (this runs for every word).
var contractionShapes = func() (f shapeFilter) {
	for w := range contractions {
		f.add(w)
	}
	return f
}()

// contraction returns the byte length of the first word of w when w is
// one of the contractions in any case, or 0.
func contraction(w string) int {
	if len(w) > 8 || !contractionShapes.has(w) {
		return 0
	}
	var buf [8]byte
	for k := 0; k < len(w); k++ {
		c := w[k]
		if c >= utf8.RuneSelf {
			return 0
		}
		buf[k] = foldByte(c)
	}
	return contractions[string(buf[:len(w)])]
}

// shapeFilter is a set of word shapes — length, first and last byte, ASCII
// letters in lower case — in a 4096-bit table. Testing it rules out most
// words before a look-up in a set of words, so that the tokenizer's checks
// made for every word (contractions) or every word before a period
// (abbreviations) rarely lower-case and hash a string. Shapes collide, so
// a hit must be confirmed by the look-up.
type shapeFilter [4096 / 64]uint64

func (f *shapeFilter) add(w string) {
	h := shapeOf(w)
	f[h/64] |= 1 << (h % 64)
}

func (f *shapeFilter) has(w string) bool {
	h := shapeOf(w)
	return f[h/64]&(1<<(h%64)) != 0
}

// shapeOf returns the bit of w's shape in a shapeFilter.
func shapeOf(w string) uint32 {
	if w == "" {
		return 0
	}
	key := uint32(len(w))<<16 | uint32(foldByte(w[0]))<<8 | uint32(foldByte(w[len(w)-1]))
	return key * 0x9e3779b1 >> 20 // Fibonacci hashing to 12 bits
}

// foldByte lower-cases an ASCII letter and leaves every other byte.
func foldByte(c byte) byte {
	if 'A' <= c && c <= 'Z' {
		c += 'a' - 'A'
	}
	return c
}

// cliticSuffixes follow an apostrophe and are split off as words of their
// own ("it's" = "it" + "'s"), as UD EWT does.
var cliticSuffixes = map[string]bool{"s": true, "re": true, "ve": true, "ll": true, "d": true, "m": true}

// units are split off a number they are written against ("5 kg",
// "11:30 am", "3 M"), as EWT 2.15 does; other letters stay joined ("1980s",
// "5th", "83N", "4gamer"). Keys are lower case. The EWT train counts of
// split units: m 44, pm 38, k 20, am 19, b 11, M 6, mm 4, ft 4, x 4, bn 3,
// cm 3, kg 2; the SI and computing units beyond them are common practice.
var units = map[string]bool{
	"m": true, "mm": true, "cm": true, "km": true, "g": true, "kg": true, "mg": true,
	"lb": true, "lbs": true, "oz": true, "ft": true, "k": true, "b": true, "bn": true,
	"am": true, "pm": true, "x": true, "hz": true, "khz": true, "mhz": true, "ghz": true,
	"v": true, "kv": true, "mv": true, "vac": true, "vdc": true, "w": true, "kw": true,
	"kwh": true, "mw": true, "mwh": true, "a": true, "ma": true, "ml": true, "l": true,
	"min": true, "mins": true, "hr": true, "hrs": true, "h": true, "sec": true,
	"kb": true, "mb": true, "gb": true, "tb": true, "bar": true, "mbar": true,
	"kpa": true, "pa": true, "psi": true, "nm": true, "rpm": true, "mph": true, "kph": true,
}

// emoticons are kept as single tokens (EWT has ":)", ":-)", ":D", "^_^", …).
// Longest first, so that ":-)" wins over ":-".
var emoticons = []string{
	":-))", ":'-(", ":-)", ":-(", ":-D", ":-P", ":-p", ";-)", ":-/", ":'(",
	"^_^", ":))", ":)", ":(", ":D", ":P", ":p", ":O", ":o", ";)", ";D", ";P",
	"=)", "=(", "^^", "<3", ":/",
}
