package main

import (
	"flag"
	"fmt"
	"io"

	"pqfab/geom"
)

// netFlags are the options every command that reads a net takes.
type netFlags struct {
	unit     string
	reorient bool
	tol      float64
}

func (nf *netFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&nf.unit, "unit", "mm", "unit of the net file: mm, cm or m")
	fs.BoolVar(&nf.reorient, "reorient", false, "turn flipped panels so all run counter-clockwise seen from above or outside")
	fs.Float64Var(&nf.tol, "merge-tol", geom.DefaultCoincidentTolMM, "nodes closer than this (mm) are reported as coincident")
}

// loadNet reads and validates a net, printing warnings to stderr.
func loadNet(path string, nf netFlags, stderr io.Writer) (*geom.Net, *geom.Topology, error) {
	unit, err := geom.ParseUnit(nf.unit)
	if err != nil {
		return nil, nil, usagef("--unit: %v", err)
	}
	if !(nf.tol >= 0) {
		return nil, nil, usagef("--merge-tol %g: must be zero or more", nf.tol)
	}
	net, err := geom.ReadFile(path, unit)
	if err != nil {
		return nil, nil, err
	}
	opt := geom.DefaultValidateOptions()
	opt.CoincidentTolMM = nf.tol
	topo, fd := geom.Validate(net, opt)
	if nf.reorient && len(fd.Misoriented) > 0 {
		geom.Reorient(net, fd.Misoriented)
		fmt.Fprintf(stderr, "pqfab: %s: turned %d panels to a consistent orientation\n", path, len(fd.Misoriented))
		topo, fd = geom.Validate(net, opt)
	}
	for _, w := range fd.Warnings {
		fmt.Fprintln(stderr, "pqfab: warning:", w)
	}
	if err := fd.Err(); err != nil {
		printOthers(stderr, fd)
		return nil, nil, err
	}
	return net, topo, nil
}

// printOthers lists the problems after the first, which the error names.
func printOthers(stderr io.Writer, fd geom.Findings) {
	for i, p := range fd.Errors[1:] {
		if i == 20 {
			fmt.Fprintf(stderr, "pqfab: also: … %d more\n", len(fd.Errors)-21)
			break
		}
		fmt.Fprintln(stderr, "pqfab: also:", p)
	}
}
