package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pqfab/internal/pipeline"
)

// runCmd runs the program in-process and returns stdout, stderr and error.
func runCmd(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	var out, errb bytes.Buffer
	err := run(args, strings.NewReader(""), &out, &errb)
	return out.String(), errb.String(), err
}

// endToEnd skips a test of whole builds (seconds to a minute each) in a
// quick run, go test -short; CI runs them all.
func endToEnd(t *testing.T) {
	t.Helper()
	if testing.Short() {
		t.Skip("end-to-end build: run without -short")
	}
}

func TestSampleInspect(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	for _, name := range []string{"canopy", "dome", "wave"} {
		path := filepath.Join(dir, name+".obj")
		if _, _, err := runCmd(t, "sample", name, "--panels", "500", "-o", path); err != nil {
			t.Fatal(err)
		}
		out, _, err := runCmd(t, "inspect", "--json", path)
		if err != nil {
			t.Fatal(err)
		}
		var in pipeline.Inspection
		if err := json.Unmarshal([]byte(out), &in); err != nil {
			t.Fatal(err)
		}
		if in.Panels < 450 || in.Nodes == 0 || in.Edges == 0 || len(in.Worst) != 10 {
			t.Errorf("%s: %+v", name, in)
		}
		planar := name != "wave"
		if planar && in.FlatnessMM.Max > 1e-3 {
			t.Errorf("%s: flatness max %g mm", name, in.FlatnessMM.Max)
		}
		if !planar && (in.RatioPct.Median < 0.3 || in.RatioPct.Max > 2) {
			t.Errorf("%s: ratio %+v", name, in.RatioPct)
		}
		text, _, err := runCmd(t, "inspect", path)
		if err != nil || !strings.Contains(text, "worst panels") {
			t.Errorf("%s: text output %q %v", name, text, err)
		}
	}
}

func TestCommandErrors(t *testing.T) {
	t.Parallel()
	tests := []struct {
		args []string
		want string
		code int
	}{
		{[]string{"frobnicate"}, `unknown command "frobnicate"`, 2},
		{[]string{"inspect"}, "inspect takes one net file", 2},
		{[]string{"inspect", "nowhere.obj"}, "nowhere.obj: file not found", 1},
		{[]string{"inspect", "--unit", "ft", "x.obj"}, "--unit: unknown unit", 2},
		{[]string{"sample", "dome"}, "sample needs -o FILE", 2},
		{[]string{"sample", "castle", "-o", "x.obj"}, "unknown sample", 2},
		{[]string{"inspect", "../../quadnet/testdata/bad/flipped.obj"}, "flipped panel", 1},
	}
	for _, tc := range tests {
		_, _, err := runCmd(t, tc.args...)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: got %v, want %q", tc.args, err, tc.want)
			continue
		}
		if got := exitCode(err); got != tc.code {
			t.Errorf("%v: exit code %d want %d", tc.args, got, tc.code)
		}
	}
	if _, _, err := runCmd(t, "inspect", "--reorient", "../../quadnet/testdata/bad/flipped.obj"); err != nil {
		t.Errorf("--reorient should fix the flipped panel: %v", err)
	}
}

func TestPlanarizeCommand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	in := filepath.Join(dir, "wave.obj")
	if _, _, err := runCmd(t, "sample", "wave", "--panels", "400", "-o", in); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "flat.obj")
	rep := filepath.Join(dir, "rep.json")
	text, _, err := runCmd(t, "planarize", in, "--tol", "0.1", "-o", out, "--report", rep)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text, "node moves   max") {
		t.Errorf("summary %q", text)
	}
	js, _, err := runCmd(t, "inspect", "--json", out)
	if err != nil {
		t.Fatal(err)
	}
	var in2 pipeline.Inspection
	if err := json.Unmarshal([]byte(js), &in2); err != nil {
		t.Fatal(err)
	}
	if in2.FlatnessMM.Max > 0.1 {
		t.Errorf("flatness after %g", in2.FlatnessMM.Max)
	}
	// Too small a move limit: non-zero exit, no OBJ written, report written.
	out2 := filepath.Join(dir, "flat2.obj")
	_, _, err = runCmd(t, "planarize", in, "--max-move", "1", "-o", out2, "--report", rep)
	if err == nil || !strings.Contains(err.Error(), "allowed node move") {
		t.Errorf("want a move-limit failure, got %v", err)
	}
	if _, err := os.Stat(out2); err == nil {
		t.Error("failed planarize wrote its OBJ")
	}
	if _, _, err := runCmd(t, "planarize", in, "--supports", "1,2,nope", "-o", out2); err == nil || !strings.Contains(err.Error(), `node "nope"`) {
		t.Errorf("bad support id: %v", err)
	}
}

func TestMembersCommand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	for _, name := range []string{"canopy", "dome", "wave"} {
		path := filepath.Join(dir, name+".obj")
		if _, _, err := runCmd(t, "sample", name, "--panels", "300", "-o", path); err != nil {
			t.Fatal(err)
		}
		out, _, err := runCmd(t, "members", "--json", "--axis", "least-twist", "--hub-radius", "50", path)
		if err != nil {
			t.Fatal(err)
		}
		var s pipeline.MemberSummary
		if err := json.Unmarshal([]byte(out), &s); err != nil {
			t.Fatal(err)
		}
		total := 0
		for _, b := range s.TwistHistogram {
			total += b.Count
		}
		if total != s.Members || s.MemberTypes == 0 || s.NodeTypes == 0 {
			t.Errorf("%s: %+v", name, s)
		}
		if name == "dome" && s.TwistDeg.Max > 1e-6 {
			t.Errorf("dome twist %g", s.TwistDeg.Max)
		}
	}
	if _, _, err := runCmd(t, "members", "--axis", "sideways", filepath.Join(dir, "dome.obj")); err == nil || !strings.Contains(err.Error(), "--axis: \"sideways\": want normal or least-twist") || exitCode(err) != 2 {
		t.Errorf("bad axis: %v", err)
	}
}

func TestNestCommand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	path := filepath.Join(dir, "canopy.obj")
	if _, _, err := runCmd(t, "sample", "canopy", "--panels", "60", "-o", path); err != nil {
		t.Fatal(err)
	}
	out, _, err := runCmd(t, "nest", path, "--sheet", "3210x2250", "--inset", "3", "--rotation", "quarter")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, "placed on") || !strings.Contains(out, "S-01") || !strings.Contains(out, "0 unplaced") {
		t.Errorf("output %q", out)
	}
	if _, _, err := runCmd(t, "nest", path, "--sheet", "big"); err == nil || !strings.Contains(err.Error(), "WIDTHxHEIGHT") {
		t.Errorf("bad sheet: %v", err)
	}
	// Panels on no sheet are listed and make the command fail.
	out, _, err = runCmd(t, "nest", path, "--sheet", "1000x1000")
	if err == nil || !strings.Contains(err.Error(), "60 of 60 panels fit no sheet") || !strings.Contains(out, "larger than every stock sheet") {
		t.Errorf("small sheet: %v %q", err, out)
	}
}

// TestUnusedNodesLeftOut: a node that belongs to no panel is left out with
// one warning, and the build goes on (one rule: the warning says so and the
// outputs hold only the net's used nodes).
func TestUnusedNodesLeftOut(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	net := goodQuad + "v 9000 9000 0\n"
	for name, body := range map[string]string{"n.obj": net, "job.toml": jobFor("n.obj")} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	out := filepath.Join(dir, "out")
	_, stderr, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(stderr, "node 7: 1 node belongs to no panel (id 7); it is left out") {
		t.Errorf("stderr %q", stderr)
	}
	if rep := loadReport(t, out); len(rep.Nodes) != 6 || len(rep.Warnings) == 0 {
		t.Errorf("%d nodes in the report, warnings %v", len(rep.Nodes), rep.Warnings)
	}
}
