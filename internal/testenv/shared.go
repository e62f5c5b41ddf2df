// Package testenv locates the reference data that tests read from the
// shared folder beside the repository (../shared), which is never copied in.
package testenv

import (
	"os"
	"path/filepath"
	"testing"
)

// Root returns the module root: the nearest directory at or above the
// working directory that holds go.mod.
func Root(t testing.TB) string {
	t.Helper()
	dir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			return dir
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			t.Fatal("go.mod not found above the working directory")
		}
		dir = parent
	}
}

// SharedDir returns ../shared/<rel> next to the module root. When it is
// missing the test fails under CI (CI=true), where the data must be present,
// and is skipped elsewhere with a message saying what is missing.
func SharedDir(t testing.TB, rel string) string {
	t.Helper()
	p := filepath.Join(Root(t), "..", "shared", rel)
	if _, err := os.Stat(p); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("shared data %s is missing (required under CI): %v", p, err)
		}
		t.Skipf("shared data %s is missing; skipping (it is required under CI=true)", p)
	}
	return p
}

// Demo returns the path of the demo corpus, testdata/demo.
func Demo(t testing.TB) string {
	t.Helper()
	return filepath.Join(Root(t), "testdata", "demo")
}

// Installed returns path, a file or directory that the Debian package pkg
// installs. When it is missing the test fails under CI (CI=true), whose
// .ci/run installs the package, and is skipped elsewhere.
func Installed(t testing.TB, path, pkg string) string {
	t.Helper()
	if _, err := os.Stat(path); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("%s is missing (Debian package %s, required under CI): %v", path, pkg, err)
		}
		t.Skipf("%s is missing; install the Debian package %s (it is required under CI=true)", path, pkg)
	}
	return path
}
