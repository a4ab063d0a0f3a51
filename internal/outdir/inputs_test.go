package outdir

import (
	"os"
	"path/filepath"
	"slices"
	"testing"
)

// TestForInputs: every command's output rules keep the inputs it read
// from disk, the panels file of a CSV pair included, and nothing else.
func TestForInputs(t *testing.T) {
	for _, tc := range []struct {
		force  bool
		inputs []string
		want   []string
	}{
		{false, nil, nil}, // sample -o, demo: nothing read from disk
		{true, []string{"", ""}, nil},
		{false, []string{"wave.obj"}, []string{"wave.obj"}}, // planarize
		{false, []string{"a/job.toml", "a/net.obj"}, []string{"a/job.toml", "a/net.obj"}},
		{true, []string{"job.toml", "site/canopy-nodes.csv"}, []string{"job.toml", "site/canopy-nodes.csv", "site/canopy-panels.csv"}},
		{false, []string{"net.CSV"}, []string{"net.CSV"}}, // no "nodes" in the name: the reader says so
	} {
		got := ForInputs(tc.force, tc.inputs...)
		if got.Force != tc.force || !slices.Equal(got.Keep, tc.want) || got.OnTemp != nil {
			t.Errorf("ForInputs(%v, %q) = {Force %v, Keep %q}, want {Force %v, Keep %q}", tc.force, tc.inputs, got.Force, got.Keep, tc.force, tc.want)
		}
	}
}

// TestForInputsKeepPanelsFile: with the rules of a build from a CSV
// pair, neither file of the pair nor their folder can be an output, not
// even with force.
func TestForInputsKeepPanelsFile(t *testing.T) {
	dir := t.TempDir()
	nodes, panels := filepath.Join(dir, "in", "canopy-nodes.csv"), filepath.Join(dir, "in", "canopy-panels.csv")
	if err := os.Mkdir(filepath.Join(dir, "in"), 0o755); err != nil {
		t.Fatal(err)
	}
	for _, f := range []string{nodes, panels} {
		if err := os.WriteFile(f, []byte("id\n"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	opt := ForInputs(true, filepath.Join(dir, "job.toml"), nodes)
	if err := CheckFiles(opt, panels); err == nil {
		t.Errorf("%s may be replaced as an output", panels)
	}
	if err := CheckFolder(filepath.Join(dir, "in"), opt); err == nil {
		t.Errorf("the folder holding the net may be replaced")
	}
	if err := CheckFolder(filepath.Join(dir, "out"), opt); err != nil {
		t.Errorf("a new folder beside the inputs: %v", err)
	}
}
