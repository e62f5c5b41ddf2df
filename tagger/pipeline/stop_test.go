package pipeline_test

import (
	"context"
	"fmt"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
)

// A run whose context is cancelled from the reduce step stops there: no
// later document is reduced, no input past the documents in flight is
// read, and Run returns (for any number of workers).
func TestRunStopsWhenCancelled(t *testing.T) {
	dir := smallDocs(t, 200)
	for _, workers := range append(workerCounts, 16) {
		t.Run(fmt.Sprint(workers, " workers"), func(t *testing.T) {
			ctx, cancel := context.WithCancel(context.Background())
			defer cancel()
			var reduced, mapped []string
			mappedCh := make(chan string, 100)
			opt := pipeline.Options{Workers: workers, Context: ctx}
			finished := make(chan pipeline.Stats, 1)
			go func() {
				finished <- pipeline.Run([]string{dir}, opt,
					func(d *doc.Document) string { mappedCh <- d.Name; return d.Name },
					func(d *doc.Document, name string) {
						reduced = append(reduced, name)
						if len(reduced) == 3 {
							cancel()
						}
					})
			}()
			var st pipeline.Stats
			select {
			case st = <-finished:
			case <-time.After(2 * time.Minute):
				t.Fatal("Run did not return after its context was cancelled")
			}
			close(mappedCh)
			for n := range mappedCh {
				mapped = append(mapped, n)
			}
			assert.True(t, st.Stopped)
			require.Len(t, reduced, 3, "nothing is reduced after the cancel")
			// Inputs in flight are finished, no more: a window per worker.
			assert.LessOrEqual(t, len(mapped), 3+1+pipeline.DocsPerWorker*max(workers, 1)+workers)
			assert.Less(t, len(mapped), 150, "most inputs were never read")
		})
	}
}

// Without a context, or with one never cancelled, every input is reduced.
func TestRunNotCancelledRunsAll(t *testing.T) {
	dir := smallDocs(t, 12)
	for _, ctx := range []context.Context{nil, context.Background()} {
		n := 0
		st := pipeline.Run([]string{dir}, pipeline.Options{Workers: 2, Context: ctx}, nil, func(*doc.Document, struct{}) { n++ })
		assert.False(t, st.Stopped)
		assert.Equal(t, st.Documents, n)
		assert.Equal(t, 10, n, "12 files, one empty and one binary")
	}
}
