package outdir

import (
	"path/filepath"
	"strings"

	"pqfab/quadnet"
)

// ForInputs returns the rules every command writes its outputs by
// (build and demo, planarize -o and --report, sample -o): an existing
// output is replaced only when pqfab wrote it, or with force; never an
// input read from disk (each of inputs, such as the job file and the net
// file, and the panels file of a CSV net pair), a folder holding one, the
// current folder or the home folder or a folder above them, or the root
// (see Options). Empty inputs are skipped.
func ForInputs(force bool, inputs ...string) Options {
	opt := Options{Force: force}
	for _, in := range inputs {
		if in == "" {
			continue
		}
		opt.Keep = append(opt.Keep, in)
		if pp, err := quadnet.PanelsPathFor(in); err == nil && strings.EqualFold(filepath.Ext(in), ".csv") {
			opt.Keep = append(opt.Keep, pp)
		}
	}
	return opt
}
