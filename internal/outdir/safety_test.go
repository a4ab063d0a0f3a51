package outdir

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func writeText(t *testing.T, path, text string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
}

func readText(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// fillWith returns a fill function writing one file with text.
func fillWith(text string) func(tmp string) error {
	return func(tmp string) error { return os.WriteFile(filepath.Join(tmp, "a.txt"), []byte(text), 0o644) }
}

// leftovers lists the entries of dir whose names show they are pqfab's
// temporary or old copies.
func leftovers(t *testing.T, dir string) []string {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range ents {
		if strings.Contains(e.Name(), ".pqfab-tmp-") || strings.Contains(e.Name(), ".pqfab-old-") {
			out = append(out, e.Name())
		}
	}
	return out
}

func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "net.obj")
	writeText(t, path, "old")
	// A file pqfab did not write is not replaced without Force.
	err := WriteFileAtomic(path, Options{}, func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err })
	if !errors.Is(err, ErrNotOurs) || !strings.Contains(err.Error(), "--force") {
		t.Fatalf("foreign file: got %v", err)
	}
	// A failed write leaves the old file.
	err = WriteFileAtomic(path, Options{Force: true}, func(w io.Writer) error {
		io.WriteString(w, "half")
		return errors.New("disk on fire")
	})
	if err == nil {
		t.Fatal("want the write error")
	}
	if got := readText(t, path); got != "old" {
		t.Errorf("failed write changed the file to %q", got)
	}
	own := "# net\n# units: mm, z up; written by pqfab\nv 0 0 0\n"
	if err := WriteFileAtomic(path, Options{Force: true}, func(w io.Writer) error { _, err := io.WriteString(w, own); return err }); err != nil {
		t.Fatal(err)
	}
	// pqfab's own file is replaced without Force.
	if err := WriteFileAtomic(path, Options{}, func(w io.Writer) error { _, err := io.WriteString(w, own+"v 1 1 1\n"); return err }); err != nil {
		t.Fatal(err)
	}
	if got := readText(t, path); got != own+"v 1 1 1\n" {
		t.Errorf("got %q", got)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("leftover files: %v", ents)
	}
	if err := WriteFileAtomic(filepath.Join(dir, "missing", "x.obj"), Options{}, func(io.Writer) error { return nil }); err == nil {
		t.Error("missing folder: want an error")
	}
	// An input file is never replaced, not even with Force.
	err = WriteFileAtomic(path, Options{Force: true, Keep: []string{path}}, func(io.Writer) error { return nil })
	if err == nil || !strings.Contains(err.Error(), "never replaces an input file") {
		t.Errorf("kept file: got %v", err)
	}
}

// TestFolderOwnership: a folder pqfab did not write is replaced only with
// Force; an empty folder and pqfab's own folder are replaced freely.
func TestFolderOwnership(t *testing.T) {
	base := t.TempDir()
	out := filepath.Join(base, "out")
	writeText(t, filepath.Join(out, "thesis.docx"), "years of work")
	err := WriteFolder(out, Options{}, fillWith("new"))
	if !errors.Is(err, ErrNotOurs) || !strings.Contains(err.Error(), "thesis.docx") || !strings.Contains(err.Error(), "--force") {
		t.Fatalf("foreign folder: got %v", err)
	}
	if got := readText(t, filepath.Join(out, "thesis.docx")); got != "years of work" {
		t.Fatal("foreign folder touched")
	}
	if err := WriteFolder(out, Options{Force: true}, fillWith("one")); err != nil {
		t.Fatal(err)
	}
	if got := readText(t, filepath.Join(out, MarkerFile)); got != markerText {
		t.Errorf("marker %q", got)
	}
	if err := WriteFolder(out, Options{}, fillWith("two")); err != nil {
		t.Fatalf("own folder: %v", err)
	}
	if got := readText(t, filepath.Join(out, "a.txt")); got != "two" {
		t.Errorf("got %q", got)
	}
	empty := filepath.Join(base, "empty")
	if err := os.Mkdir(empty, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := WriteFolder(empty, Options{}, fillWith("x")); err != nil {
		t.Errorf("empty folder: %v", err)
	}
	if l := leftovers(t, base); len(l) > 0 {
		t.Errorf("leftovers %v", l)
	}
}

// TestFolderNeverReplaced: the folder holding an input, the current
// folder, a folder above it, the home folder and the root are refused,
// even with Force.
func TestFolderNeverReplaced(t *testing.T) {
	base := t.TempDir()
	proj := filepath.Join(base, "proj")
	job := filepath.Join(proj, "job.toml")
	writeText(t, job, "title = \"x\"\n")
	home := filepath.Join(base, "home")
	if err := os.Mkdir(home, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Setenv("HOME", home)
	work := filepath.Join(base, "work", "here")
	if err := os.MkdirAll(work, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Chdir(work)
	force := Options{Force: true, Keep: []string{job}}
	for _, tc := range []struct{ dir, want string }{
		{proj, "a folder holding an input file"},
		{base, "a folder holding an input file"},
		{".", "the current folder"},
		{"..", "the current folder or a folder above it"},
		{home, "the home folder"},
		{"/", "the root folder"},
	} {
		err := WriteFolder(tc.dir, force, fillWith("x"))
		if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), "not even with --force") {
			t.Errorf("%s: got %v, want %q", tc.dir, err, tc.want)
		}
	}
	if got := readText(t, job); got != "title = \"x\"\n" {
		t.Error("job file touched")
	}
}

// TestInterruptedSwap: a run killed between the two renames of the swap
// leaves no folder under the name, the old copy and the new folder; the
// next run puts the old copy back first, so even a failing next run
// leaves the previous folder in place.
func TestInterruptedSwap(t *testing.T) {
	base := t.TempDir()
	out := filepath.Join(base, "out")
	old := filepath.Join(base, ".out.pqfab-old-123")
	tmp := filepath.Join(base, ".out.pqfab-tmp-123")
	writeText(t, filepath.Join(old, "a.txt"), "previous")
	writeText(t, filepath.Join(old, MarkerFile), markerText)
	writeText(t, filepath.Join(tmp, "a.txt"), "half")
	writeText(t, filepath.Join(tmp, MarkerFile), buildingText)
	foreign := filepath.Join(base, ".out.pqfab-tmp-999")                             // no marker: not pqfab's
	if err := os.Mkdir(filepath.Join(base, ".out.pqfab-tmp-7"), 0o755); err != nil { // empty: stopped before its marker
		t.Fatal(err)
	}
	writeText(t, filepath.Join(foreign, "keep.txt"), "mine")
	err := WriteFolder(out, Options{}, func(string) error { return errors.New("fails") })
	if err == nil {
		t.Fatal("want the fill error")
	}
	if got := readText(t, filepath.Join(out, "a.txt")); got != "previous" {
		t.Errorf("previous folder not restored: %q", got)
	}
	if l := leftovers(t, base); len(l) != 1 || l[0] != ".out.pqfab-tmp-999" {
		t.Errorf("leftovers %v, want only the foreign folder", l)
	}
	if err := WriteFolder(out, Options{}, fillWith("next")); err != nil {
		t.Fatal(err)
	}
	if got := readText(t, filepath.Join(out, "a.txt")); got != "next" {
		t.Errorf("got %q", got)
	}
	if got := readText(t, filepath.Join(foreign, "keep.txt")); got != "mine" {
		t.Error("foreign folder touched")
	}
}

// TestFolderLock: while one build holds the lock, another stops with a
// clear message.
func TestFolderLock(t *testing.T) {
	out := filepath.Join(t.TempDir(), "out")
	l, err := lockFolder(out)
	if err != nil {
		t.Fatal(err)
	}
	err = WriteFolder(out, Options{}, fillWith("x"))
	if err == nil || !strings.Contains(err.Error(), "another pqfab build is writing") {
		t.Errorf("got %v", err)
	}
	l.unlock()
	if err := WriteFolder(out, Options{}, fillWith("x")); err != nil {
		t.Errorf("after unlock: %v", err)
	}
	if _, err := os.Stat(filepath.Join(filepath.Dir(out), ".out.pqfab-lock")); err == nil {
		t.Error("lock file left behind")
	}
}
