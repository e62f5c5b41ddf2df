package main

import (
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strings"

	"github.com/spf13/cobra"
	"golang.org/x/text/language"

	"glossmith/internal/suggest"
)

// A usage error is a flag value or argument that cannot be right: the
// command stops before reading any input, with exit status 2 and one
// message that lists what would be valid.
func usageError(format string, a ...any) error {
	return exitError{code: 2, msg: fmt.Sprintf(format, a...)}
}

// validateThenRun is a command's RunE: validate checks every flag value
// and argument before run reads any input.
func validateThenRun(validate func(*cobra.Command, []string) error, run func([]string) error) func(*cobra.Command, []string) error {
	return func(cmd *cobra.Command, args []string) error {
		if err := validate(cmd, args); err != nil {
			return err
		}
		return run(args)
	}
}

// validateThenWrite is validateThenRun for the commands that only report
// to the command's output (the termbase group).
func validateThenWrite(validate func([]string) error, run func(io.Writer, []string) error) func(*cobra.Command, []string) error {
	return func(cmd *cobra.Command, args []string) error {
		if err := validate(args); err != nil {
			return err
		}
		return run(cmd.OutOrStdout(), args)
	}
}

// bomUsage is the help of --bom, on every command that writes CSV.
const bomUsage = "csv: start with a UTF-8 byte order mark, for spreadsheet programs that need one"

// checkChoice refuses a value that is not one of valid, naming the valid
// ones and the nearest of them.
func checkChoice(flag, value string, valid []string) error {
	if slices.Contains(valid, value) {
		return nil
	}
	msg := fmt.Sprintf("--%s %q: want one of %s", flag, value, strings.Join(valid, ", "))
	if h := suggest.Hint(value, valid); h != "" {
		msg += "; " + h
	}
	return exitError{code: 2, msg: msg}
}

// checkLangTag refuses a --lang value that is not a well-formed BCP 47
// language tag (en, en-GB, de-CH), the form xml:lang takes.
func checkLangTag(tag string) error {
	if _, err := language.Parse(tag); err != nil || strings.TrimSpace(tag) != tag {
		return usageError("--lang %q: want a BCP 47 language tag such as en, en-GB or de", tag)
	}
	return nil
}

// checkRange refuses an integer flag outside [lo, hi]; hi < 0 means no
// upper bound.
func checkRange(flag string, v, lo, hi int64) error {
	switch {
	case v < lo && hi < 0:
		return usageError("--%s %d: want a whole number of at least %d", flag, v, lo)
	case v < lo || hi >= 0 && v > hi:
		return usageError("--%s %d: want a whole number from %d to %d", flag, v, lo, hi)
	}
	return nil
}

// maxWorkers bounds --workers: each worker holds a few documents in
// flight, so thousands of them only cost memory.
const maxWorkers = 1024

// checkWorkers accepts the default (0: one per core) or 1..maxWorkers.
func checkWorkers(cmd *cobra.Command, workers int) error {
	if !cmd.Flags().Changed("workers") {
		return nil
	}
	return checkRange("workers", int64(workers), 1, maxWorkers)
}

// extFormats maps output file extensions to the format they imply.
var extFormats = map[string]string{
	".tbx": "tbx", ".csv": "csv", ".tsv": "tsv", ".jsonl": "jsonl", ".json": "json",
	".conllu": "conllu", ".html": "html", ".htm": "html", ".xlsx": "xlsx", ".sarif": "sarif",
}

// outputFormat settles --to against the extension of -o: an extension
// picks the format when --to is not given (if the command writes that
// format), and a known extension that contradicts an explicit --to is a
// usage error. It returns the format to write.
func outputFormat(cmd *cobra.Command, to, outPath string, valid []string) (string, error) {
	ext := strings.ToLower(filepath.Ext(outPath))
	implied, known := extFormats[ext]
	if outPath == "" || outPath == "-" || !known {
		return to, checkChoice("to", to, valid)
	}
	if implied == "json" && !slices.Contains(valid, "json") {
		implied = "jsonl" // a .json name for a JSON Lines file
	}
	if !cmd.Flags().Changed("to") {
		if !slices.Contains(valid, implied) {
			return "", usageError("-o %s: this command does not write %s; give --to (one of %s) or another extension", outPath, implied, strings.Join(valid, ", "))
		}
		return implied, nil
	}
	if err := checkChoice("to", to, valid); err != nil {
		return "", err
	}
	if implied != to && !(implied == "tbx" && strings.HasPrefix(to, "tbx-")) { // .tbx holds every TBX dialect
		return "", usageError("--to %s contradicts -o %s (a .%s file); change one of them", to, outPath, implied)
	}
	return to, nil
}

// needInputs refuses a command line without inputs.
func needInputs(args []string) error {
	if len(args) == 0 {
		return usageError("no input: name files, directories, glob patterns, or - for standard input")
	}
	return nil
}
