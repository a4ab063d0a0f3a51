package main

import (
	"flag"
	"os"
	"path/filepath"
	"pqfab/internal/report"
	"testing"
)

var update = flag.Bool("update", false, "rewrite golden files")

// TestGoldenBuild builds a two-panel job and compares every writer's
// output with the golden files in testdata/golden (go test -update
// rewrites them; read the diff before committing). Files that are not
// text are compared as text read back by outside readers: the schedule's
// every sheet by openpyxl (Debian's python3-openpyxl, xlsx_text.py) in
// schedule.txt, the site PDFs by pdftotext -layout (Debian's
// poppler-utils) in plan.txt and tags.txt. It is the quick run's
// (go test -short) end-to-end build. Not parallel: it changes the working
// folder.
func TestGoldenBuild(t *testing.T) {
	dir := t.TempDir()
	net := "v 0 0 0\nv 1500 0 0\nv 1500 1200 30\nv 0 1200 0\nv 3000 0 0\nv 3000 1200 0\nf 1 2 3 4\nf 2 5 6 3\n"
	job := `title = "golden"
[net]
file = "n.obj"
[supports]
mode = "none"
[nodes]
hub_radius_mm = 40
[panel]
edge_inset_mm = 5
[[stock]]
name = "board"
width_mm = 3210
height_mm = 2250
margin_mm = 15
spacing_mm = 6
rotation = "quarter"
price = 100
[rates]
currency = "EUR"
member_per_m = 10
node_each = 5
panel_per_m2 = 50
`
	for name, body := range map[string]string{"n.obj": net, "job.toml": job} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	goldenDir, err := filepath.Abs(filepath.Join("testdata", "golden"))
	if err != nil {
		t.Fatal(err)
	}
	// Relative names, so the report does not carry the temporary folder.
	t.Chdir(dir)
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", "job.toml", "-o", "out"); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{report.FileReport, report.FileNet, report.FileAssembly, filepath.Join(report.DirSheets, "sheet-01.dxf"), report.FileHTML} {
		got, err := os.ReadFile(filepath.Join(out, name))
		if err != nil {
			t.Fatal(err)
		}
		checkGolden(t, filepath.Join(goldenDir, filepath.Base(name)), got, name)
	}
	texts := []struct{ golden, file, reader string }{
		{"schedule.txt", report.FileSchedule, "openpyxl"},
		{"plan.txt", report.FilePlanPDF, "pdftotext"},
		{"tags.txt", report.FileTagsPDF, "pdftotext"},
	}
	for _, tx := range texts {
		path := filepath.Join(out, filepath.FromSlash(tx.file))
		var got string
		if tx.reader == "openpyxl" {
			got = runTool(t, debianPython, filepath.Join(goldenDir, "..", "xlsx_text.py"), path)
		} else {
			got = runTool(t, pdftotext, "-layout", "-enc", "UTF-8", path, "-")
		}
		checkGolden(t, filepath.Join(goldenDir, tx.golden), []byte(got), tx.file+" read by "+tx.reader)
	}
}

// checkGolden compares got, what is named what, with the golden file, or
// rewrites the golden file with -update.
func checkGolden(t *testing.T, golden string, got []byte, what string) {
	t.Helper()
	if *update {
		if err := os.MkdirAll(filepath.Dir(golden), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatal(err)
	}
	if string(got) != string(want) {
		t.Errorf("%s differs from %s (go test -update rewrites it)", what, golden)
	}
}
