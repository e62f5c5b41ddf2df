package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/tbx"
	"glossmith/extract/tbx/tbxtest"
)

// termsStatus runs terms --to jsonl with the termbase and returns each
// candidate's status and entry.
func termsStatus(t *testing.T, tb string, extra ...string) map[string][2]string {
	t.Helper()
	return statusOf(t, append([]string{"terms", "--termbase", tb, "--to", "jsonl", "--all"}, append(extra, "testdata/demo")...)...)
}

// statusOf runs glossmith with args (a terms run writing JSON Lines) and
// returns each candidate's status and entry.
func statusOf(t *testing.T, args ...string) map[string][2]string {
	t.Helper()
	r := run(t, "", args...)
	require.Equal(t, 0, r.code, r.stderr)
	out := map[string][2]string{}
	for _, line := range strings.Split(strings.TrimSpace(r.stdout), "\n") {
		var c struct{ Term, Status, Entry string }
		require.NoError(t, json.Unmarshal([]byte(line), &c))
		out[c.Term] = [2]string{c.Status, c.Entry}
	}
	return out
}

// The glossary's life on the demo corpus: record a first version, decide,
// record a second, compare, export and import again.
func TestTermbaseWorkflow(t *testing.T) {
	dir := t.TempDir()
	tb := filepath.Join(dir, "gloss.db")

	r := run(t, "", "terms", "--termbase", tb, "--record", "v1", "--limit", "5",
		"testdata/demo/gc48-installation-manual.md", "testdata/demo/maintenance-schedule.txt")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "status")

	for _, args := range [][]string{
		{"accept", "irrigation", "valve", "solenoid valve"},
		{"reject", "AC"},
		{"defer", "drip"},
		{"set", "solenoid valve", "--deprecated", "magnet valve", "--pos", "noun", "--definition", "A valve opened by an electromagnet."},
	} {
		r = run(t, "", append([]string{"termbase", "--termbase", tb, "--user", "tester"}, args...)...)
		require.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
		assert.Regexp(t, `^#\d+ `, r.stdout)
	}
	st := termsStatus(t, tb)
	assert.Equal(t, [2]string{"accepted", "irrigation"}, st["irrigation"])
	assert.Equal(t, [2]string{"accepted", "solenoid valve"}, st["solenoid valve"])
	assert.Equal(t, [2]string{"rejected", "AC"}, st["AC"])
	assert.Equal(t, "new", st["drip"][0], "a deferred candidate has no decision yet")
	assert.Equal(t, "new", st["emitter"][0])

	onlyNew := termsStatus(t, tb, "--new")
	assert.NotContains(t, onlyNew, "irrigation")
	assert.NotContains(t, onlyNew, "AC")
	assert.Contains(t, onlyNew, "emitter")

	r = run(t, "", "terms", "--termbase", tb, "--record", "v2", "--limit", "3", "testdata/demo")
	require.Equal(t, 0, r.code, r.stderr)
	r = run(t, "", "terms", "--termbase", tb, "--record", "v2", "--limit", "3", "testdata/demo")
	assert.Equal(t, 1, r.code, "a label is recorded once")
	assert.Contains(t, r.stderr, "v2")

	// A run against itself is a usage error, before the termbase is read.
	r = run(t, "", "termbase", "--termbase", tb, "diff", "v2", "v2", "--to", "tsv")
	assert.Equal(t, 2, r.code, r.stderr)
	assert.Contains(t, r.stderr, "name two different runs")
	assert.Empty(t, r.stdout)

	r = run(t, "", "termbase", "--termbase", tb, "diff", "v1", "v2", "--to", "jsonl")
	require.Equal(t, 0, r.code, r.stderr)
	kinds := map[string]int{}
	for _, line := range strings.Split(strings.TrimSpace(r.stdout), "\n") {
		var d struct {
			Term, Kind   string
			Freq1, Freq2 int
			G2           float64
		}
		require.NoError(t, json.Unmarshal([]byte(line), &d))
		kinds[d.Kind]++
		switch d.Kind {
		case "new":
			assert.Zero(t, d.Freq1, d.Term)
		case "gone":
			assert.Zero(t, d.Freq2, d.Term)
		case "rose":
			assert.GreaterOrEqual(t, d.G2, 15.13, d.Term)
		case "fell":
			assert.LessOrEqual(t, d.G2, -15.13, d.Term)
		}
	}
	assert.Positive(t, kinds["new"], "the whole corpus has terms the two documents lack")

	r = run(t, "", "termbase", "--termbase", tb, "show", "magnet valve")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "deprecated  magnet valve")
	assert.Contains(t, r.stdout, "preferred   solenoid valve")
	assert.Contains(t, r.stdout, "tester set")

	// Export as CSV, import into a new termbase: the same list.
	csv := filepath.Join(dir, "gloss.csv")
	r = run(t, "", "termbase", "--termbase", tb, "export", "-o", csv)
	require.Equal(t, 0, r.code, r.stderr)
	tb2 := filepath.Join(dir, "copy.db")
	r = run(t, "", "termbase", "--termbase", tb2, "import", csv)
	require.Equal(t, 0, r.code, r.stderr)
	list1 := run(t, "", "termbase", "--termbase", tb, "list")
	list2 := run(t, "", "termbase", "--termbase", tb2, "list")
	assert.Equal(t, list1.stdout, list2.stdout)
	r = run(t, "", "termbase", "--termbase", tb2, "import", csv)
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "nothing changed")

	// TBX-Basic export names the statuses.
	r = run(t, "", "termbase", "--termbase", tb, "export", "--to", "tbx-basic")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, `<termNote type="administrativeStatus">deprecatedTerm-admn-sts</termNote>`)

	// Undo the last decision (the set): magnet valve is gone again.
	r = run(t, "", "termbase", "--termbase", tb, "undo", "3")
	require.Equal(t, 0, r.code, r.stderr)
	r = run(t, "", "termbase", "--termbase", tb, "show", "magnet valve")
	assert.Equal(t, 1, r.code)
}

// A candidate linked to an acronym or full form the termbase accepted is
// labelled as that other term of the concept: with "RMS" accepted, "root
// zone moisture sensor" is its full form (not a variant, which the
// acronym's spellings among its forms made it); with the full form
// accepted, "RMS" is its acronym (not new). An invented manual text.
func TestTermsLabelsAcronymPairs(t *testing.T) {
	dir := t.TempDir()
	docs := acronymDocs(t, dir)
	for _, tc := range []struct {
		accept   []string
		full, rm [2]string
	}{
		{[]string{"RMS"}, [2]string{"full form", "RMS"}, [2]string{"accepted", "RMS"}},
		{[]string{"root zone moisture sensor"}, [2]string{"accepted", "root zone moisture sensor"}, [2]string{"acronym", "root zone moisture sensor"}},
		{[]string{"root zone moisture sensor", "RMS"}, [2]string{"accepted", "root zone moisture sensor"}, [2]string{"accepted", "RMS"}},
	} {
		tb := filepath.Join(dir, strings.Join(tc.accept, "+")+".db")
		r := run(t, "", append([]string{"termbase", "--termbase", tb, "accept"}, tc.accept...)...)
		require.Equal(t, 0, r.code, r.stderr)
		st := statusOf(t, "terms", "--termbase", tb, "--to", "jsonl", "--all", "--max-words", "5", docs)
		assert.Equal(t, tc.full, st["root zone moisture sensor"], "%v", tc.accept)
		assert.Equal(t, tc.rm, st["RMS"], "%v", tc.accept)
		assert.Equal(t, "new", st["drip emitter"][0], "%v", tc.accept)
		// --new leaves out both terms of the concept, in TBX too (one
		// entry of fullForm and acronym terms otherwise).
		nw := run(t, "", "terms", "-q", "--termbase", tb, "--to", "tbx", "--all", "--new", "--max-words", "5", docs)
		require.Equal(t, 0, nw.code, nw.stderr)
		assert.Contains(t, nw.stdout, "<term>drip emitter</term>", "%v", tc.accept)
		assert.NotContains(t, nw.stdout, "<term>RMS</term>", "%v", tc.accept)
		assert.NotContains(t, nw.stdout, "<term>root zone moisture sensor</term>", "%v", tc.accept)
	}
}

// acronymDocs writes two invented manual texts that define "root zone
// moisture sensor (RMS)" into dir/docs and returns that folder.
func acronymDocs(t *testing.T, dir string) string {
	t.Helper()
	docs := filepath.Join(dir, "docs")
	require.NoError(t, os.Mkdir(docs, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(docs, "a.txt"), []byte("The root zone moisture sensor (RMS) reads the water in the substrate. "+
		"Mount the RMS near the drip emitter.\nCalibrate the RMS each season. The root zone moisture sensor needs a dry reference.\n"), 0o644))
	require.NoError(t, os.WriteFile(filepath.Join(docs, "b.txt"), []byte("Each root zone moisture sensor has a serial number. Replace a faulty RMS at once.\n"), 0o644))
	return docs
}

func TestTermbaseErrors(t *testing.T) {
	dir := t.TempDir()
	tb := filepath.Join(dir, "gloss.db")
	// No termbase named: a usage error before anything is read.
	r := run(t, "", "termbase", "list")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, "GLOSSMITH_TERMBASE")
	r = run(t, "", "terms", "--new", "testdata/demo")
	assert.Equal(t, 2, r.code)

	// A file that is not a termbase is refused and kept.
	notes := filepath.Join(dir, "notes.txt")
	require.NoError(t, os.WriteFile(notes, []byte("remember the valves\n"), 0o644))
	r = run(t, "", "termbase", "--termbase", notes, "accept", "valve")
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stderr, notes)
	got, _ := os.ReadFile(notes)
	assert.Equal(t, "remember the valves\n", string(got))

	// Bad rows are reported with their line; the others are imported.
	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("term,status\nvalve,preferred\n,admitted\nvent,sometimes\nemitter,\n"), 0o644))
	r = run(t, "", "termbase", "--termbase", tb, "import", bad)
	assert.Equal(t, 1, r.code)
	assert.Contains(t, r.stderr, bad+":3: no term")
	assert.Contains(t, r.stderr, bad+":4: unknown status")
	r = run(t, "", "termbase", "--termbase", tb, "list")
	assert.Contains(t, r.stdout, "valve")
	assert.Contains(t, r.stdout, "emitter")
	assert.Contains(t, r.stdout, "2 entries")

	r = run(t, "", "termbase", "--termbase", tb, "list", "--changed-since", "2000-01-01")
	assert.Contains(t, r.stdout, "2 entries")
	r = run(t, "", "termbase", "--termbase", tb, "list", "--changed-since", "2999-01-01")
	assert.Contains(t, r.stdout, "0 entries")
	r = run(t, "", "termbase", "--termbase", tb, "list", "--changed-since", "yesterday")
	assert.Equal(t, 2, r.code)
	r = run(t, "", "termbase", "--termbase", tb, "export", "--to", "jsonl")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Len(t, strings.Split(strings.TrimSpace(r.stdout), "\n"), 2)
	r = run(t, "", "termbase", "--termbase", tb, "list", "--status", "prefered")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, "preferred")
}

// terms' TBX output validates against the TBX schemas of
// ../shared/standards/tbx (tbxtest: TBX-Core against the TBX-Core
// integrated RELAX NG schema, TBX-Basic against the core structure and
// TBX-Basic_DCA.sch, the Schematron rules in Go too); an empty list too.
// The list holds acronyms with and without their full form's line.
func TestTermsTBXValidates(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct{ to, dialect, minFreq string }{
		{"tbx", "TBX-Core", "1"},
		{"tbx-basic", "TBX-Basic", "1"},
		{"tbx", "TBX-Core", "100000"},
	} {
		out := filepath.Join(dir, tc.to+tc.minFreq+".tbx")
		r := run(t, "", "terms", "--to", tc.to, "--limit", "50", "--min-freq", tc.minFreq, "-o", out, "testdata/demo")
		require.Equal(t, 0, r.code, r.stderr)
		data, err := os.ReadFile(out)
		require.NoError(t, err)
		tbxtest.Validate(t, tc.dialect, data)
		assert.NotContains(t, string(data), "<term>valves</term>", "inflected forms are not terms")
		if tc.to == "tbx-basic" {
			// "vapour pressure deficit (VPD)": one entry, the acronym typed.
			assert.Contains(t, string(data), `<termNote type="termType">acronym</termNote>`)
			assert.Equal(t, 1, strings.Count(string(data), "<term>VPD</term>"))
			// "drip" is mostly within "drip emitter": a cross-reference.
			assert.Contains(t, string(data), `<ref type="crossReference" target="`)
		}
	}
}

// terms --termbase --to tbx-basic writes each term's administrative status
// as the termbase holds it, the label TBX has no field for as a note, and
// leaves the rejected candidates out; the file validates (tbxtest).
func TestTermsTBXWithTermbase(t *testing.T) {
	dir := t.TempDir()
	tb := filepath.Join(dir, "gloss.gtb")
	for _, args := range [][]string{
		{"accept", "valve", "solenoid valve", "VPD"},
		{"reject", "zone", "firmware"},
		{"set", "set point", "--preferred", "set point", "--admitted", "set-point", "--deprecated", "setpoint"},
	} {
		r := run(t, "", append([]string{"termbase", "--termbase", tb}, args...)...)
		require.Equal(t, 0, r.code, r.stderr)
	}
	for _, to := range []string{"tbx-basic", "tbx"} {
		out := filepath.Join(dir, to+".tbx")
		r := run(t, "", "terms", "-q", "--termbase", tb, "--to", to, "--all", "--limit", "50", "-o", out, "testdata/demo")
		require.Equal(t, 0, r.code, r.stderr)
		data, err := os.ReadFile(out)
		require.NoError(t, err)
		tbxtest.Validate(t, map[string]string{"tbx": "TBX-Core", "tbx-basic": "TBX-Basic"}[to], data)
		doc, err := tbx.Read(strings.NewReader(string(data)), out)
		require.NoError(t, err)
		status, labels := map[string]string{}, map[string][]string{}
		for _, e := range doc.Entries {
			for _, x := range e.Terms {
				status[x.Text] = x.Status
				for _, n := range x.Notes {
					if strings.HasPrefix(n, "termbase: ") {
						labels[x.Text] = append(labels[x.Text], n)
					}
				}
			}
		}
		for term, want := range map[string]string{
			"valve": tbx.PreferredStatus, "solenoid valve": tbx.PreferredStatus, "VPD": tbx.PreferredStatus,
			"set point": tbx.PreferredStatus, "set-point": tbx.AdmittedStatus, "setpoint": tbx.DeprecatedStatus,
			"emitter": "",
		} {
			require.Contains(t, status, term, to)
			assert.Equal(t, want, status[term], "%s: %s", to, term)
		}
		assert.Empty(t, labels["valve"], "%s: the status says it", to)
		assert.Equal(t, []string{"termbase: new"}, labels["emitter"], to)
		assert.Equal(t, []string{"termbase: full form of VPD"}, labels["vapour pressure deficit"], to)
		assert.NotContains(t, status, "zone", "%s: rejected", to)
		assert.NotContains(t, status, "firmware", "%s: rejected", to)
		assert.Contains(t, doc.Source, "2 candidate(s) the termbase rejected are left out", to)
	}
}

// termbase set --pos takes the TBX-Basic part-of-speech values (the
// picklist of TBX-Basic's partOfSpeech, as extract/tbx writes them) or
// Universal Dependencies UPOS tags (universaldependencies.org/u/pos/), one
// a word as a recorded run stores a multiword term's; anything else is a
// usage error before the termbase is opened.
func TestTermbaseSetChecksPOS(t *testing.T) {
	for _, c := range []struct {
		pos  string
		ok   bool
		hint string
	}{
		{"noun", true, ""},
		{"adjective", true, ""},
		{"other", true, ""},
		{"PROPN", true, ""},
		{"ADJ NOUN", true, ""},
		{"nuon", false, `did you mean "noun"`},
		{"Noun", false, `did you mean "noun"`},
		{"NN", false, ""},
		{"ADJ  NOUN", false, ""},
		{" NOUN", false, ""},
		{"ADJ NUON", false, ""},
	} {
		t.Run(c.pos, func(t *testing.T) {
			err := checkPOS(c.pos)
			if c.ok {
				assert.NoError(t, err)
				return
			}
			require.Error(t, err)
			assert.Contains(t, err.Error(), "want one of noun, verb, adjective, adverb, other, or UPOS tags")
			if c.hint != "" {
				assert.Contains(t, err.Error(), c.hint)
			}
		})
	}

	// Completion offers what the check accepts.
	r := run(t, "", "__complete", "termbase", "set", "valve", "--pos", "")
	for _, v := range []string{"noun", "adjective", "other", "NOUN", "PROPN"} {
		assert.Contains(t, strings.Fields(r.stdout), v)
		assert.NoError(t, checkPOS(v))
	}

	tb := filepath.Join(t.TempDir(), "gloss.db")
	r = run(t, "", "termbase", "--termbase", tb, "set", "valve", "--pos", "nuon")
	assert.Equal(t, 2, r.code, r.stderr)
	assert.Contains(t, r.stderr, `--pos "nuon"`)
	assert.NoFileExists(t, tb, "a refused edit created the termbase")
	r = run(t, "", "termbase", "--termbase", tb, "set", "valve", "--pos", "noun")
	require.Equal(t, 0, r.code, r.stderr)
	r = run(t, "", "termbase", "--termbase", tb, "show", "valve")
	assert.Contains(t, r.stdout, "valve [en] (noun)")
}

// Commands that only read a termbase refuse a file that is not there
// (a usage error, exit 2): opening creates a missing termbase, so a
// mistyped name would read as an empty glossary — an export replacing a
// good file with an empty one, every candidate labelled new — and leave a
// stray file. Commands that write create it.
func TestReadingCommandsRefuseAMissingTermbase(t *testing.T) {
	dir := t.TempDir()
	missing := filepath.Join(dir, "glosary.db")
	kept := filepath.Join(dir, "glossary.csv")
	const glossary = "concept,term,status\nc1,drip emitter,preferred\n"
	require.NoError(t, os.WriteFile(kept, []byte(glossary), 0o644))
	for _, args := range [][]string{
		{"termbase", "list"},
		{"termbase", "show", "valve"},
		{"termbase", "runs"},
		{"termbase", "undo"},
		{"termbase", "diff", "v1", "v2"},
		{"termbase", "export", "-o", kept},
		{"terms", "--limit", "3", "testdata/demo/maintenance-schedule.txt"},
		{"terms", "--new", "--limit", "3", "testdata/demo/maintenance-schedule.txt"},
		{"review", "--run", "v1"},
		{"check", "testdata/demo/maintenance-schedule.txt"},
	} {
		t.Run(strings.Join(args[:2], " "), func(t *testing.T) {
			r := run(t, "", append(args, "--termbase", missing)...)
			assert.Equal(t, 2, r.code, r.stderr)
			assert.Contains(t, r.stderr, "--termbase "+missing+": no termbase file there")
			assert.NoFileExists(t, missing)
			got, err := os.ReadFile(kept)
			require.NoError(t, err)
			assert.Equal(t, glossary, string(got), "the output file was replaced")
		})
	}
	// Writing commands create it.
	for _, args := range [][]string{
		{"termbase", "accept", "valve"},
		{"termbase", "import", kept},
		{"terms", "-q", "--record", "v1", "--limit", "3", "testdata/demo/maintenance-schedule.txt"},
	} {
		t.Run(strings.Join(args, " "), func(t *testing.T) {
			tb := filepath.Join(t.TempDir(), "new.db")
			r := run(t, "", append(args, "--termbase", tb)...)
			require.Equal(t, 0, r.code, r.stderr)
			assert.FileExists(t, tb)
		})
	}
}

// A term that starts with a hyphen ("-20 °C mode") reads as flags; the
// error says how to give it, and that way works.
func TestTermStartingWithAHyphen(t *testing.T) {
	tb := filepath.Join(t.TempDir(), "gloss.db")
	for _, args := range [][]string{
		{"termbase", "--termbase", tb, "accept", "-20 °C mode"},
		{"termbase", "--termbase", tb, "reject", "valve", "-40 series"},
		{"termbase", "--termbase", tb, "set", "-20 °C mode", "--note", "frost"},
	} {
		r := run(t, "", args...)
		assert.Equal(t, 2, r.code, r.stderr)
		assert.Contains(t, r.stderr, `(a term that starts with "-" goes after "--", the flags before it: glossmith termbase `+args[3]+" -- ")
	}
	r := run(t, "", "termbase", "--termbase", tb, "accept", "--", "-20 °C mode")
	require.Equal(t, 0, r.code, r.stderr)
	r = run(t, "", "termbase", "--termbase", tb, "list")
	assert.Contains(t, r.stdout, "-20 °C mode  preferred")
}

// Control characters of a termbase's texts — an escape sequence or a
// bidirectional override in an imported glossary — never reach the
// terminal: list and show write them escaped (printable.Escape), as find
// does with documents.
func TestTermbaseOutputEscapesControls(t *testing.T) {
	dir := t.TempDir()
	tb := filepath.Join(dir, "gloss.db")
	csv := filepath.Join(dir, "g.csv")
	require.NoError(t, os.WriteFile(csv, []byte("concept,term,status,definition\nc1,\"red\x1b[31m valve\",preferred,\"Clears\x1b[2J the screen \u202eevlav\"\n"), 0o644))
	r := run(t, "", "termbase", "--termbase", tb, "import", csv)
	require.Equal(t, 0, r.code, r.stderr)
	for _, args := range [][]string{{"list"}, {"show", "red\x1b[31m valve"}} {
		t.Run(args[0], func(t *testing.T) {
			r := run(t, "", append([]string{"termbase", "--termbase", tb}, args...)...)
			require.Equal(t, 0, r.code, r.stderr)
			assert.NotContains(t, r.stdout, "\x1b")
			assert.NotContains(t, r.stdout, "\u202e")
			assert.Contains(t, r.stdout, `red\x1b[31m valve`)
		})
	}
	r = run(t, "", "termbase", "--termbase", tb, "show", "red\x1b[31m valve")
	assert.Contains(t, r.stdout, `Clears\x1b[2J the screen \u202eevlav`)
}
