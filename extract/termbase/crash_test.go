package termbase

import (
	"bufio"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"sync"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The child processes of these tests are this test binary run again with
// GLOSSMITH_TB_CHILD naming what to do.
const childEnv = "GLOSSMITH_TB_CHILD"

// manyEntries makes n entries of two terms each, as an imported glossary.
func manyEntries(n int) []*Entry {
	es := make([]*Entry, n)
	for i := range es {
		es[i] = &Entry{ExtID: "c" + strconv.Itoa(i), Subject: "greenhouse climate",
			Definition: fmt.Sprintf("Definition number %d of a control parameter.", i),
			Terms: []*Term{
				{Lang: "en", Text: fmt.Sprintf("zone %d set point", i), Status: Preferred, POS: "noun"},
				{Lang: "en", Text: fmt.Sprintf("zone %d setpoint", i), Status: Admitted, POS: "noun"},
			}}
	}
	return es
}

// TestChild is the child process's work; it does nothing in a normal run.
func TestChild(t *testing.T) {
	what := os.Getenv(childEnv)
	if what == "" {
		t.Skip("run as a child process by the crash and concurrency tests")
	}
	path := os.Getenv(childEnv + "_PATH")
	s, err := Open(path)
	if err != nil {
		fmt.Println("error:", err)
		os.Exit(3)
	}
	switch what {
	case "import":
		es := manyEntries(100_000)
		fmt.Println("importing")
		if _, err := s.Import("child", es); err != nil {
			fmt.Println("error:", err)
			os.Exit(3)
		}
		fmt.Println("done")
	case "decide":
		who := os.Getenv(childEnv + "_WHO")
		s.User = who
		for i := range 40 {
			if _, err := s.Accept(fmt.Sprintf("%s term %d", who, i)); err != nil {
				fmt.Println("error:", err)
				os.Exit(3)
			}
		}
		fmt.Println("done")
	}
	s.Close()
	os.Exit(0)
}

func child(t *testing.T, what, path string, env ...string) *exec.Cmd {
	cmd := exec.Command(os.Args[0], "-test.run=^TestChild$", "-test.count=1")
	cmd.Env = append(os.Environ(), append([]string{childEnv + "=" + what, childEnv + "_PATH=" + path}, env...)...)
	return cmd
}

// kill -9 during an import of 100,000 entries leaves the termbase as it
// was before, or with the whole import: never a part of it, never a file
// that does not open.
func TestKillDuringImport(t *testing.T) {
	if testing.Short() {
		t.Skip("imports 100,000 entries several times")
	}
	// A negative delay kills the child after it reports the import done.
	for _, delay := range []time.Duration{0, 300 * time.Millisecond, 1500 * time.Millisecond, -1} {
		t.Run(delay.String(), func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "tb.db")
			s, err := Open(path)
			require.NoError(t, err)
			_, err = s.Accept("solenoid valve", "drip emitter")
			require.NoError(t, err)
			before, err := s.Entries()
			require.NoError(t, err)
			require.NoError(t, s.Close())

			cmd := child(t, "import", path)
			out, err := cmd.StdoutPipe()
			require.NoError(t, err)
			require.NoError(t, cmd.Start())
			sc := bufio.NewScanner(out)
			require.True(t, sc.Scan(), "the child starts")
			require.Equal(t, "importing", sc.Text())
			if delay >= 0 {
				time.Sleep(delay)
			} else {
				require.True(t, sc.Scan())
				require.Equal(t, "done", sc.Text())
			}
			require.NoError(t, cmd.Process.Kill()) // SIGKILL
			_ = cmd.Wait()

			s, err = Open(path)
			require.NoError(t, err, "the termbase opens after the kill")
			defer s.Close()
			after, err := s.Entries()
			require.NoError(t, err)
			switch len(after) {
			case len(before):
				assert.Equal(t, before, after)
				t.Logf("killed after %v: the termbase is as before", delay)
			case len(before) + 100_000:
				assert.Equal(t, before, after[:len(before)])
				assert.Equal(t, "zone 99999 setpoint", after[len(after)-1].Terms[1].Text)
				t.Logf("killed after %v: the import was complete", delay)
			default:
				require.GreaterOrEqual(t, delay, time.Duration(0), "after the import reported done, all of it is there")
				t.Fatalf("killed after %v: %d entries, want %d or %d", delay, len(after), len(before), len(before)+100_000)
			}
			// Still writable.
			_, err = s.Accept("humidity sensor")
			assert.NoError(t, err)
		})
	}
}

// Two processes deciding at the same time both succeed and lose nothing.
func TestTwoProcessesDecide(t *testing.T) {
	path := filepath.Join(t.TempDir(), "tb.db")
	s, err := Open(path)
	require.NoError(t, err)
	require.NoError(t, s.Close())
	var wg sync.WaitGroup
	outs := make([]string, 2)
	errs := make([]error, 2)
	for i, who := range []string{"ana", "ben"} {
		wg.Add(1)
		go func() {
			defer wg.Done()
			b, err := child(t, "decide", path, childEnv+"_WHO="+who).CombinedOutput()
			outs[i], errs[i] = string(b), err
		}()
	}
	wg.Wait()
	for i := range outs {
		require.NoError(t, errs[i], outs[i])
		assert.Contains(t, outs[i], "done")
	}
	s, err = Open(path)
	require.NoError(t, err)
	defer s.Close()
	es, err := s.Entries()
	require.NoError(t, err)
	assert.Len(t, es, 80)
	cs, err := s.Changes(time.Time{})
	require.NoError(t, err)
	assert.Len(t, cs, 80)
	users := map[string]int{}
	for _, c := range cs {
		users[c.User]++
	}
	assert.Equal(t, map[string]int{"ana": 40, "ben": 40}, users)
}
