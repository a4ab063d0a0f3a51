package pqfab_test

import (
	"context"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"pqfab"
)

// ExampleBuild builds a two-panel job whose net and job file are held in
// memory (two 1.5 × 1.2 m panels, one of them 30 mm off flat, on one
// board stock) into a new folder.
func ExampleBuild() {
	files := map[string]string{
		"net.obj": "v 0 0 0\nv 1500 0 0\nv 1500 1200 30\nv 0 1200 0\nv 3000 0 0\nv 3000 1200 0\nf 1 2 3 4\nf 2 5 6 3\n",
	}
	open := func(name string) (io.ReadCloser, error) {
		s, ok := files[name]
		if !ok {
			return nil, fs.ErrNotExist
		}
		return io.NopCloser(strings.NewReader(s)), nil
	}
	text := `title = "two panels"
[net]
file = "net.obj"
[supports]
mode = "none"
[[stock]]
name = "board"
width_mm = 3210
height_mm = 2250
`
	j, err := pqfab.ParseJob([]byte(text), "job.toml")
	if err != nil {
		fmt.Println(err)
		return
	}
	tmp, err := os.MkdirTemp("", "pqfab-example-")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(tmp)
	out := filepath.Join(tmp, "out")
	rep, err := pqfab.Build(context.Background(), j, out, pqfab.Options{Open: open}, pqfab.Quiet{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d nodes, %d members, %d panels on %d sheets\n", len(rep.Nodes), len(rep.Members), len(rep.Panels), len(rep.Sheets))
	fmt.Printf("converged: %v, every panel within %g mm of flat\n", rep.Planarity.Converged, rep.Planarity.ToleranceMM)
	_, err = os.Stat(filepath.Join(out, "schedule.xlsx"))
	fmt.Println("schedule written:", err == nil)
	// Output:
	// 6 nodes, 7 members, 2 panels on 1 sheets
	// converged: true, every panel within 0.5 mm of flat
	// schedule written: true
}
