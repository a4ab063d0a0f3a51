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

// textOpener opens the named files from their texts.
func textOpener(files map[string]string) pipeline.Opener {
	return func(name string) (io.ReadCloser, error) {
		s, ok := files[name]
		if !ok {
			return nil, fs.ErrNotExist
		}
		return io.NopCloser(strings.NewReader(s)), nil
	}
}

// sampleOpener opens "net.obj": the sample net of the given name and
// panel count, as OBJ.
func sampleOpener(t *testing.T, sample string, panels int) pipeline.Opener {
	t.Helper()
	net, _ := samples.Make(sample, panels)
	var obj strings.Builder
	if err := export.WriteOBJ(&obj, net, sample); err != nil {
		t.Fatal(err)
	}
	return textOpener(map[string]string{"net.obj": obj.String()})
}

// runJob parses a job text and runs it, reading files through open.
func runJob(t *testing.T, text string, open pipeline.Opener) (*pipeline.Result, error) {
	t.Helper()
	j, err := job.Parse([]byte(text), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	return pipeline.Run(context.Background(), j, open, pipeline.Quiet{}, pipeline.Policy{})
}

// runSample runs a job text whose net.file is "net.obj", the sample net
// of the given name and panel count.
func runSample(t *testing.T, sample string, panels int, text string) *pipeline.Result {
	t.Helper()
	res, err := runJob(t, text, sampleOpener(t, sample, panels))
	if err != nil {
		t.Fatal(err)
	}
	return res
}
