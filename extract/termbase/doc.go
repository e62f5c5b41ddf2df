// Package termbase keeps a glossary's decisions between runs: one SQLite
// file per termbase (the pure-Go driver modernc.org/sqlite, so the binary
// stays static), concept-oriented as ISO 30042 (TBX) has it.
//
// # Model
//
// An [Entry] is one concept: subject field, definition and its source,
// notes. It holds [Term]s, each with a language, its text, a part of
// speech, a [Status] (the TBX-Basic administrative statuses preferred,
// admitted and deprecated, or the review states candidate and rejected —
// rejected terms are kept so that they never come back as new), the
// surface forms seen in documents and a few contexts. Recorded runs of
// `glossmith terms` ([Run]) keep each candidate's counts, so that two
// document versions can be compared ([Store.Diff]).
//
// # Opening
//
// [Open] creates the file on first use and otherwise refuses, with an
// error naming the file, anything that is not a glossmith termbase: an
// empty file, another kind of file, a truncated or corrupt database, or one
// written by a newer glossmith. It never overwrites such a file. An older
// schema is migrated after a backup copy (FILE.vN.bak). The database runs
// in WAL mode with a busy timeout, so several processes may decide at once.
//
// # Reading
//
//   - [Store.Entries] loads every entry with its terms, forms and contexts
//     in one call (a handful of queries, not one per entry); [NewIndex]
//     turns them into an in-memory map from a term's [Key] to its status,
//     which is how `terms --termbase` labels candidates.
//   - [Store.Lookup] finds the entries holding a text as a term or a
//     surface form (exact text first, then its [Key]); [Store.Entry] reads
//     one entry by id.
//   - [Store.Changes] and [Store.History] read the change log; [Store.Runs]
//     and [Store.RunTerms] the recorded runs.
//
// # Changing
//
// Every change is one transaction and one row of the append-only change
// log (who: [Store.User], by default the login name; when; what), which
// also holds the affected entries as they were before, so that
// [Store.Undo] can restore them. A change that changes nothing writes no
// log row and returns a Change with ID 0.
//
//   - [Store.Accept], [Store.Reject], [Store.Defer]: decisions on
//     candidates, by text; an unknown text becomes a new entry.
//   - [Store.Decide] does the same for candidates with part of speech,
//     forms and contexts (what a review page knows).
//   - [Store.SetPreferred], [Store.SetStatus]: a form of an entry becomes
//     its preferred term, or gets a status (admitted, deprecated, …).
//   - [Store.Merge]: two entries become one concept.
//   - [Store.SetDefinition], [Store.SetNote], [Store.SetPOS],
//     [Store.SetSubject]: the entry's or term's fields.
//   - [Store.Import]: whole entries (from TBX or CSV); an entry that shares
//     a term with a stored one is merged into it, so importing the same
//     data twice changes nothing.
//   - [Store.RecordRun]: a run's candidates with their counts; stored
//     terms gain the surface forms and contexts the run saw.
//   - [Store.Undo]: the last n changes, newest first, each undo itself a
//     logged change.
//
// All methods are safe for use by one goroutine at a time per Store; for
// concurrent writers open the file once per process (SQLite locks the
// file; writers wait up to the busy timeout).
package termbase
