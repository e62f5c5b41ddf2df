package review

import "fmt"

// Status is what the page shows of a candidate's decision.
type Status string

// The statuses: a candidate without a decision is New; Accepted means the
// termbase holds it as a preferred or admitted term; Variant that it is a
// form of another entry's term; Acronym and FullForm that the documents
// define it as the acronym of an accepted term, or with an accepted
// acronym (the other term of that concept); Deferred that a reviewer put
// it off.
const (
	New        Status = "new"
	Accepted   Status = "accepted"
	Rejected   Status = "rejected"
	Deferred   Status = "deferred"
	Variant    Status = "variant"
	Acronym    Status = "acronym"
	FullForm   Status = "full form"
	Deprecated Status = "deprecated"
)

// Decision is what the termbase holds about one candidate.
type Decision struct {
	Status     Status            `json:"status"`
	Entry      string            `json:"entry,omitempty"`     // the preferred term of the entry it belongs to, when another
	Preferred  string            `json:"preferred,omitempty"` // the form chosen as preferred
	Forms      map[string]string `json:"forms,omitempty"`     // form → admitted, deprecated or preferred
	Concept    []string          `json:"concept,omitempty"`   // the other terms of its entry (one concept)
	Definition string            `json:"definition,omitempty"`
	Note       string            `json:"note,omitempty"`
	POS        string            `json:"pos,omitempty"`
}

// Reviewed reports whether the candidate has a decision.
func (d Decision) Reviewed() bool { return d.Status != "" && d.Status != New }

// Kind names an action of the review page.
type Kind string

// The actions. Prefer, Admit and Deprecate take a Form; Merge takes the
// Other candidate; Definition, Note and POS take a Text.
const (
	Accept     Kind = "accept"
	Reject     Kind = "reject"
	Defer      Kind = "defer"
	Prefer     Kind = "prefer"
	Admit      Kind = "admit"
	Deprecate  Kind = "deprecate"
	Merge      Kind = "merge"
	Definition Kind = "definition"
	Note       Kind = "note"
	SetPOS     Kind = "pos"
)

// Kinds lists the actions a Store applies (undo is a call of its own).
var Kinds = []Kind{Accept, Reject, Defer, Prefer, Admit, Deprecate, Merge, Definition, Note, SetPOS}

// Action is one decision on a candidate.
type Action struct {
	Kind  Kind   `json:"kind"`
	Term  string `json:"term"`
	Form  string `json:"form,omitempty"`
	Other string `json:"other,omitempty"`
	Text  string `json:"text,omitempty"`
}

// Check reports an action that cannot be applied as given.
func (a Action) Check() error {
	known := false
	for _, k := range Kinds {
		known = known || k == a.Kind
	}
	switch {
	case !known:
		return fmt.Errorf("unknown action %q", a.Kind)
	case a.Term == "":
		return fmt.Errorf("%s: no term", a.Kind)
	case (a.Kind == Prefer || a.Kind == Admit || a.Kind == Deprecate) && a.Form == "":
		return fmt.Errorf("%s: no form", a.Kind)
	case a.Kind == Merge && (a.Other == "" || a.Other == a.Term):
		return fmt.Errorf("merge: name another candidate")
	case len(a.Text) > MaxText:
		return fmt.Errorf("%s: text longer than %d bytes", a.Kind, MaxText)
	}
	return nil
}

// MaxText bounds a definition, note or part of speech.
const MaxText = 8 << 10

// Store keeps decisions: a termbase. Each Apply and Undo is one
// transaction, written before it returns.
type Store interface {
	// Lookup returns the decisions on the named candidates; a candidate
	// the store knows nothing of is left out.
	Lookup(terms []string) (map[string]Decision, error)
	// Apply records one action.
	Apply(a Action) error
	// Undo takes back the latest change made through this store, unless a
	// change made elsewhere came after it (an error); false when there is none.
	Undo() (bool, error)
}
