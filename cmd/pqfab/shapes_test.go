package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// shapesNet is a flat net of a triangle, a quad, a pentagon and a hexagon
// around a common node, each sharing edges with its neighbours (mm).
const shapesNet = `v 0 0 0
v 2000 0 0
v 1000 1500 0
v 3200 1200 0
v 3000 -1500 0
v -1200 1300 0
v -2000 -100 0
v -1600 -1600 0
v 0 -2200 0
v 1500 -2300 0
v 1900 2600 0
v 300 2900 0
f 1 2 3
f 2 4 11 3
f 1 3 12 6 7
f 1 7 8 9 10 2
f 2 10 5
`

// TestPanelShapesInSchedule: triangles to hexagons go through a build with
// every cut edge, diagonal and corner angle in the schedule, equal to
// report.json, the angles summing to (n−2)·180° (readback_shapes.py, with
// Debian's openpyxl).
func TestPanelShapesInSchedule(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	job := "[net]\nfile = \"shapes.obj\"\n[supports]\nmode = \"none\"\n[panel]\nedge_inset_mm = 8\n" + goodStock
	for name, body := range map[string]string{"shapes.obj": shapesNet, "job.toml": job} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	b, err := exec.Command(debianPython, filepath.Join("testdata", "readback_shapes.py"), out).CombinedOutput()
	if err != nil || !strings.HasSuffix(strings.TrimSpace(string(b)), "ok") || !strings.Contains(string(b), "[3, 4, 5, 6]") {
		t.Fatalf("read back: %v\n%s", err, b)
	}
	readBack(t, "readback_dxf.py", out)
	readBack(t, "readback_types.py", out)
}

// TestTurnedOverPanels: with mirrored panels allowed the symmetric canopy
// has panels cut from their type's shape turned over; the type drawings,
// the schedule and report.json agree on every panel's corner 1 and edges
// (readback_types.py, Debian's ezdxf).
func TestTurnedOverPanels(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	if _, _, err := runCmd(t, "sample", "canopy", "--panels", "96", "-o", filepath.Join(dir, "c.obj")); err != nil {
		t.Fatal(err)
	}
	job := "[net]\nfile = \"c.obj\"\n[panel]\nmirror = true\nedge_inset_mm = 5\n" + goodStock + "mirror = true\n"
	if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	turned := 0
	for _, pt := range loadReport(t, out).PanelTypes {
		turned += len(pt.Mirrored)
	}
	if turned == 0 {
		t.Fatal("no panel cut turned over")
	}
	readBack(t, "readback_types.py", out)
	readBack(t, "readback_dxf.py", out)
}

// TestGlassCutsReplay: on glass stock whose parts must come free by
// straight cuts from edge to edge, every sheet's cutting sequence is
// replayed with shapely (replay_cuts.py): each cut splits one uncut piece
// edge to edge, crosses no part, and every part comes free whole and
// alone; the schedule's Sheets sheet gives each sheet's cuts.
func TestGlassCutsReplay(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	if _, _, err := runCmd(t, "sample", "dome", "--panels", "80", "-o", filepath.Join(dir, "d.obj")); err != nil {
		t.Fatal(err)
	}
	job := "[net]\nfile = \"d.obj\"\n[panel]\nedge_inset_mm = 5\n[[stock]]\nname = \"float\"\nwidth_mm = 3210\nheight_mm = 2250\nmargin_mm = 10\nspacing_mm = 4\ncuts = \"edge-to-edge\"\n"
	if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	readBack(t, "replay_cuts.py", out)
	readBack(t, "readback_dxf.py", out)
}
