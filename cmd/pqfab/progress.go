package main

import (
	"io"
	"os"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"
)

// progress draws a bar on stderr for a long step, or nothing when stderr
// is not a terminal or the user asked for quiet.
type progress struct {
	bar *progressbar.ProgressBar
}

func newProgress(stderr io.Writer, quiet bool, max int, what string) *progress {
	f, ok := stderr.(*os.File)
	if quiet || !ok || !term.IsTerminal(int(f.Fd())) {
		return &progress{}
	}
	return &progress{bar: progressbar.NewOptions(max,
		progressbar.OptionSetWriter(stderr),
		progressbar.OptionSetDescription(what),
		progressbar.OptionShowCount(),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100_000_000))}
}

// set moves the bar to n and changes its description.
func (p *progress) set(n int, desc string) {
	if p.bar == nil {
		return
	}
	p.bar.Describe(desc)
	_ = p.bar.Set(n)
}

// done removes the bar.
func (p *progress) done() {
	if p.bar != nil {
		_ = p.bar.Finish()
	}
}
