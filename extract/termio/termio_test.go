package termio

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"

	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
	"glossmith/internal/testenv"
)

const glossaryCSV = "concept,term,status,pos,definition,note,subject,lang,owner\n" +
	"v1,solenoid valve,preferred,noun,A valve opened by an electromagnet.,,irrigation,en,Valve team\n" +
	"v1,magnet valve,deprecated,noun,,\"Shop-floor word; avoid.\",,en,\n" +
	"v1,Magnetventil,,noun,,,,de,\n" +
	"sp,set point,preferred,noun,The value a controller holds.,,climate,,\n" +
	"sp,setpoint,admitted,,,,,,\n" +
	",,preferred,,,,,,\n" +
	",drip line,sometimes,,,,,,\n" +
	",vent,,verb,,,,,\n"

func openStore(t *testing.T) *termbase.Store {
	t.Helper()
	s, err := termbase.Open(filepath.Join(t.TempDir(), "tb.db"))
	require.NoError(t, err)
	t.Cleanup(func() { s.Close() })
	return s
}

// comparable strips what differs between two stores holding the same
// glossary: ids.
func comparable(es []*termbase.Entry) []*termbase.Entry {
	for _, e := range es {
		e.ID = 0
		for _, t := range e.Terms {
			t.ID, t.EntryID = 0, 0
		}
	}
	return es
}

func TestCSVImportReportsBadRowsAndRoundTrips(t *testing.T) {
	imp, err := ReadTable(strings.NewReader(glossaryCSV), "glossary.csv", ',', "en")
	require.NoError(t, err)
	require.Len(t, imp.Problems, 2)
	assert.Equal(t, "glossary.csv:7: no term", imp.Problems[0].Error())
	assert.Contains(t, imp.Problems[1].Error(), "glossary.csv:8: unknown status \"sometimes\"")
	require.Len(t, imp.Entries, 3)
	assert.Len(t, imp.Entries[0].Terms, 3, "rows of one concept are one entry")
	assert.Equal(t, []string{"Shop-floor word; avoid."}, imp.Entries[0].Terms[1].Notes)
	assert.Equal(t, []string{"owner: Valve team"}, imp.Entries[0].Terms[0].Notes, "other columns are kept as notes")

	s := openStore(t)
	c, err := s.Import("glossary.csv", imp.Entries)
	require.NoError(t, err)
	require.NotZero(t, c.ID)
	again, err := ReadTable(strings.NewReader(glossaryCSV), "glossary.csv", ',', "en")
	require.NoError(t, err)
	c, err = s.Import("glossary.csv", again.Entries)
	require.NoError(t, err)
	assert.Zero(t, c.ID, "importing the same file twice changes nothing")

	first, err := s.Entries()
	require.NoError(t, err)
	for _, sep := range []rune{',', '\t'} {
		var buf bytes.Buffer
		require.NoError(t, WriteTable(&buf, first, sep, false))
		back, err := ReadTable(bytes.NewReader(buf.Bytes()), "export", sep, "en")
		require.NoError(t, err)
		assert.Empty(t, back.Problems)
		// Into the same termbase: nothing changes.
		c, err := s.Import("export", back.Entries)
		require.NoError(t, err)
		assert.Zero(t, c.ID)
		// Into a new one: the same entries.
		s2 := openStore(t)
		_, err = s2.Import("export", back.Entries)
		require.NoError(t, err)
		second, err := s2.Entries()
		require.NoError(t, err)
		want, _ := s.Entries()
		for _, e := range want {
			e.ExtID = conceptID(e)
		}
		assert.Equal(t, comparable(want), comparable(second))
	}
}

// The published examples import with every term and status; export to
// TBX-Basic and import into a new termbase gives the same entries.
func TestTBXImportExportRoundTrip(t *testing.T) {
	dir := testenv.SharedDir(t, "standards/tbx")
	for _, name := range []string{"example-basic-astronomy-dct.tbx", "example-basic-astronomy-dca.tbx", "example-core-astronomy.tbx"} {
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(filepath.Join(dir, name))
			require.NoError(t, err)
			imp, err := ReadFile(filepath.Join(dir, name), "en")
			require.NoError(t, err)
			s := openStore(t)
			_, err = s.Import(name, imp.Entries)
			require.NoError(t, err)
			again, err := ReadFile(filepath.Join(dir, name), "en")
			require.NoError(t, err)
			c, err := s.Import(name, again.Entries)
			require.NoError(t, err)
			assert.Zero(t, c.ID, "importing the same file twice changes nothing")
			es, err := s.Entries()
			require.NoError(t, err)
			terms, statuses := 0, map[termbase.Status]int{}
			for _, e := range es {
				for _, x := range e.Terms {
					terms++
					statuses[x.Status]++
				}
			}
			text := string(data)
			assert.Equal(t, strings.Count(text, "<term>"), terms)
			pref := strings.Count(text, tbx.PreferredStatus)
			adm := strings.Count(text, tbx.AdmittedStatus)
			dep := strings.Count(text, tbx.DeprecatedStatus) + strings.Count(text, tbx.SupersededStatus)
			assert.Equal(t, pref, statuses[termbase.Preferred])
			assert.Equal(t, dep, statuses[termbase.Deprecated])
			// Terms without a status are admitted.
			assert.Equal(t, terms-pref-dep, statuses[termbase.Admitted])
			assert.GreaterOrEqual(t, statuses[termbase.Admitted], adm)

			for _, dialect := range []string{tbx.Core, tbx.Basic} {
				var buf bytes.Buffer
				require.NoError(t, tbx.Write(&buf, ToTBX(es, dialect, "en", "round trip")))
				path := filepath.Join(t.TempDir(), "out.tbx")
				require.NoError(t, os.WriteFile(path, buf.Bytes(), 0o644))
				back, err := ReadFile(path, "en")
				require.NoError(t, err)
				s2 := openStore(t)
				_, err = s2.Import("out.tbx", back.Entries)
				require.NoError(t, err)
				got, err := s2.Entries()
				require.NoError(t, err)
				want, _ := s.Entries()
				assert.Equal(t, comparable(want), comparable(got), dialect)
			}
		})
	}
}

// The review sheet comes back as verdicts: a subject expert's decisions
// and comments.
func TestReviewSheetRoundTrip(t *testing.T) {
	s := openStore(t)
	_, err := s.Decide(termbase.Candidate, termbase.Proposal{Text: "solenoid valve", Forms: []string{"solenoid valves"},
		Contexts: []termbase.Context{{Text: "Close the solenoid valve.", Doc: "manual.md", Line: 4}}})
	require.NoError(t, err)
	_, err = s.Defer("next step", "drip line")
	require.NoError(t, err)
	es, err := s.Entries()
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, WriteReviewSheet(&buf, es, "en"))
	imp, err := ReadReviewSheet(bytes.NewReader(buf.Bytes()), "review.xlsx")
	require.NoError(t, err)
	assert.Empty(t, imp.Verdicts, "an unfilled sheet has no verdicts")
	assert.Empty(t, imp.Entries)

	// Fill in the decision and comment columns as a reviewer would.
	filled := fillSheet(t, buf.Bytes(), map[string][2]string{
		"solenoid valve": {"accept", "Standard term in the valve catalogue."},
		"next step":      {"reject", ""},
		"drip line":      {"maybe", ""},
	})
	imp, err = ReadReviewSheet(bytes.NewReader(filled), "review.xlsx")
	require.NoError(t, err)
	require.Len(t, imp.Problems, 1)
	assert.Contains(t, imp.Problems[0].Error(), "review.xlsx:4: unknown decision \"maybe\"")
	require.Len(t, imp.Verdicts, 2)
	_, err = s.Review("review.xlsx", imp.Verdicts)
	require.NoError(t, err)
	got, err := s.Lookup("solenoid valve")
	require.NoError(t, err)
	require.Len(t, got, 1)
	assert.Equal(t, termbase.Preferred, got[0].Terms[0].Status)
	assert.Equal(t, []string{"Standard term in the valve catalogue."}, got[0].Notes)
	got, err = s.Lookup("next step")
	require.NoError(t, err)
	assert.Equal(t, termbase.Rejected, got[0].Terms[0].Status)
}

// fillSheet writes decisions and comments into the review sheet's rows
// whose term is a key of verdicts.
func fillSheet(t *testing.T, data []byte, verdicts map[string][2]string) []byte {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(data))
	require.NoError(t, err)
	defer f.Close()
	rows, err := f.GetRows(reviewSheet)
	require.NoError(t, err)
	for i, r := range rows {
		if v, ok := verdicts[r[1]]; ok && i > 0 {
			require.NoError(t, f.SetCellValue(reviewSheet, "H"+strconv.Itoa(i+1), v[0]))
			require.NoError(t, f.SetCellValue(reviewSheet, "I"+strconv.Itoa(i+1), v[1]))
		}
	}
	var out bytes.Buffer
	_, err = f.WriteTo(&out)
	require.NoError(t, err)
	return out.Bytes()
}

// A term type (TBX-Basic termType: the acronym of a full form) and a
// cross-reference have no field in the termbase and are kept as notes.
func TestTBXTermTypeKeptAsNote(t *testing.T) {
	es := FromTBX(&tbx.Document{Lang: "en", Entries: []tbx.Entry{{ID: "c1", CrossRefs: []tbx.CrossRef{{Target: "c2", Text: "pressure"}}, Terms: []tbx.Term{
		{Text: "vapour pressure deficit", Type: "fullForm"}, {Text: "VPD", Type: "acronym"},
	}}}})
	require.Len(t, es, 1)
	require.Len(t, es[0].Terms, 2)
	assert.Contains(t, es[0].Terms[1].Notes, "term type: acronym")
	assert.Contains(t, es[0].Terms[0].Notes, "term type: fullForm")
	assert.Contains(t, es[0].Notes, "see: pressure", "a cross-reference too")
}
