package check

import (
	"strconv"
	"unicode"
	"unicode/utf8"

	"glossmith/extract/termbase"
)

// FromTermbase makes the glossary the check uses out of a termbase's
// entries (termbase.Store.Entries), keeping the terms of language lang
// ("" for every language):
//
//   - preferred, admitted and deprecated terms keep their status;
//   - a rejected term of an entry that has a preferred or admitted term is
//     a forbidden designation of that concept; a rejected candidate in an
//     entry of its own is only "not a term" and is not checked;
//   - candidates (no decision yet) are not checked;
//   - a term is case-sensitive when it has a capital letter after its
//     first character ("PLC", "pH", "PV array"): only its case is right;
//     "Pump" is not;
//   - the entry is named by the id it was imported with, else its number.
//
// Entries left without terms are dropped.
func FromTermbase(entries []*termbase.Entry, lang string) Glossary {
	var g Glossary
	for _, e := range entries {
		allowed := false
		for _, t := range e.Terms {
			if inLang(t, lang) && (t.Status == termbase.Preferred || t.Status == termbase.Admitted) {
				allowed = true
			}
		}
		var forms []Form
		for _, t := range e.Terms {
			if !inLang(t, lang) {
				continue
			}
			var st Status
			switch t.Status {
			case termbase.Preferred:
				st = Preferred
			case termbase.Admitted:
				st = Admitted
			case termbase.Deprecated:
				st = Deprecated
			case termbase.Rejected:
				if !allowed {
					continue
				}
				st = Forbidden
			default:
				continue
			}
			forms = append(forms, Form{Text: t.Text, Status: st, POS: t.POS, CaseSensitive: caseMatters(t.Text)})
		}
		if len(forms) == 0 {
			continue
		}
		id := e.ExtID
		if id == "" {
			id = strconv.FormatInt(e.ID, 10)
		}
		g.Entries = append(g.Entries, Entry{ID: id, Forms: forms})
	}
	return g
}

func inLang(t *termbase.Term, lang string) bool { return lang == "" || t.Lang == "" || t.Lang == lang }

// caseMatters reports whether a term has a capital letter after its first
// character.
func caseMatters(s string) bool {
	_, n := utf8.DecodeRuneInString(s)
	for _, r := range s[n:] {
		if unicode.IsUpper(r) {
			return true
		}
	}
	return false
}
