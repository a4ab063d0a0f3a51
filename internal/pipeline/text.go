package pipeline

import (
	"fmt"
	"io"
	"sort"
)

// WriteText writes the inspection as a table for a terminal.
func (in *Inspection) WriteText(w io.Writer) {
	fmt.Fprintf(w, "net        %s\n", in.File)
	fmt.Fprintf(w, "nodes      %d (%d supports)\n", in.Nodes, in.Supports)
	fmt.Fprintf(w, "panels     %d (by corners %s)\n", in.Panels, byCount(in.PanelsByCorners))
	fmt.Fprintf(w, "edges      %d (%d on the boundary, %d boundary loops, %.3f m of boundary)\n",
		in.Edges, in.BoundaryEdges, in.BoundaryLoops, in.BoundaryLengthM)
	fmt.Fprintf(w, "bounds     x %.1f … %.1f, y %.1f … %.1f, z %.1f … %.1f mm\n",
		in.BoundsMinMM[0], in.BoundsMaxMM[0], in.BoundsMinMM[1], in.BoundsMaxMM[1], in.BoundsMinMM[2], in.BoundsMaxMM[2])
	fmt.Fprintf(w, "size       %.1f × %.1f × %.1f mm\n", in.SizeMM[0], in.SizeMM[1], in.SizeMM[2])
	fmt.Fprintf(w, "members at node  %s\n", byCount(in.MembersAtNode))
	fmt.Fprintf(w, "planarity  ratio %% min %.4f  median %.4f  max %.4f\n", in.RatioPct.Min, in.RatioPct.Median, in.RatioPct.Max)
	fmt.Fprintf(w, "flatness   mm      min %.3f  median %.3f  max %.3f\n", in.FlatnessMM.Min, in.FlatnessMM.Median, in.FlatnessMM.Max)
	fmt.Fprintln(w, "worst panels (flatness deviation from the least-squares plane):")
	fmt.Fprintf(w, "  %-10s %8s %12s %10s %12s\n", "panel", "line", "flatness mm", "ratio %", "diag gap mm")
	for _, p := range in.Worst {
		fmt.Fprintf(w, "  %-10s %8d %12.3f %10.4f %12.3f\n", p.Panel, p.Line, p.FlatnessMM, p.RatioPct, p.GapMM)
	}
}

// byCount formats a count map with numeric keys as "3: 8, 4: 120" (counts
// of nodes or panels, in key order).
func byCount(m map[string]int) string {
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

// WriteText writes the summary as a table for a terminal.
func (s *MemberSummary) WriteText(w io.Writer) {
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

// WriteText writes the report's summary for a terminal.
func (r *PlanarizeReport) WriteText(w io.Writer) {
	fmt.Fprintf(w, "made the panels of %s flat: %d iterations\n", r.Net, r.Iterations)
	fmt.Fprintf(w, "  supports     %d nodes held fixed\n", r.Supports)
	fmt.Fprintf(w, "  node moves   max %.3f mm, RMS %.3f mm\n", r.MaxMoveMM, r.RMSMoveMM)
	fmt.Fprintf(w, "  flatness     before min %.3f  median %.3f  max %.3f mm\n", r.FlatBefore.Min, r.FlatBefore.Median, r.FlatBefore.Max)
	fmt.Fprintf(w, "               after  min %.4f median %.4f max %.4f mm (tolerance %.3g mm)\n", r.FlatAfter.Min, r.FlatAfter.Median, r.FlatAfter.Max, r.TolMM)
}

// WriteText writes the nesting's sheets and utilization for a terminal.
func (s *NestSummary) WriteText(w io.Writer) {
	fmt.Fprintf(w, "%d parts, %.2f m² in all; %d placed on %d sheets (%s ordering), %d unplaced\n",
		s.Parts, s.AreaM2, s.Placed, len(s.Sheets), s.Ordering, len(s.Unplaced))
	size := map[string]string{}
	for _, st := range s.Stocks {
		size[st.Name] = fmt.Sprintf("%s %g × %g mm", st.Name, st.WidthMM, st.HeightMM)
		if st.Sheets > 0 {
			fmt.Fprintf(w, "stock %s: %d sheets, fewest sheets by area %d (ratio %.3f)\n", size[st.Name], st.Sheets, st.AreaBound, float64(st.Sheets)/float64(st.AreaBound))
		}
	}
	fmt.Fprintf(w, "  %-6s %-24s %6s %12s\n", "sheet", "stock", "parts", "utilization")
	var total float64
	for _, sh := range s.Sheets {
		fmt.Fprintf(w, "  %-6s %-24s %6d %11.1f%%\n", sh.Name, size[sh.Stock], len(sh.Panels), 100*sh.Utilization)
		total += sh.Utilization
	}
	if len(s.Sheets) > 0 {
		fmt.Fprintf(w, "  mean utilization %.1f%%\n", 100*total/float64(len(s.Sheets)))
	}
	for _, u := range s.Unplaced {
		fmt.Fprintf(w, "  unplaced %s: %s\n", u.Panel, u.Reason)
	}
}
