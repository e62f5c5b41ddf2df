package read

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"glossmith/tagger/doc"
)

// Expand turns command-line arguments into the inputs to read, in order:
// "-" is standard input; a file is itself; a directory is walked
// recursively in lexical order (hidden entries, files of formats glossmith
// does not read, and links to directories skipped with a note); an argument
// that names nothing but holds the glob characters * ? [ is expanded here
// (for a shell that did not, or a quoted pattern). A file named twice is
// read once. Problems name the argument or the entry they are about.
func Expand(args []string, opt Options) ([]Input, []Problem) {
	e := &expander{opt: opt, seen: map[string]bool{}}
	for _, arg := range args {
		e.arg(arg)
	}
	return e.ins, e.probs
}

type expander struct {
	opt   Options
	ins   []Input
	probs []Problem
	seen  map[string]bool
}

func (e *expander) problem(sev Severity, file, format string, args ...any) {
	e.probs = append(e.probs, Problem{File: file, Severity: sev, Msg: fmt.Sprintf(format, args...)})
}

func (e *expander) add(in Input) {
	key := in.Path
	if key != "-" {
		key = filepath.Clean(key)
	}
	if e.seen[key] {
		e.problem(Note, in.Name, "named more than once; read once")
		return
	}
	e.seen[key] = true
	e.ins = append(e.ins, in)
}

func (e *expander) arg(arg string) {
	if arg == "-" {
		e.add(Input{Name: "-", Path: "-"})
		return
	}
	st, err := os.Stat(arg)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) && hasGlobMeta(arg) {
			e.glob(arg)
			return
		}
		e.problem(Error, arg, "cannot open: %s", Describe(err))
		return
	}
	if st.IsDir() {
		e.walk(arg)
		return
	}
	e.add(Input{Name: arg, Path: arg})
}

func hasGlobMeta(s string) bool { return strings.ContainsAny(s, "*?[") }

// glob expands a pattern with filepath.Match syntax. Like a shell, "*" and
// "?" do not match a leading dot unless the pattern spells it.
func (e *expander) glob(pattern string) {
	matches, err := filepath.Glob(pattern)
	if err != nil {
		e.problem(Error, pattern, "bad file pattern: %v", err)
		return
	}
	dotOK := strings.HasPrefix(filepath.Base(pattern), ".")
	n := 0
	for _, m := range matches {
		if !dotOK && isHidden(filepath.Base(m)) {
			continue
		}
		n++
		st, err := os.Stat(m)
		switch {
		case err != nil:
			e.problem(Error, m, "cannot open: %s", Describe(err))
		case st.IsDir():
			e.walk(m)
		default:
			e.add(Input{Name: m, Path: m})
		}
	}
	if n == 0 {
		e.problem(Error, pattern, "no files match this pattern")
	}
}

func isHidden(name string) bool { return len(name) > 1 && name[0] == '.' && name != ".." }

// walk adds the readable files below dir.
func (e *expander) walk(dir string) {
	found := 0
	other := map[string]int{}
	_ = filepath.WalkDir(dir, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			e.problem(Error, path, "cannot read: %s", Describe(err))
			if d != nil && d.IsDir() {
				return fs.SkipDir
			}
			return nil
		}
		if path != dir && isHidden(d.Name()) {
			if d.IsDir() {
				e.problem(Note, path, "skipped hidden directory")
				return fs.SkipDir
			}
			e.problem(Note, path, "skipped hidden file")
			return nil
		}
		if d.IsDir() {
			return nil
		}
		if d.Type()&fs.ModeSymlink != 0 {
			st, err := os.Stat(path)
			switch {
			case err != nil:
				e.problem(Note, path, "skipped broken link: %s", Describe(err))
				return nil
			case st.IsDir():
				e.problem(Note, path, "skipped link to a directory (not followed, to avoid loops)")
				return nil
			case !st.Mode().IsRegular():
				e.problem(Note, path, "skipped: not a regular file")
				return nil
			}
		} else if !d.Type().IsRegular() {
			e.problem(Note, path, "skipped: not a regular file")
			return nil
		}
		if e.opt.Format == "" && formatByName(d.Name()) == "" {
			ext := strings.ToLower(filepath.Ext(d.Name()))
			if ext == "" {
				ext = "no extension"
			}
			other[ext]++
			return nil
		}
		found++
		e.add(Input{Name: path, Path: path, Dir: dir})
		return nil
	})
	if len(other) > 0 {
		exts := make([]string, 0, len(other))
		total := 0
		for ext, n := range other {
			exts = append(exts, fmt.Sprintf("%s: %d", ext, n))
			total += n
		}
		sort.Strings(exts)
		e.problem(Note, dir, "skipped %d file(s) of types glossmith does not read (%s); --from FORMAT reads every file as that format", total, strings.Join(exts, ", "))
	}
	if found == 0 {
		e.problem(Error, dir, "no files to read in this directory (formats read: %s)", strings.Join(Formats(), ", "))
	}
}

// Each expands args and reads every input in turn, handing each document
// to fn and each problem to report as they come, so a batch needs memory
// for one document at a time. It also reports, naming the directory, a
// directory argument none of whose files gave any text. It stops early
// only when fn returns an error, and returns that error.
func Each(args []string, opt Options, fn func(*doc.Document) error, report func(Problem)) error {
	ins, probs := Expand(args, opt)
	for _, p := range probs {
		report(p)
	}
	tried, read := map[string]int{}, map[string]int{}
	var dirs []string
	for _, in := range ins {
		d, probs := Read(in, opt)
		for _, p := range probs {
			report(p)
		}
		if in.Dir != "" {
			if tried[in.Dir] == 0 {
				dirs = append(dirs, in.Dir)
			}
			tried[in.Dir]++
		}
		if d == nil {
			continue
		}
		if in.Dir != "" {
			read[in.Dir]++
		}
		if err := fn(d); err != nil {
			return err
		}
	}
	for _, dir := range dirs {
		if read[dir] == 0 {
			report(Problem{File: dir, Severity: Error, Msg: fmt.Sprintf("no readable text in any of its %d files", tried[dir])})
		}
	}
	return nil
}
