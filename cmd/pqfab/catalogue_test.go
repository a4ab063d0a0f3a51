package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const goodQuad = "v 0 0 0\nv 1500 0 0\nv 1500 1200 0\nv 0 1200 0\nv 3000 0 0\nv 3000 1200 0\nf 1 2 3 4\nf 2 5 6 3\n"

const goodStock = "\n[[stock]]\nname = \"jumbo\"\nwidth_mm = 6000\nheight_mm = 3210\nmargin_mm = 20\nspacing_mm = 6\n"

func jobFor(net string) string { return "[net]\nfile = \"" + net + "\"\n" + goodStock }

// TestBadInputCatalogue runs the build on bad net files and bad job files.
// Each gives one clear line naming the file, the line and the element, a
// non-zero exit, and no output folder (nor any temporary left behind).
func TestBadInputCatalogue(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name  string
		files map[string]string // written into a fresh folder; "job.toml" is built
		out   string            // output folder relative to the folder ("out" if empty)
		want  []string          // all must appear in the error
	}{
		// Net files.
		{"missing net", map[string]string{"job.toml": jobFor("nowhere.obj")}, "", []string{"nowhere.obj", "file not found"}},
		{"empty net", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": ""}, "", []string{"n.obj", "empty net"}},
		{"binary junk", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": "\x00\x01\x02\xff\xfe garbage"}, "", []string{"n.obj:1", "binary"}},
		{"bad number", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": strings.Replace(goodQuad, "1500 0 0", "1500 O 0", 1)}, "", []string{"n.obj:2", "node 2", "bad number"}},
		{"NaN", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": strings.Replace(goodQuad, "v 0 1200 0", "v 0 NaN 0", 1)}, "", []string{"n.obj:4", "node 4", "not a finite number"}},
		{"Inf", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": strings.Replace(goodQuad, "v 0 1200 0", "v 0 1200 -Inf", 1)}, "", []string{"n.obj:4", "node 4", "not a finite"}},
		{"huge coordinates", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": strings.Replace(goodQuad, "v 3000 0 0", "v 3e11 0 0", 1)}, "", []string{"n.obj:5", "node 5", "beyond 100 km"}},
		{"wrong unit", map[string]string{"job.toml": strings.Replace(jobFor("n.obj"), "[net]\n", "[net]\nunit = \"inch\"\n", 1), "n.obj": goodQuad}, "", []string{"job.toml:2", "key net.unit", "want mm, cm or m"}},
		{"index out of range", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "f 1 2 9\n"}, "", []string{"n.obj:9", "panel 3", "node 9 does not exist"}},
		{"non-manifold", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "v 1500 0 900\nf 3 2 7\n"}, "", []string{"n.obj:10", "panel 3", "non-manifold"}},
		{"flipped panels", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": strings.Replace(goodQuad, "f 2 5 6 3", "f 3 6 5 2", 1)}, "", []string{"n.obj:8", "panel 2", "flipped"}},
		{"coincident nodes", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "v 1500.001 0 0\nf 7 5 6\n"}, "", []string{"n.obj:9", "node 7", "coincides with node 2"}},
		{"zero-area panel", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "v 4500 0 0\nf 2 5 7\n"}, "", []string{"n.obj:10", "panel 3", "degenerate"}},
		{"duplicate panel", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "f 1 2 3 4\n"}, "", []string{"n.obj:9", "panel 3", "same corners as panel 1", "(and 1 more problem)"}},
		{"two corners", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "f 1 2\n"}, "", []string{"n.obj:9", "panel 3", "2 corners"}},
		{"repeated corner", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad + "f 1 2 2 4\n"}, "", []string{"n.obj:9", "panel 3", "same node"}},
		{"OFF truncated", map[string]string{"job.toml": jobFor("n.off"), "n.off": "OFF\n4 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"}, "", []string{"n.off:7", "panel 2", "file ends"}},
		{"CSV unknown node", map[string]string{"job.toml": jobFor("a-nodes.csv"), "a-nodes.csv": "id,x,y,z\nA,0,0,0\nB,1000,0,0\nC,1000,1000,0\n", "a-panels.csv": "id,n1,n2,n3\nP1,A,B,D\n"}, "", []string{"a-panels.csv:2", "panel P1", `node "D"`}},
		{"CSV partner missing", map[string]string{"job.toml": jobFor("a-nodes.csv"), "a-nodes.csv": "id,x,y,z\nA,0,0,0\n"}, "", []string{"a-panels.csv", "file not found"}},
		{"unknown format", map[string]string{"job.toml": jobFor("n.stl"), "n.stl": "solid"}, "", []string{"n.stl", "unknown net format"}},
		// Job files.
		{"missing job", map[string]string{}, "", []string{"job.toml", "file not found"}},
		{"empty job", map[string]string{"job.toml": "\n\n"}, "", []string{"job.toml", "empty job file"}},
		{"binary job", map[string]string{"job.toml": "\x00\x01PK\x03\x04"}, "", []string{"job.toml:1"}},
		{"unknown key", map[string]string{"job.toml": jobFor("n.obj") + "colour = \"blue\"\n", "n.obj": goodQuad}, "", []string{"job.toml:10", "key stock.colour", "unknown key"}},
		{"negative tolerance", map[string]string{"job.toml": jobFor("n.obj") + "[flatness]\ntolerance_mm = -0.5\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key flatness.tolerance_mm", "must be more than 0"}},
		{"zero stock", map[string]string{"job.toml": strings.Replace(jobFor("n.obj"), "width_mm = 6000", "width_mm = 0", 1), "n.obj": goodQuad}, "", []string{"job.toml:6", "key stock[1].width_mm", "must be a positive number"}},
		{"no stock", map[string]string{"job.toml": "[net]\nfile = \"n.obj\"\n", "n.obj": goodQuad}, "", []string{"job.toml", "no [[stock]]"}},
		{"bad rotation", map[string]string{"job.toml": jobFor("n.obj") + "rotation = \"any\"\n", "n.obj": goodQuad}, "", []string{"job.toml:10", "key stock[1].rotation"}},
		{"syntax error", map[string]string{"job.toml": "[net\nfile = \"n.obj\"\n"}, "", []string{"job.toml:2"}},
		{"wrong type", map[string]string{"job.toml": jobFor("n.obj") + "[nodes]\nhub_radius_mm = \"big\"\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key nodes.hub_radius_mm"}},
		{"unknown support node", map[string]string{"job.toml": jobFor("n.obj") + "[supports]\nmode = \"list\"\nnodes = [\"1\", \"99\"]\n", "n.obj": goodQuad}, "", []string{"job.toml:12", "key supports.nodes", `node "99"`}},
		{"panel bigger than every sheet", map[string]string{"job.toml": strings.Replace(jobFor("n.obj"), "height_mm = 3210", "height_mm = 1000", 1), "n.obj": goodQuad}, "", []string{"job.toml:4", "key stock", "n.obj line 7", "larger than every stock sheet"}},
		{"hub larger than members", map[string]string{"job.toml": jobFor("n.obj") + "[nodes]\nhub_radius_mm = 800\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key nodes.hub_radius_mm", "n.obj:7: member 1–2", "use up"}},
		{"inset too large", map[string]string{"job.toml": jobFor("n.obj") + "[panel]\nedge_inset_mm = 700\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key panel.edge_inset_mm", "n.obj:7: panel 1", "swallows"}},
		{"flatness not reachable", map[string]string{"job.toml": jobFor("n.obj") + "[supports]\nmode = \"none\"\n[flatness]\nmax_move_mm = 0.001\n", "n.obj": strings.Replace(goodQuad, "v 1500 1200 0", "v 1500 1200 40", 1)}, "", []string{"planarization failed", "panel 1 (line 7)", "nothing built"}},
		{"supports from a file that has none", map[string]string{"job.toml": jobFor("n.obj") + "[supports]\nmode = \"file\"\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key supports.mode", "marks no node as a support"}},
		{"title with a newline", map[string]string{"job.toml": "title = \"a\\nb\"\n" + jobFor("n.obj"), "n.obj": goodQuad}, "", []string{"job.toml:1", "key title", "control character"}},
		{"duplicate stock names", map[string]string{"job.toml": jobFor("n.obj") + "[[stock]]\nname = \"jumbo\"\nwidth_mm = 3000\nheight_mm = 2000\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key stock[2].name", "the name of stock 1 too"}},
		{"price beyond every budget", map[string]string{"job.toml": jobFor("n.obj") + "price = 1e308\n", "n.obj": goodQuad}, "", []string{"job.toml:10", "key stock[1].price", "at most 1e+12"}},
		{"near-miss key", map[string]string{"job.toml": jobFor("n.obj") + "[flatness]\ntolerance = 0.5\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key flatness.tolerance", "did you mean flatness.tolerance_mm?"}},
		{"text where a number goes", map[string]string{"job.toml": jobFor("n.obj") + "[nodes]\nbay_mm = \"six metres\"\n", "n.obj": goodQuad}, "", []string{"job.toml:11", "key nodes.bay_mm", "want a number, got text"}},
		{"bars shorter than the members", map[string]string{"job.toml": jobFor("n.obj") + "[[bar]]\nname = \"1 m\"\nlength_mm = 1000\n", "n.obj": goodQuad}, "", []string{"job.toml:10", "key bar", "7 members are on no bar; the first is A1-M01: blank 1500 mm is longer than the longest usable bar length, 970 mm"}}, // 1000 mm less the default trim at each end
		{"job file is a folder", map[string]string{"job.toml/x": ""}, "", []string{"job.toml", "is a folder, not a file"}},
		// Output folder.
		{"output under a file", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad, "afile": "x"}, "afile/out", []string{"afile/out", "cannot write there"}},
		{"output is a file", map[string]string{"job.toml": jobFor("n.obj"), "n.obj": goodQuad, "afile": "x"}, "afile", []string{"afile", "not a folder"}},
	}
	if len(tests) < 30 {
		t.Fatalf("only %d cases", len(tests))
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			for name, body := range tc.files {
				if err := os.MkdirAll(filepath.Dir(filepath.Join(dir, name)), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
					t.Fatal(err)
				}
			}
			out := filepath.Join(dir, "out")
			if tc.out != "" {
				out = filepath.Join(dir, tc.out)
			}
			_, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out)
			if err == nil {
				t.Fatal("no error")
			}
			msg := err.Error()
			if strings.Contains(msg, "\n") {
				t.Errorf("error is not one line: %q", msg)
			}
			for _, w := range tc.want {
				if !strings.Contains(msg, w) {
					t.Errorf("error %q does not contain %q", msg, w)
				}
			}
			// Bad input is not a command-line mistake: exit code 1, not 2.
			if got := exitCode(err); got != 1 {
				t.Errorf("exit code %d, want 1", got)
			}
			if tc.out == "" {
				if _, err := os.Stat(out); err == nil {
					t.Error("output folder written")
				}
			}
			ents, _ := os.ReadDir(dir)
			for _, e := range ents {
				if strings.Contains(e.Name(), ".tmp-") {
					t.Errorf("temporary %s left behind", e.Name())
				}
			}
		})
	}
}
