package main

import (
	"errors"
	"fmt"
	"io"
	"pqfab/export"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/panels"
)

// inspection is what `inspect` prints; --json writes it as is.
type inspection struct {
	File            string         `json:"file"`
	Nodes           int            `json:"nodes"`
	Supports        int            `json:"supports"`
	Panels          int            `json:"panels"`
	PanelsByCorners map[string]int `json:"panels_by_corners"`
	Edges           int            `json:"edges"`
	BoundaryEdges   int            `json:"boundary_edges"`
	BoundaryLoops   int            `json:"boundary_loops"`
	BoundaryLengthM float64        `json:"boundary_length_m"`
	BoundsMinMM     [3]float64     `json:"bounds_min_mm"`
	BoundsMaxMM     [3]float64     `json:"bounds_max_mm"`
	SizeMM          [3]float64     `json:"size_mm"`
	Valence         map[string]int `json:"valence"`
	RatioPct        panels.Spread  `json:"planarity_ratio_pct"`
	FlatnessMM      panels.Spread  `json:"flatness_mm"`
	Worst           []worstPanel   `json:"worst_panels"`
}

type worstPanel struct {
	Panel      string  `json:"panel"`
	Line       int     `json:"line,omitempty"`
	FlatnessMM float64 `json:"flatness_mm"`
	RatioPct   float64 `json:"ratio_pct"`
	GapMM      float64 `json:"diagonal_gap_mm"`
}

func runInspect(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("inspect", "NET", stderr)
	var nf netFlags
	nf.register(fs)
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
	in, err := inspectNet(pos[0], net, topo)
	if err != nil {
		return err
	}
	if *asJSON {
		return writeJSON(stdout, in)
	}
	printInspection(stdout, in)
	return nil
}

func inspectNet(file string, net *geom.Net, topo *geom.Topology) (*inspection, error) {
	in := &inspection{File: file, Nodes: len(net.Nodes), Panels: len(net.Faces), Edges: len(topo.Edges),
		BoundaryLoops: len(topo.Loops), PanelsByCorners: map[string]int{}, Valence: map[string]int{}}
	for _, nd := range net.Nodes {
		if nd.Support {
			in.Supports++
		}
	}
	for _, f := range net.Faces {
		in.PanelsByCorners[fmt.Sprint(len(f.Corners))]++
	}
	for _, e := range topo.Edges {
		if e.Boundary() {
			in.BoundaryEdges++
		}
	}
	in.BoundaryLengthM = export.Round(topo.BoundaryLength(net)/1000, 3)
	lo, hi := net.Bounds()
	size := r3.Sub(hi, lo)
	in.BoundsMinMM = [3]float64{export.Round(lo.X, 1), export.Round(lo.Y, 1), export.Round(lo.Z, 1)}
	in.BoundsMaxMM = [3]float64{export.Round(hi.X, 1), export.Round(hi.Y, 1), export.Round(hi.Z, 1)}
	in.SizeMM = [3]float64{export.Round(size.X, 1), export.Round(size.Y, 1), export.Round(size.Z, 1)}
	for v, c := range topo.ValenceHistogram() {
		if c > 0 {
			in.Valence[fmt.Sprint(v)] = c
		}
	}
	pl, err := panels.MeasureNet(net)
	if err != nil {
		return nil, err
	}
	ratios := make([]float64, len(pl))
	flat := make([]float64, len(pl))
	for i, p := range pl {
		ratios[i] = p.Ratio * 100
		flat[i] = p.Flatness
	}
	in.RatioPct = export.RoundSpread(panels.SpreadOf(ratios), 4)
	in.FlatnessMM = export.RoundSpread(panels.SpreadOf(flat), 3)
	for _, f := range panels.Worst(pl, 10) {
		in.Worst = append(in.Worst, worstPanel{Panel: net.Faces[f].ID, Line: net.Faces[f].Line,
			FlatnessMM: export.Round(pl[f].Flatness, 3), RatioPct: export.Round(pl[f].Ratio*100, 4), GapMM: export.Round(pl[f].DiagonalGap, 3)})
	}
	return in, nil
}

func printInspection(w io.Writer, in *inspection) {
	fmt.Fprintf(w, "net        %s\n", in.File)
	fmt.Fprintf(w, "nodes      %d (%d supports)\n", in.Nodes, in.Supports)
	fmt.Fprintf(w, "panels     %d (%s)\n", in.Panels, byCorners(in.PanelsByCorners))
	fmt.Fprintf(w, "edges      %d (%d on the boundary, %d boundary loops, %.3f m of boundary)\n",
		in.Edges, in.BoundaryEdges, in.BoundaryLoops, in.BoundaryLengthM)
	fmt.Fprintf(w, "bounds     x %.1f … %.1f, y %.1f … %.1f, z %.1f … %.1f mm\n",
		in.BoundsMinMM[0], in.BoundsMaxMM[0], in.BoundsMinMM[1], in.BoundsMaxMM[1], in.BoundsMinMM[2], in.BoundsMaxMM[2])
	fmt.Fprintf(w, "size       %.1f × %.1f × %.1f mm\n", in.SizeMM[0], in.SizeMM[1], in.SizeMM[2])
	fmt.Fprintf(w, "valence    %s\n", byCorners(in.Valence))
	fmt.Fprintf(w, "planarity  ratio %% min %.4f  median %.4f  max %.4f\n", in.RatioPct.Min, in.RatioPct.Median, in.RatioPct.Max)
	fmt.Fprintf(w, "flatness   mm      min %.3f  median %.3f  max %.3f\n", in.FlatnessMM.Min, in.FlatnessMM.Median, in.FlatnessMM.Max)
	fmt.Fprintln(w, "worst panels (flatness deviation from the least-squares plane):")
	fmt.Fprintf(w, "  %-10s %8s %12s %10s %12s\n", "panel", "line", "flatness mm", "ratio %", "diag gap mm")
	for _, p := range in.Worst {
		fmt.Fprintf(w, "  %-10s %8d %12.3f %10.4f %12.3f\n", p.Panel, p.Line, p.FlatnessMM, p.RatioPct, p.GapMM)
	}
}

// byCorners formats a count map with numeric keys as "4: 120, 3: 8".
func byCorners(m map[string]int) string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool {
		if len(keys[i]) != len(keys[j]) {
			return len(keys[i]) < len(keys[j])
		}
		return keys[i] < keys[j]
	})
	s := ""
	for i, k := range keys {
		if i > 0 {
			s += ", "
		}
		s += fmt.Sprintf("%s: %d", k, m[k])
	}
	return s
}
