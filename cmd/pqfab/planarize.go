package main

import (
	"io"
	"strings"

	"pqfab/export"
	"pqfab/internal/job"
	"pqfab/internal/outdir"
	"pqfab/internal/pipeline"
	"pqfab/panels"
)

func runPlanarize(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs, names := newFlags("planarize", "NET -o OUT.obj", stderr), fieldFlags{}
	var nf netFlags
	nf.register(fs)
	opt := panels.DefaultPlanarizeOptions()
	names.float(fs, &opt.TolMM, "tol", "TolMM", "flatness deviation every panel must reach (mm)")
	names.float(fs, &opt.MaxMoveMM, "max-move", "MaxMoveMM", "largest node move allowed (mm)")
	names.float(fs, &opt.Fairness, "fairness", "Fairness", "weight of smooth moves against small moves (0: off)")
	names.integer(fs, &opt.MaxIter, "max-iter", "MaxIter", "iteration budget")
	fs.BoolVar(&opt.Vertical, "vertical", opt.Vertical, "move nodes only along z (plan layout fixed)")
	supports := fs.String("supports", job.DefaultSupportsMode, "nodes that never move: boundary, none, file (flags in a CSV net) or node ids a,b,c")
	out := fs.String("o", "", "the net with flat panels, OBJ in mm (required)")
	report := fs.String("report", "", "also write the full report (per node moves, per panel flatness) as JSON")
	quiet := fs.Bool("q", false, "no progress bar")
	force := fs.Bool("force", false, "replace output files that pqfab did not write")
	asJSON := fs.Bool("json", false, "print the full report as JSON instead of the summary")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	if *out == "" {
		return usagef("planarize needs -o OUT.obj")
	}
	if opt, err = job.ExplicitPlanarize(opt); err != nil {
		return names.check(err)
	}
	wopt := outdir.ForInputs(*force, pos[0])
	if err := outdir.CheckFiles(wopt, *out, *report); err != nil {
		return err
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	mode, ids := *supports, []string(nil)
	if mode != job.SupportsBoundary && mode != job.SupportsNone && mode != job.SupportsFile {
		mode, ids = job.SupportsList, strings.Split(*supports, ",")
	}
	if opt.Fixed, err = pipeline.Supports(mode, ids, in.Net, in.Topo); err != nil {
		return usagef("--supports: %v", err)
	}
	obs := &observer{stderr: stderr, quiet: *quiet}
	res, perr := pipeline.Planarize(in.Net, in.Topo, opt, obs)
	obs.finish()
	if res == nil {
		return perr
	}
	rep := pipeline.NewPlanarizeReport(in.Net, opt, res)
	if err := show(stdout, *asJSON, rep); err != nil {
		return err
	}
	if *report != "" {
		if err := outdir.WriteFileAtomic(*report, wopt, func(w io.Writer) error { return writeJSON(w, rep) }); err != nil {
			return err
		}
	}
	if perr != nil {
		return perr // nothing written but the report asked for
	}
	return outdir.WriteFileAtomic(*out, wopt, func(w io.Writer) error {
		return export.WriteOBJ(w, in.Order.Apply(pipeline.Moved(in.Net, res)), "pqfab: the net of "+in.Net.Source+" with flat panels")
	})
}
