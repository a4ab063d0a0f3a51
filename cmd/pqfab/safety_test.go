package main

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestMain lets a test run the program itself as a child process (for
// signals and kills): with PQFAB_TEST_MAIN=1 the test binary is pqfab.
func TestMain(m *testing.M) {
	if os.Getenv("PQFAB_TEST_MAIN") == "1" {
		main()
		os.Exit(0)
	}
	os.Exit(m.Run())
}

// child returns a command running pqfab with args in dir.
func child(t *testing.T, dir string, args ...string) *exec.Cmd {
	t.Helper()
	exe, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(exe, args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "PQFAB_TEST_MAIN=1")
	return cmd
}

// pqfabLeftovers lists pqfab's temporary and old folders in dir.
func pqfabLeftovers(t *testing.T, dir string) []string {
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

// TestOutputSafety: outputs never replace what pqfab did not write, nor
// the inputs, the current folder or a folder above them. Not parallel:
// it changes the working folder.
func TestOutputSafety(t *testing.T) {
	endToEnd(t)
	dir := t.TempDir()
	proj := filepath.Join(dir, "proj")
	if err := os.Mkdir(proj, 0o755); err != nil {
		t.Fatal(err)
	}
	job := writeJob(t, proj, "")
	net := filepath.Join(proj, "wave.obj")
	netBytes, _ := os.ReadFile(net)
	user := filepath.Join(dir, "mine")
	if err := os.MkdirAll(user, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(user, "notes.txt"), []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "plan.obj"), []byte("v 0 0 0\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	work := filepath.Join(dir, "work", "sub")
	if err := os.MkdirAll(work, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Chdir(work)
	tests := []struct {
		args []string
		want string
	}{
		{[]string{"build", "-q", job, "-o", proj}, "a folder holding an input file"},
		{[]string{"build", "-q", "--force", job, "-o", proj}, "not even with --force"},
		{[]string{"build", "-q", "--force", job, "-o", dir}, "a folder holding an input file"},
		{[]string{"build", "-q", "--force", job, "-o", "."}, "the current folder"},
		{[]string{"build", "-q", "--force", job, "-o", ".."}, "the current folder or a folder above it"},
		{[]string{"build", "-q", job, "-o", user}, "did not write it (it holds 1 entry: notes.txt)"},
		{[]string{"planarize", "-q", net, "-o", net}, "an input file of this job"},
		{[]string{"planarize", "-q", net, "-o", filepath.Join(dir, "a.obj"), "--report", filepath.Join(dir, "a.obj")}, "are the same file"},
		{[]string{"planarize", "-q", net, "-o", filepath.Join(dir, "plan.obj")}, "plan.obj exists and pqfab did not write it"},
		{[]string{"sample", "dome", "-o", filepath.Join(dir, "plan.obj")}, "plan.obj exists and pqfab did not write it"},
	}
	for _, tc := range tests {
		_, _, err := runCmd(t, tc.args...)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: got %v, want %q", tc.args, err, tc.want)
		}
	}
	if b, _ := os.ReadFile(net); string(b) != string(netBytes) {
		t.Error("the net file was changed")
	}
	if _, err := os.Stat(job); err != nil {
		t.Error("the job file is gone")
	}
	if b, _ := os.ReadFile(filepath.Join(user, "notes.txt")); string(b) != "mine" {
		t.Error("the user's folder was changed")
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "plan.obj")); string(b) != "v 0 0 0\n" {
		t.Error("the user's file was replaced")
	}
	// --force replaces the user's own folder and file on request.
	if _, _, err := runCmd(t, "build", "-q", "--force", job, "-o", user); err != nil {
		t.Errorf("--force: %v", err)
	}
	if _, _, err := runCmd(t, "sample", "dome", "--force", "-o", filepath.Join(dir, "plan.obj")); err != nil {
		t.Errorf("sample --force: %v", err)
	}
	// A second build replaces pqfab's own folder and file without --force.
	if _, _, err := runCmd(t, "build", "-q", job, "-o", user); err != nil {
		t.Errorf("rebuild: %v", err)
	}
	if _, _, err := runCmd(t, "sample", "dome", "-o", filepath.Join(dir, "plan.obj")); err != nil {
		t.Errorf("sample again: %v", err)
	}
}

// startBuild starts a child build of a 1200-panel job into out and waits
// until a new temporary folder appears (the write stage has begun).
func startBuild(t *testing.T, dir, job, out string) *exec.Cmd {
	t.Helper()
	old := map[string]bool{}
	for _, l := range pqfabLeftovers(t, filepath.Dir(out)) {
		old[l] = true
	}
	cmd := child(t, dir, "build", "-q", job, "-o", out)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	deadline := time.Now().Add(60 * time.Second)
	for time.Now().Before(deadline) {
		for _, l := range pqfabLeftovers(t, filepath.Dir(out)) {
			if !old[l] {
				return cmd
			}
		}
		time.Sleep(2 * time.Millisecond)
	}
	cmd.Process.Kill()
	t.Fatal("the build never started writing")
	return nil
}

// bigJob writes a job over a 1200-panel wave (its writing takes long
// enough to be interrupted).
func bigJob(t *testing.T, dir string) string {
	t.Helper()
	if _, _, err := runCmd(t, "sample", "wave", "--panels", "1200", "-o", filepath.Join(dir, "wave.obj")); err != nil {
		t.Fatal(err)
	}
	job := filepath.Join(dir, "job.toml")
	text := "[net]\nfile = \"wave.obj\"\n[[stock]]\nname = \"jumbo\"\nwidth_mm = 6000\nheight_mm = 3210\nmargin_mm = 20\nspacing_mm = 6\n"
	if err := os.WriteFile(job, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return job
}

// TestInterruptDuringWrite: SIGINT or SIGTERM while the outputs are being
// written removes the temporary folder, exits non-zero and leaves the
// previous folder as it was; a SIGKILL leaves the temporary folder, which
// the next run removes.
func TestInterruptDuringWrite(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	job := bigJob(t, dir)
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", job, "-o", out); err != nil {
		t.Fatal(err)
	}
	before, err := os.ReadFile(filepath.Join(out, "report.json"))
	if err != nil {
		t.Fatal(err)
	}
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM, syscall.SIGKILL} {
		cmd := startBuild(t, dir, job, out)
		if err := cmd.Process.Signal(sig); err != nil {
			t.Fatal(err)
		}
		err := cmd.Wait()
		var ee *exec.ExitError
		if !errors.As(err, &ee) {
			t.Fatalf("%v: the build ended without an error: %v", sig, err)
		}
		if sig != syscall.SIGKILL && ee.ExitCode() != 130 {
			t.Errorf("%v: exit code %d, want 130", sig, ee.ExitCode())
		}
		after, err := os.ReadFile(filepath.Join(out, "report.json"))
		if err != nil || string(after) != string(before) {
			t.Fatalf("%v: the previous folder changed or went missing: %v", sig, err)
		}
		left := pqfabLeftovers(t, dir)
		if sig != syscall.SIGKILL && len(left) > 0 {
			t.Errorf("%v: temporary folders left: %v", sig, left)
		}
		if sig == syscall.SIGKILL && len(left) == 0 {
			t.Logf("SIGKILL came after the temporary folder was gone")
		}
	}
	// The next run cleans what the killed run left and builds.
	if _, _, err := runCmd(t, "build", "-q", job, "-o", out); err != nil {
		t.Fatal(err)
	}
	if left := pqfabLeftovers(t, dir); len(left) > 0 {
		t.Errorf("leftovers after the next run: %v", left)
	}
	checkAccounting(t, out)
}
