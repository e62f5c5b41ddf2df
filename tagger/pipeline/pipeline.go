// Package pipeline runs glossmith's document stages — read, tokenize, tag —
// and the caller's own per-document work on every core, while delivering
// results in input order so that output never depends on scheduling.
//
// The shape is map/reduce over documents: Map runs on worker goroutines
// right after a document is annotated (matching, local counting), Reduce
// runs on the caller's goroutine in input order (merging, printing); with
// one worker, everything runs on the caller's goroutine. Only a
// bounded window of documents is in flight at once, so memory depends on
// the largest documents, not on the size of the corpus.
package pipeline

import (
	"context"
	"os"
	"runtime"
	"sync"
	"sync/atomic"

	"glossmith/tagger/doc"
	"glossmith/tagger/read"
	"glossmith/tagger/tokenize"
)

// Tagger fills the tags and lemmas of a document's tokens. It must be safe
// for concurrent use.
type Tagger interface {
	TagDocument(d *doc.Document)
}

// Options configure a run.
type Options struct {
	Read    read.Options
	Tagger  Tagger // nil: tokenize only
	Workers int    // <= 0: one per core
	// Report receives every problem (notes, warnings, errors) in input order.
	Report func(read.Problem)
	// Progress, if set, is called from the reducing goroutine after each
	// document with the running totals.
	Progress func(Stats)
	// ReuseTokens declares that neither mapFn's result nor reduceFn keeps
	// anything of a document's tokens (the slices; strings are fine) once
	// reduceFn has returned: the run then hands the document's token array
	// to a later document instead of allocating a new one.
	ReuseTokens bool
	// Context, if set, stops the run when it is done: no input is started
	// after that, reduceFn is not called again, and Run returns once the
	// documents being annotated are finished (a reduceFn that has what it
	// needs — find's --limit — or whose output is gone cancels it).
	Context context.Context
}

// Stats are running totals of a run.
type Stats struct {
	Inputs    int   // inputs found after expanding directories and globs
	Documents int   // documents read and annotated
	Bytes     int64 // bytes of plain text
	Tokens    int64
	Skipped   int // inputs that could not be read (an Error problem)
	Done      int // inputs finished: read, skipped, or passed over with a note
	// InputBytes is the size on disk of all inputs (standard input counts
	// 0), DoneBytes that of the inputs finished so far, read or skipped.
	// Documents vary in size, so time left is better estimated from bytes
	// than from the number of documents.
	InputBytes, DoneBytes int64
	// Stopped is set when Options.Context ended the run early.
	Stopped bool
}

// Run expands args into inputs and processes them. mapFn is called on a
// worker goroutine for each annotated document; reduceFn is called in input
// order with the document and mapFn's result. Either may be nil. Run returns
// the totals; Skipped > 0 means some input was not processed.
func Run[R any](args []string, opt Options, mapFn func(*doc.Document) R, reduceFn func(*doc.Document, R)) Stats {
	inputs, probs := read.Expand(args, opt.Read)
	var st Stats
	st.Inputs = len(inputs)
	for _, p := range probs {
		if p.Severity == read.Error {
			st.Skipped++
		}
		if opt.Report != nil {
			opt.Report(p)
		}
	}
	sizes := make([]int64, len(inputs))
	for i, in := range inputs {
		if in.Path != "-" {
			if fi, err := os.Stat(in.Path); err == nil {
				sizes[i] = fi.Size()
				st.InputBytes += fi.Size()
			}
		}
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	if workers > len(inputs) {
		workers = max(1, len(inputs))
	}

	type result struct {
		doc   *doc.Document
		probs []read.Problem
		val   R
		toks  []doc.Token // the document's token array, for reuse
	}
	var pool tokenPool
	reduce := func(i int, res result) {
		st.Done++
		st.DoneBytes += sizes[i]
		failed := false
		for _, p := range res.probs {
			failed = failed || p.Severity == read.Error
			if opt.Report != nil {
				opt.Report(p)
			}
		}
		if failed && res.doc == nil {
			st.Skipped++
		}
		if res.doc != nil {
			st.Documents++
			st.Bytes += int64(len(res.doc.Text))
			st.Tokens += int64(res.doc.TokenCount())
			if reduceFn != nil {
				reduceFn(res.doc, res.val)
			}
		}
		if opt.ReuseTokens {
			pool.put(res.toks) // (an unreadable input hands back the array it was given)
		}
		if opt.Progress != nil {
			opt.Progress(st)
		}
	}
	work := func(i int) (res result) {
		var buf []doc.Token
		if opt.ReuseTokens {
			buf = pool.get()
		}
		res.doc, res.probs, res.toks = annotate(inputs[i], opt.Read, opt.Tagger, buf)
		if res.doc != nil && mapFn != nil {
			res.val = mapFn(res.doc)
		}
		return res
	}
	if workers == 1 {
		// One worker is one core: the caller's goroutine does all the
		// work, reducing included. (With a worker goroutine of its own the
		// reducer kept a second core some 17% busy on the benchmark
		// corpus: "one worker" used more than one core's time.)
		for i := range inputs {
			if stopped(opt.Context) {
				st.Stopped = true
				break
			}
			reduce(i, work(i))
		}
		return st
	}

	// window bounds the documents in flight: a worker takes a token before
	// it takes the next input and the reducer gives the token back when it
	// receives a document, so at most `window` documents are being
	// annotated or waiting, plus the one being reduced. The inputs taken
	// and not yet received are always fewer than `window` past the next
	// one to reduce, so input i can use slot i % window: its previous user,
	// input i − window, has been received.
	//
	// Documents are reduced in input order, so while one worker is slow
	// on a document (a long one, or a core shared with other work) the
	// others run ahead only as far as the window lets them. With a
	// busy-loop on one of two cores (20 MB, three alternated runs each),
	// a window of 2 per worker kept the process 123–124% busy, 4 per
	// worker 127–129% (wall time 3% less), 8 per worker no better than
	// 4; on an idle machine all three measured alike (195%). Each
	// document in flight holds its text, tokens and counts: about 1 MB.
	window := DocsPerWorker * workers
	slots := make([]chan result, window)
	for i := range slots {
		slots[i] = make(chan result, 1)
	}
	var next atomic.Int64
	tokens := make(chan struct{}, window)
	for i := 0; i < window; i++ {
		tokens <- struct{}{}
	}
	// done is closed when the run stops early: workers waiting for a
	// token give up, and the reducer stops waiting for inputs that no
	// worker will take.
	var done <-chan struct{}
	if opt.Context != nil {
		done = opt.Context.Done()
	}
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				select {
				case <-tokens:
				case <-done:
					return
				}
				i := int(next.Add(1) - 1)
				if i >= len(inputs) || stopped(opt.Context) {
					tokens <- struct{}{}
					return
				}
				slots[i%window] <- work(i)
			}
		}()
	}
reduce:
	for i := range inputs {
		var res result
		select {
		case res = <-slots[i%window]:
		case <-done:
			st.Stopped = true
			break reduce
		}
		if stopped(opt.Context) {
			st.Stopped = true
			break
		}
		tokens <- struct{}{}
		reduce(i, res)
	}
	wg.Wait()
	return st
}

// stopped reports whether ctx (which may be nil) is done.
func stopped(ctx context.Context) bool { return ctx != nil && ctx.Err() != nil }

// Annotate reads one input, tokenizes it unless it came tokenized, and tags
// it unless it came tagged or tagger is nil.
func Annotate(in read.Input, ropt read.Options, tagger Tagger) (*doc.Document, []read.Problem) {
	d, probs, _ := annotate(in, ropt, tagger, nil)
	return d, probs
}

// annotate is Annotate with a token array to reuse (see
// tokenize.DocumentReusing); it returns the array the tokens are in.
func annotate(in read.Input, ropt read.Options, tagger Tagger, buf []doc.Token) (*doc.Document, []read.Problem, []doc.Token) {
	d, probs := read.Read(in, ropt)
	if d == nil {
		return nil, probs, buf
	}
	toks := tokenize.DocumentReusing(d, buf)
	if tagger != nil && !d.Tagged() {
		tagger.TagDocument(d)
	}
	return d, probs, toks
}

// DocsPerWorker is the number of documents per worker that may be in
// flight at once (read, being annotated, or waiting to be reduced in input
// order), besides the one being reduced.
const DocsPerWorker = 4

// tokenPool holds token arrays free for reuse: at most as many as there
// are documents in flight, and none larger than maxPooledTokens, so that
// one huge document does not pin its array for the rest of the run.
type tokenPool struct {
	mu   sync.Mutex
	free [][]doc.Token
}

// maxPooledTokens is the capacity (in tokens, 80 bytes each) above which
// an array is left to the garbage collector: documents are rarely longer
// than the 1.3 MB of text it holds.
const maxPooledTokens = 256 << 10

func (p *tokenPool) get() []doc.Token {
	p.mu.Lock()
	defer p.mu.Unlock()
	n := len(p.free)
	if n == 0 {
		return nil
	}
	b := p.free[n-1]
	p.free = p.free[:n-1]
	return b
}

func (p *tokenPool) put(b []doc.Token) {
	if cap(b) == 0 || cap(b) > maxPooledTokens {
		return
	}
	p.mu.Lock()
	p.free = append(p.free, b[:0])
	p.mu.Unlock()
}
