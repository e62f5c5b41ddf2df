package termbase

import (
	"fmt"
	"slices"
	"strings"

	"glossmith/tagger/doc"
)

// BasicPOS are the TBX-Basic part-of-speech values a glossary writes.
var BasicPOS = []string{"noun", "verb", "adjective", "adverb", "other"}

// ValidPOS reports whether a part of speech set by a user is one every
// reader of the termbase understands: "" (none), a TBX-Basic value, or
// UPOS tags one a word as recorded runs store them ("ADJ NOUN"). A typing
// error ("nuon") would otherwise be stored, exported as "other" and
// ignored by check.
func ValidPOS(pos string) bool {
	if pos == "" || slices.Contains(BasicPOS, pos) {
		return true
	}
	tags := strings.Fields(pos)
	return len(tags) > 0 && strings.Join(tags, " ") == pos &&
		!slices.ContainsFunc(tags, func(t string) bool { return !slices.Contains(doc.UPOSTags, t) })
}

// CheckPOS is ValidPOS as an error that says what is wanted.
func CheckPOS(pos string) error {
	if ValidPOS(pos) {
		return nil
	}
	return fmt.Errorf("part of speech %q: want one of %s, or UPOS tags such as NOUN or \"ADJ NOUN\"", pos, strings.Join(BasicPOS, ", "))
}
