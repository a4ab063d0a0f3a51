package main

import (
	"io"
	"os"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"
)

// observer shows the pipeline's stages as progress bars on stderr, one at
// a time (none when stderr is not a terminal or the user asked for quiet),
// and keeps warnings until flush, or attaches them to the error that ends
// the command, so that the error is the first line printed.
type observer struct {
	stderr   io.Writer
	quiet    bool
	stage    string
	bar      *progressbar.ProgressBar
	warnings []string
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

func (o *observer) Warn(msg string) { o.warnings = append(o.warnings, msg) }

// flush prints the warnings held.
func (o *observer) flush() { printOthers(o.stderr, o.attach(nil)) }

// attach returns err carrying the warnings held, which main prints after
// the error (printOthers).
func (o *observer) attach(err error) error {
	w := o.warnings
	o.warnings = nil
	return &warnedError{err, w}
}

// warnedError is an error with warnings to print after it.
type warnedError struct {
	error
	warnings []string
}

func (e *warnedError) Unwrap() error { return e.error }

// finish removes the current bar.
func (o *observer) finish() {
	if o.bar != nil {
		_ = o.bar.Finish()
	}
	o.bar, o.stage = nil, ""
}
