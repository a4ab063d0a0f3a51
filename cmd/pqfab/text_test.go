package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"pqfab/internal/report"
	"pqfab/quadnet"
)

// TestTextReachesFilesSafely: a title with accents, a CJK character, a
// backslash escape look-alike and percent signs, and net ids holding tabs
// and OBJ-looking text, go through a build: the DXF files pass ezdxf's
// audit and give the title back, the schedule gives it back (openpyxl),
// and net-flat.obj still holds exactly the net's nodes and panels (an id
// must never start a new OBJ statement).
func TestTextReachesFilesSafely(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	title := `Bibliothèque d'été 中 \U+0041 100%% "quoted" <b>`
	nodes := "id,x,y,z\n\"a\tv 9 9 9\",0,0,0\n\"b\tc\",1500,0,0\nc,1500,1200,0\nd,0,1200,0\ne,3000,0,0\nf,3000,1200,0\n"
	panels := "id,n1,n2,n3,n4\n\"P\tf 1 2 3 # é\",\"a\tv 9 9 9\",\"b\tc\",c,d\nQ,\"b\tc\",e,f,c\n"
	job := "title = " + strings.ReplaceAll(`"`+strings.ReplaceAll(strings.ReplaceAll(title, `\`, `\\`), `"`, `\"`)+`"`, "\n", "") +
		"\n[net]\nfile = \"n-nodes.csv\"\n" + goodStock
	for name, body := range map[string]string{"n-nodes.csv": nodes, "n-panels.csv": panels, "job.toml": job} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	net, err := quadnet.ReadFile(filepath.Join(out, report.FileNet), quadnet.MM)
	if err != nil {
		t.Fatal(err)
	}
	if len(net.Nodes) != 6 || len(net.Faces) != 2 {
		t.Errorf("net-flat.obj holds %d nodes and %d panels, want 6 and 2", len(net.Nodes), len(net.Faces))
	}
	b, err := exec.Command(debianPython, filepath.Join("testdata", "readback_text.py"), out, title).CombinedOutput()
	if err != nil || !strings.HasSuffix(strings.TrimSpace(string(b)), "ok") {
		t.Fatalf("read back: %v\n%s", err, b)
	}
}
