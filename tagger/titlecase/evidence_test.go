package titlecase

import (
	"maps"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/read"
	"glossmith/tagger/tokenize"
)

// document tokenizes text whose lines starting "# " are headings, as a
// reader marks them (doc.Document.Headings), without the "# ".
func document(t *testing.T, text string) *doc.Document {
	lines := strings.Split(text, "\n")
	d := &doc.Document{}
	for i, l := range lines {
		if h, ok := strings.CutPrefix(l, "# "); ok {
			lines[i] = h
			d.Headings = append(d.Headings, doc.LineRange{First: int32(i + 1), Last: int32(i + 1)})
		}
	}
	d.Text = strings.Join(lines, "\n")
	tokenize.Document(d)
	return d
}

// headingViews returns the view of each heading of d, with the evidence of
// d's running text when withDoc.
func headingViews(v Viewer, d *doc.Document, withDoc bool) []string {
	if withDoc {
		v.Doc = Gather(d.Sentences)
	}
	var got []string
	for _, s := range d.Sentences {
		if s.Heading {
			got = append(got, forms(v.View(nil, s.Tokens)))
		}
	}
	return got
}

// The document's running text decides what the general tables cannot:
// names of common words, acronyms that are words, and words the tables
// lack. The scenarios are invented (a maker of greenhouse controllers).
func TestViewWithDocumentEvidence(t *testing.T) {
	tests := []struct {
		name, text string
		want       []string // the headings' views with the evidence
		without    []string // and without it
	}{
		{"a name in running text",
			"# Installing the Climate Master\n\nMount the Climate Master on a dry wall.\n\n# Cleaning the Drip Emitters\n\nClean the drip emitters once a month.\n",
			[]string{"Installing the Climate Master", "Cleaning the drip emitters"},
			[]string{"Installing the climate master", "Cleaning the drip emitters"}},
		{"a name after a sentence's first word",
			"# Installing the Climate Master\n\nThe Climate Master fits any greenhouse.\n",
			[]string{"Installing the Climate Master"}, []string{"Installing the climate master"}},
		{"capitals at a sentence start say nothing",
			"# Installing the Climate Master\n\nClimate Master units ship with a wall bracket.\n",
			[]string{"Installing the climate master"}, []string{"Installing the climate master"}},
		{"nor after a colon",
			"# Installing the Climate Master\n\nIn the box: Climate Master units and a bracket.\n",
			[]string{"Installing the climate master"}, []string{"Installing the climate master"}},
		{"nor after a number: a label",
			"# Emissions by Year\n\nYear 2008 Year 2009 Total in tonnes of carbon dioxide\n",
			[]string{"Emissions by year"}, []string{"Emissions by year"}},
		{"a name with small words",
			"# Reports to the Ministry of Water Supply\n\nSend the yearly report to the Ministry of Water Supply before March.\n",
			[]string{"Reports to the Ministry of Water Supply"}, []string{"Reports to the ministry of water supply"}},
		{"a part of a longer name",
			"# Notices in the Official Journal\n\nTenders appear in the Official Journal of the Water Board.\n",
			[]string{"Notices in the Official Journal"}, []string{"Notices in the official journal"}},
		{"one word of a name is no name",
			"# Checking the Supply\n\nSend the report to the Ministry of Supply.\n",
			[]string{"Checking the supply"}, []string{"Checking the supply"}},
		{"a line of title case that is no heading says nothing",
			"# Cleaning the Drip Emitters\n\nStep 3 Cleaning the Drip Emitters\n\nClean the drip emitters once a month.\n",
			[]string{"Cleaning the drip emitters"}, []string{"Cleaning the drip emitters"}},
		{"nor one with the name inside",
			"# Cleaning the Drip Emitters\n\nStep 3 Cleaning the Drip Emitters (GC-48)\n\nClean the drip emitters once a month.\n",
			[]string{"Cleaning the drip emitters"}, []string{"Cleaning the drip emitters"}},
		{"a task's heading repeated in running text is a reference to it",
			"# Cleaning the Drip Emitters\n\nBefore winter, see Cleaning the Drip Emitters and drain the lines.\n",
			[]string{"Cleaning the drip emitters"}, []string{"Cleaning the drip emitters"}},
		{"a name's heading repeated in running text is the name",
			"# Climate Master\n\nMount the Climate Master on a dry wall.\n",
			[]string{"Climate Master"}, []string{"Climate master"}},
		{"a name in a heading in capitals",
			"# INSTALLING THE CLIMATE MASTER\n\nMount the Climate Master on a dry wall.\n",
			[]string{"Installing the Climate Master"}, []string{"Installing the climate master"}},
		{"a name with small words in capitals",
			"# REPORTS TO THE MINISTRY OF WATER SUPPLY\n\nSend the report to the Ministry of Water Supply.\n",
			[]string{"Reports to the Ministry of Water Supply"}, []string{"Reports to the ministry of water supply"}},
		{"an acronym in a heading in capitals",
			"# SETTING UP THE PAN MODULE\n\nThe PAN module reports soil moisture every minute.\n",
			[]string{"Setting up the PAN module"}, []string{"Setting up the pan module"}},
		{"an acronym as a heading's only word",
			"# FORM\n\nThe FORM report lists the valves that failed.\n",
			[]string{"FORM"}, []string{"form"}},
		{"an acronym and a name in one heading",
			"# INSTALLING THE PAN SERIES\n\nThe valves of the PAN Series close in a second.\n",
			[]string{"Installing the PAN Series"}, []string{"Installing the pan series"}},
		{"a word written both ways: the tables decide",
			"# CLEANING THE PAN\n\nEmpty the pan before the PAN sensor reads it.\n",
			[]string{"Cleaning the pan"}, []string{"Cleaning the pan"}},
		{"capitals in a sentence without lower case say nothing",
			"# CHECKING THE PAN\n\nCHECK THE PAN DAILY.\n",
			[]string{"Checking the pan"}, []string{"Checking the pan"}},
		{"a word the tables lack, in lower case in running text",
			"# Planning the Fertigation Schedule\n\nPlan fertigation by crop and season.\n",
			[]string{"Planning the fertigation schedule"}, []string{"Planning the Fertigation schedule"}},
		{"an invented name stays one",
			"# Installing the Aquavent Controller\n\nThe Aquavent controller opens the vents.\n",
			[]string{"Installing the Aquavent controller"}, []string{"Installing the Aquavent controller"}},

		// Running text that refers to a section by its heading writes the
		// heading's capitals, not a name's: a reference repeats a whole
		// heading, cued as one (a word before or after it that points to a
		// section), or quoted, or at a sentence's start, where capitals are
		// the writing's anyway. The same words without a cue stay a name.
		{"after see", "# Filter Maintenance\n\nFor details, see Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after see also", "# Filter Maintenance\n\nRinse the housing monthly; see also Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after refer to", "# Filter Maintenance\n\nFor the intervals, refer to Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after described in", "# Filter Maintenance\n\nRinse the housing as described in Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after under", "# Filter Maintenance\n\nThe intervals are listed under Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after in section", "# Filter Maintenance\n\nThe intervals are given in section Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after in Section, capitalized", "# Filter Maintenance\n\nThe intervals are given in Section Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"after in chapter", "# Filter Maintenance\n\nThe intervals are given in chapter Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"before section", "# Filter Maintenance\n\nThe Filter Maintenance section lists the intervals.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"in typographic quotes", "# Filter Maintenance\n\nFor the intervals, read “Filter Maintenance” first.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"in straight quotes", "# Filter Maintenance\n\nFor the intervals, read \"Filter Maintenance\" first.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"in single quotes", "# Filter Maintenance\n\nFor the intervals, read ‘Filter Maintenance’ or 'Filter Maintenance' first.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"at a sentence's start", "# Filter Maintenance\n\nFilter Maintenance describes the intervals.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"a heading in capitals", "# FILTER MAINTENANCE\n\nFor details, see Filter Maintenance.\n",
			[]string{"Filter maintenance"}, []string{"Filter maintenance"}},
		{"a numbered heading", "# 4.2 Filter Maintenance\n\nFor details, see Filter Maintenance.\n",
			[]string{"4.2 Filter maintenance"}, []string{"4.2 Filter maintenance"}},
		{"a heading with a colon",
			"# Filter Maintenance: Daily Checks\n\nFor details, see Filter Maintenance: Daily Checks.\n",
			[]string{"Filter maintenance : daily checks"}, []string{"Filter maintenance : daily checks"}},
		{"a heading's first part without a cue: a name",
			"# Filter Maintenance: Daily Checks\n\nOur service partner Filter Maintenance cleans the housings.\n",
			[]string{"Filter Maintenance : daily checks"}, []string{"Filter maintenance : daily checks"}},
		{"a heading's first part after a cue: a name",
			"# Filter Maintenance: Daily Checks\n\nFor the housings, see Filter Maintenance at the depot.\n",
			[]string{"Filter Maintenance : daily checks"}, []string{"Filter maintenance : daily checks"}},
		{"two headings joined by and",
			"# Filter Maintenance\n\nRinse the housing monthly.\n\n# Valve Care\n\nBefore winter, see Filter Maintenance and Valve Care.\n",
			[]string{"Filter maintenance", "Valve care"}, []string{"Filter maintenance", "Valve care"}},
		{"a list of headings after see",
			"# Filter Maintenance\n\n# Valve Care\n\n# Winter Storage\n\nBefore winter, see Filter Maintenance, Valve Care or Winter Storage.\n",
			[]string{"Filter maintenance", "Valve care", "Winter storage"}, []string{"Filter maintenance", "Valve care", "Winter storage"}},
		{"a list of headings after See at a sentence's start",
			"# Filter Maintenance\n\n# Valve Care\n\n# Winter Storage\n\nSee Filter Maintenance, Valve Care and Winter Storage before the first frost.\n",
			[]string{"Filter maintenance", "Valve care", "Winter storage"}, []string{"Filter maintenance", "Valve care", "Winter storage"}},
		{"a list of headings after Refer to at a sentence's start",
			"# Filter Maintenance\n\n# Valve Care\n\nRefer to Filter Maintenance, Valve Care for the intervals.\n",
			[]string{"Filter maintenance", "Valve care"}, []string{"Filter maintenance", "Valve care"}},
		{"a list of names without a cue",
			"# Filter Maintenance\n\n# Valve Care\n\nOur partners Filter Maintenance, Valve Care and the Water Board clean the housings.\n",
			[]string{"Filter Maintenance", "Valve Care"}, []string{"Filter maintenance", "Valve care"}},
		{"without a cue: a name",
			"# Filter Maintenance\n\nOur service partner Filter Maintenance cleans the housings.\n",
			[]string{"Filter Maintenance"}, []string{"Filter maintenance"}},
		{"a name written as one elsewhere stays one",
			"# Climate Master\n\nFor the wiring, see Climate Master. Mount the Climate Master on a dry wall.\n",
			[]string{"Climate Master"}, []string{"Climate master"}},
		{"a cue before part of a heading: a name",
			"# Climate Master Setup\n\nFor the wiring, see Climate Master before you start.\n",
			[]string{"Climate Master setup"}, []string{"Climate master setup"}},
		{"a quoted product name and the name unquoted",
			"# Climate Master Setup\n\nMount the “Climate Master” controller on a dry wall; the Climate Master opens the vents.\n",
			[]string{"Climate Master setup"}, []string{"Climate master setup"}},
		{"a quoted product name alone says nothing",
			"# Climate Master Setup\n\nMount the “Climate Master” controller on a dry wall.\n",
			[]string{"Climate master setup"}, []string{"Climate master setup"}},
		{"a heading and more after a cue: a name",
			"# Climate Master\n\n# Climate Master Care\n\nFor the wiring, see Climate Master and the Water Board.\n",
			[]string{"Climate Master", "Climate Master care"}, []string{"Climate master", "Climate master care"}},
	}
	v := viewer(t)
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := document(t, tt.text)
			require.NotEmpty(t, d.Headings)
			assert.Equal(t, tt.want, headingViews(v, d, true))
			assert.Equal(t, tt.without, headingViews(v, d, false))
		})
	}
}

// Without headings there is nothing to gather; running text alone
// changes no view.
func TestGatherNeedsHeadings(t *testing.T) {
	d := document(t, "Mount the Climate Master on a dry wall.\n")
	assert.Nil(t, Gather(d.Sentences))
	d = document(t, "# 3.2\n\nMount the Climate Master on a dry wall.\n")
	assert.Nil(t, Gather(d.Sentences), "a heading without a capitalized word")

	var none *Evidence
	marks, _ := none.nameTokens(d.Sentences[0].Tokens, nil)
	assert.Zero(t, marks)
	assert.Zero(t, none.seen([]byte("climate")))
}

// BenchmarkGather measures the evidence of the demo corpus's documents,
// per token: the cost a document with headings adds to tagging.
func BenchmarkGather(b *testing.B) {
	paths, err := filepath.Glob("../../testdata/demo/*")
	require.NoError(b, err)
	var docs []*doc.Document
	tokens := 0
	for _, p := range paths {
		d, ps := read.Read(read.Input{Name: p, Path: p}, read.Options{})
		require.NotNil(b, d, "%v", ps)
		tokenize.Document(d)
		for _, s := range d.Sentences {
			tokens += len(s.Tokens)
		}
		docs = append(docs, d)
	}
	b.ResetTimer()
	for b.Loop() {
		for _, d := range docs {
			Gather(d.Sentences)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(tokens), "ns/token")
}

// BenchmarkGatherList measures the evidence of a sentence that lists one
// heading thousands of times without a cue, per token: each item asks
// whether the list began with a reference, which must not make the cost
// grow with the list (ns/token alike for both sizes).
func BenchmarkGatherList(b *testing.B) {
	for _, n := range []int{1000, 10000} {
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			text := "# Valve Care\n\nOur partners " + strings.Repeat("Valve Care, ", n) + "and others clean the housings.\n"
			d := &doc.Document{Text: text, Headings: []doc.LineRange{{First: 1, Last: 1}}}
			tokenize.Document(d)
			tokens := 0
			for _, s := range d.Sentences {
				tokens += len(s.Tokens)
			}
			b.ResetTimer()
			for b.Loop() {
				Gather(d.Sentences)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(tokens), "ns/token")
		})
	}
}

// A capital is the writing's at a sentence's start and after the tokens
// writers capitalize any word after (colon, quote, bracket, a list item's
// number); after a word or a comma it is the word's own.
func TestCapitalOfWriting(t *testing.T) {
	tests := []struct {
		text string
		word string // the capitalized word asked about
		want bool
	}{
		{"Vavle seats wear fast.", "Vavle", true},
		{"Note: Vavle seats wear fast.", "Vavle", true},
		{`He wrote "Vavle seats wear fast."`, "Vavle", true},
		{"Spare parts (Vavle seats) are in stock.", "Vavle", true},
		{"Order the Vavle seats now.", "Vavle", false},
		{"Seats, Vavle and others are in stock.", "Vavle", false},
	}
	for _, tc := range tests {
		t.Run(tc.text, func(t *testing.T) {
			d := document(t, tc.text)
			require.Len(t, d.Sentences, 1)
			toks := d.Sentences[0].Tokens
			k := slices.IndexFunc(toks, func(tok doc.Token) bool { return tok.Form == tc.word })
			require.GreaterOrEqual(t, k, 0)
			assert.Equal(t, tc.want, CapitalOfWriting(toks, k))
		})
	}
}

// OwnCapitals keeps the words running text writes with capitals of their
// own — names where a name may start, acronyms among lower-case words —
// and none that a sentence's start, a heading or a line of title case or
// capitals gave their capitals.
func TestOwnCapitals(t *testing.T) {
	tests := []struct {
		name, text string
		drop       string // a word keep turns down
		want       []string
	}{
		{"a name inside a sentence", "The crew of Borehale Drilling came at noon.", "", []string{"borehale", "drilling"}},
		{"a sentence's first word", "Borehale crews came at noon.", "", nil},
		{"after a colon", "Crew: Borehale came at noon.", "", nil},
		{"an acronym, even first", "FLAOT inputs are wired to the FLAOT board.", "", []string{"flaot"}},
		{"a heading", "# Replacing the Solenoid Vavle\n\nThe seat is worn.", "", nil},
		{"a line of title case", "Replacing The Solenoid Vavle", "", nil},
		{"a line in capitals", "SOLENOID VAVLE REPLACED", "", nil},
		{"left out by keep", "The crew of Borehale Drilling came at noon.", "drilling", []string{"borehale"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			keep := func(w []byte) bool { return string(w) != tc.drop }
			got := OwnCapitals(document(t, tc.text).Sentences, keep)
			assert.ElementsMatch(t, tc.want, slices.Collect(maps.Keys(got)))
		})
	}
}

// A line of capitals has two words or more and no lower-case letter; it
// is read line by line, as a sentence splitter may run it into the next.
func TestCapsLine(t *testing.T) {
	tests := []struct {
		text string
		want bool // for the sentence's first token
	}{
		{"SOLENOID VAVLE REPLACED ON TANK 2", true},
		{"SOLENOID VAVLE REPLACED ON TANK 2\nThe seat was worn.", true},
		{"THERMISTR\nThe seat was worn.", false},
		{"THERMISTR leads were loose.", false},
		{"Solenoid Vavle Replaced", false},
	}
	for _, tc := range tests {
		t.Run(tc.text, func(t *testing.T) {
			d := document(t, tc.text)
			require.NotEmpty(t, d.Sentences)
			assert.Equal(t, tc.want, CapsLine(d.Sentences[0].Tokens, 0))
		})
	}
}
