package geom

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// TestFitPlaneSkewQuad checks the least-squares plane of the skew quad
// (0,0,+h), (a,0,-h), (a,a,+h), (0,a,-h) against its closed form: by
// symmetry the plane is z = 0, each corner lies h from it, and the smallest
// eigenvalue of the scatter matrix equals the sum of squared distances,
// 4h² (principal component analysis; any linear algebra text).
func TestFitPlaneSkewQuad(t *testing.T) {
	for _, tc := range []struct{ a, h float64 }{{1000, 5}, {1500, 0.25}, {2, 0.5}} {
		pts := []Vec{{X: 0, Y: 0, Z: tc.h}, {X: tc.a, Y: 0, Z: -tc.h}, {X: tc.a, Y: tc.a, Z: tc.h}, {X: 0, Y: tc.a, Z: -tc.h}}
		fit, err := FitPlane(pts)
		if err != nil {
			t.Fatal(err)
		}
		if got, want := fit.SumSq, 4*tc.h*tc.h; math.Abs(got-want) > 1e-9*want {
			t.Errorf("a=%g h=%g: SumSq got %g, want %g", tc.a, tc.h, got, want)
		}
		if got, want := fit.MaxDist, tc.h; math.Abs(got-want) > 1e-9*want {
			t.Errorf("a=%g h=%g: MaxDist got %g, want %g", tc.a, tc.h, got, want)
		}
		if math.Abs(fit.Normal.Z-1) > 1e-12 {
			t.Errorf("normal %v, want +z for a counter-clockwise quad", fit.Normal)
		}
	}
}

// TestFitPlaneSumSq checks on random point sets that SumSq equals the sum
// of squared distances to the fitted plane (property, fixed seed).
func TestFitPlaneSumSq(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 200; trial++ {
		n := 3 + rng.IntN(5)
		pts := make([]Vec, n)
		for i := range pts {
			pts[i] = Vec{X: rng.Float64() * 1000, Y: rng.Float64() * 1000, Z: rng.Float64() * 50}
		}
		fit, err := FitPlane(pts)
		if err != nil {
			t.Fatal(err)
		}
		var s float64
		for _, p := range pts {
			d := fit.Dist(p)
			s += d * d
		}
		if math.Abs(s-fit.SumSq) > 1e-9*(1+s) {
			t.Fatalf("trial %d: sum of squares %g, eigenvalue %g", trial, s, fit.SumSq)
		}
		// No other plane through the centroid does better: try tilted normals.
		for k := 0; k < 5; k++ {
			m := r3.Unit(r3.Add(fit.Normal, Vec{X: rng.NormFloat64() * 0.1, Y: rng.NormFloat64() * 0.1, Z: rng.NormFloat64() * 0.1}))
			pl := Plane{Origin: fit.Origin, Normal: m}
			var s2 float64
			for _, p := range pts {
				d := pl.Dist(p)
				s2 += d * d
			}
			if s2 < s-1e-9*(1+s) {
				t.Fatalf("trial %d: tilted plane does better: %g < %g", trial, s2, s)
			}
		}
	}
	if _, err := FitPlane([]Vec{{}, {X: 1}}); err == nil {
		t.Error("two points: want an error")
	}
}

func TestNoPackagePrefix(t *testing.T) {
	_, err := FitPlane(nil)
	if err == nil || strings.Contains(err.Error(), "geom") {
		t.Errorf("got %v", err)
	}
}

func TestPlaneFrame(t *testing.T) {
	f, err := PlaneFrame(Vec{X: 1, Y: 2, Z: 3}, Vec{Z: 2}, Vec{X: 1, Y: 1, Z: 5}, 1e-9)
	if err != nil {
		t.Fatal(err)
	}
	p := Vec{X: 4, Y: -1, Z: 7}
	back := f.ToWorld(f.ToLocal(p))
	if r3.Norm(r3.Sub(back, p)) > 1e-12 {
		t.Errorf("round trip %v -> %v", p, back)
	}
	if math.Abs(r3.Dot(r3.Cross(f.X, f.Y), f.Z)-1) > 1e-12 {
		t.Error("frame is not right-handed")
	}
	if _, err := PlaneFrame(Vec{}, Vec{Z: 1}, Vec{Z: 3}, 1e-9); err == nil {
		t.Error("direction along the normal: want an error")
	}
}
