package pipeline_test

import (
	"context"
	"fmt"
	"io"
	"io/fs"
	"strings"

	"pqfab/internal/job"
	"pqfab/internal/pipeline"
)

// ExampleRun runs a two-panel job whose net and job file are held in
// memory: two 1.5 × 1.2 m panels, one of them 30 mm off flat, on one
// board stock.
func ExampleRun() {
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
	j, err := job.Parse([]byte(text), "job.toml")
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := pipeline.Run(context.Background(), j, open, pipeline.Quiet{}, pipeline.Policy{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d nodes, %d members, %d panels on %d sheets\n",
		len(res.Net.Nodes), len(res.Structure.Members), len(res.Flats), len(res.Nesting.Sheets))
	fmt.Printf("converged: %v, every panel within %g mm of flat\n", res.Planarize.Converged, j.Flatness.TolMM)
	// Output:
	// 6 nodes, 7 members, 2 panels on 1 sheets
	// converged: true, every panel within 0.5 mm of flat
}
