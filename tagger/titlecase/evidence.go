package titlecase

import (
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Evidence is what a document's running text says about the capitalized
// words of its headings. General English cannot tell a name made of common
// words ("Climate Master", "Ministry of Water Supply") from the same words
// in title case, nor an acronym that is also a word ("PAN", "ME") in a
// heading written in capitals; the document's own sentences can, since
// there the writer capitalizes only what they mean as a name:
//
//   - a sequence of heading words that running text writes capitalized
//     (not at a sentence start, nor as a reference to a section: "see
//     Filter Maintenance") is a name, and keeps its capitals;
//   - a heading word that running text writes in capitals is an acronym;
//   - a heading word that running text writes in lower case is a common
//     word, whatever the general tables say.
//
// Only the heading's words are looked for, so the evidence stays small.
type Evidence struct {
	// words maps each capitalized heading word, lower-cased, to how
	// running text wrote it (seenLower, seenCaps).
	words map[string]uint8
	// names holds the capitalized sequences of running text made of
	// heading words, lower-cased, words joined by a space.
	names map[string]struct{}
	// longest is the number of tokens of the longest name.
	longest int
	// filter has a bit set for each key of words (filterBit), so that
	// most words of running text need no map look-up.
	filter [16]uint64
}

// How running text wrote a heading word.
const (
	seenLower uint8 = 1 << iota // in lower case
	seenCaps                    // in capitals, in a sentence with lower case too
)

// Gather reads the evidence of a document's running text (its sentences
// that are not headings) for the words of its headings. It returns nil
// when no heading has a capitalized word, after one look at the heading
// flags for a document without headings.
func Gather(sents []doc.Sentence) *Evidence {
	var e *Evidence
	var r runningText
	var buf []byte
	for i := range sents {
		if !sents[i].Heading {
			continue
		}
		r.addHeading(sents[i].Tokens)
		for k := range sents[i].Tokens {
			form := sents[i].Tokens[k].Form
			if upper, _ := caseOf(form); !upper {
				continue
			}
			if e == nil {
				e = &Evidence{words: map[string]uint8{}, names: map[string]struct{}{}}
			}
			buf = appendLower(buf[:0], form)
			if _, ok := e.words[string(buf)]; !ok {
				e.words[string(buf)] = 0
				b := filterBit(buf)
				e.filter[b>>6&15] |= 1 << (b & 63)
			}
		}
	}
	if e == nil {
		return nil
	}
	for i := range sents {
		if !sents[i].Heading {
			r.read(e, sents[i].Tokens)
		}
	}
	return e
}

// runningText is the scratch space of reading one sentence of running
// text into the evidence.
type runningText struct {
	buf    []byte
	inHead []bool // for each token of the current run: a heading word
	// refs holds the document's headings, lower-cased from first word to
	// last, each with its kind (refTask, refTitle): running text that
	// repeats one may refer to that section ("see Filter Maintenance"),
	// and then its capitals are the heading's, not a name's.
	refs map[string]uint8
	// refLongest is the number of tokens of the longest key of refs.
	refLongest int
	// What headings found: the end of the repeat; each a task's heading;
	// a word pointing to a section leads.
	end         int
	tasks, cued bool
	// The answer of isReference for the last run of the sentence asked,
	// and the end of that run or of the headings it repeats; -1 for none.
	lastEnd int
	lastRef bool
	// The sentence's case (sentenceCase), worked out when first needed.
	known, lowerText, names bool
}

// read adds what the sentence toks shows to e: the case of each heading
// word, and its runs of capitalized words. A run is capitalized words in a
// row, joined perhaps by the small words of names ("of", "and", "the");
// it counts only when its first word is not a sentence's or a list item's
// first (see mayStartName), and only in a sentence that has a content word
// in lower case (a line of title case that no reader marked as a heading
// says nothing). Most words of running text are in lower case and in no
// heading: for them read costs a look at two bytes (Evidence.filter).
func (r *runningText) read(e *Evidence, toks []doc.Token) {
	r.known, r.lastEnd = false, -1
	start, last := -1, -1 // the current run's first and last capitalized token
	counts := false       // the current run may be a name: not a sentence's first words
	for k := range toks {
		form := toks[k].Form
		if start < 0 && form != "" && form[0] < utf8.RuneSelf && form[0]-'A' >= 26 {
			// Not capitalized, no run open: only a lower-case heading word counts.
			if form[0]-'a' < 26 && mayHold(e, form) {
				e.sawLower(form)
			}
			continue
		}
		upper, lower := caseOf(form)
		if upper {
			inHead := false
			if r.mayHoldCapitalized(e, form) {
				var flags uint8
				flags, inHead = e.words[string(r.buf)]
				if inHead && flags&seenCaps == 0 && isCaps(form) && r.sentenceCase(toks).lowerText {
					e.words[string(r.buf)] = flags | seenCaps
				}
			}
			if start < 0 {
				initial := k == 0 || !mayStartName(toks[k-1].Form)
				if initial && len(form) <= 4 && isSmallWord(string(appendLower(r.buf[:0], form))) {
					continue // "The" of "The Climate Master controller"
				}
				start, counts = k, !initial
				r.inHead = r.inHead[:0]
			}
			for len(r.inHead) < k-start {
				r.inHead = append(r.inHead, false) // the small words between
			}
			r.inHead = append(r.inHead, inHead)
			last = k
			continue
		}
		if start >= 0 {
			if counts && isSmallWord(form) {
				continue // "of" in "Ministry of Water Supply"; not "the" after "Mount"
			}
			if counts && r.sentenceCase(toks).names {
				r.addNames(e, toks, start, last+1)
			}
			start = -1
		}
		if lower && mayHold(e, form) {
			e.sawLower(form)
		}
	}
	if start >= 0 && counts && r.sentenceCase(toks).names {
		r.addNames(e, toks, start, last+1)
	}
}

// sawLower records that running text writes form, a word in lower case,
// so: if it is a heading word, that heading word is common.
func (e *Evidence) sawLower(form string) {
	if flags, ok := e.words[form]; ok && flags&seenLower == 0 {
		e.words[form] = flags | seenLower
	}
}

// mayHold reports whether a word may be a key of e.words, by its bit of
// e.filter.
func mayHold[S string | []byte](e *Evidence, w S) bool {
	b := filterBit(w)
	return e.filter[b>>6&15]&(1<<(b&63)) != 0
}

// mayHoldCapitalized reports whether the capitalized word form may be a
// heading word, by its bit of e.filter, and leaves its lower case in r.buf
// when it may. Lower-casing does not change an ASCII first or last byte's
// bit.
func (r *runningText) mayHoldCapitalized(e *Evidence, form string) bool {
	if form[0] < utf8.RuneSelf && form[len(form)-1] < utf8.RuneSelf && !mayHold(e, form) {
		return false
	}
	r.buf = appendLower(r.buf[:0], form)
	return mayHold(e, r.buf)
}

// sentenceCase reports, once per sentence, whether it has a lower-case
// letter (else capitals in it say nothing), and whether it has a word in
// lower case after its first that is not one of the small words of names
// (else its capitalized words are a title, not names).
func (r *runningText) sentenceCase(toks []doc.Token) *runningText {
	if r.known {
		return r
	}
	r.known, r.lowerText, r.names = true, false, false
	words := 0
	for k := range toks {
		form := toks[k].Form
		c, _ := utf8.DecodeRuneInString(form)
		if !unicode.IsLetter(c) {
			continue
		}
		words++
		if unicode.IsLower(c) {
			r.lowerText = true
			if words > 1 && !isSmallWord(form) {
				r.names = true
				return r
			}
		} else if !r.lowerText {
			r.lowerText = strings.ContainsFunc(form, unicode.IsLower)
		}
	}
	return r
}

// addNames records the run of capitalized words and small words
// toks[start:end], and each of its parts between small words that has
// two words or more ("Official Journal" of "Official Journal of the Water
// Board"), as far as they are made of heading words. A part of one word is
// left out: "Board" alone is no evidence that a heading's "Board" is a
// name. A run that refers to sections of the document (isReference) is no
// evidence at all.
func (r *runningText) addNames(e *Evidence, toks []doc.Token, start, end int) {
	run := toks[start:end]
	if r.isReference(toks, start, end) {
		return
	}
	from := 0 // the current part's first token
	for k := 0; k <= len(run); k++ {
		if k < len(run) && !isSmallWord(run[k].Form) {
			continue
		}
		if k-from >= 2 && k-from < len(run) && !slices.Contains(r.inHead[from:k], false) {
			r.addName(e, run[from:k])
		}
		from = k + 1
	}
	if r.headingWordsOnly(run) {
		r.addName(e, run)
	}
}

// headingWordsOnly reports whether each word of run that is not a small
// word is a heading word.
func (r *runningText) headingWordsOnly(run []doc.Token) bool {
	for k := range run {
		if !r.inHead[k] && !isSmallWord(run[k].Form) {
			return false
		}
	}
	return true
}

// Kinds of heading in runningText.refs.
const (
	// refTitle: a heading that running text refers to only with a cue
	// (isReferenceCue); without one the same words may be a name ("Mount
	// the Climate Master", heading "Climate Master").
	refTitle uint8 = 1 + iota
	// refTask: a heading that names a task, its first word an -ing form
	// and another following ("Cleaning the Drip Emitters"). Names seldom
	// start so, manuals' section titles often do: running text repeating
	// one refers to it, cue or none.
	refTask
)

// addHeading adds the heading toks to r.refs, from its first word to its
// last ("4.2 Filter Maintenance" as "filter maintenance").
func (r *runningText) addHeading(toks []doc.Token) {
	first, last := -1, -1
	for k := range toks {
		if c, _ := utf8.DecodeRuneInString(toks[k].Form); unicode.IsLetter(c) {
			if first < 0 {
				first = k
			}
			last = k
		}
	}
	if first < 0 {
		return
	}
	kind := refTitle
	if first != last && strings.HasSuffix(strings.ToLower(toks[first].Form), "ing") {
		kind = refTask
	}
	if r.refs == nil {
		r.refs = map[string]uint8{}
	}
	r.refs[string(r.key(toks[first:last+1]))] = kind
	r.refLongest = max(r.refLongest, last+1-first)
}

// isReference reports whether the run toks[start:end] refers to sections
// of the document, as a careful reader takes it: the whole run repeats a
// heading, first word to last, or several joined by "and" (headings), the
// last perhaps going on past the run ("see Filter Maintenance: Daily
// Checks"); and either each is a task's heading (refTask), or a cue
// points to a section (isReferenceCue): "see Filter Maintenance", "refer
// to Filter Maintenance", "described in Filter Maintenance", "in Section
// Filter Maintenance", "the Filter Maintenance section", "see Filter
// Maintenance and Valve Care"; or it goes on a list of references after a
// comma or "or" ("see Filter Maintenance, Valve Care or Winter Storage").
//
// A run that is more than headings ("see Filter Maintenance Records") or
// has no cue ("Mount the Climate Master", heading "Climate Master") stays
// evidence of a name. Quotation marks need no rule here: a capital after
// an opening quote is the writing's (mayStartName), so a quoted run ("see
// “Filter Maintenance”") never counts as a name, nor does a quoted product
// name ("the “Climate Master” controller"), whose evidence comes from
// where the text writes it unquoted. Nor does a run at a sentence's start
// ("Filter Maintenance describes the intervals", "Climate Master units
// ship with a bracket"): its capital is the writing's, name or reference.
func (r *runningText) isReference(toks []doc.Token, start, end int) bool {
	ref, to := r.reference(toks, start, end)
	r.lastEnd, r.lastRef = to, ref
	return ref
}

// maxListItems bounds how far isReference walks back along a list whose
// items the last run's answer does not cover (runs at a sentence's start
// or after a quote are not asked): a sentence of thousands of repeated
// headings costs linear time.
const maxListItems = 8

// reference is isReference, also returning the end of the run or of the
// headings it repeats.
func (r *runningText) reference(toks []doc.Token, start, end int) (bool, int) {
	if len(r.refs) == 0 || !r.inHead[0] && !(end-start > 1 && r.inHead[1] && isLeadWord(toks[start].Form)) {
		return false, end // most runs: not starting with a heading word
	}
	if !r.headings(toks, start, end) {
		return false, end
	}
	if end = r.end; r.tasks || r.cued || isReferenceCue(toks, start, end) {
		return true, end
	}
	// Back along a list, item by item, to a cue.
	to := start - 1
	for items := 0; items < maxListItems && to > 0 && (toks[to].Form == "," || strings.EqualFold(toks[to].Form, "or")); items++ {
		if to == r.lastEnd {
			return r.lastRef, end // the item before, as its run was answered
		}
		from := to
		for from > 0 && to-from <= 2*r.refLongest+2 && isRunWord(toks[from-1].Form) {
			from--
		}
		for from < to && !r.headings(toks, from, to) {
			from++ // "Filter Maintenance" of "Refer to Filter Maintenance"
		}
		if from == to {
			return false, end
		}
		if r.tasks || r.cued || isReferenceCue(toks, from, r.end) {
			return true, end
		}
		to = from - 1
	}
	return false, end
}

// headings reports whether toks[from:to] repeats headings of r.refs, one
// or several joined by "and", perhaps after a word that points to a
// section ("See", "Section", "Chapter"); the last may go on past to, over
// the punctuation that ends a run ("Filter Maintenance: Daily Checks"). It
// sets r.end to the end of the repeat, r.tasks when each is a task's
// heading, and r.cued when such a word leads.
func (r *runningText) headings(toks []doc.Token, from, to int) bool {
	r.tasks, r.cued = true, false
	i := from
	if to-from > 1 && isLeadWord(toks[from].Form) {
		i, r.cued = from+1, true
	}
	for {
		end, kind := r.longestHeading(toks, i)
		if kind == 0 {
			return false
		}
		r.tasks = r.tasks && kind == refTask
		if end >= to {
			r.end = end
			return true
		}
		if !strings.EqualFold(toks[end].Form, "and") {
			return false
		}
		i = end + 1
	}
}

// longestHeading returns the end of the longest heading of r.refs that
// toks repeats from its token i, and its kind; 0 for none. It looks no
// further than a word in lower case that is not a small word: where a
// run of capitalized words ends, mostly, and headings seldom go on.
func (r *runningText) longestHeading(toks []doc.Token, i int) (to int, kind uint8) {
	r.buf = r.buf[:0]
	for j := i; j < len(toks) && j-i < r.refLongest; j++ {
		if _, lower := caseOf(toks[j].Form); lower && !isSmallWord(toks[j].Form) {
			break
		}
		if j > i {
			r.buf = append(r.buf, ' ')
		}
		r.buf = appendLower(r.buf, toks[j].Form)
		if k, ok := r.refs[string(r.buf)]; ok {
			to, kind = j+1, k
		}
	}
	return to, kind
}

// isLeadWord reports a word that, capitalized before a heading in a run,
// points to a section ("See Filter Maintenance", "Section Filter
// Maintenance").
func isLeadWord(form string) bool {
	return isSectionWord(form) || strings.EqualFold(form, "see")
}

// isRunWord reports a token that may stand in a run of capitalized words:
// capitalized, or one of the small words of names.
func isRunWord(form string) bool {
	upper, _ := caseOf(form)
	return upper || isSmallWord(form)
}

// isReferenceCue reports whether the words around toks[from:to] point to
// a section: "see", "under", "section" or "chapter" right before it, "see
// also", "refer to" or "described in" before it, or "section" or
// "chapter" right after it; in any case, "sections" and "chapters" too.
func isReferenceCue(toks []doc.Token, from, to int) bool {
	is := func(k int, w string) bool { return k >= 0 && k < len(toks) && strings.EqualFold(toks[k].Form, w) }
	if to < len(toks) && isSectionWord(toks[to].Form) {
		return true
	}
	switch {
	case from < 1:
		return false
	case is(from-1, "see"), is(from-1, "under"), isSectionWord(toks[from-1].Form):
		return true
	}
	return is(from-1, "also") && is(from-2, "see") ||
		is(from-1, "to") && is(from-2, "refer") ||
		is(from-1, "in") && is(from-2, "described")
}

// isSectionWord reports the words that name a part of a document
// ("section", "Chapter", "sections"), in any case.
func isSectionWord(form string) bool {
	for _, w := range [...]string{"section", "sections", "chapter", "chapters"} {
		if strings.EqualFold(form, w) {
			return true
		}
	}
	return false
}

// key returns the lower case of toks' forms joined by spaces, in r.buf.
func (r *runningText) key(toks []doc.Token) []byte {
	r.buf = r.buf[:0]
	for k := range toks {
		if k > 0 {
			r.buf = append(r.buf, ' ')
		}
		r.buf = appendLower(r.buf, toks[k].Form)
	}
	return r.buf
}

// addName records one name, unless all its words are in capitals: those
// are acronyms (seenCaps), whose capitals a heading in capitals keeps.
func (r *runningText) addName(e *Evidence, name []doc.Token) {
	if !slices.ContainsFunc(name, func(t doc.Token) bool { return !isCaps(t.Form) && !isSmallWord(t.Form) }) {
		return
	}
	if _, ok := e.names[string(r.key(name))]; !ok {
		e.names[string(r.buf)] = struct{}{}
		e.longest = max(e.longest, len(name))
	}
}

// caseOf reports whether a token starts with a capital or with a
// lower-case letter.
func caseOf(form string) (upper, lower bool) {
	if form != "" && form[0] < utf8.RuneSelf {
		return form[0]-'A' < 26, form[0]-'a' < 26
	}
	c, _ := utf8.DecodeRuneInString(form)
	return unicode.IsUpper(c), unicode.IsLower(c)
}

// mayStartName reports whether a capitalized word after the token prev
// can be taken for a name: prev is a word or a comma. After anything else
// writers capitalize a first word too (a colon, a quote, a bracket, a
// list item's "3." or bullet), or the word is a label (the rows of a table
// run together: "Year 2008 Year 2009", "Table 5.2 Blade geometry").
func mayStartName(prev string) bool {
	if prev == "," {
		return true
	}
	first, _ := utf8.DecodeRuneInString(prev)
	last, _ := utf8.DecodeLastRuneInString(prev)
	return unicode.IsLetter(first) && unicode.IsLetter(last)
}

// isSmallWord reports the words names are written with in lower case
// between their capitalized words ("Ministry of Water Supply", "Bureau for
// Soil and Water").
func isSmallWord(form string) bool {
	switch form {
	case "of", "the", "and", "for", "on", "in", "to", "at", "a", "an", "by", "with", "&", "de":
		return true
	}
	return false
}

// isCaps reports a word of two letters or more, all of them capitals.
func isCaps(form string) bool {
	n, ok := capitals(form)
	return ok && n >= 2
}

// appendLower appends the lower case of s to buf, rune by rune (as
// lowered does), so that running text and headings give the same key;
// ASCII byte by byte.
func appendLower(buf []byte, s string) []byte {
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= utf8.RuneSelf {
			for _, r := range s[i:] {
				buf = utf8.AppendRune(buf, unicode.ToLower(r))
			}
			return buf
		}
		if 'A' <= c && c <= 'Z' {
			c += 'a' - 'A'
		}
		buf = append(buf, c)
	}
	return buf
}

// filterBit is the bit of Evidence.filter for a word: the low five bits
// of its first and of its last byte, the same for an ASCII letter in
// either case. w is not empty.
func filterBit[S string | []byte](w S) uint {
	return uint(w[0]&31)<<5 | uint(w[len(w)-1]&31)
}

// nameTokens marks, in a bit set of the first 64 tokens of a heading, the
// tokens of the sequences that running text writes as names.
func (e *Evidence) nameTokens(toks []doc.Token, buf []byte) (uint64, []byte) {
	if e == nil || len(e.names) == 0 {
		return 0, buf
	}
	var marks uint64
	n := min(len(toks), 64)
	for i := 0; i < n; i++ {
		if r, _ := utf8.DecodeRuneInString(toks[i].Form); !unicode.IsUpper(r) {
			continue
		}
		buf = buf[:0]
		for j := i; j < n && j-i < e.longest; j++ {
			if j > i {
				buf = append(buf, ' ')
			}
			buf = appendLower(buf, toks[j].Form)
			if _, ok := e.names[string(buf)]; ok {
				marks |= (uint64(1)<<(j-i+1) - 1) << i
			}
		}
	}
	return marks, buf
}

// seen returns how running text wrote the lower-cased heading word w.
func (e *Evidence) seen(w []byte) uint8 {
	if e == nil {
		return 0
	}
	return e.words[string(w)]
}

// CapitalOfWriting reports whether the capital of the word toks[k] may be
// the writing's rather than the word's: the word is its sentence's first,
// or follows a token after which writers capitalize any word (a colon, a
// quote, a bracket, a list item's "3.": see mayStartName). Elsewhere in
// running text a capital marks a name.
func CapitalOfWriting(toks []doc.Token, k int) bool {
	return k == 0 || !mayStartName(toks[k-1].Form)
}

// OwnCapitals returns the words that the running text of sents (the
// sentences not marked as headings) writes with capitals of their own,
// lower-cased: a word in capitals in a sentence that has lower case too
// (an acronym, as Evidence's seenCaps) but on a line of capitals
// (CapsLine), and a capitalized word where a
// name may start (not CapitalOfWriting) in a sentence with a word in lower
// case after its first (a name: "the Vavleco pumps"). The capitals of a
// sentence's first word, of a heading or of a line of title case say
// nothing of the word and are not counted. keep, given a word's lower
// case, tells which words to record, so that the set stays small.
func OwnCapitals(sents []doc.Sentence, keep func(lower []byte) bool) map[string]struct{} {
	own := map[string]struct{}{}
	var r runningText
	for i := range sents {
		if sents[i].Heading {
			continue
		}
		toks := sents[i].Tokens
		r.known = false
		line, capsLine := int32(-1), false // the line capsLine speaks of
		for k := range toks {
			form := toks[k].Form
			if upper, _ := caseOf(form); !upper {
				continue
			}
			if isCaps(form) {
				if !r.sentenceCase(toks).lowerText {
					continue // a sentence in capitals
				}
				if toks[k].Line != line {
					line, capsLine = toks[k].Line, CapsLine(toks, k)
				}
				if capsLine {
					continue // a line in capitals, run into the next sentence
				}
			} else if CapitalOfWriting(toks, k) || !r.sentenceCase(toks).names {
				continue
			}
			if r.buf = appendLower(r.buf[:0], form); keep(r.buf) {
				own[string(r.buf)] = struct{}{}
			}
		}
	}
	return own
}

// CapsLine reports whether the word toks[k] stands on a line of capitals:
// the tokens of toks on its line (LineOf) have two words or more and no
// letter in lower case ("SOLENOID VAVLE REPLACED ON TANK 2", which a
// sentence splitter may run into the sentence below). There capitals are
// the writing's, as in a heading in capitals; among lower-case words a
// word in capitals may be an acronym, and a line of one word too.
func CapsLine(toks []doc.Token, k int) bool {
	from, to := LineOf(toks, k)
	return words(toks[from:to]) >= 2 && AllCaps(toks[from:to])
}

// LineOf returns the tokens of toks on the line of toks[k] (doc.Token.Line)
// as toks[from:to].
func LineOf(toks []doc.Token, k int) (from, to int) {
	from, to = k, k+1
	for from > 0 && toks[from-1].Line == toks[k].Line {
		from--
	}
	for to < len(toks) && toks[to].Line == toks[k].Line {
		to++
	}
	return from, to
}
