package check

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"io"
	"iter"
	"net/url"
	"path/filepath"
	"slices"
	"strings"
)

// Formats are the output formats Write knows.
var Formats = []string{"text", "jsonl", "sarif"}

// WriteOptions tune Write.
type WriteOptions struct {
	// Color marks the levels with ANSI colours in text output (for a
	// terminal; the command honours NO_COLOR).
	Color bool
	// Version is glossmith's version, for SARIF's tool description.
	Version string
}

// Write writes findings in a format of Formats.
func Write(w io.Writer, format string, fs []Finding, opt WriteOptions) error {
	return WriteSeq(w, format, slices.Values(fs), opt)
}

// WriteSeq writes findings as they come, in a format of Formats: a report
// of any size is written holding one finding at a time (a SARIF log too,
// whose results are written one by one into the log around them).
func WriteSeq(w io.Writer, format string, fs iter.Seq[Finding], opt WriteOptions) error {
	bw := bufio.NewWriter(w)
	var err error
	switch format {
	case "text", "":
		err = writeText(bw, fs, opt)
	case "jsonl":
		err = writeJSONL(bw, fs)
	case "sarif":
		err = writeSARIF(bw, fs, opt)
	default:
		return fmt.Errorf("unknown output format %q (want %s)", format, strings.Join(Formats, ", "))
	}
	if err != nil {
		return err
	}
	return bw.Flush()
}

// ANSI colours of the levels: note cyan, warning yellow, error red; the
// position bold.
var levelColor = [...]string{"\x1b[36m", "\x1b[33m", "\x1b[31m"}

const bold, reset = "\x1b[1m", "\x1b[0m"

// writeText writes one compiler-style line per finding,
// "file:line:col: level: message", which editors and terminals link to the
// place.
func writeText(w *bufio.Writer, fs iter.Seq[Finding], opt WriteOptions) error {
	for f := range fs {
		lv := f.Level()
		if opt.Color {
			fmt.Fprintf(w, "%s%s:%d:%d:%s %s%s%s: %s\n", bold, f.File, f.Line, f.Column, reset, levelColor[lv], lv, reset, f.Message)
		} else {
			fmt.Fprintf(w, "%s:%d:%d: %s: %s\n", f.File, f.Line, f.Column, lv, f.Message)
		}
	}
	return nil
}

// record is a finding as a line of JSON Lines.
type record struct {
	File      string `json:"file"`
	Line      int    `json:"line"`
	Column    int    `json:"column"`
	EndLine   int    `json:"end_line"`
	EndColumn int    `json:"end_column"`
	Text      string `json:"text"`
	Kind      string `json:"kind"`
	Level     string `json:"level"`
	Preferred string `json:"preferred"`
	Entry     string `json:"entry"`
	Message   string `json:"message"`
}

func writeJSONL(w *bufio.Writer, fs iter.Seq[Finding]) error {
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false)
	for f := range fs {
		if err := enc.Encode(record{f.File, f.Line, f.Column, f.EndLine, f.EndColumn, f.Text, f.Kind.String(),
			f.Level().String(), f.Preferred, f.Entry, f.Message}); err != nil {
			return err
		}
	}
	return nil
}

// SARIF 2.1.0 (OASIS Static Analysis Results Interchange Format): the
// parts of the log glossmith writes.
type (
	sarifLog struct {
		Schema  string     `json:"$schema"`
		Version string     `json:"version"`
		Runs    []sarifRun `json:"runs"`
	}
	sarifRun struct {
		Tool       sarifTool     `json:"tool"`
		ColumnKind string        `json:"columnKind"`
		Results    []sarifResult `json:"results"`
	}
	sarifTool struct {
		Driver sarifDriver `json:"driver"`
	}
	sarifDriver struct {
		Name    string      `json:"name"`
		Version string      `json:"version,omitempty"`
		Rules   []sarifRule `json:"rules"`
	}
	sarifRule struct {
		ID               string       `json:"id"`
		ShortDescription sarifMessage `json:"shortDescription"`
		DefaultConfig    struct {
			Level string `json:"level"`
		} `json:"defaultConfiguration"`
	}
	sarifMessage struct {
		Text string `json:"text"`
	}
	sarifResult struct {
		RuleID              string            `json:"ruleId"`
		RuleIndex           int               `json:"ruleIndex"`
		Level               string            `json:"level"`
		Message             sarifMessage      `json:"message"`
		Locations           []sarifLocation   `json:"locations"`
		PartialFingerprints map[string]string `json:"partialFingerprints"`
		Properties          sarifProperties   `json:"properties"`
	}
	sarifLocation struct {
		PhysicalLocation struct {
			ArtifactLocation struct {
				URI string `json:"uri"`
			} `json:"artifactLocation"`
			Region struct {
				StartLine   int          `json:"startLine"`
				StartColumn int          `json:"startColumn"`
				EndLine     int          `json:"endLine"`
				EndColumn   int          `json:"endColumn"`
				Snippet     sarifMessage `json:"snippet"`
			} `json:"region"`
		} `json:"physicalLocation"`
	}
	sarifProperties struct {
		Text      string `json:"text"`
		Preferred string `json:"preferred"`
		Entry     string `json:"entry"`
	}
)

// sarifRules describe the kinds, in Kind order.
var sarifRules = [...]string{
	"A deprecated or forbidden term of the glossary is used.",
	"A term is spelled other than its preferred form (hyphen, space, closed, case or inflection).",
	"A term is spelled more than one way across the documents.",
	"A term of the glossary is written with one word misspelt: a letter left out, added or wrong, or two letters swapped.",
}

// fingerprintKey is the partial fingerprint glossmith writes: the same
// finding in a later version of a file has the same one wherever it moved.
const fingerprintKey = "glossmith/finding/v1"

// sarifIndent is the indent of the results in the log: they are the
// elements of an array in an object in an array in an object.
const sarifIndent = "        "

// writeSARIF writes the log as encoding/json writes it indented by two
// spaces, the results streamed: the log is encoded without results and
// split where they go, and each result is encoded on its own with the
// indent it has there.
func writeSARIF(w *bufio.Writer, fs iter.Seq[Finding], opt WriteOptions) error {
	run := sarifRun{ColumnKind: "unicodeCodePoints", Results: []sarifResult{}}
	run.Tool.Driver = sarifDriver{Name: "glossmith", Version: opt.Version}
	for k, d := range sarifRules {
		r := sarifRule{ID: Kind(k).String(), ShortDescription: sarifMessage{d}}
		r.DefaultConfig.Level = Kind(k).Level().String()
		run.Tool.Driver.Rules = append(run.Tool.Driver.Rules, r)
	}
	var frame bytes.Buffer
	enc := json.NewEncoder(&frame)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(sarifLog{
		Schema:  "https://json.schemastore.org/sarif-2.1.0.json",
		Version: "2.1.0",
		Runs:    []sarifRun{run},
	}); err != nil {
		return err
	}
	const results = `"results": [`
	at := bytes.LastIndex(frame.Bytes(), []byte(results+"]"))
	if at < 0 {
		return fmt.Errorf("sarif: no results array in the log") // cannot happen: the run has one
	}
	head, tail := frame.Bytes()[:at+len(results)], frame.Bytes()[at+len(results):]
	w.Write(head)
	var item bytes.Buffer
	enc = json.NewEncoder(&item)
	enc.SetEscapeHTML(false)
	enc.SetIndent(sarifIndent, "  ")
	n := 0
	for f := range fs {
		var loc sarifLocation
		p := &loc.PhysicalLocation
		p.ArtifactLocation.URI = fileURI(f.File)
		p.Region.StartLine, p.Region.StartColumn = f.Line, f.Column
		p.Region.EndLine, p.Region.EndColumn = f.EndLine, f.EndColumn
		p.Region.Snippet.Text = f.Text
		item.Reset()
		if err := enc.Encode(sarifResult{
			RuleID: f.Kind.String(), RuleIndex: int(f.Kind), Level: f.Level().String(),
			Message:             sarifMessage{f.Message},
			Locations:           []sarifLocation{loc},
			PartialFingerprints: map[string]string{fingerprintKey: fingerprint(f.File, f.Kind.String(), f.Text, f.Entry)},
			Properties:          sarifProperties{f.Text, f.Preferred, f.Entry},
		}); err != nil {
			return err
		}
		if n > 0 {
			w.WriteByte(',')
		}
		w.WriteString("\n" + sarifIndent)
		w.Write(bytes.TrimSuffix(item.Bytes(), []byte("\n")))
		n++
	}
	if n > 0 {
		w.WriteString("\n" + sarifIndent[2:])
	}
	_, err := w.Write(tail)
	return err
}

// fileURI writes a document's name as a relative URI reference.
func fileURI(name string) string {
	return (&url.URL{Path: filepath.ToSlash(name)}).String()
}

// fingerprint identifies a finding apart from its position: the file, the
// kind, the text in lower case and the entry.
func fingerprint(file, kind, text, entry string) string {
	h := sha256.Sum256([]byte(baselineKey(file, kind, text, entry)))
	return hex.EncodeToString(h[:16])
}
