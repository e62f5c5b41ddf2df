package pattern

import (
	"fmt"
	"strings"
	"unicode"

	"glossmith/tagger/doc"
)

// fakeTags is a hand-written lexicon: the UPOS and Penn tag that a tagger
// trained on the Universal Dependencies English Web Treebank gives each word
// of the stock rule examples in their context (following the UD English
// EWT annotation: "off" after a verb is ADP/RP, "their" is PRON/PRP$,
// "today" and "tonight" are NOUN/NN). It stands in for the real tagger in unit
// tests; `glossmith rules check` runs the examples through the real one.
var fakeTags = map[string]string{
	"a": "DET DT", "vent": "VERB VB", "install": "VERB VB", "noon": "NOUN NN", "climate": "NOUN NN", "after": "ADP IN", "air": "NOUN NN", "always": "ADV RB", "and": "CCONJ CC",
	"at": "ADP IN", "automatic": "ADJ JJ", "before": "ADP IN", "bench": "NOUN NN", "body": "NOUN NN",
	"both": "DET DT", "calibrate": "VERB VB", "checked": "VERB VBD", "close": "VERB VB",
	"compensating": "VERB VBG", "controller": "NOUN NN", "controllers": "NOUN NNS", "cracks": "NOUN NNS",
	"crew": "NOUN NN", "dawn": "NOUN NN", "display": "NOUN NN", "drip": "NOUN NN", "dropped": "VERB VBD",
	"dry": "ADJ JJ", "during": "ADP IN", "each": "DET DT", "ec": "PROPN NNP", "emitter": "NOUN NN",
	"escape": "VERB VB", "feeding": "NOUN NN", "fine": "ADJ JJ", "first": "ADV RB", "fit": "VERB VB",
	"flow": "NOUN NN", "flush": "VERB VB", "for": "ADP IN", "free": "ADJ JJ", "frost": "NOUN NN",
	"fully": "ADV RB", "gravel": "NOUN NN", "heavily": "ADV RB", "humid": "ADJ JJ", "humidity": "NOUN NN",
	"hydrants": "NOUN NNS", "i": "PRON PRP", "in": "ADP IN", "inspect": "VERB VB", "is": "AUX VBZ",
	"it": "PRON PRP", "layer": "NOUN NN", "left": "VERB VBD", "let": "VERB VBD", "line": "NOUN NN",
	"list": "NOUN NN", "low": "ADJ JJ", "loss": "NOUN NN", "main": "ADJ JJ", "most": "ADJ JJS", "mount": "VERB VB",
	"never": "ADV RB", "new": "ADJ JJ", "north": "ADJ JJ", "of": "ADP IN", "off": "ADP RP", "old": "ADJ JJ",
	"on": "ADP IN", "open": "VERB VB", "operating": "VERB VBG", "outage": "NOUN NN", "outside": "ADV RB",
	"overnight": "ADV RB", "plcs": "PROPN NNPS", "please": "INTJ UH", "pot": "NOUN NN", "pots": "NOUN NNS",
	"pressure": "NOUN NN", "pump": "NOUN NN", "quick": "ADJ JJ", "quickly": "ADV RB", "radio": "NOUN NN",
	"rained": "VERB VBD", "rate": "NOUN NN", "reading": "NOUN NN", "replace": "VERB VB",
	"restarted": "VERB VBD", "restarts": "VERB VBZ", "rose": "VERB VBD", "saw": "VERB VBD",
	"seals": "NOUN NNS", "sensor": "NOUN NN", "shown": "VERB VBN", "shut": "VERB VB", "signal": "NOUN NN",
	"slowly": "ADV RB", "so": "ADV RB", "soon": "ADV RB", "sowing": "NOUN NN", "spread": "VERB VB",
	"stainless": "ADJ JJ", "stall": "VERB VBP", "stay": "VERB VB", "stayed": "VERB VBD", "steel": "NOUN NN",
	"stopped": "VERB VBD", "storms": "NOUN NNS", "suddenly": "ADV RB", "supply": "NOUN NN", "the": "DET DT",
	"their": "PRON PRP$", "them": "PRON PRP", "they": "PRON PRP", "to": "ADP IN", "tonight": "NOUN NN",
	"turn": "VERB VB", "twice": "ADV RB", "two": "NUM CD", "under": "ADP IN", "valve": "NOUN NN",
	"vents": "NOUN NNS", "very": "ADV RB", "warm": "ADJ JJ", "was": "AUX VBD", "watch": "VERB VB",
	"way": "NOUN NN", "we": "PRON PRP", "weekly": "ADV RB", "went": "VERB VBD", "will": "AUX MD",
	"worked": "VERB VBD",
	".":      "PUNCT .", ",": "PUNCT ,", "-": "PUNCT HYPH",
}

// fakeAnalyze splits text into one sentence of tokens, cutting at spaces
// and around punctuation (a hyphen inside a word becomes its own token, as
// in UD English tokenization), and tags every token from fakeTags.
func fakeAnalyze(text string) ([]doc.Sentence, error) {
	var toks []doc.Token
	start := -1
	flush := func(end int) error {
		if start < 0 {
			return nil
		}
		form := text[start:end]
		tags, ok := fakeTags[strings.ToLower(form)]
		if !ok {
			return fmt.Errorf("fake tagger: no tags for %q", form)
		}
		upos, xpos, _ := strings.Cut(tags, " ")
		toks = append(toks, doc.Token{Form: form, Start: int32(start), End: int32(end), Line: 1,
			Lemma: strings.ToLower(form), UPOS: upos, XPOS: xpos})
		start = -1
		return nil
	}
	for i, r := range text {
		switch {
		case unicode.IsSpace(r):
			if err := flush(i); err != nil {
				return nil, err
			}
		case r == '.' || r == ',' || r == '-':
			if err := flush(i); err != nil {
				return nil, err
			}
			start = i
			if err := flush(i + 1); err != nil {
				return nil, err
			}
		default:
			if start < 0 {
				start = i
			}
		}
	}
	if err := flush(len(text)); err != nil {
		return nil, err
	}
	for i := range toks {
		toks[i].SpaceAfter = i+1 < len(toks) && toks[i].End < toks[i+1].Start
	}
	return []doc.Sentence{{Tokens: toks}}, nil
}
