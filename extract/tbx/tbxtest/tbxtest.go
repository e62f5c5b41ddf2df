// Package tbxtest checks TBX files the way the standard's schemas of
// ../shared/standards/tbx do, for tests: jing with the RELAX NG schemas and
// the Schematron rules, and in Go the Schematron rules jing's engine cannot
// evaluate. It names the standard's values itself rather than taking them
// from package tbx, so that a check never agrees with the writer by
// construction.
package tbxtest

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// The TBX v3 namespace and dialect names (ISO 30042:2019; tbx/@type).
const (
	namespace = "urn:iso:std:iso:30042:ed-2"
	core      = "TBX-Core"
	basic     = "TBX-Basic"
)

// Validate checks a file of the dialect ("TBX-Core" or "TBX-Basic") with
// everything this package has: TBX-Core against the TBX-Core integrated
// RELAX NG schema and TBX-Core.sch's rules in Go; TBX-Basic against the
// core structure schema (which the TBX-Basic NVDL file names for the TBX
// namespace), the rules of TBX-Basic_DCA.sch with jing, and those rules
// in Go.
func Validate(t testing.TB, dialect string, data []byte) {
	t.Helper()
	switch dialect {
	case core:
		assert.Empty(t, SchematronCore(t, data), "TBX-Core.sch")
		assert.Empty(t, Jing(t, "TBXcoreStructV03_TBX-Core_integrated.rng", data), "TBX-Core RELAX NG")
	case basic:
		assert.Empty(t, SchematronBasicDCA(t, data), "TBX-Basic_DCA.sch, in Go")
		assert.Empty(t, Jing(t, "TBXcoreStructV03.rng", data), "TBX core structure RELAX NG")
		assert.Empty(t, Jing(t, "TBX-Basic_DCA.sch", data), "TBX-Basic_DCA.sch, with jing")
	default:
		t.Fatalf("unknown TBX dialect %q", dialect)
	}
}

// elem is an element of a document checked against Schematron rules.
type elem struct {
	space, local string
	attr         map[string]string
	text         string
	parent       *elem
	kids         []*elem
}

func parseTree(t testing.TB, data []byte) *elem {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	var root, cur *elem
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		require.NoError(t, err)
		switch x := tok.(type) {
		case xml.StartElement:
			e := &elem{space: x.Name.Space, local: x.Name.Local, attr: map[string]string{}, parent: cur}
			for _, a := range x.Attr {
				e.attr[a.Name.Local] = a.Value
			}
			if cur == nil {
				root = e
			} else {
				cur.kids = append(cur.kids, e)
			}
			cur = e
		case xml.EndElement:
			cur = cur.parent
		case xml.CharData:
			if cur != nil {
				cur.text += string(x)
			}
		}
	}
	return root
}

func (e *elem) walk(fn func(*elem)) {
	fn(e)
	for _, k := range e.kids {
		k.walk(fn)
	}
}

// parentLevel is the structural level an element sits at: its parent, or
// its grandparent when the parent is a group (…Grp other than transacGrp).
func (e *elem) parentLevel() string {
	p := e.parent
	if p != nil && strings.HasSuffix(p.local, "Grp") && p.local != "transacGrp" && p.parent != nil {
		p = p.parent
	}
	if p == nil {
		return ""
	}
	return p.local
}

// SchematronBasicDCA checks the rules of TBX-Basic_DCA.sch
// (../shared/standards/tbx) that a Go test can check:
//   - coreEnforcement: termNote only at termSec level (or in a
//     termNoteGrp there); a type attribute is never empty; @target is a
//     URI or the id of an element of the document;
//   - dialectEnforcement: tbx/@type = TBX-Basic, tbx/@style = dca, no
//     element outside the TBX namespace; the permitted type values of
//     admin, descrip, ref, termNote, transac, transacNote and xref;
//   - module.min: administrativeStatus and partOfSpeech values;
//     subjectField only at conceptEntry level; customerSubset levels;
//   - module.basic: context only at termSec level, definition at
//     conceptEntry or langSec level, source and projectSubset levels,
//     grammaticalGender values.
//
// Not checked: the XLIFF inline-markup rules (sc/ec pairing), which
// glossmith never writes.
func SchematronBasicDCA(t testing.TB, data []byte) []string {
	t.Helper()
	root := parseTree(t, data)
	var errs []string
	bad := func(e *elem, msg string, args ...any) {
		errs = append(errs, fmt.Sprintf("<%s>: %s", e.local, fmt.Sprintf(msg, args...)))
	}
	ids := map[string]bool{}
	root.walk(func(e *elem) {
		if id := e.attr["id"]; id != "" {
			ids[id] = true
		}
	})
	if root.attr["type"] != basic {
		bad(root, "type %q, want TBX-Basic", root.attr["type"])
	}
	if root.attr["style"] != "dca" {
		bad(root, "style %q, want dca", root.attr["style"])
	}
	allowed := map[string][]string{
		"admin":       {"customerSubset", "projectSubset", "source"},
		"descrip":     {"subjectField", "context", "definition"},
		"ref":         {"crossReference"},
		"termNote":    {"administrativeStatus", "partOfSpeech", "geographicalUsage", "grammaticalGender", "termLocation", "termType"},
		"transac":     {"transactionType"},
		"transacNote": {"responsibility"},
		"xref":        {"externalCrossReference", "xGraphic"},
	}
	values := map[string][]string{
		"administrativeStatus": {"admittedTerm-admn-sts", "deprecatedTerm-admn-sts", "supersededTerm-admn-sts", "preferredTerm-admn-sts"},
		"partOfSpeech":         {"adjective", "noun", "other", "verb", "adverb"},
		"grammaticalGender":    {"masculine", "feminine", "neuter", "other"},
		"termType":             {"fullForm", "acronym", "abbreviation", "shortForm", "variant", "phrase"},
	}
	levels := map[string][]string{
		"subjectField":   {"conceptEntry"},
		"customerSubset": {"conceptEntry", "termSec"},
		"projectSubset":  {"conceptEntry", "termSec"},
		"source":         {"conceptEntry", "langSec", "termSec"},
		"context":        {"termSec"},
		"definition":     {"conceptEntry", "langSec"},
	}
	root.walk(func(e *elem) {
		if e.space != namespace {
			bad(e, "element outside the TBX namespace %q", e.space)
		}
		typ, hasType := e.attr["type"]
		if hasType && typ == "" {
			bad(e, "empty type")
		}
		if tg, ok := e.attr["target"]; ok && !(strings.HasPrefix(tg, "http://") || strings.HasPrefix(tg, "https://")) && !ids[tg] {
			bad(e, "target %q is neither a URI nor an id", tg)
		}
		if e.local == "termNote" && e.parentLevel() != "termSec" {
			bad(e, "termNote at %s level", e.parentLevel())
		}
		if list, ok := allowed[e.local]; ok && !slices.Contains(list, typ) {
			bad(e, "type %q not permitted", typ)
		}
		if v, ok := values[typ]; ok && e.local == "termNote" && !slices.Contains(v, strings.TrimSpace(e.text)) {
			bad(e, "%s value %q not permitted", typ, e.text)
		}
		if lv, ok := levels[typ]; ok && (e.local == "admin" || e.local == "descrip") && !slices.Contains(lv, e.parentLevel()) {
			bad(e, "%s at %s level", typ, e.parentLevel())
		}
	})
	return errs
}

// SchematronCore checks the rules of TBX-Core.sch (../shared/standards/tbx)
// that a Go test can check: tbx/@type = TBX-Core, no element outside the
// TBX namespace, termNote only at termSec level, no empty type, @target a
// URI or an id. Not checked: the XLIFF inline-markup rules.
func SchematronCore(t testing.TB, data []byte) []string {
	t.Helper()
	root := parseTree(t, data)
	var errs []string
	if root.attr["type"] != core {
		errs = append(errs, fmt.Sprintf("type %q, want TBX-Core", root.attr["type"]))
	}
	root.walk(func(e *elem) {
		if e.space != namespace {
			errs = append(errs, fmt.Sprintf("<%s> outside the TBX namespace", e.local))
		}
		if typ, ok := e.attr["type"]; ok && typ == "" {
			errs = append(errs, fmt.Sprintf("<%s> with an empty type", e.local))
		}
		if e.local == "termNote" && e.parentLevel() != "termSec" {
			errs = append(errs, "termNote outside termSec")
		}
		if tg, ok := e.attr["target"]; ok && !strings.HasPrefix(tg, "http") {
			errs = append(errs, fmt.Sprintf("<%s> target %q", e.local, tg))
		}
	})
	return errs
}

// Jing validates a file against a schema of ../shared/standards/tbx — a
// RELAX NG schema (.rng) or Schematron rules (.sch; jing checks the rules
// its XPath 1 engine can evaluate, such as the permitted values) — when
// jing is installed (Debian package jing; CI installs it, and there a
// missing jing fails the test). It returns jing's complaints.
func Jing(t testing.TB, schema string, data []byte) string {
	t.Helper()
	bin, err := exec.LookPath("jing")
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatal("jing is not installed (.ci/run installs it)")
		}
		t.Skip("jing is not installed: apt-get install jing")
	}
	dir := testenv.SharedDir(t, "standards/tbx")
	f := filepath.Join(t.TempDir(), "out.tbx")
	require.NoError(t, os.WriteFile(f, data, 0o644))
	out, err := exec.Command(bin, filepath.Join(dir, schema), f).CombinedOutput()
	// An error line, and the indented lines after it (a failed Schematron
	// assertion's message); jing's warnings about missing optional jars are
	// not complaints. jing exits 0 on failed Schematron assertions.
	var lines []string
	inError := false
	for _, l := range strings.Split(string(out), "\n") {
		inError = strings.Contains(l, "error") || inError && strings.HasPrefix(l, " ")
		if inError {
			lines = append(lines, l)
		}
	}
	if err != nil && len(lines) == 0 {
		lines = append(lines, err.Error()+": "+string(out))
	}
	return strings.Join(lines, "\n")
}
