package samples

import (
	"math"
	"testing"

	"pqfab/panels"
	"pqfab/quadnet"
)

func measure(t *testing.T, n *quadnet.Net) []panels.Planarity {
	t.Helper()
	if _, fd := quadnet.Validate(n, quadnet.DefaultValidateOptions()); fd.Err() != nil || len(fd.Misoriented) > 0 || len(fd.Warnings) > 0 {
		t.Fatalf("%s: %v %v %v", n.Source, fd.Err(), fd.Misoriented, fd.Warnings)
	}
	p, err := panels.MeasureNet(n)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestPlanarSamples: translational nets (canopy) and meridian/parallel nets
// of surfaces of revolution (dome) have exactly planar quads (Liu,
// Pottmann, Wallner, Yang, Wang, SIGGRAPH 2006), so every panel is planar
// to 1e-9 relative to its size.
func TestPlanarSamples(t *testing.T) {
	for _, name := range []string{"canopy", "dome"} {
		for _, size := range []int{10, 1000, 20000} {
			n, err := Make(name, size)
			if err != nil {
				t.Fatal(err)
			}
			if got := len(n.Faces); got < size*9/10 || got > size*12/10 {
				t.Errorf("%s %d: %d panels", name, size, got)
			}
			for f, p := range measure(t, n) {
				if p.Ratio > 1e-9 {
					t.Fatalf("%s %d: panel %d ratio %g", name, size, f, p.Ratio)
				}
			}
		}
	}
}

// TestWaveBand: the wave sample's quads are 0.3–2 % off planar. Its
// supports are set out exactly, so some panels in the rows beside them are
// flatter: at least 93 % lie in the band, none above it.
func TestWaveBand(t *testing.T) {
	for _, size := range []int{100, 1000, 30000} {
		n, err := Make("wave", size)
		if err != nil {
			t.Fatal(err)
		}
		in := 0
		pl := measure(t, n)
		for f, p := range pl {
			if p.Ratio > 0.02 {
				t.Fatalf("wave %d: panel %d ratio %.4f %% above 2 %%", size, f, p.Ratio*100)
			}
			if p.Ratio >= 0.003 {
				in++
			}
		}
		if frac := float64(in) / float64(len(pl)); frac < 0.93 {
			t.Errorf("wave %d: %.3f of panels in the band", size, frac)
		}
	}
}

func TestMakeErrors(t *testing.T) {
	if _, err := Make("tower", 100); err == nil {
		t.Error("unknown sample: want an error")
	}
	if _, err := Make("dome", 5); err == nil {
		t.Error("too few panels: want an error")
	}
}

// TestDemoNetCurrent: the embedded demo net is what the generator makes
// now (regenerate it as DEVELOPERS.md says when the generator changes).
func TestDemoNetCurrent(t *testing.T) {
	f, err := OpenDemo("demo/wave.obj")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	got, err := quadnet.ReadOBJ(f, "demo/wave.obj", quadnet.MM)
	if err != nil {
		t.Fatal(err)
	}
	want := Wave(600)
	if len(got.Nodes) != len(want.Nodes) || len(got.Faces) != len(want.Faces) {
		t.Fatalf("demo net has %d nodes, %d panels; generator %d, %d", len(got.Nodes), len(got.Faces), len(want.Nodes), len(want.Faces))
	}
	for i := range want.Nodes {
		d := want.Nodes[i].Pos
		g := got.Nodes[i].Pos
		if math.Abs(d.X-g.X) > 1e-4 || math.Abs(d.Y-g.Y) > 1e-4 || math.Abs(d.Z-g.Z) > 1e-4 {
			t.Fatalf("node %d: embedded %v, generator %v", i+1, g, d)
		}
	}
}
