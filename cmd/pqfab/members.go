package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"pqfab/export"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
)

// structureFlags are the options of the node and member step, shared with
// build.
type structureFlags struct {
	axis      string
	hubRadius float64
	bay       float64
	lengthTol float64
	angleTol  float64
}

func (sf *structureFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&sf.axis, "axis", string(nodes.AxisNormal), "node axes: normal or least-twist")
	fs.Float64Var(&sf.hubRadius, "hub-radius", 0, "hub radius at every node (mm); members are cut back to it")
	fs.Float64Var(&sf.bay, "bay", geom.DefaultBaySizeMM, "bay size for labels (mm)")
	fs.Float64Var(&sf.lengthTol, "length-tol", nodes.DefaultTypeLengthTolMM, "members whose cut lengths differ by no more are one type (mm)")
	fs.Float64Var(&sf.angleTol, "angle-tol", nodes.DefaultTypeAngleTolDeg, "parts whose angles differ by no more are one type (degrees)")
}

func (sf *structureFlags) options(net *geom.Net) (nodes.Options, error) {
	bays, err := geom.NewBays(net.Positions(), sf.bay, sf.bay)
	if err != nil {
		return nodes.Options{}, usagef("--bay: %v", err)
	}
	if !(sf.hubRadius >= 0) || !(sf.lengthTol >= 0) || !(sf.angleTol >= 0) {
		return nodes.Options{}, usagef("--hub-radius, --length-tol and --angle-tol must be zero or more")
	}
	return nodes.Options{Axis: nodes.AxisMethod(sf.axis), HubRadiusMM: sf.hubRadius, Bays: bays,
		Types: nodes.TypeOptions{LengthTolMM: sf.lengthTol, AngleTolDeg: sf.angleTol}}, nil
}

// twistBins are the upper edges of the |twist| histogram (degrees).
var twistBins = []float64{0.01, 0.1, 0.5, 1, 2, 5, math.Inf(1)}

type memberSummary struct {
	Net            string        `json:"net"`
	Axis           string        `json:"axis"`
	Members        int           `json:"members"`
	Nodes          int           `json:"nodes"`
	TwistDeg       panels.Spread `json:"abs_twist_deg"`
	TwistNormalMax float64       `json:"max_abs_twist_normal_axes_deg"`
	TwistHistogram []binCount    `json:"abs_twist_histogram"`
	CutLengthMM    panels.Spread `json:"cut_length_mm"`
	MemberTypes    int           `json:"member_types"`
	NodeTypes      int           `json:"node_types"`
	TopTypes       []typeCount   `json:"largest_member_types"`
}

type binCount struct {
	UpToDeg float64 `json:"up_to_deg"` // -1 for no upper limit
	Count   int     `json:"count"`
}

type typeCount struct {
	Type        string  `json:"type"`
	Count       int     `json:"count"`
	CutLengthMM float64 `json:"cut_length_mm"`
}

func summarizeMembers(file string, axis string, s *nodes.Structure) *memberSummary {
	sum := &memberSummary{Net: file, Axis: axis, Members: len(s.Members), Nodes: len(s.Nodes),
		MemberTypes: len(s.MemberTypes), NodeTypes: len(s.NodeTypes), TwistNormalMax: export.Round(s.TwistNormalDeg, 6)}
	tw := make([]float64, len(s.Members))
	cut := make([]float64, len(s.Members))
	counts := make([]int, len(twistBins))
	for i, m := range s.Members {
		tw[i] = math.Abs(m.TwistDeg)
		cut[i] = m.CutLengthMM
		for b, up := range twistBins {
			if tw[i] <= up {
				counts[b]++
				break
			}
		}
	}
	for b, up := range twistBins {
		if math.IsInf(up, 1) {
			up = -1
		}
		sum.TwistHistogram = append(sum.TwistHistogram, binCount{UpToDeg: up, Count: counts[b]})
	}
	sum.TwistDeg = export.RoundSpread(panels.SpreadOf(tw), 6)
	sum.CutLengthMM = export.RoundSpread(panels.SpreadOf(cut), 1)
	order := make([]int, len(s.MemberTypes))
	for i := range order {
		order[i] = i
	}
	sortByCount(order, func(i int) int { return len(s.MemberTypes[i].Members) })
	for _, t := range order[:min(10, len(order))] {
		ty := s.MemberTypes[t]
		sum.TopTypes = append(sum.TopTypes, typeCount{Type: ty.Name, Count: len(ty.Members), CutLengthMM: export.Round(s.Members[ty.Rep].CutLengthMM, 1)})
	}
	return sum
}

func printMemberSummary(w io.Writer, s *memberSummary) {
	fmt.Fprintf(w, "net          %s (%s axes)\n", s.Net, s.Axis)
	fmt.Fprintf(w, "members      %d in %d types\n", s.Members, s.MemberTypes)
	fmt.Fprintf(w, "nodes        %d in %d types\n", s.Nodes, s.NodeTypes)
	fmt.Fprintf(w, "cut length   min %.1f  median %.1f  max %.1f mm\n", s.CutLengthMM.Min, s.CutLengthMM.Median, s.CutLengthMM.Max)
	fmt.Fprintf(w, "|twist|      min %.4f  median %.4f  max %.4f° (normal axes: max %.4f°)\n", s.TwistDeg.Min, s.TwistDeg.Median, s.TwistDeg.Max, s.TwistNormalMax)
	fmt.Fprintln(w, "twist histogram:")
	lo := 0.0
	for _, b := range s.TwistHistogram {
		if b.UpToDeg < 0 {
			fmt.Fprintf(w, "  > %-13g° %8d\n", lo, b.Count)
		} else {
			fmt.Fprintf(w, "  %5g … %-5g° %8d\n", lo, b.UpToDeg, b.Count)
			lo = b.UpToDeg
		}
	}
	fmt.Fprintln(w, "largest member types:")
	for _, t := range s.TopTypes {
		fmt.Fprintf(w, "  %-8s %6d × %9.1f mm\n", t.Type, t.Count, t.CutLengthMM)
	}
}

func runMembers(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("members", "NET", stderr)
	var nf netFlags
	var sf structureFlags
	nf.register(fs)
	sf.register(fs)
	asJSON := fs.Bool("json", false, "print JSON for machines")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if errors.Is(err, errHelp) {
		return nil
	} else if err != nil {
		return err
	}
	net, topo, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	opt, err := sf.options(net)
	if err != nil {
		return err
	}
	s, err := nodes.Build(net, topo, opt)
	if err != nil {
		return err
	}
	sum := summarizeMembers(pos[0], sf.axis, s)
	if *asJSON {
		return writeJSON(stdout, sum)
	}
	printMemberSummary(stdout, sum)
	return nil
}
