package testenv

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"sync"
	"testing"
)

// pythons caches PythonWith's answer per module ("" for none): asking
// an interpreter to import pandas takes a good part of a second.
var pythons sync.Map

// PythonWith returns a Python 3 interpreter that can import module: the
// first python3 on PATH, or else /usr/bin/python3 (Debian's, where
// python3-pandas installs; a pyenv shim earlier on PATH may hide it). When
// neither can, the test fails under CI (CI=true), where .ci/run installs
// the module, and is skipped elsewhere with a message saying what is
// missing.
func PythonWith(t testing.TB, module string) string {
	t.Helper()
	found, ok := pythons.Load(module)
	if !ok {
		found, _ = pythons.LoadOrStore(module, findPython(module))
	}
	if py := found.(string); py != "" {
		return py
	}
	if os.Getenv("CI") == "true" {
		t.Fatalf("no Python 3 that imports %s (python3 on PATH, /usr/bin/python3; required under CI)", module)
	}
	t.Skipf("no Python 3 that imports %s (python3 on PATH, /usr/bin/python3; apt-get install python3-%s); skipping (it is required under CI=true)", module, module)
	return ""
}

// findPython returns the first of python3 on PATH and /usr/bin/python3
// that imports module, or "".
func findPython(module string) string {
	for _, name := range []string{"python3", "/usr/bin/python3"} {
		if py, err := exec.LookPath(name); err == nil && exec.Command(py, "-c", "import "+module).Run() == nil {
			return py
		}
	}
	return ""
}

// pandasScript reads a table from standard input with pandas.read_csv as
// a user of glossmith's TSV or CSV would: separator argv[1], fields quoted
// as RFC 4180 quotes them (QUOTE_MINIMAL, inner quotes doubled), every cell
// a string, no "NA" guessing, the header row kept as a row, a byte-order
// mark dropped. It prints the rows as JSON.
const pandasScript = `import csv, io, json, sys
import pandas as pd
df = pd.read_csv(io.BytesIO(sys.stdin.buffer.read()), sep=sys.argv[1], header=None, dtype=str,
                 keep_default_na=False, na_filter=False, quotechar='"', doublequote=True,
                 quoting=csv.QUOTE_MINIMAL, skip_blank_lines=False, encoding="utf-8-sig")
print(json.dumps(df.values.tolist()))
`

// PandasRows returns the rows (header first) that pandas, the data-frame
// library most Python users load tables with, reads from data with the
// separator sep ("\t" or ","). It skips or fails as PythonWith does when
// pandas is missing.
func PandasRows(t testing.TB, data []byte, sep string) [][]string {
	t.Helper()
	py := PythonWith(t, "pandas")
	cmd := exec.Command(py, "-c", pandasScript, sep)
	cmd.Stdin = bytes.NewReader(data)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("pandas.read_csv: %v\n%s", err, stderr.String())
	}
	var rows [][]string
	if err := json.Unmarshal(out, &rows); err != nil {
		t.Fatalf("pandas.read_csv output: %v", err)
	}
	return rows
}
