package main

import (
	"flag"
	"io"

	"pqfab/geom"
	"pqfab/internal/pipeline"
	"pqfab/nodes"
)

// structureFlags are the options of the node and member step.
type structureFlags struct {
	opt  nodes.Options
	axis string
	bay  float64
}

func (sf *structureFlags) register(fs *flag.FlagSet) {
	sf.opt = nodes.DefaultOptions()
	fs.StringVar(&sf.axis, "axis", string(nodes.AxisNormal), "node axes: normal or least-twist")
	fs.Float64Var(&sf.opt.HubRadiusMM, "hub-radius", 0, "hub radius at every node (mm); members are cut back to it")
	fs.Float64Var(&sf.opt.Section.WidthMM, "width", nodes.DefaultSectionWidthMM, "member section width (mm)")
	fs.Float64Var(&sf.opt.Section.DepthMM, "depth", nodes.DefaultSectionDepthMM, "member section depth (mm)")
	fs.Float64Var(&sf.bay, "bay", geom.DefaultBaySizeMM, "bay size for labels (mm)")
	fs.Float64Var(&sf.opt.Types.LengthTolMM, "length-tol", nodes.DefaultTypeLengthTolMM, "members whose cut lengths differ by no more are one type (mm)")
	fs.Float64Var(&sf.opt.Types.AngleTolDeg, "angle-tol", nodes.DefaultTypeAngleTolDeg, "parts whose angles differ by no more are one type (degrees)")
}

// structureFlagNames maps option fields to their flags.
var structureFlagNames = map[string]string{"Axis": "axis", "HubRadiusMM": "hub-radius", "Section.WidthMM": "width",
	"Section.DepthMM": "depth", "Types.LengthTolMM": "length-tol", "Types.AngleTolDeg": "angle-tol"}

func runMembers(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("members", "NET", stderr)
	var nf netFlags
	var sf structureFlags
	nf.register(fs)
	sf.register(fs)
	asJSON := fs.Bool("json", false, "print JSON for machines")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	sf.opt.Axis = nodes.AxisMethod(sf.axis)
	if err := sf.opt.Validate(); err != nil {
		return flagError(err, structureFlagNames)
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	s, _, err := pipeline.Structure(in.Net, in.Topo, sf.opt, sf.bay)
	if err != nil {
		return err
	}
	sum := pipeline.SummarizeMembers(pos[0], sf.opt.Axis, s)
	if *asJSON {
		return writeJSON(stdout, sum)
	}
	sum.WriteText(stdout)
	return nil
}
