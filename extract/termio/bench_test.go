package termio

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"syscall"
	"testing"

	"github.com/stretchr/testify/require"

	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
)

// BenchmarkImportTBX100k reads a TBX-Basic file of 100,000 entries (two
// terms each, with part of speech, status, definition and a context) and
// imports it into a new termbase: the whole of "termbase import" but the
// command line. Target: at most 10 s an operation.
func BenchmarkImportTBX100k(b *testing.B) {
	dir := b.TempDir()
	doc := &tbx.Document{Dialect: tbx.Basic, Lang: "en", Source: "benchmark"}
	for i := range 100_000 {
		doc.Entries = append(doc.Entries, tbx.Entry{ID: fmt.Sprintf("c%d", i), Subject: "greenhouse climate",
			Definitions: []tbx.Definition{{Lang: "en", Text: fmt.Sprintf("Control parameter number %d of a climate zone.", i), Source: "spec"}},
			Terms: []tbx.Term{
				{Lang: "en", Text: fmt.Sprintf("zone %d set point", i), POS: "noun", Status: tbx.PreferredStatus,
					Contexts: []tbx.Context{{Text: fmt.Sprintf("Raise the zone %d set point by two degrees.", i), Source: "manual.md, line 7"}}},
				{Lang: "en", Text: fmt.Sprintf("zone %d setpoint", i), POS: "noun", Status: tbx.AdmittedStatus},
			}})
	}
	var buf bytes.Buffer
	require.NoError(b, tbx.Write(&buf, doc))
	path := filepath.Join(dir, "big.tbx")
	require.NoError(b, os.WriteFile(path, buf.Bytes(), 0o644))
	b.SetBytes(int64(buf.Len()))
	// CPU seconds as well as wall time: on a shared machine the wall time
	// says more about the other processes than about the import.
	cpu0 := cpuSeconds()
	b.ResetTimer()
	defer func() { b.ReportMetric((cpuSeconds()-cpu0)/float64(b.N), "cpu-s/op") }()
	for i := range b.N {
		imp, err := ReadFile(path, "en")
		require.NoError(b, err)
		s, err := termbase.Open(filepath.Join(dir, fmt.Sprintf("tb%d.db", i)))
		require.NoError(b, err)
		_, err = s.Import("big.tbx", imp.Entries)
		require.NoError(b, err)
		require.NoError(b, s.Close())
	}
}

// cpuSeconds is the process's user and system CPU time so far.
func cpuSeconds() float64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return float64(ru.Utime.Sec+ru.Stime.Sec) + float64(ru.Utime.Usec+ru.Stime.Usec)/1e6
}
