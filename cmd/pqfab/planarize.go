package main

import (
	"flag"
	"io"
	"path/filepath"
	"strings"
	"time"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/pipeline"
	"pqfab/panels"
)

// planarizeFlags are the options of planarization.
type planarizeFlags struct {
	opt      panels.PlanarizeOptions
	supports string
}

func (pf *planarizeFlags) register(fs *flag.FlagSet) {
	d := panels.DefaultPlanarizeOptions()
	fs.Float64Var(&pf.opt.TolMM, "tol", d.TolMM, "flatness deviation every panel must reach (mm)")
	fs.Float64Var(&pf.opt.MaxMoveMM, "max-move", d.MaxMoveMM, "largest node move allowed (mm)")
	fs.Float64Var(&pf.opt.Fairness, "fairness", d.Fairness, "weight of smooth moves against small moves (0: off)")
	fs.StringVar(&pf.supports, "supports", "boundary", "nodes that never move: boundary, none, file (flags in a CSV net) or node ids a,b,c")
	fs.BoolVar(&pf.opt.Vertical, "vertical", false, "move nodes only along z (plan layout fixed)")
	fs.IntVar(&pf.opt.MaxIter, "max-iter", d.MaxIter, "iteration budget")
}

// planarizeFlagNames maps option fields to their flags.
var planarizeFlagNames = map[string]string{"TolMM": "tol", "MaxMoveMM": "max-move", "Fairness": "fairness", "MaxIter": "max-iter"}

// options checks the flags and sets the supports of the loaded net.
func (pf *planarizeFlags) options(in *pipeline.Loaded) (panels.PlanarizeOptions, error) {
	opt := pf.opt
	if err := opt.Validate(); err != nil {
		return opt, flagError(err, planarizeFlagNames)
	}
	mode, ids := pf.supports, []string(nil)
	switch mode {
	case "boundary", "none", "file":
	default:
		mode, ids = "list", strings.Split(pf.supports, ",")
	}
	fixed, err := pipeline.Supports(mode, ids, in.Net, in.Topo)
	if err != nil {
		return opt, usagef("--supports: %v", err)
	}
	opt.Fixed = fixed
	return opt, nil
}

func runPlanarize(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("planarize", "NET -o OUT.obj", stderr)
	var nf netFlags
	var pf planarizeFlags
	nf.register(fs)
	pf.register(fs)
	out := fs.String("o", "", "planarized net, OBJ in mm (required)")
	report := fs.String("report", "", "also write the full report (per node moves, per panel flatness) as JSON")
	quiet := fs.Bool("q", false, "no progress bar")
	force := fs.Bool("force", false, "replace output files that pqfab did not write")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	if *out == "" {
		return usagef("planarize needs -o OUT.obj")
	}
	wopt := export.WriteOptions{Force: *force, Keep: inputFiles(pos[0])}
	if err := checkOutputs(wopt, *out, *report); err != nil {
		return err
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	opt, err := pf.options(in)
	if err != nil {
		return err
	}
	obs := &observer{stderr: stderr, quiet: *quiet}
	start := time.Now()
	res, perr := pipeline.Planarize(in.Net, in.Topo, opt, obs)
	obs.finish()
	if res == nil {
		return perr
	}
	rep := pipeline.NewPlanarizeReport(in.Net, opt, res, time.Since(start).Seconds())
	supports := 0
	for _, f := range opt.Fixed {
		if f {
			supports++
		}
	}
	rep.WriteText(stdout, supports)
	if *report != "" {
		if err := export.WriteFileAtomic(*report, wopt, func(w io.Writer) error { return writeJSON(w, rep) }); err != nil {
			return err
		}
	}
	if perr != nil {
		return perr // nothing written but the diagnostic report
	}
	return export.WriteFileAtomic(*out, wopt, func(w io.Writer) error {
		return export.WriteOBJ(w, pipeline.Moved(in.Net, res), "pqfab planarized net from "+in.Net.Source)
	})
}

// inputFiles lists the files a net path reads: the file, and the panels
// file of a CSV pair.
func inputFiles(net string) []string {
	if pp, err := geom.PanelsPathFor(net); err == nil && strings.EqualFold(filepath.Ext(net), ".csv") {
		return []string{net, pp}
	}
	return []string{net}
}

// checkOutputs checks, before any work, that each output file may be
// written and that no two outputs are the same file.
func checkOutputs(opt export.WriteOptions, paths ...string) error {
	seen := map[string]string{}
	for _, p := range paths {
		if p == "" {
			continue
		}
		abs, _ := filepath.Abs(p)
		if q, dup := seen[abs]; dup {
			return usagef("%s and %s are the same file: give each output its own name", q, p)
		}
		seen[abs] = p
		if err := export.CheckFile(p, opt); err != nil {
			return err
		}
	}
	return nil
}
