package main

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pqfab/internal/job"
	"pqfab/panels/nest"
)

var flagDefault = regexp.MustCompile(`(?m)^  -(\S+)(?: \S+)?\n(?:\s+.*?)(?: \(default (.*)\))?$`)

// flagDefaults runs `pqfab CMD -h` and returns each flag's default as the
// usage text shows it ("" for a zero default, which it leaves out).
func flagDefaults(t *testing.T, cmd string) map[string]string {
	t.Helper()
	_, usage, _ := runCmd(t, cmd, "-h")
	out := map[string]string{}
	for _, m := range flagDefault.FindAllStringSubmatch(usage, -1) {
		out[m[1]] = strings.Trim(m[2], `"`)
	}
	if len(out) < 5 {
		t.Fatalf("pqfab %s -h: read %d flags from\n%s", cmd, len(out), usage)
	}
	return out
}

// TestFlagDefaultsAreJobDefaults: every flag of the single-stage commands
// that sets what a job key sets has the job's default (a job with only
// its required keys), so a command and a build given the same net and no
// settings do the same work.
func TestFlagDefaultsAreJobDefaults(t *testing.T) {
	t.Parallel()
	j, err := job.Parse([]byte("[net]\nfile = \"n.obj\"\n[[stock]]\nwidth_mm = 6000\nheight_mm = 3210\n"), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	s := j.Stock[0]
	tests := map[string]map[string]any{
		"planarize": {"tol": j.Flatness.TolMM, "max-move": j.Flatness.MaxMoveMM, "fairness": j.Flatness.Fairness,
			"max-iter": j.Flatness.MaxIter, "vertical": j.Flatness.VerticalOnly, "supports": j.Supports.Mode,
			"unit": j.Net.Unit, "merge-tol": j.Net.MergeTolMM, "reorient": j.Net.Reorient},
		"members": {"axis": j.Nodes.Axis, "hub-radius": j.Nodes.HubRadiusMM, "width": j.Member.WidthMM, "depth": j.Member.DepthMM,
			"length-tol": j.Types.LengthTolMM, "angle-tol": j.Types.AngleTolDeg, "bay": j.Nodes.BayMM,
			"unit": j.Net.Unit, "merge-tol": j.Net.MergeTolMM, "reorient": j.Net.Reorient},
		"nest": {"margin": s.MarginMM, "spacing": s.SpacingMM, "rotation": s.Rotation, "mirror": s.Mirror,
			"inset": j.Panel.EdgeInsetMM, "bay": j.Nodes.BayMM, "sheet": fmt.Sprintf("%gx%g", nest.DefaultSheetWidthMM, nest.DefaultSheetHeightMM),
			"unit": j.Net.Unit, "merge-tol": j.Net.MergeTolMM, "reorient": j.Net.Reorient},
	}
	for cmd, flags := range tests {
		got := flagDefaults(t, cmd)
		for name, want := range flags {
			g, ok := got[name]
			if !ok {
				t.Errorf("pqfab %s has no flag -%s", cmd, name)
				continue
			}
			if !sameDefault(g, want) {
				t.Errorf("pqfab %s -%s: default %q, the job's is %v", cmd, name, g, want)
			}
		}
	}
}

// sameDefault compares a default as flag usage shows it with a job value.
func sameDefault(shown string, want any) bool {
	switch w := want.(type) {
	case float64:
		v, err := strconv.ParseFloat(cmpZero(shown), 64)
		return err == nil && v == w
	case int:
		v, err := strconv.Atoi(cmpZero(shown))
		return err == nil && v == w
	case bool:
		return (shown == "" || shown == "false") == !w
	case string:
		return shown == w
	}
	return false
}

// cmpZero reads a left-out default as zero.
func cmpZero(s string) string {
	if s == "" {
		return "0"
	}
	return s
}
