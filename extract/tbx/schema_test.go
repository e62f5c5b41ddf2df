package tbx

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

	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// elem is an element of a document checked against Schematron rules.
type elem struct {
	space, local string
	attr         map[string]string
	text         string
	parent       *elem
	kids         []*elem
}

func parseTree(t *testing.T, data []byte) *elem {
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

// schematronBasicDCA checks the rules of TBX-Basic_DCA.sch
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
func schematronBasicDCA(root *elem) []string {
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
	if root.attr["type"] != Basic {
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
		"administrativeStatus": {AdmittedStatus, DeprecatedStatus, SupersededStatus, PreferredStatus},
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
		if e.space != Namespace {
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

// schematronCore checks the rules of TBX-Core.sch (../shared/standards/tbx)
// that a Go test can check: tbx/@type = TBX-Core, no element outside the
// TBX namespace, termNote only at termSec level, no empty type, @target a
// URI or an id. Not checked: the XLIFF inline-markup rules.
func schematronCore(root *elem) []string {
	var errs []string
	if root.attr["type"] != Core {
		errs = append(errs, fmt.Sprintf("type %q, want TBX-Core", root.attr["type"]))
	}
	root.walk(func(e *elem) {
		if e.space != Namespace {
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

// jing validates a file against a RELAX NG schema of
// ../shared/standards/tbx when jing is installed (Debian package jing; CI
// installs it). It returns jing's complaints.
func jing(t *testing.T, schema string, data []byte) string {
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
	var lines []string
	for _, l := range strings.Split(string(out), "\n") {
		if strings.Contains(l, "error") {
			lines = append(lines, l)
		}
	}
	if err != nil && len(lines) == 0 {
		lines = append(lines, err.Error()+": "+string(out))
	}
	return strings.Join(lines, "\n")
}
