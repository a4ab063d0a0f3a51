package samples

import (
	"embed"
	"io"
)

//go:embed demo/job.toml demo/wave.obj
var demoFS embed.FS

// DemoJobName is the demo job's file name, for messages.
const DemoJobName = "demo/job.toml"

// DemoJob returns the embedded demo job file.
func DemoJob() []byte {
	b, err := demoFS.ReadFile(DemoJobName)
	if err != nil {
		panic("samples: demo job missing from the build: " + err.Error())
	}
	return b
}

// OpenDemo opens a file of the embedded demo by its path, such as
// "demo/wave.obj".
func OpenDemo(name string) (io.ReadCloser, error) {
	return demoFS.Open(name)
}
