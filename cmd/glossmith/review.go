package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"net"
	"net/http"
	"os"
	"os/exec"
	"os/signal"
	"runtime"
	"strconv"
	"syscall"
	"time"

	"github.com/spf13/cobra"

	"glossmith/extract/review"
	"glossmith/extract/review/tbstore"
	"glossmith/extract/review/web"
	"glossmith/extract/terms"
	"glossmith/grammar"
	"glossmith/pattern"
)

// reviewOptions are the flags of the review command.
type reviewOptions struct {
	in       inputFlags
	tb       termbaseFlags
	runLabel string
	port     int
	listen   string
	open     bool
	minFreq  int
	all      bool
}

// reviewContexts is how many example sentences per candidate the review
// page keeps (it shows a few and more on demand).
const reviewContexts = 12

func newReviewCmd() *cobra.Command {
	o := &reviewOptions{}
	cmd := &cobra.Command{
		Use:   "review --termbase FILE [flags] INPUT... | --run LABEL",
		Short: "Review term candidates in the browser, saving each decision to a termbase",
		Long: `Extracts the term candidates of the inputs (as "terms" lists them), serves a
review page on this computer only, and prints its address on the first line of
standard output. The address holds a secret token: only a browser given it can
see the documents' text or change anything. Every decision on the page —
accept, reject, defer, preferred form, admitted or deprecated variant, merge,
definition, note, part of speech, undo — is saved to the termbase at once.
Ctrl-C stops the server.`,
		Example: `  glossmith review --termbase climate.gtb testdata/demo
  glossmith review --termbase climate.gtb --run v2
  glossmith review --termbase climate.gtb --open --port 8714 manuals/`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(cmd, args); err != nil {
				return err
			}
			return o.run(cmd.Context(), args, cmd.OutOrStdout(), cmd.ErrOrStderr())
		},
	}
	o.in.register(cmd, true)
	fl := cmd.Flags()
	o.tb.register(fl)
	fl.StringVar(&o.runLabel, "run", "", "review the candidates of this recorded run (terms --record LABEL) instead of reading inputs")
	fl.IntVar(&o.port, "port", 0, "port to listen on (default: a free one)")
	fl.StringVar(&o.listen, "listen", "", "listen on this address (host:port) instead of 127.0.0.1 — anyone who can reach it and has the address may read the documents")
	fl.BoolVar(&o.open, "open", false, "open the page in the default browser")
	fl.IntVar(&o.minFreq, "min-freq", 1, "leave out candidates seen fewer times")
	fl.BoolVar(&o.all, "all", false, "list every candidate, not only those above the score cut-off (as terms does)")
	return cmd
}

// validate checks every flag value before any input is read.
func (o *reviewOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validate(cmd); err != nil {
		return err
	}
	if err := o.tb.validate(); err != nil {
		return err
	}
	if err := checkRange("port", int64(o.port), 0, 65535); err != nil {
		return err
	}
	if o.listen != "" {
		if cmd.Flags().Changed("port") {
			return usageError("--listen names the port too: give --listen or --port, not both")
		}
		if _, _, err := net.SplitHostPort(o.listen); err != nil {
			return usageError("--listen %q: want host:port, such as 127.0.0.1:8714", o.listen)
		}
	}
	if err := checkRange("min-freq", int64(o.minFreq), 1, -1); err != nil {
		return err
	}
	if o.runLabel != "" {
		if len(args) > 0 {
			return usageError("--run %q reviews a recorded run: name no inputs with it", o.runLabel)
		}
		return o.tb.needFile() // a recorded run is in a termbase that is there
	}
	return needInputs(args)
}

// addr is where the server listens: loopback unless --listen.
func (o *reviewOptions) addr() string {
	if o.listen != "" {
		return o.listen
	}
	return net.JoinHostPort("127.0.0.1", strconv.Itoa(o.port))
}

func (o *reviewOptions) run(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	tb, err := o.tb.open()
	if err != nil {
		return err
	}
	defer tb.Close()
	var ds *review.Dataset
	var runErr error
	if o.runLabel != "" {
		if ds, err = tbstore.FromRun(tb, o.runLabel); err != nil {
			return exitError{1, err.Error()}
		}
	} else if ds, runErr = extractForReview(&o.in, args, reviewContexts, terms.RankOptions{MinFreq: o.minFreq, All: o.all}); ds == nil {
		return runErr
	}
	if runErr != nil {
		fmt.Fprintf(stderr, "warning: %v\n", runErr)
	}
	srv, err := web.New(ds, tbstore.New(tb, ds))
	if err != nil {
		return err
	}
	ln, url, err := srv.Listen(o.addr())
	if err != nil {
		return err
	}
	if host, _, _ := net.SplitHostPort(ln.Addr().String()); !net.ParseIP(host).IsLoopback() {
		fmt.Fprintf(stderr, "warning: listening on %s, not on this computer only: whoever reaches it with the address can read the documents\n", ln.Addr())
	}
	fmt.Fprintln(stdout, url)
	if !o.in.quiet {
		fmt.Fprintf(stderr, "note: %s; Ctrl-C stops the server\n", ds.Source)
	}
	if o.open {
		if err := openBrowser(url); err != nil {
			fmt.Fprintf(stderr, "warning: cannot open a browser (%v): open the address above\n", err)
		}
	}
	return serveUntilSignal(ctx, ln, srv.Handler())
}

// serveUntilSignal serves until Ctrl-C (or SIGTERM, or the context's end),
// then lets requests in flight finish.
func serveUntilSignal(ctx context.Context, ln net.Listener, h http.Handler) error {
	if ctx == nil {
		ctx = context.Background()
	}
	ctx, stop := signal.NotifyContext(ctx, os.Interrupt, syscall.SIGTERM)
	defer stop()
	hs := &http.Server{Handler: h, ReadHeaderTimeout: 10 * time.Second, MaxHeaderBytes: 16 << 10}
	done := make(chan error, 1)
	go func() { done <- hs.Serve(ln) }()
	select {
	case err := <-done:
		return err
	case <-ctx.Done():
	}
	sctx, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	defer cancel()
	err := hs.Shutdown(sctx)
	if errors.Is(err, context.DeadlineExceeded) {
		// A connection the browser opened ahead of need (a preconnect)
		// counts as busy until it has been silent for five seconds, so
		// Shutdown can wait out its deadline with nothing in flight.
		// Every decision is its own transaction: closing now loses none.
		return hs.Close()
	}
	return err
}

// openBrowser asks the desktop to open url.
func openBrowser(url string) error {
	var c *exec.Cmd
	switch runtime.GOOS {
	case "darwin":
		c = exec.Command("open", url)
	case "windows":
		c = exec.Command("rundll32", "url.dll,FileProtocolHandler", url)
	default:
		c = exec.Command("xdg-open", url)
	}
	return c.Start()
}

// extractForReview runs the pipeline over the inputs and builds the review
// dataset: the ranked candidates of the stock terms rules with the pairs of
// the stock pair rules. A nil dataset means nothing was read.
func extractForReview(in *inputFlags, args []string, contexts int, rank terms.RankOptions) (*review.Dataset, error) {
	termRules, err := grammar.LoadStock("terms")
	if err != nil {
		return nil, err
	}
	tm, err := pattern.Compile(termRules)
	if err != nil {
		return nil, err
	}
	model, err := loadModel(in.model)
	if err != nil {
		return nil, err
	}
	return runExtraction(in, args, model, tm, terms.Options{}, terms.ModelReference(model), contexts, rank, nil)
}
