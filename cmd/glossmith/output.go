package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// output is where a command writes its result: standard output, or a file
// that appears only when complete. A file output is written to a temporary
// file in the same directory and renamed over the target on success, so an
// interrupted or failed run never leaves a half-written file behind.
type output struct {
	io.Writer
	path string
	tmp  *os.File
}

func openOutput(path string) (*output, error) {
	if path == "" || path == "-" {
		return &output{Writer: os.Stdout}, nil
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return nil, fmt.Errorf("cannot write %s: %w", path, err)
	}
	_ = tmp.Chmod(0o644) // a finished list is an ordinary file, not a secret
	return &output{Writer: tmp, path: path, tmp: tmp}, nil
}

// commit finishes the output: on success the temporary file replaces the
// target; on failure (err != nil) it is removed and err is returned.
func (o *output) commit(err error) error {
	if o.tmp == nil {
		return err
	}
	name := o.tmp.Name()
	if cerr := o.tmp.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Rename(name, o.path); err != nil {
		os.Remove(name)
		return fmt.Errorf("cannot write %s: %w", o.path, err)
	}
	return nil
}
