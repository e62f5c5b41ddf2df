package main

import (
	"os"

	"golang.org/x/term"
)

// colorModes are the values of --color.
var colorModes = []string{"auto", "always", "never"}

// useColor decides whether output gets terminal colours: --color always or
// never decides; auto colours only a terminal (tty), and never when
// NO_COLOR is set to anything (no-color.org) or TERM is "dumb".
func useColor(mode string, tty bool) bool {
	switch mode {
	case "always":
		return true
	case "never":
		return false
	}
	if os.Getenv("NO_COLOR") != "" || os.Getenv("TERM") == "dumb" {
		return false
	}
	return tty
}

// isTerminal reports whether f is a terminal (golang.org/x/term, the one
// terminal package of the program).
func isTerminal(f *os.File) bool { return term.IsTerminal(int(f.Fd())) }
