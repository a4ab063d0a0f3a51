package main

import (
	"errors"
	"flag"
	"fmt"
	"io"

	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/quadnet"
)

// netFlags are the options every command that reads a net takes.
type netFlags struct {
	unit     string
	reorient bool
	tol      float64
}

func (nf *netFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&nf.unit, "unit", quadnet.DefaultUnit.String(), "unit of the net file: mm, cm or m")
	fs.BoolVar(&nf.reorient, "reorient", false, "turn flipped panels so all run counter-clockwise seen from above or outside")
	fs.Float64Var(&nf.tol, "merge-tol", quadnet.DefaultCoincidentTolMM, "nodes closer than this (mm) are reported as coincident")
}

// loadNet reads and checks a net with the build's own stage, printing
// warnings, and the problems after the first, to stderr.
func loadNet(path string, nf netFlags, stderr io.Writer) (*pipeline.Loaded, error) {
	unit, err := quadnet.ParseUnit(nf.unit)
	if err != nil {
		return nil, usagef("--unit: %v", err)
	}
	opt := quadnet.DefaultValidateOptions()
	opt.CoincidentTolMM = nf.tol
	if opt, err = job.ExplicitValidate(opt); err != nil {
		return nil, fieldFlags{"CoincidentTolMM": "merge-tol"}.check(err)
	}
	in, err := pipeline.LoadNet(pipeline.OpenFile, path, unit, opt, nf.reorient)
	if err != nil {
		return nil, err
	}
	for _, w := range in.Warnings {
		fmt.Fprintln(stderr, "pqfab: warning:", w)
	}
	return in, nil
}

// printOthers lists the problems after the first, which the error names;
// main calls it after printing the error, so the error is the first line.
func printOthers(stderr io.Writer, err error) {
	var we *warnedError
	if errors.As(err, &we) {
		for _, w := range we.warnings {
			fmt.Fprintln(stderr, "pqfab: warning:", w)
		}
	}
	var ve *quadnet.ValidationError
	if errors.As(err, &ve) {
		for _, p := range ve.Problems[1:min(len(ve.Problems), 21)] {
			fmt.Fprintln(stderr, "pqfab: also:", p)
		}
		if n := len(ve.Problems) - 21; n > 0 {
			fmt.Fprintf(stderr, "pqfab: also: … %d more\n", n)
		}
	}
}
