package pipeline_test

import (
	"context"
	"io"
	"io/fs"
	"strings"
	"testing"

	"pqfab/export"
	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/samples"
)

// runSample runs a job text whose net.file is "net.obj", the sample net
// of the given name and panel count.
func runSample(t *testing.T, sample string, panels int, text string) *pipeline.Result {
	t.Helper()
	net, _ := samples.Make(sample, panels)
	var obj strings.Builder
	if err := export.WriteOBJ(&obj, net, sample); err != nil {
		t.Fatal(err)
	}
	open := func(name string) (io.ReadCloser, error) {
		if name != "net.obj" {
			return nil, fs.ErrNotExist
		}
		return io.NopCloser(strings.NewReader(obj.String())), nil
	}
	j, err := job.Parse([]byte(text), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	res, err := pipeline.Run(context.Background(), j, open, pipeline.Quiet{}, pipeline.Policy{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}
