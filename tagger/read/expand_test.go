package read

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
	"glossmith/tagger/doc"
)

// tree makes files (name → content) under a new temp dir and returns it.
func tree(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, content := range files {
		writeFile(t, dir, name, []byte(content))
	}
	return dir
}

func names(ins []Input) []string {
	var out []string
	for _, in := range ins {
		out = append(out, in.Name)
	}
	return out
}

func msgs(ps []Problem) []string {
	var out []string
	for _, p := range ps {
		out = append(out, p.Severity.String()+": "+p.Error())
	}
	return out
}

func TestExpandDirectory(t *testing.T) {
	dir := tree(t, map[string]string{
		"b.md":              "# B",
		"a.txt":             "A",
		"sub/c.html":        "<p>C</p>",
		"sub/z/d.conllu":    "1\tD\t_\t_\t_\t_\t_\t_\t_\t_\n",
		"sub/e.docx":        "",
		"sub/manual.md.gz":  "",
		".hidden.txt":       "H",
		".git/config":       "x",
		"sub/.cache/f.txt":  "F",
		"img/logo.png":      "\x89PNG",
		"img/photo.PNG":     "\x89PNG",
		"Makefile":          "all:",
		"notes.Markdown":    "N",
		"sub/z/readme.TXT":  "R",
		"sub/z/y/data.json": "{}",
	})
	t.Chdir(dir)
	ins, ps := Expand([]string{"."}, Options{})
	assert.Equal(t, []string{
		"a.txt", "b.md", "notes.Markdown",
		filepath.Join("sub", "c.html"), filepath.Join("sub", "e.docx"), filepath.Join("sub", "manual.md.gz"),
		filepath.Join("sub", "z", "d.conllu"), filepath.Join("sub", "z", "readme.TXT"),
	}, names(ins))
	for _, in := range ins {
		assert.Equal(t, ".", in.Dir)
		assert.Equal(t, in.Name, in.Path)
	}
	assert.Equal(t, []string{
		"note: .git: skipped hidden directory",
		"note: .hidden.txt: skipped hidden file",
		"note: " + filepath.Join("sub", ".cache") + ": skipped hidden directory",
		"note: .: skipped 4 file(s) of types glossmith does not read (.json: 1, .png: 2, no extension: 1); --from FORMAT reads every file as that format",
	}, msgs(ps))

	// With --from, every (non-hidden) file is taken.
	ins, _ = Expand([]string{"img"}, Options{Format: "txt"})
	assert.Equal(t, []string{filepath.Join("img", "logo.png"), filepath.Join("img", "photo.PNG")}, names(ins))
}

func TestExpandArguments(t *testing.T) {
	dir := tree(t, map[string]string{
		"docs/a.md": "A", "docs/b.md": "B", "docs/c.txt": "C", "docs/.d.md": "D",
		"odd[1].txt": "odd", "empty/x.png": "",
	})
	require.NoError(t, os.Mkdir(filepath.Join(dir, "void"), 0o755))
	t.Chdir(dir)
	ins, ps := Expand([]string{
		"docs/c.txt",   // a file
		"docs/*.md",    // a pattern the shell left alone; skips .d.md
		"docs/a.md",    // a duplicate
		"-",            // standard input
		"odd[1].txt",   // a name with glob characters that exists
		"nothing*.txt", // a pattern matching nothing
		"docs/[",       // a bad pattern
		"missing.txt",  // a missing file
		"void",         // an empty directory
		"empty",        // a directory with nothing readable
	}, Options{})
	assert.Equal(t, []string{"docs/c.txt", "docs/a.md", "docs/b.md", "-", "odd[1].txt"}, names(ins))
	assert.Equal(t, "", ins[1].Dir, "a glob match is named, not found in a walk")
	assert.Equal(t, []string{
		"note: docs/a.md: named more than once; read once",
		"error: nothing*.txt: no files match this pattern",
		"error: docs/[: bad file pattern: syntax error in pattern",
		"error: missing.txt: cannot open: no such file or directory",
		"error: void: no files to read in this directory (formats read: txt, md, html, docx, pdf, conllu)",
		"note: empty: skipped 1 file(s) of types glossmith does not read (.png: 1); --from FORMAT reads every file as that format",
		"error: empty: no files to read in this directory (formats read: txt, md, html, docx, pdf, conllu)",
	}, msgs(ps))
}

func TestExpandGlobDirectoryAndDot(t *testing.T) {
	dir := tree(t, map[string]string{"m1/a.md": "A", "m2/b.md": "B", ".m3/c.md": "C"})
	t.Chdir(dir)
	ins, ps := Expand([]string{"m*"}, Options{})
	assert.Equal(t, []string{filepath.Join("m1", "a.md"), filepath.Join("m2", "b.md")}, names(ins))
	assert.Empty(t, ps)
	assert.Equal(t, "m1", ins[0].Dir)
	ins, _ = Expand([]string{".m*"}, Options{})
	assert.Equal(t, []string{filepath.Join(".m3", "c.md")}, names(ins))
}

func TestExpandSymlinks(t *testing.T) {
	dir := tree(t, map[string]string{"real/a.txt": "A"})
	t.Chdir(dir)
	require.NoError(t, os.Mkdir("top", 0o755))
	require.NoError(t, os.Symlink("../real", "top/loop"))
	require.NoError(t, os.Symlink("../real/a.txt", "top/link.txt"))
	require.NoError(t, os.Symlink("../nowhere.txt", "top/broken.txt"))
	ins, ps := Expand([]string{"top"}, Options{})
	assert.Equal(t, []string{filepath.Join("top", "link.txt")}, names(ins))
	assert.Equal(t, []string{
		"note: " + filepath.Join("top", "broken.txt") + ": skipped broken link: no such file or directory",
		"note: " + filepath.Join("top", "loop") + ": skipped link to a directory (not followed, to avoid loops)",
	}, msgs(ps))
}

func TestEach(t *testing.T) {
	dir := tree(t, map[string]string{
		"good/a.txt":   "The valve opens.",
		"good/b.txt":   "",
		"good/c.txt":   "bin\x00ary",
		"bad/empty.md": "   \n",
		"bad/bin.txt":  "\x00\x01\x02",
	})
	t.Chdir(dir)
	var got []string
	var ps []Problem
	err := Each([]string{"good", "bad", "missing"}, Options{}, func(d *doc.Document) error {
		got = append(got, d.Name+"="+d.Text)
		return nil
	}, func(p Problem) { ps = append(ps, p) })
	require.NoError(t, err)
	assert.Equal(t, []string{filepath.Join("good", "a.txt") + "=The valve opens."}, got)
	assert.Equal(t, []string{
		"error: missing: cannot open: no such file or directory",
		"note: " + filepath.Join("good", "b.txt") + ": no text",
		"note: " + filepath.Join("good", "c.txt") + ": skipped: not text (contains NUL bytes)",
		"note: " + filepath.Join("bad", "bin.txt") + ": skipped: not text (contains NUL bytes)",
		"note: " + filepath.Join("bad", "empty.md") + ": no text",
		"error: bad: no readable text in any of its 2 files",
	}, msgs(ps))

	stop := errors.New("stop")
	n := 0
	err = Each([]string{"good/a.txt", "good/a.txt", "-"}, Options{Stdin: strings.NewReader("More text.")}, func(d *doc.Document) error {
		n++
		return stop
	}, func(Problem) {})
	assert.Equal(t, stop, err)
	assert.Equal(t, 1, n)
}

// The binary fixture is a note inside a directory walk, an error when named.
func TestBinaryInDirectoryIsNote(t *testing.T) {
	raw, err := os.ReadFile(fixture(t, "binary.dat"))
	require.NoError(t, err)
	dir := tree(t, map[string]string{"d/pic.txt": string(raw), "d/ok.txt": "Valve."})
	t.Chdir(dir)
	var ps []Problem
	n := 0
	require.NoError(t, Each([]string{"d"}, Options{}, func(*doc.Document) error { n++; return nil }, func(p Problem) { ps = append(ps, p) }))
	assert.Equal(t, 1, n)
	assert.Equal(t, []string{"note: " + filepath.Join("d", "pic.txt") + ": skipped: not text (a PNG image)"}, msgs(ps))
	ps = nil
	require.NoError(t, Each([]string{"d/pic.txt"}, Options{}, func(*doc.Document) error { return nil }, func(p Problem) { ps = append(ps, p) }))
	assert.Equal(t, []string{"error: d/pic.txt: not text (a PNG image)"}, msgs(ps))
}

// The whole demo corpus reads without errors or warnings, each file in
// the format its name gives.
func TestDemoCorpus(t *testing.T) {
	demo := testenv.Demo(t)
	want := map[string]string{}
	entries, err := os.ReadDir(demo)
	require.NoError(t, err)
	for _, e := range entries {
		if f := formatByName(e.Name()); f != "" && !isHidden(e.Name()) {
			want[filepath.Join(demo, e.Name())] = f
		}
	}
	require.NotEmpty(t, want)
	got := map[string]string{}
	err = Each([]string{demo}, Options{}, func(d *doc.Document) error {
		got[d.Name] = d.Format
		for i, line := range strings.Split(d.Text, "\n") {
			line = strings.TrimLeft(line, " \u2029")
			if d.Format == "md" && strings.HasPrefix(line, "#") || d.Format == "html" && strings.Contains(line, "<p") {
				t.Errorf("%s:%d: markup left: %q", d.Name, i+1, line)
			}
		}
		return nil
	}, func(p Problem) {
		if p.Severity != Note {
			t.Errorf("%v: %v", p.Severity, p)
		}
	})
	require.NoError(t, err)
	assert.Equal(t, want, got)
}
