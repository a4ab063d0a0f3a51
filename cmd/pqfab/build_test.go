package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pqfab/internal/report"
	"pqfab/quadnet"
	"pqfab/samples"
)

// debianPython is Debian's interpreter, where python3-ezdxf and
// python3-openpyxl are installed (.ci/run installs them).
const debianPython = "/usr/bin/python3"

// readBack runs a read-back script on an output folder. A missing reader
// is a failure, not a skip: CI installs the readers.
func readBack(t *testing.T, script, dir string) {
	t.Helper()
	out, err := exec.Command(debianPython, filepath.Join("testdata", script), dir).CombinedOutput()
	if err != nil {
		t.Fatalf("%s: %v\n%s", script, err, tail(string(out), 2000))
	}
	if !strings.HasSuffix(strings.TrimSpace(string(out)), "ok") {
		t.Fatalf("%s: no ok:\n%s", script, tail(string(out), 2000))
	}
}

func tail(s string, n int) string {
	if len(s) > n {
		return "…" + s[len(s)-n:]
	}
	return s
}

func loadReport(t *testing.T, dir string) *report.Report {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(dir, report.FileReport))
	if err != nil {
		t.Fatal(err)
	}
	var rep report.Report
	if err := json.Unmarshal(b, &rep); err != nil {
		t.Fatal(err)
	}
	return &rep
}

// TestDemoReadBack builds the demo and reads every DXF back with ezdxf
// (audit: no errors; entity counts and outline coordinates equal
// report.json to 0.01 mm) and the schedule with openpyxl (row counts equal
// the net's panels, members and nodes; spot values equal report.json).
// Both are general-purpose libraries from Debian's packages. The panel
// tags (poppler's pdftotext), type drawings and schedule are read back by
// readback_panel_marks.py: tag diagonals equal the cut outline's, bevel
// signs agree across schedule, type drawing and tag, drawing texts are dark
// and clear of the outlines and print the schedule's numbers.
func TestDemoReadBack(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runCmd(t, "demo", "-q", "-o", dir); err != nil {
		t.Fatal(err)
	}
	readBack(t, "readback_dxf.py", dir)
	readBack(t, "readback_xlsx.py", dir)
	readBack(t, "readback_types.py", dir)
	readBack(t, "readback_panel_marks.py", dir)
	checkAccounting(t, dir)
	checkWords(t, dir)
}

// checkWords runs check_words.py on the demo's schedule and report, the
// help of every command and the README: words with a plain replacement
// appear nowhere outside the glossary, and kept words (job keys, job
// values, command names) are explained in the Glossary sheet and the
// README's glossary.
func checkWords(t *testing.T, dir string) {
	t.Helper()
	var help strings.Builder
	for _, args := range [][]string{{"help"}, {"demo", "-h"}, {"build", "-h"}, {"inspect", "-h"}, {"sample", "-h"},
		{"members", "-h"}, {"nest", "-h"}, {"planarize", "-h"}} {
		out, errOut, _ := runCmd(t, args...)
		help.WriteString(out + errOut)
	}
	if !strings.Contains(help.String(), "Usage: pqfab planarize") {
		t.Fatalf("no command help read:\n%s", tail(help.String(), 500))
	}
	helpFile := filepath.Join(t.TempDir(), "help.txt")
	if err := os.WriteFile(helpFile, []byte(help.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	out, err := exec.Command(debianPython, filepath.Join("testdata", "check_words.py"), dir, helpFile, filepath.Join("..", "..", "README.md")).CombinedOutput()
	if err != nil || !strings.HasSuffix(strings.TrimSpace(string(out)), "ok") {
		t.Fatalf("check_words.py: %v\n%s", err, tail(string(out), 2000))
	}
}

// TestBevelledTypes: with bevelled edges and panels allowed to be turned
// over, every panel type keeps each edge's bevel, sign included, within
// the angle tolerance over its panels (a turned-over panel's signs
// reversed, as report.json's part_bevels give them; recomputed here from
// each panel's own edges too), and the read-back of tags, drawings and
// schedule (readback_panel_marks.py) holds with turned-over panels.
func TestBevelledTypes(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	if _, _, err := runCmd(t, "sample", "wave", "--panels", "120", "-o", filepath.Join(dir, "w.obj")); err != nil {
		t.Fatal(err)
	}
	const tolDeg = 0.5
	job := "[net]\nfile = \"w.obj\"\n[panel]\nedge_inset_mm = 5\nmirror = true\nbevelled_edges = true\n[types]\nangle_tol_deg = 0.5\n" +
		"[nesting]\nsteps = 2000\n[[stock]]\nname = \"board\"\nwidth_mm = 6000\nheight_mm = 3210\nmirror = true\n"
	if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	rep := loadReport(t, out)
	if !rep.PanelMaterial.BevelledEdges {
		t.Fatal("report does not say the edges are bevelled")
	}
	panelOf := map[string]report.PanelRow{}
	for _, p := range rep.Panels {
		panelOf[p.Label] = p
	}
	turned := 0
	for _, ty := range rep.PanelTypes {
		over := map[string]bool{}
		for _, l := range ty.Mirrored {
			over[l] = true
		}
		turned += len(ty.Mirrored)
		k := len(ty.EdgesMM)
		lo, hi := make([]float64, k), make([]float64, k)
		for i := range k {
			lo[i], hi[i] = math.Inf(1), math.Inf(-1)
		}
		for _, pb := range ty.PartBevels {
			p := panelOf[pb.Panel]
			for i := range k {
				// Type edge i of a turned-over panel is its edge k-1-i,
				// seen from its other face.
				want := p.Edges[i].BevelDeg
				if over[pb.Panel] {
					want = -p.Edges[(k-1-i)%k].BevelDeg
				}
				if math.Abs(pb.BevelsDeg[i]-want) > 0.0051 {
					t.Errorf("%s %s edge %d: %g, the panel's own edge gives %g", ty.Name, pb.Panel, i+1, pb.BevelsDeg[i], want)
				}
				lo[i], hi[i] = min(lo[i], want), max(hi[i], want)
			}
		}
		for i := range k {
			if hi[i]-lo[i] > tolDeg+0.002 {
				t.Errorf("%s edge %d: bevels %g to %g, more than %g° apart", ty.Name, i+1, lo[i], hi[i], tolDeg)
			}
		}
	}
	if turned == 0 {
		t.Error("no panel turned over: the test does not reach turned-over panels")
	}
	readBack(t, "readback_panel_marks.py", out)
}

// checkAccounting: every panel, member and node of the net appears exactly
// once in the report, and every panel on exactly one sheet or unplaced.
func checkAccounting(t *testing.T, dir string) {
	t.Helper()
	rep := loadReport(t, dir)
	net, err := quadnet.ReadFile(filepath.Join(dir, report.FileNet), quadnet.MM)
	if err != nil {
		t.Fatal(err)
	}
	topo := quadnet.BuildTopology(net)
	if len(rep.Nodes) != len(net.Nodes) || len(rep.Members) != len(topo.Edges) || len(rep.Panels) != len(net.Faces) {
		t.Fatalf("report has %d nodes, %d members, %d panels; net %d, %d, %d",
			len(rep.Nodes), len(rep.Members), len(rep.Panels), len(net.Nodes), len(topo.Edges), len(net.Faces))
	}
	unique := func(kind string, labels []string) {
		seen := map[string]bool{}
		for _, l := range labels {
			if seen[l] {
				t.Fatalf("%s label %s twice", kind, l)
			}
			seen[l] = true
		}
	}
	var nl, ml, pl []string
	for _, n := range rep.Nodes {
		nl = append(nl, n.Label)
	}
	for _, m := range rep.Members {
		ml = append(ml, m.Label)
	}
	for _, p := range rep.Panels {
		pl = append(pl, p.Label)
	}
	unique("node", nl)
	unique("member", ml)
	unique("panel", pl)
	onSheet := map[string]int{}
	for _, s := range rep.Sheets {
		for _, p := range s.Placements {
			onSheet[p.Panel]++
		}
	}
	for _, u := range rep.Unplaced {
		onSheet[u.Panel]++
	}
	for _, p := range rep.Panels {
		if onSheet[p.Label] != 1 {
			t.Fatalf("panel %s on %d sheets or lists", p.Label, onSheet[p.Label])
		}
	}
	typed := 0
	for _, ty := range rep.MemberTypes {
		typed += ty.Count
	}
	if typed != len(rep.Members) {
		t.Errorf("member types hold %d of %d members", typed, len(rep.Members))
	}
}

// TestBuildDeterministic: the same job twice gives byte-identical files.
func TestBuildDeterministic(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	base := t.TempDir()
	a, b := filepath.Join(base, "a"), filepath.Join(base, "b")
	for _, d := range []string{a, b} {
		if _, _, err := runCmd(t, "demo", "-q", "-o", d); err != nil {
			t.Fatal(err)
		}
	}
	sameTrees(t, a, b)
}

// writeJob writes a small wave net and a job using it; extra is appended
// to the [flatness] table.
func writeJob(t *testing.T, dir, flatness string) string {
	t.Helper()
	if _, _, err := runCmd(t, "sample", "wave", "--panels", "120", "-o", filepath.Join(dir, "wave.obj")); err != nil {
		t.Fatal(err)
	}
	job := `title = "test vault"
[net]
file = "wave.obj"
[flatness]
tolerance_mm = 0.5
` + flatness + `
[[stock]]
name = "jumbo"
width_mm = 6000
height_mm = 3210
margin_mm = 20
spacing_mm = 6
`
	path := filepath.Join(dir, "job.toml")
	if err := os.WriteFile(path, []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestPlanarityFailure: when the tolerance cannot be met the build writes
// only the diagnostic report, exits non-zero and leaves the old folder
// alone; --continue builds anyway.
func TestPlanarityFailure(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	job := writeJob(t, dir, "max_move_mm = 0.5")
	out := filepath.Join(dir, "out")
	if err := os.MkdirAll(out, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(out, "old.txt"), []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	// The folder was not written by pqfab: only --force may replace it.
	if _, _, err := runCmd(t, "build", "-q", job, "-o", out); err == nil || !strings.Contains(err.Error(), "did not write it") {
		t.Fatalf("foreign folder: got %v", err)
	}
	_, _, err := runCmd(t, "build", "-q", "--force", job, "-o", out)
	if err == nil || !strings.Contains(err.Error(), "allowed node move") || !strings.Contains(err.Error(), "nothing built") {
		t.Fatalf("got %v", err)
	}
	if _, err := os.Stat(out + "-planarity.json"); err != nil {
		t.Errorf("no diagnostic report: %v", err)
	}
	if b, _ := os.ReadFile(filepath.Join(out, "old.txt")); string(b) != "old" {
		t.Error("failed build touched the old folder")
	}
	if _, _, err := runCmd(t, "build", "-q", "--continue", "--force", job, "-o", out); err != nil {
		t.Fatal(err)
	}
	rep := loadReport(t, out)
	if len(rep.Warnings) == 0 || rep.Planarity.Converged {
		t.Errorf("continued build should carry the warning: %+v", rep.Planarity)
	}
	if _, err := os.Stat(filepath.Join(out, "old.txt")); err == nil {
		t.Error("old folder content survived the replacement")
	}
	if _, err := os.Stat(out + "-planarity.json"); err == nil {
		t.Error("the stale diagnostic report survived a successful build")
	}
	checkAccounting(t, out)
	checkWarningsEverywhere(t, out)
}

// checkWarningsEverywhere: a build with warnings carries them in every
// output: the drawings' title blocks, the OBJ, the schedule, the JSON,
// the pages and the site PDFs (read with pdftotext from poppler-utils).
func checkWarningsEverywhere(t *testing.T, out string) {
	t.Helper()
	const mark = "WARNING: built with panels over the flatness tolerance"
	files := []string{report.FileNet, report.FileAssembly, filepath.Join(report.DirSheets, "sheet-01.dxf"), report.FileHTML, report.FileView, report.FileReport}
	for _, f := range files {
		b, err := os.ReadFile(filepath.Join(out, f))
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(b), "built with panels over the flatness tolerance") {
			t.Errorf("%s does not carry the warning", f)
		}
	}
	for _, f := range []string{report.FilePlanPDF, report.FileTagsPDF} {
		b, err := exec.Command("pdftotext", "-l", "2", filepath.Join(out, f), "-").CombinedOutput()
		if err != nil || !strings.Contains(strings.Join(strings.Fields(string(b)), " "), mark) {
			t.Errorf("%s does not carry the warning (%v)", f, err)
		}
	}
	b, err := exec.Command(debianPython, "-c", `import openpyxl,sys
ws = openpyxl.load_workbook(sys.argv[1])["Summary"]
print(any(r[0] == "Warning" and "flatness tolerance" in (r[1] or "") for r in ws.iter_rows(values_only=True)))`, filepath.Join(out, report.FileSchedule)).CombinedOutput()
	if err != nil || strings.TrimSpace(string(b)) != "True" {
		t.Errorf("schedule.xlsx does not carry the warning: %v %s", err, b)
	}
}

func TestBuildErrors(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	job := writeJob(t, dir, "")
	notDir := filepath.Join(dir, "file")
	if err := os.WriteFile(notDir, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		args []string
		want string
	}{
		{[]string{"build", "-q", filepath.Join(dir, "none.toml"), "-o", filepath.Join(dir, "o")}, "none.toml: file not found"},
		{[]string{"build", "-q", job, "-o", filepath.Join(notDir, "out")}, "cannot write there"},
		{[]string{"build", "-q", job, "-o", notDir}, "exists and is not a folder"},
		{[]string{"build", "-q", job}, "build needs -o DIR"},
	}
	for _, tc := range tests {
		_, _, err := runCmd(t, tc.args...)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: got %v, want %q", tc.args, err, tc.want)
		}
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("leftover temporary %s", e.Name())
		}
	}
}

// benchBuild times a whole build (pqfab build -q) of the demo job's
// settings on a wave sample net of about the given number of panels. Each
// round writes a new output folder: replacing the last one would time the
// file system's cleanup too. It reports the process's peak memory.
func benchBuild(b *testing.B, panels int) {
	benchBuildNet(b, func(path string) {
		if _, _, err := runCmdB(b, "sample", "wave", "--panels", strconv.Itoa(panels), "-o", path); err != nil {
			b.Fatal(err)
		}
	})
}

// benchBuildNet is benchBuild on the net that writeNet writes to the
// path it is given.
func benchBuildNet(b *testing.B, writeNet func(path string)) {
	dir := b.TempDir()
	writeNet(filepath.Join(dir, "wave.obj"))
	job := filepath.Join(dir, "job.toml")
	if err := os.WriteFile(job, samples.DemoJob(), 0o644); err != nil { // its net file is wave.obj
		b.Fatal(err)
	}
	b.ReportAllocs()
	round := 0
	for b.Loop() {
		round++
		if _, _, err := runCmdB(b, "build", "-q", job, "-o", filepath.Join(dir, "out"+strconv.Itoa(round))); err != nil {
			b.Fatal(err)
		}
	}
	if mb := peakRSSMB(); mb > 0 {
		b.ReportMetric(mb, "peak-RSS-MB")
	}
}

func runCmdB(b *testing.B, args ...string) (string, string, error) {
	var out, errb bytes.Buffer
	err := run(args, strings.NewReader(""), &out, &errb)
	return out.String(), errb.String(), err
}

// Targets (demo job settings, wave net, this 2-core machine): 10k panels
// ≤ 3 s and ≤ 250 MB peak; 100k panels ≤ 40 s and ≤ 1.5 GB. Measured
// 2026-12: 10k 4.2–4.9 s, 225–250 MB (the time target is not met:
// nesting takes 1.9 s of it); 100k 39–50 s over six runs (median 42.8 s),
// 1.35–1.48 GB. Times vary with the machine's load and its file system
// (some 20 000 files are created).
func BenchmarkBuild10k(b *testing.B)  { benchBuild(b, 10000) }
func BenchmarkBuild100k(b *testing.B) { benchBuild(b, 100000) }
