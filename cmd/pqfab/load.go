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
	topo, _, err := checkNet(net, nf.tol, nf.reorient, stderr)
	if err != nil {
		return nil, nil, err
	}
	return net, topo, nil
}

// checkNet validates a net read from a file, turning flipped panels when
// asked. It prints the warnings to stderr and returns them for reports;
// on error it prints the problems after the first, which the error names.
func checkNet(net *geom.Net, mergeTolMM float64, reorient bool, stderr io.Writer) (*geom.Topology, []string, error) {
	opt := geom.DefaultValidateOptions()
	opt.CoincidentTolMM = mergeTolMM
	topo, fd := geom.Validate(net, opt)
	var warnings []string
	if reorient && len(fd.Misoriented) > 0 {
		geom.Reorient(net, fd.Misoriented)
		warnings = append(warnings, fmt.Sprintf("%s: turned %d panels to a consistent orientation", net.Source, len(fd.Misoriented)))
		topo, fd = geom.Validate(net, opt)
	}
	for _, w := range fd.Warnings {
		warnings = append(warnings, w.Error())
	}
	if err := fd.Err(); err != nil {
		printOthers(stderr, fd)
		return nil, nil, err
	}
	for _, w := range warnings {
		fmt.Fprintln(stderr, "pqfab: warning:", w)
	}
	return topo, warnings, nil
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
