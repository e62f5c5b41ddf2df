package main

import (
	"io"
	"os"

	"glossmith/internal/atomicfile"
)

// output is where a command writes its result: standard output, or a file
// written whole or not at all (package atomicfile: a temporary file renamed
// over the target; devices written through; read-only files refused).
type output struct {
	io.Writer
	file *atomicfile.File // nil for standard output
}

// openOutput opens path ("" or "-": standard output) for writing.
func openOutput(path string) (*output, error) {
	if path == "" || path == "-" {
		return &output{Writer: os.Stdout}, nil
	}
	f, err := atomicfile.Create(path)
	if err != nil {
		return nil, err
	}
	return &output{Writer: f, file: f}, nil
}

// commit finishes the output: on success (err == nil) the file replaces
// the target; otherwise it is discarded and err returned.
func (o *output) commit(err error) error {
	if o.file == nil {
		return err
	}
	return o.file.Finish(err)
}

// abort discards a file output; the target stays as it was.
func (o *output) abort() {
	if o.file != nil {
		o.file.Abort()
	}
}

// toTerminal reports whether the output is standard output on a terminal.
func (o *output) toTerminal() bool { return o.file == nil && isTerminal(os.Stdout) }
