package web

import (
	"bytes"
	"crypto/sha256"
	"encoding/base64"
	"encoding/json"
	"errors"
	"io"
	"text/template"

	"glossmith/extract/review"
)

// reportData is the report's inlined data: the table, every detail view,
// and each context sentence once (many candidates share a sentence).
type reportData struct {
	*review.Dataset
	Details []reportDetail `json:"details"`
	Texts   []string       `json:"texts"`
	// Stamp tells reports apart in the browser's storage of remarks.
	Stamp string `json:"stamp"`
}

type reportDetail struct {
	review.Detail
	Contexts [][3]int `json:"contexts"` // document, line, index in Texts
}

// ReportContexts is how many contexts per candidate the report carries.
const ReportContexts = 3

// WriteReport writes the dataset as one self-contained HTML page: the
// page's CSS and script inline, the data as JSON, and a Content Security
// Policy that lets the page load nothing from anywhere. It opens from
// file:// in a browser with no network.
func WriteReport(w io.Writer, ds *review.Dataset) error {
	rd := reportData{Dataset: ds, Details: make([]reportDetail, len(ds.Details))}
	texts := map[string]int{}
	for i, d := range ds.Details {
		rd.Details[i].Detail = d
		cs := d.Contexts[:min(len(d.Contexts), ReportContexts)]
		rd.Details[i].Contexts = make([][3]int, len(cs))
		for k, c := range cs {
			t, ok := texts[c.Text]
			if !ok {
				t = len(rd.Texts)
				texts[c.Text] = t
				rd.Texts = append(rd.Texts, c.Text)
			}
			rd.Details[i].Contexts[k] = [3]int{c.Doc, c.Line, t}
		}
	}
	// json.Marshal escapes <, > and & in strings, so no document text can
	// end the script element the data sits in.
	body, err := json.Marshal(rd)
	if err != nil {
		return err
	}
	sum := sha256.Sum256(body)
	rd.Stamp = base64.RawURLEncoding.EncodeToString(sum[:9])
	if body, err = json.Marshal(rd); err != nil {
		return err
	}
	script, err := assets.ReadFile("assets/app.js")
	if err != nil {
		return err
	}
	css, err := assets.ReadFile("assets/app.css")
	if err != nil {
		return err
	}
	if bytes.Contains(bytes.ToLower(script), []byte("</script")) || bytes.Contains(bytes.ToLower(css), []byte("</style")) {
		return errors.New("report: the page's script or style would end its element early")
	}
	tmpl, err := template.ParseFS(assets, "assets/report.html")
	if err != nil {
		return err
	}
	hash := sha256.Sum256(script)
	return tmpl.Execute(w, map[string]string{
		"CSS":        string(css),
		"Script":     string(script),
		"ScriptHash": "sha256-" + base64.StdEncoding.EncodeToString(hash[:]),
		"Data":       string(body),
	})
}
