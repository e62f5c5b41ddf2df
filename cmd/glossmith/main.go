// Command glossmith turns technical documents into reviewed-glossary drafts:
// it tags them with an embedded hidden Markov model, matches phrase rules,
// ranks term candidates and collocations, and writes open formats.
//
// The commands are thin: they read flags, call the library packages
// (tagger, grammar, pattern, extract) and print. See README.md.
package main

import (
	"errors"
	"fmt"
	"os"
)

func main() {
	root := newRootCmd()
	err := unknownSubcommand(root, os.Args[1:])
	if err == nil {
		err = root.Execute()
	}
	if err != nil {
		var ex exitError
		if errors.As(err, &ex) {
			if ex.msg != "" {
				fmt.Fprintln(os.Stderr, "glossmith:", ex.msg)
			}
			os.Exit(ex.code)
		}
		fmt.Fprintln(os.Stderr, "glossmith:", err)
		os.Exit(2)
	}
}

// exitError ends the program with a given status after output was written,
// for example 1 when some inputs were skipped but the rest was processed.
type exitError struct {
	code int
	msg  string
}

func (e exitError) Error() string { return e.msg }
