// Package tbx reads and writes TermBase eXchange files (ISO 30042:2019,
// TBX v3) in the two dialects glossaries are exchanged in: TBX-Core (the
// core structure alone; every datum a note) and TBX-Basic (the data
// categories subject field, definition, source, context, part of speech
// and administrative status).
//
// The reader takes both styles of TBX-Basic — data categories as
// attributes (DCA: <termNote type="partOfSpeech">) and as tags (DCT:
// <min:partOfSpeech>) — and TBX-Core; data categories it has no field for
// are kept as notes "category: value", so nothing of a term is dropped.
// Transaction groups (who changed an entry when) are skipped.
//
// The writer writes TBX-Core, and TBX-Basic in DCA style (all elements in
// the TBX namespace, so the core RELAX NG schema and the TBX-Basic DCA
// Schematron rules both apply). A document with no entries still
// validates: the schemas require one concept entry, so an empty list is
// written as one entry, id "glossmith-empty", whose one term is empty; the
// reader skips it.
package tbx

import (
	"strings"
)

// Namespace is the TBX v3 namespace.
const Namespace = "urn:iso:std:iso:30042:ed-2"

// The dialects.
const (
	Core  = "TBX-Core"
	Basic = "TBX-Basic"
)

// EmptyID is the id of the placeholder entry of an empty document.
const EmptyID = "glossmith-empty"

// Document is a TBX file's content.
type Document struct {
	Dialect string // Core or Basic
	Lang    string // the document's language (xml:lang of <tbx>), BCP 47
	Source  string // what the glossary was made from (the header's source description)
	Entries []Entry
}

// Entry is one concept entry.
type Entry struct {
	ID          string
	Subject     string
	Definitions []Definition
	Notes       []string
	// CrossRefs point to other entries of the document (TBX-Basic
	// crossReference); a target that is no entry's id, and every one under
	// TBX-Core, is written as the note "see: TEXT".
	CrossRefs []CrossRef
	Terms     []Term
}

// CrossRef is a reference to another entry: its id and the text shown.
type CrossRef struct {
	Target string
	Text   string
}

// Definition is a definition in one language, with its source.
type Definition struct {
	Lang   string
	Text   string
	Source string
}

// Term is one term of an entry.
type Term struct {
	Lang   string
	Text   string
	POS    string // a TBX-Basic part of speech: noun, verb, adjective, adverb, other
	Status string // a TBX-Basic administrative status, e.g. preferredTerm-admn-sts; "" for none
	// Type is a TBX-Basic term type: fullForm, acronym, abbreviation,
	// shortForm, variant or phrase; "" for none. TBX-Basic writes it as the
	// termType data category, TBX-Core as the note "term type: …".
	Type     string
	Contexts []Context
	Notes    []string
}

// Context is an example sentence with its source.
type Context struct {
	Text   string
	Source string
}

// The administrative statuses of TBX-Basic.
const (
	PreferredStatus  = "preferredTerm-admn-sts"
	AdmittedStatus   = "admittedTerm-admn-sts"
	DeprecatedStatus = "deprecatedTerm-admn-sts"
	SupersededStatus = "supersededTerm-admn-sts"
)

// BasicPOS maps a part of speech — a TBX-Basic value, a Universal
// Dependencies tag (UPOS) or a sequence of UPOS tags of a multiword term —
// to the TBX-Basic values (noun, verb, adjective, adverb, other; "" stays
// ""). A sequence is named by its head: noun when it holds a noun, else
// its last word's.
func BasicPOS(pos string) string {
	f := strings.Fields(pos)
	if len(f) == 0 {
		return ""
	}
	head := f[len(f)-1]
	for _, p := range f {
		switch strings.ToUpper(p) {
		case "NOUN", "PROPN":
			head = "NOUN"
		}
	}
	switch strings.ToUpper(head) {
	case "NOUN", "PROPN":
		return "noun"
	case "VERB", "AUX":
		return "verb"
	case "ADJ", "ADJECTIVE":
		return "adjective"
	case "ADV", "ADVERB":
		return "adverb"
	}
	return "other"
}
