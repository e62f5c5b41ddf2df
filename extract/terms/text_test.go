package terms

import (
	"strings"
	"testing"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// Spellings are built in reused buffers rather than with the strings
// package; they must come out as strings.ToLower and strings.Fields would
// make them, for any bytes, including white space beyond ASCII and invalid
// UTF-8 (the reference is the Go standard library).
var textCases = []string{
	"", "a", "Valve", "VALVE body", "set-point", "ÄRZTE-kammer", "Überdruck\u00a0Ventil",
	"  lead and trail  ", "tab\tnew\nline\r\n", "two  spaces", "nbsp\u00a0inside", "ideo\u3000space",
	"bad \xff byte", "\xffstart", "end\xc3", "İstanbul", "ΣΊΣΥΦΟΣ", "ǅ digraph", "x\u0085nel",
}

func TestAppendLowerIsToLower(t *testing.T) {
	for _, s := range textCases {
		if got, want := string(appendLower([]byte("prefix"), s)), "prefix"+strings.ToLower(s); got != want {
			t.Errorf("appendLower(%q) = %q, want %q", s, got, want)
		}
		if got, want := needsLower(s), strings.ToLower(s) != s; want && !got {
			t.Errorf("needsLower(%q) = false, but lower-casing changes it", s)
		}
	}
}

func TestAppendFieldsIsJoinedFields(t *testing.T) {
	for _, s := range textCases {
		if got, want := string(appendFields([]byte("p"), s)), "p"+strings.Join(strings.Fields(s), " "); got != want {
			t.Errorf("appendFields(%q) = %q, want %q", s, got, want)
		}
		if s != "" && singleSpaced(s) && strings.Join(strings.Fields(s), " ") != s {
			t.Errorf("singleSpaced(%q), but folding its white space changes it", s)
		}
	}
}

// A group key is the lower-cased words without hyphens of any kind.
func TestAppendKey(t *testing.T) {
	for in, want := range map[string]string{
		"set-point": "setpoint", "set‐point": "setpoint", "set‑point": "setpoint",
		"root-zone": "rootzone", "überdruck–ventil": "überdruck–ventil", "a\xffb": "a\ufffdb",
	} {
		if got := string(appendKey(nil, []byte(in))); got != want {
			t.Errorf("appendKey(%q) = %q, want %q", in, got, want)
		}
	}
}

// The strings an arena hands out never change, however many follow.
func TestArenaStringsStay(t *testing.T) {
	var a arena
	var got []string
	var want []string
	for i := 0; i < 3000; i++ {
		s := strings.Repeat(string(rune('a'+i%26)), 1+i%17)
		got = append(got, a.str(s))
		want = append(want, s)
	}
	got = append(got, a.str(strings.Repeat("x", 3*arenaBlock)))
	want = append(want, strings.Repeat("x", 3*arenaBlock))
	for i := range got {
		if got[i] != want[i] {
			t.Fatalf("string %d changed: %q, want %q", i, got[i], want[i])
		}
	}
}

// Collect reuses working memory from document to document: counting a
// document after others gives the same counts as counting it first.
func TestCollectReusesNothingOfTheLastDocument(t *testing.T) {
	m, col := defaultSetup(t)
	texts := []string{
		"The Drip Emitters clog. Each drip emitter delivers 2 litres. The EC sensor reads the EC.",
		"Set‐points and set-points: the set point of the PLCs.\nRoot-zone temperature sensors read  values.",
		"Die Überdruckventile prüfen. The valve\u00a0body and the valve bodies.",
	}
	docs := make([]*doc.Document, len(texts))
	for i, text := range texts {
		docs[i] = &doc.Document{Name: string(rune('a' + i)), Text: text}
		tokenize.Document(docs[i])
		m.TagDocument(docs[i])
	}
	dump := func(dc *DocCounts) string {
		c := NewCorpus(3)
		c.Add(dc)
		var b strings.Builder
		for _, x := range c.Terms(nil) {
			b.WriteString(x.Term + "|" + x.POS)
			for _, v := range x.Variants {
				b.WriteString("|" + v.Form)
			}
			for _, cx := range x.Contexts {
				b.WriteString("|" + cx.Text)
			}
			b.WriteString("\n")
		}
		return b.String()
	}
	for i, d := range docs {
		alone := dump(col.Collect(d))
		if alone == "" {
			t.Fatalf("document %d: no candidates", i)
		}
		for _, other := range docs {
			col.Collect(other)
		}
		if again := dump(col.Collect(d)); again != alone {
			t.Errorf("document %d counted after others:\n%s\nfirst:\n%s", i, again, alone)
		}
	}
}
