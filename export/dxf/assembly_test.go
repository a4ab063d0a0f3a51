package dxf

import (
	"pqfab/export/internal/exporttest"
	"pqfab/export/internal/layout"
	"testing"
)

// TestAssemblyLayoutNoOverlap lays out the plan of a grid and checks
// every pair of label boxes by brute force, and that no label is on a
// member line.
func TestAssemblyLayoutNoOverlap(t *testing.T) {
	rep := exporttest.GridReport(t, 8, 6, 1500, 6000)
	m, err := layout.NewSite(rep)
	if err != nil {
		t.Fatal(err)
	}
	ps := newPlanScale(m.SpanMM, rep.Section.WidthMM)
	pl := newAssemblyLayout(m, ps)
	want := len(m.Bays) + len(rep.Nodes) + len(rep.Members) + len(rep.Panels)
	if len(pl.labels) != want {
		t.Fatalf("%d labels, want %d", len(pl.labels), want)
	}
	for i, a := range pl.labels {
		for j := i + 1; j < len(pl.labels); j++ {
			if exporttest.ClipArea(a.at.Box.Corners(), pl.labels[j].at.Box.Corners()) > 1e-6 {
				t.Fatalf("labels %v and %v overlap", a.lines, pl.labels[j].lines)
			}
		}
		for _, mb := range rep.Members {
			pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
			line := layout.SegmentBox([2]float64{pa[0], pa[1]}, [2]float64{pb[0], pb[1]}, 1e-3)
			if exporttest.ClipArea(a.at.Box.Corners(), line.Corners()) > 1e-6 {
				t.Fatalf("label %v lies on member %s", a.lines, mb.Label)
			}
		}
	}
}

func BenchmarkAssemblyLayout(b *testing.B) {
	rep := exporttest.GridReport(b, 100, 100, 1500, 6000)
	m, err := layout.NewSite(rep)
	if err != nil {
		b.Fatal(err)
	}
	ps := newPlanScale(m.SpanMM, rep.Section.WidthMM)
	for b.Loop() {
		newAssemblyLayout(m, ps)
	}
}
