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
// and prints warnings; with hold it keeps them until flush, or attaches
// them to the error that ends the command, so the error comes first.
type observer struct {
	stderr   io.Writer
	quiet    bool
	hold     bool
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

func (o *observer) Warn(msg string) {
	o.finish()
	if o.hold {
		o.warnings = append(o.warnings, msg)
		return
	}
	fmt.Fprintln(o.stderr, "pqfab: warning:", msg)
}

// flush prints the warnings held.
func (o *observer) flush() {
	for _, w := range o.warnings {
		fmt.Fprintln(o.stderr, "pqfab: warning:", w)
	}
	o.warnings = nil
}

// attach returns err carrying the warnings held, which main prints after
// the error.
func (o *observer) attach(err error) error {
	if len(o.warnings) == 0 {
		return err
	}
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
