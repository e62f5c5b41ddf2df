// Package check finds, in annotated documents, the uses of a glossary's
// terms that a writer should change: deprecated and forbidden terms, and
// spellings of a term other than its preferred form (hyphen, space or
// closed spellings, case where case matters, inflected forms through their
// lemmas). With Variants it also reports variant groups spelled more than
// one way across the documents and within each.
//
// The glossary comes in as a small value of this package (Glossary), so the
// check does not depend on where it is stored; the command adapts the
// termbase to it. All of an entry's forms are compiled into one automaton
// (see Matcher): a document is scanned once, whatever the glossary's size.
package check

import (
	"fmt"
	"strings"
)

// Status is a form's standing in the glossary (the TBX-Basic administrative
// statuses, with forbidden for terms a team has rejected outright).
type Status uint8

const (
	Preferred Status = iota
	Admitted
	Deprecated
	Forbidden
)

var statusNames = [...]string{"preferred", "admitted", "deprecated", "forbidden"}

func (s Status) String() string {
	if int(s) < len(statusNames) {
		return statusNames[s]
	}
	return fmt.Sprintf("status(%d)", s)
}

// ParseStatus reads a status name: the four above, and the TBX-Basic
// spellings "preferredTerm-admn-sts", "admittedTerm-admn-sts",
// "deprecatedTerm-admn-sts" and "supersededTerm-admn-sts" (superseded is
// deprecated).
func ParseStatus(s string) (Status, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "preferred", "preferredterm-admn-sts":
		return Preferred, nil
	case "admitted", "admittedterm-admn-sts":
		return Admitted, nil
	case "deprecated", "deprecatedterm-admn-sts", "supersededterm-admn-sts", "superseded":
		return Deprecated, nil
	case "forbidden", "rejected":
		return Forbidden, nil
	}
	return 0, fmt.Errorf("unknown term status %q (want preferred, admitted, deprecated or forbidden)", s)
}

// allowed reports whether a writer may use a form of this status.
func (s Status) allowed() bool { return s == Preferred || s == Admitted }

// Form is one term of an entry.
type Form struct {
	Text   string
	Status Status
	// POS is the term's part of speech as the glossary gives it ("noun",
	// "verb", "adjective", "adverb" or a UPOS tag); empty when unknown. A
	// use whose head word the tagger tagged as an incompatible word class
	// is not the term ("we set points" is no use of the noun "set point").
	POS string
	// CaseSensitive forms match only as written: "PLC" is not "plc".
	CaseSensitive bool
}

// Entry is one concept with its terms.
type Entry struct {
	// ID names the entry in findings (the termbase's entry id).
	ID    string
	Forms []Form
}

// Preferred returns the term writers should use: the entry's first
// preferred form, else its first admitted form, else "".
func (e *Entry) Preferred() string {
	for _, st := range []Status{Preferred, Admitted} {
		for _, f := range e.Forms {
			if f.Status == st {
				return f.Text
			}
		}
	}
	return ""
}

// Glossary is what the check compares documents with.
type Glossary struct {
	Entries []Entry
}
