// Package termio moves a termbase's entries in and out of files: TBX (Core
// and Basic, through package tbx), CSV and TSV with a header of named
// columns, JSON Lines, and an XLSX review sheet for a subject expert whose
// decision and comment columns come back as verdicts.
//
// The CSV/TSV columns (matched by name, in any order, case ignored):
//
//	concept       rows with the same value are terms of one entry (absent or empty: each row its own entry)
//	term          the term (required)
//	lang          its language (default: the importer's)
//	status        preferred, admitted, deprecated, candidate, deferred, rejected
//	              (or the TBX-Basic names, preferredTerm-admn-sts …; superseded counts as deprecated)
//	pos           part of speech
//	subject       the entry's subject field
//	definition    the entry's definition; source: where it comes from
//	note          the term's notes, one per line of the cell
//	concept_note  the entry's notes, one per line of the cell
//	decision      a reviewer's verdict (accept, reject, defer, preferred, admitted, deprecated);
//	comment       a reviewer's comment
//
// Other columns are kept as the term's notes "column: value". A file with a
// decision column is a review: its rows with a decision or comment are
// verdicts and nothing else is imported.
package termio

import (
	"fmt"
	"strings"

	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
)

// Problem is a row or datum that could not be used.
type Problem struct {
	File string
	Line int // 0 when the problem is the whole file's
	Msg  string
}

func (p Problem) Error() string {
	if p.Line > 0 {
		return fmt.Sprintf("%s:%d: %s", p.File, p.Line, p.Msg)
	}
	return p.File + ": " + p.Msg
}

// Import is what a file holds for the termbase.
type Import struct {
	Entries  []*termbase.Entry
	Verdicts []termbase.Verdict
	Problems []Problem
}

// Notes glossmith writes into TBX to keep what TBX has no category for.
const (
	noteStatus = "glossmith status: "
	noteForms  = "surface forms: "
)

// FromTBX turns a TBX document into termbase entries: the definition in
// the document's language (else the first) is the entry's, others become
// notes; statuses map to the termbase's (superseded to deprecated, with a
// note); a context's source "DOC, line N" gives its document and line.
func FromTBX(doc *tbx.Document) []*termbase.Entry {
	out := make([]*termbase.Entry, 0, len(doc.Entries))
	for _, e := range doc.Entries {
		n := &termbase.Entry{ExtID: e.ID, Subject: e.Subject, Notes: e.Notes}
		for _, r := range e.CrossRefs {
			// The termbase has no cross-references: kept as a note.
			n.Notes = append(n.Notes, "see: "+r.Text)
		}
		def := -1
		for i, d := range e.Definitions {
			if def < 0 || (d.Lang == doc.Lang && e.Definitions[def].Lang != doc.Lang) {
				def = i
			}
		}
		for i, d := range e.Definitions {
			if i == def {
				n.Definition, n.DefSource = d.Text, d.Source
				continue
			}
			note := "definition (" + d.Lang + "): " + d.Text
			if d.Source != "" {
				note += " (source: " + d.Source + ")"
			}
			n.Notes = append(n.Notes, note)
		}
		for _, t := range e.Terms {
			x := &termbase.Term{Lang: t.Lang, Text: t.Text, POS: t.POS}
			if x.Lang == "" {
				x.Lang = doc.Lang
			}
			if t.Type != "" {
				// The termbase has no term type: kept as a note.
				x.Notes = append(x.Notes, "term type: "+t.Type)
			}
			if st, deferred, note, ok := parseStatus(t.Status); ok {
				x.Status, x.Deferred = st, deferred
				if note != "" {
					x.Notes = append(x.Notes, note)
				}
			} else {
				x.Notes = append(x.Notes, "administrative status: "+t.Status)
			}
			for _, note := range t.Notes {
				switch {
				case strings.HasPrefix(note, noteStatus):
					st := strings.TrimPrefix(note, noteStatus)
					if st == "deferred" {
						x.Status, x.Deferred = termbase.Candidate, true
					} else if s, err := termbase.ParseStatus(st); err == nil {
						x.Status = s
					}
				case strings.HasPrefix(note, noteForms):
					x.Forms = append(x.Forms, strings.Split(strings.TrimPrefix(note, noteForms), "; ")...)
				default:
					x.Notes = append(x.Notes, note)
				}
			}
			for _, c := range t.Contexts {
				x.Contexts = append(x.Contexts, contextFrom(c.Text, c.Source))
			}
			n.Terms = append(n.Terms, x)
		}
		out = append(out, n)
	}
	return out
}

// contextFrom reads a context's source back into document and line when
// it has the form glossmith writes ("DOC, line N").
func contextFrom(text, source string) termbase.Context {
	c := termbase.Context{Text: text, Source: source}
	if i := strings.LastIndex(source, ", line "); i > 0 {
		var line int
		if _, err := fmt.Sscanf(source[i+len(", line "):], "%d", &line); err == nil && fmt.Sprint(line) == source[i+len(", line "):] {
			c.Doc, c.Line, c.Source = source[:i], line, ""
		}
	}
	return c
}

// contextSource is the source written for a context.
func contextSource(c termbase.Context) string {
	if c.Source != "" {
		return c.Source
	}
	if c.Doc != "" {
		return fmt.Sprintf("%s, line %d", c.Doc, c.Line)
	}
	return ""
}

// conceptID is the id an entry is exported with: the id it was imported
// with, else one made from its number.
func conceptID(e *termbase.Entry) string {
	if e.ExtID != "" {
		return e.ExtID
	}
	return fmt.Sprintf("e%d", e.ID)
}

// ToTBX turns entries into a TBX document of the dialect (tbx.Core or
// tbx.Basic). Candidates and rejected terms, which TBX has no
// administrative status for, carry a note "glossmith status: …"; surface
// forms a note "surface forms: …"; both are read back by FromTBX.
func ToTBX(entries []*termbase.Entry, dialect, lang, source string) *tbx.Document {
	doc := &tbx.Document{Dialect: dialect, Lang: lang, Source: source}
	for _, e := range entries {
		n := tbx.Entry{ID: conceptID(e), Subject: e.Subject, Notes: e.Notes}
		if e.Definition != "" {
			dl := lang
			if p := e.Head(lang); p != nil {
				dl = p.Lang
			}
			n.Definitions = []tbx.Definition{{Lang: dl, Text: e.Definition, Source: e.DefSource}}
		}
		for _, t := range e.Terms {
			x := tbx.Term{Lang: t.Lang, Text: t.Text, POS: t.POS, Status: adminStatus(t.Status)}
			if x.Status == "" {
				st := string(t.Status)
				if t.Deferred {
					st = "deferred"
				}
				x.Notes = append(x.Notes, noteStatus+st)
			}
			if len(t.Forms) > 0 {
				x.Notes = append(x.Notes, noteForms+strings.Join(t.Forms, "; "))
			}
			x.Notes = append(x.Notes, t.Notes...)
			for _, c := range t.Contexts {
				x.Contexts = append(x.Contexts, tbx.Context{Text: c.Text, Source: contextSource(c)})
			}
			n.Terms = append(n.Terms, x)
		}
		doc.Entries = append(doc.Entries, n)
	}
	return doc
}

// adminStatus is the TBX-Basic administrative status of a termbase status;
// "" for candidate and rejected, which TBX-Basic has none for.
func adminStatus(st termbase.Status) string {
	switch st {
	case termbase.Preferred:
		return tbx.PreferredStatus
	case termbase.Admitted:
		return tbx.AdmittedStatus
	case termbase.Deprecated:
		return tbx.DeprecatedStatus
	}
	return ""
}

// ParseVerdict reads a reviewer's decision: accept (yes, ok, preferred),
// admitted, deprecated, reject (no), defer (later, ?); "" for none.
func ParseVerdict(s string) (termbase.Status, bool) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "":
		return "", true
	case "accept", "accepted", "yes", "y", "ok", "preferred":
		return termbase.Preferred, true
	case "admitted", "admit":
		return termbase.Admitted, true
	case "deprecated", "deprecate":
		return termbase.Deprecated, true
	case "reject", "rejected", "no", "n":
		return termbase.Rejected, true
	case "defer", "deferred", "later", "?":
		return termbase.Candidate, true
	}
	return "", false
}

// parseStatus reads a status cell: the termbase's names, "deferred", or
// the TBX-Basic names.
func parseStatus(s string) (st termbase.Status, deferred bool, note string, ok bool) {
	v := strings.ToLower(strings.TrimSpace(s))
	switch v {
	case "":
		return "", false, "", true
	case "deferred":
		return termbase.Candidate, true, "", true
	case "superseded", strings.ToLower(tbx.SupersededStatus):
		return termbase.Deprecated, false, "superseded term (" + tbx.SupersededStatus + ")", true
	case strings.ToLower(tbx.PreferredStatus):
		return termbase.Preferred, false, "", true
	case strings.ToLower(tbx.AdmittedStatus):
		return termbase.Admitted, false, "", true
	case strings.ToLower(tbx.DeprecatedStatus):
		return termbase.Deprecated, false, "", true
	}
	st, err := termbase.ParseStatus(v)
	return st, false, "", err == nil
}

// statusCell is how a status is written in a table.
func statusCell(t *termbase.Term) string {
	if t.Deferred {
		return "deferred"
	}
	return string(t.Status)
}
