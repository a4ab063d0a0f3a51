package main

import (
	"os"
	"path/filepath"
	"testing"

	"pqfab/samples"
)

// TestAllSamplesBuild builds every sample twice: identical bytes, and every
// panel, member and node accounted for.
func TestAllSamplesBuild(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	for _, name := range samples.Names() {
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			if _, _, err := runCmd(t, "sample", name, "--panels", "250", "-o", filepath.Join(dir, "net.obj")); err != nil {
				t.Fatal(err)
			}
			job := "title = \"" + name + "\"\n[net]\nfile = \"net.obj\"\n[nodes]\nhub_radius_mm = 50\n[panel]\nedge_inset_mm = 5\n" + goodStock +
				"\n[[stock]]\nname = \"split\"\nwidth_mm = 3210\nheight_mm = 2250\nmargin_mm = 15\nspacing_mm = 6\nprice = 1\n"
			if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
				t.Fatal(err)
			}
			a, b := filepath.Join(dir, "a"), filepath.Join(dir, "b")
			for _, out := range []string{a, b} {
				if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
					t.Fatal(err)
				}
			}
			checkAccounting(t, a)
			sameTrees(t, a, b)
		})
	}
}
