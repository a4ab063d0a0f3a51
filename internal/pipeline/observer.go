package pipeline

import (
	"io"

	"pqfab/quadnet"
)

// Opener opens a named input file (the net, or the panels file of a CSV
// pair). OpenFile opens files on disk; an embedded file system's Open
// serves the demo.
type Opener func(name string) (io.ReadCloser, error)

// OpenFile opens a regular file on disk; a FIFO, device or socket is
// refused at once (quadnet.OpenRegular), never waited on.
func OpenFile(name string) (io.ReadCloser, error) { return quadnet.OpenRegular(name) }

// Observer is told how a job goes. Its methods are called from the
// goroutine that runs the job, one call at a time.
type Observer interface {
	// Step reports that a stage has done done of total units of work.
	Step(stage string, done, total int, note string)
	// Warn reports a problem the job goes on with.
	Warn(msg string)
}

// Quiet is an Observer that ignores everything.
type Quiet struct{}

// Step does nothing.
func (Quiet) Step(string, int, int, string) {}

// Warn does nothing.
func (Quiet) Warn(string) {}
