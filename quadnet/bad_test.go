package quadnet

import (
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite golden files")

// loadChecked reads and validates a net file the way the command does and
// returns the first error.
func loadChecked(path string) error {
	n, err := ReadFile(path, MM)
	if err != nil {
		return err
	}
	_, fd := Validate(n, DefaultValidateOptions())
	return fd.Err()
}

// TestBadInput reads every malformed file in testdata/bad and compares the
// error with the .want file beside it (go test -update rewrites them).
func TestBadInput(t *testing.T) {
	files, err := filepath.Glob("testdata/bad/*")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, path := range files {
		if strings.HasSuffix(path, ".want") || strings.HasSuffix(path, "-panels.csv") {
			continue
		}
		n++
		t.Run(filepath.Base(path), func(t *testing.T) {
			err := loadChecked(path)
			if err == nil {
				t.Fatalf("no error for %s", path)
			}
			got := err.Error()
			want := strings.TrimSuffix(path, filepath.Ext(path)) + ".want"
			if *update {
				if err := os.WriteFile(want, []byte(got+"\n"), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			w, err := os.ReadFile(want)
			if err != nil {
				t.Fatal(err)
			}
			if got != strings.TrimSuffix(string(w), "\n") {
				t.Errorf("got  %q\nwant %q", got, strings.TrimSuffix(string(w), "\n"))
			}
			if !strings.Contains(got, path) {
				t.Errorf("error does not name the file %s: %q", path, got)
			}
		})
	}
	if n < 15 {
		t.Errorf("only %d bad-input cases; want at least 15", n)
	}
}

func TestMissingFile(t *testing.T) {
	err := loadChecked("testdata/no-such-net.obj")
	if err == nil || err.Error() != "testdata/no-such-net.obj: file not found" {
		t.Errorf("got %v", err)
	}
	err = loadChecked("testdata/net.stl")
	if err == nil || !strings.Contains(err.Error(), "unknown net format") {
		t.Errorf("got %v", err)
	}
}
