package main

import (
	"io"

	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/nodes"
	"pqfab/quadnet"
)

func runMembers(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs, names := newFlags("members", "NET", stderr), fieldFlags{}
	var nf netFlags
	nf.register(fs)
	opt := nodes.DefaultOptions()
	names.text(fs, (*string)(&opt.Axis), "axis", "Axis", "node axes: normal or least-twist")
	names.float(fs, &opt.HubRadiusMM, "hub-radius", "HubRadiusMM", "hub radius at every node (mm); members are cut back to it")
	names.float(fs, &opt.Section.WidthMM, "width", "Section.WidthMM", "member section width (mm)")
	names.float(fs, &opt.Section.DepthMM, "depth", "Section.DepthMM", "member section depth (mm)")
	names.float(fs, &opt.Types.LengthTolMM, "length-tol", "Types.LengthTolMM", "members whose cut lengths differ by no more are one type (mm)")
	names.float(fs, &opt.Types.AngleTolDeg, "angle-tol", "Types.AngleTolDeg", "parts whose angles differ by no more are one type (degrees)")
	bay := fs.Float64("bay", quadnet.DefaultBaySizeMM, "bay size for labels (mm)")
	asJSON := fs.Bool("json", false, "print JSON for machines")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	axis := opt.Axis // as given, for the summary
	if opt, err = job.ExplicitNodes(opt); err != nil {
		return names.check(err)
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	s, _, err := pipeline.Structure(in.Net, in.Topo, opt, *bay)
	if err != nil {
		return err
	}
	return show(stdout, *asJSON, pipeline.SummarizeMembers(pos[0], axis, s))
}
