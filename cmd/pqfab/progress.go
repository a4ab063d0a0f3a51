package main

import (
	"fmt"
	"io"
	"os"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"
)

// observer shows the pipeline's stages as progress bars on stderr, one at
// a time (none when stderr is not a terminal or the user asked for quiet),
// and prints warnings.
type observer struct {
	stderr io.Writer
	quiet  bool
	stage  string
	bar    *progressbar.ProgressBar
}

func (o *observer) Step(stage string, done, total int, note string) {
	total = max(total, 1)
	if stage != o.stage {
		o.finish()
		o.stage = stage
		if f, ok := o.stderr.(*os.File); ok && !o.quiet && term.IsTerminal(int(f.Fd())) {
			o.bar = progressbar.NewOptions(total, progressbar.OptionSetWriter(o.stderr), progressbar.OptionSetDescription(stage),
				progressbar.OptionShowCount(), progressbar.OptionClearOnFinish(), progressbar.OptionThrottle(100_000_000))
		}
	}
	if o.bar != nil {
		if total != o.bar.GetMax() {
			o.bar.ChangeMax(total)
		}
		o.bar.Describe(note)
		_ = o.bar.Set(done)
	}
}

func (o *observer) Warn(msg string) {
	o.finish()
	fmt.Fprintln(o.stderr, "pqfab: warning:", msg)
}

// finish removes the current bar.
func (o *observer) finish() {
	if o.bar != nil {
		_ = o.bar.Finish()
	}
	o.bar, o.stage = nil, ""
}
