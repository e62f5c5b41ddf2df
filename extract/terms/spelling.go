package terms

import (
	"sync"

	"glossmith/tagger/doc"
)

// SpellingOf returns how Collect counts a candidate span of tagged tokens:
// the key of its variant group (lower-cased, hyphens and spaces removed,
// head lemmatized — "Set-points", "set points" and "setpoint" share one)
// and its canonical spelling within the group ("set-point", "set point",
// "setpoint"). Other commands use it to group spans exactly as terms
// does, such as the check for mixed spellings.
func SpellingOf(toks []doc.Token) (key, spelling string) {
	cw := canonPool.Get().(*canonWriter)
	defer canonPool.Put(cw)
	if cw.split(toks, len(toks)) == 0 {
		return "", ""
	}
	cw.write(toks)
	return string(cw.key), string(cw.text)
}

var canonPool = sync.Pool{New: func() any { return new(canonWriter) }}
