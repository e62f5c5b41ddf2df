// Package atomicfile writes an output file whole or not at all, without
// damaging what the path names today.
//
// A program that writes its result straight into the target leaves a
// half-written file when it fails or is interrupted, and truncates a good
// file before it knows whether it has anything better. Create instead
// writes into a hidden temporary file beside the target ("." + name +
// ".tmp" + random digits) and Commit renames it over the target, so
// readers see the old file or the new one, never a mixture. Rename
// replaces whatever the path names, so Create first looks at it:
//
//   - a symbolic link is followed: its target is replaced, the link stays;
//   - anything that is not a regular file (a terminal, /dev/null, a FIFO, a
//     character device) is written through, opened as it is, because
//     renaming over it would put a regular file in its place;
//   - a regular file the user may not write, or one without any write
//     permission bit (a file marked read-only, which root could otherwise
//     replace), is refused;
//   - a replaced file keeps its permission bits; a new file gets the mode
//     the umask gives to 0666, as a shell redirection would.
//
// While temporary files exist, SIGINT and SIGTERM remove them before the
// program ends with the signal's usual effect.
package atomicfile

import (
	"errors"
	"fmt"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
)

// File is an output being written. Write to it, then call Commit (or
// Finish) exactly once; Abort discards it.
type File struct {
	f    *os.File
	path string // the file finally written: symbolic links resolved
	tmp  string // the temporary file; "" when writing through
	done bool
}

// ErrReadOnly is returned (wrapped) for a target that may not be written.
var ErrReadOnly = errors.New("file is read-only")

// maxLinks bounds the symbolic links followed, as the system's own
// resolution does (Linux gives up after 40).
const maxLinks = 40

// Create starts writing path. Nothing at path changes until Commit.
func Create(path string) (*File, error) {
	target, err := resolve(path)
	if err != nil {
		return nil, fmt.Errorf("cannot write %s: %w", path, err)
	}
	fi, err := os.Stat(target)
	switch {
	case err == nil && fi.IsDir():
		return nil, fmt.Errorf("cannot write %s: is a directory", path)
	case err == nil && !fi.Mode().IsRegular():
		// A device, FIFO or socket: write through, never replace it.
		f, err := os.OpenFile(target, os.O_WRONLY, 0)
		if err != nil {
			return nil, fmt.Errorf("cannot write %s: %w", path, err)
		}
		return &File{f: f, path: target}, nil
	case err == nil:
		if fi.Mode().Perm()&0o222 == 0 || !writable(target) {
			return nil, fmt.Errorf("cannot write %s: %w", path, ErrReadOnly)
		}
	case !errors.Is(err, fs.ErrNotExist):
		return nil, fmt.Errorf("cannot write %s: %w", path, err)
	}
	f, tmp, err := createTemp(target)
	if err != nil {
		return nil, fmt.Errorf("cannot write %s: %w", path, err)
	}
	if fi != nil {
		// Keep the replaced file's permissions (and, for root, its owner).
		_ = f.Chmod(fi.Mode().Perm())
		keepOwner(f, fi)
	}
	return &File{f: f, path: target, tmp: tmp}, nil
}

// resolve follows symbolic links in the last element of path, also when
// the final target does not exist yet (a dangling link names the file to
// create).
func resolve(path string) (string, error) {
	for range maxLinks {
		fi, err := os.Lstat(path)
		if err != nil || fi.Mode()&fs.ModeSymlink == 0 {
			return path, nil
		}
		link, err := os.Readlink(path)
		if err != nil {
			return "", err
		}
		if !filepath.IsAbs(link) {
			link = filepath.Join(filepath.Dir(path), link)
		}
		path = link
	}
	return "", errors.New("too many levels of symbolic links")
}

// createTemp creates the hidden temporary file beside target with mode
// 0666 less the umask (os.CreateTemp would give 0600).
func createTemp(target string) (*os.File, string, error) {
	dir, base := filepath.Split(target)
	for range 100 {
		name := filepath.Join(dir, "."+base+".tmp"+strconv.FormatUint(rand.Uint64()%1e10, 10))
		register(name)
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		if err == nil {
			return f, name, nil
		}
		unregister(name)
		if !errors.Is(err, fs.ErrExist) {
			var pe *fs.PathError
			if errors.As(err, &pe) {
				err = &dirError{dir: filepath.Dir(target), err: pe.Err}
			}
			return nil, "", err
		}
	}
	return nil, "", errors.New("no free temporary file name")
}

// dirError is a failure to create a file in dir: the user named the
// target, not the hidden temporary file, so the message names the
// directory ("no directory out", "directory out: permission denied").
type dirError struct {
	dir string
	err error
}

func (e *dirError) Error() string {
	if errors.Is(e.err, fs.ErrNotExist) {
		return "no directory " + e.dir
	}
	return "directory " + e.dir + ": " + e.err.Error()
}

func (e *dirError) Unwrap() error { return e.err }

// Write writes to the temporary file (or through to the device).
func (a *File) Write(p []byte) (int, error) { return a.f.Write(p) }

// Name returns the path that Commit writes: symbolic links resolved.
func (a *File) Name() string { return a.path }

// Commit puts the written file in place of the target. After a failure
// the temporary file is removed and the target is as it was.
func (a *File) Commit() error {
	if a.done {
		return errors.New("atomicfile: already finished")
	}
	a.done = true
	err := a.f.Close()
	if a.tmp == "" {
		if err != nil {
			return fmt.Errorf("cannot write %s: %w", a.path, err)
		}
		return nil
	}
	if err == nil {
		err = os.Rename(a.tmp, a.path)
	}
	if err != nil {
		os.Remove(a.tmp)
		unregister(a.tmp)
		return fmt.Errorf("cannot write %s: %w", a.path, err)
	}
	unregister(a.tmp)
	return nil
}

// Abort discards what was written; the target is left as it was. It may be
// called after Commit (it then does nothing), so that a deferred Abort
// cleans up every early return.
func (a *File) Abort() {
	if a.done {
		return
	}
	a.done = true
	a.f.Close()
	if a.tmp != "" {
		os.Remove(a.tmp)
		unregister(a.tmp)
	}
}

// Finish commits when err is nil and aborts otherwise; it returns err, or
// the error of the commit.
func (a *File) Finish(err error) error {
	if err != nil {
		a.Abort()
		return err
	}
	return a.Commit()
}
