package panels

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
	"pqfab/samples"
)

func quadNet(pts ...geom.Vec) *quadnet.Net {
	n := &quadnet.Net{Source: "quad"}
	for i, p := range pts {
		n.Nodes = append(n.Nodes, quadnet.Node{ID: string(rune('A' + i)), Pos: p})
	}
	n.Faces = []quadnet.Face{{ID: "Q", Corners: []int{0, 1, 2, 3}}}
	return n
}

// TestSingleQuadTLS: for one free quad with no fairness the smallest total
// squared move that makes it planar is the smallest eigenvalue of the
// corners' scatter matrix (total least squares plane fit: project every
// corner on the plane; any linear algebra text). The eigenvalue here comes
// from gonum's dense symmetric eigen solver, independent of the solver.
func TestSingleQuadTLS(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 20; trial++ {
		var pts []geom.Vec
		for k, c := range [][2]float64{{0, 0}, {1500, 0}, {1500, 1200}, {0, 1200}} {
			pts = append(pts, geom.Vec{X: c[0] + rng.NormFloat64()*30, Y: c[1] + rng.NormFloat64()*30, Z: float64(k%2)*20 - 10 + rng.NormFloat64()*5})
		}
		n := quadNet(pts...)
		opt := DefaultPlanarizeOptions()
		opt.Fairness = NoFairness
		opt.TolMM = 1e-7
		res, err := Planarize(n, quadnet.BuildTopology(n), opt)
		if err != nil {
			t.Fatal(err)
		}
		var got float64
		for _, m := range res.Moves {
			got += r3.Norm2(m)
		}
		want := smallestScatterEigen(pts)
		if math.Abs(got-want) > 1e-5*want {
			t.Errorf("trial %d: total squared move %.9g, smallest eigenvalue %.9g", trial, got, want)
		}
	}
}

func smallestScatterEigen(pts []geom.Vec) float64 {
	c := geom.Centroid(pts)
	a := mat.NewSymDense(3, nil)
	for _, p := range pts {
		d := []float64{p.X - c.X, p.Y - c.Y, p.Z - c.Z}
		for i := 0; i < 3; i++ {
			for j := i; j < 3; j++ {
				a.SetSym(i, j, a.At(i, j)+d[i]*d[j])
			}
		}
	}
	var e mat.EigenSym
	e.Factorize(a, false)
	return e.Values(nil)[0]
}

// TestPlanarNetsUnchanged: translational and rotational nets have planar
// quads (Liu et al. 2006), so nothing moves.
func TestPlanarNetsUnchanged(t *testing.T) {
	for _, name := range []string{"canopy", "dome"} {
		n, _ := samples.Make(name, 2000)
		opt := DefaultPlanarizeOptions()
		opt.TolMM = 0.01
		res, err := Planarize(n, quadnet.BuildTopology(n), opt)
		if err != nil {
			t.Fatal(err)
		}
		if res.MaxMoveMM > 1e-9 || res.Iterations != 0 {
			t.Errorf("%s: moved %g mm in %d iterations", name, res.MaxMoveMM, res.Iterations)
		}
	}
}

// TestPerturbedNet: a planar net with seeded noise comes back within the
// tolerance, moving less (RMS) than the noise did, since the unperturbed
// net is a feasible answer. Supports stay bit-identical.
func TestPerturbedNet(t *testing.T) {
	n, _ := samples.Make("canopy", 1500)
	rng := rand.New(rand.NewPCG(3, 5))
	fixed := make([]bool, len(n.Nodes))
	var noise2 float64
	for i := range n.Nodes {
		fixed[i] = n.Nodes[i].Support
		if fixed[i] {
			continue
		}
		d := geom.Vec{X: rng.NormFloat64() * 3, Y: rng.NormFloat64() * 3, Z: rng.NormFloat64() * 3}
		noise2 += r3.Norm2(d)
		n.Nodes[i].Pos = r3.Add(n.Nodes[i].Pos, d)
	}
	noiseRMS := math.Sqrt(noise2 / float64(len(n.Nodes)))
	opt := DefaultPlanarizeOptions()
	opt.TolMM = 0.1
	opt.Fixed = fixed
	res, err := Planarize(n, quadnet.BuildTopology(n), opt)
	if err != nil {
		t.Fatal(err)
	}
	if maxOf(res.After) > opt.TolMM {
		t.Errorf("flatness after %g", maxOf(res.After))
	}
	if res.RMSMoveMM > noiseRMS {
		t.Errorf("RMS move %.3f mm > RMS noise %.3f mm", res.RMSMoveMM, noiseRMS)
	}
	for i, nd := range n.Nodes {
		if nd.Support && res.Positions[i] != nd.Pos {
			t.Fatalf("support %s moved: %v -> %v", nd.ID, nd.Pos, res.Positions[i])
		}
	}
	t.Logf("noise RMS %.3f mm, move RMS %.3f mm, max %.3f mm, %d iterations", noiseRMS, res.RMSMoveMM, res.MaxMoveMM, res.Iterations)
}

func TestWaveTight(t *testing.T) {
	n, _ := samples.Make("wave", 3000)
	fixed := make([]bool, len(n.Nodes))
	for i, nd := range n.Nodes {
		fixed[i] = nd.Support
	}
	for _, vertical := range []bool{false, true} {
		opt := DefaultPlanarizeOptions()
		opt.TolMM = 0.1
		opt.Fixed = fixed
		opt.Vertical = vertical
		calls := 0
		opt.Progress = func(Progress) { calls++ }
		res, err := Planarize(n, quadnet.BuildTopology(n), opt)
		if err != nil {
			t.Fatal(err)
		}
		if maxOf(res.After) > 0.1 || calls != res.Iterations+1 {
			t.Errorf("vertical=%v: flatness %g, %d progress calls for %d iterations", vertical, maxOf(res.After), calls, res.Iterations)
		}
		for i, nd := range n.Nodes {
			p := res.Positions[i]
			if nd.Support && p != nd.Pos {
				t.Fatalf("support %s moved", nd.ID)
			}
			if vertical && (p.X != nd.Pos.X || p.Y != nd.Pos.Y) {
				t.Fatalf("vertical: node %s moved in plan", nd.ID)
			}
		}
		t.Logf("vertical=%v: max move %.2f mm, RMS %.2f mm, %d iterations", vertical, res.MaxMoveMM, res.RMSMoveMM, res.Iterations)
	}
}

func TestPlanarizeFailures(t *testing.T) {
	// A twisted quad whose corners are all supports cannot be flattened.
	n := quadNet(geom.Vec{}, geom.Vec{X: 1000, Z: 10}, geom.Vec{X: 1000, Y: 1000}, geom.Vec{Y: 1000, Z: 10})
	opt := DefaultPlanarizeOptions()
	opt.Fixed = []bool{true, true, true, true}
	_, err := Planarize(n, quadnet.BuildTopology(n), opt)
	var pe *PlanarizeError
	if !errors.As(err, &pe) || pe.Count != 1 || pe.Stop != StopSupports ||
		!strings.Contains(err.Error(), "panel Q 5.000 mm off flat (input 5.000 mm; cannot be flattened: its fixed corners are not in one plane)") {
		t.Errorf("all fixed: %v", err)
	}
	// The wave needs moves of about 15 mm; allow 2 mm.
	w, _ := samples.Make("wave", 200)
	opt = DefaultPlanarizeOptions()
	opt.MaxMoveMM = 2
	_, err = Planarize(w, quadnet.BuildTopology(w), opt)
	if !errors.As(err, &pe) || pe.Stop != StopMoveLimit || !strings.Contains(err.Error(), "stopped by the allowed node move of 2 mm") {
		t.Errorf("move limit: %v", err)
	}
	// An iteration budget of one step is not enough for 0.01 mm.
	opt = DefaultPlanarizeOptions()
	opt.TolMM, opt.MaxIter = 0.01, 1
	_, err = Planarize(w, quadnet.BuildTopology(w), opt)
	if err == nil || !strings.Contains(err.Error(), "stopped by the iteration budget of 1 steps") {
		t.Errorf("budget: %v", err)
	}
	if _, err := Planarize(w, quadnet.BuildTopology(w), PlanarizeOptions{MaxIter: -1}); err == nil {
		t.Error("a negative budget: want an error")
	}
}

func benchPlanarize(b *testing.B, size int) {
	n, _ := samples.Make("wave", size)
	topo := quadnet.BuildTopology(n)
	opt := DefaultPlanarizeOptions()
	opt.TolMM = 0.1
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Planarize(n, topo, opt); err != nil {
			b.Fatal(err)
		}
	}
}

// Targets: wave 10k to 0.1 mm ≤ 1 s and ≤ 200 MB; 100k ≤ 15 s.
func BenchmarkPlanarizeWave10k(b *testing.B)  { benchPlanarize(b, 10000) }
func BenchmarkPlanarizeWave100k(b *testing.B) { benchPlanarize(b, 100000) }
