package bars

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"pqfab/nodes"
)

func TestEndAllowanceClosedForm(t *testing.T) {
	tests := []struct {
		name               string
		w, d, mitre, bevel float64
		want               float64
	}{
		{"square cut", 60, 120, 0, 0, 0},
		{"45° mitre, 60 wide", 60, 120, 45, 0, 30},       // (60/2)·tan 45°
		{"−45° mitre", 60, 120, -45, 0, 30},              // either hand
		{"45° bevel, 120 deep", 60, 120, 0, 45, 60},      // (120/2)·tan 45°
		{"30° mitre", 60, 120, 30, 0, 30 / math.Sqrt(3)}, // tan 30° = 1/√3
		{"60° bevel", 60, 100, 0, 60, 50 * math.Sqrt(3)}, // tan 60° = √3
		{"both 45°", 60, 120, 45, -45, 90},               // the corner where both add
		{"zero width", 0, 120, 45, 0, 0},
	}
	for _, tt := range tests {
		got := EndAllowanceMM(tt.w, tt.d, tt.mitre, tt.bevel)
		if math.Abs(got-tt.want) > 1e-9 {
			t.Errorf("%s: EndAllowanceMM(%g, %g, %g, %g) = %.12g, want %.12g", tt.name, tt.w, tt.d, tt.mitre, tt.bevel, got, tt.want)
		}
	}
}

func TestEndAllowanceDegenerate(t *testing.T) {
	for _, c := range [][4]float64{
		{60, 120, 90, 0}, {60, 120, 0, -90}, {60, 120, 135, 0},
		{60, 120, math.NaN(), 0}, {math.NaN(), 120, 0, 0}, {-1, 120, 0, 0},
		{math.Inf(1), 120, 0, 0},
	} {
		if got := EndAllowanceMM(c[0], c[1], c[2], c[3]); !math.IsInf(got, 1) {
			t.Errorf("EndAllowanceMM(%v) = %v, want +Inf", c, got)
		}
	}
}

// TestEndAllowanceCorners: for random cut planes, the allowance equals the
// farthest point of the section's four long edges on the plane, found
// directly: the edge through corner c runs c + t·x, and meets the plane
// n·p = 0 at t = −(n·c)/(n·x). The normal is drawn at random and its
// angles are read with the design notes' definitions, mitre = atan2(n·y,
// n·x), bevel = atan2(n·z, n·x); the oracle uses only n.
func TestEndAllowanceCorners(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for range 1000 {
		n := [3]float64{0.2 + rng.Float64(), 2*rng.Float64() - 1, 2*rng.Float64() - 1}
		w, d := 10+200*rng.Float64(), 10+400*rng.Float64()
		mitre := math.Atan2(n[1], n[0]) * 180 / math.Pi
		bevel := math.Atan2(n[2], n[0]) * 180 / math.Pi
		want := math.Inf(-1)
		for _, sy := range []float64{-1, 1} {
			for _, sz := range []float64{-1, 1} {
				c := [3]float64{0, sy * w / 2, sz * d / 2}
				tt := -(n[0]*c[0] + n[1]*c[1] + n[2]*c[2]) / n[0]
				want = math.Max(want, tt)
			}
		}
		got := EndAllowanceMM(w, d, mitre, bevel)
		if math.Abs(got-want) > 1e-9*math.Max(1, want) {
			t.Fatalf("n %v, %g × %g: allowance %.12g, corners %.12g", n, w, d, got, want)
		}
	}
}

func TestMemberBlank(t *testing.T) {
	m := nodes.Member{Label: "C3-M12", CutLengthMM: 1000,
		A: nodes.End{MitreDeg: 45}, B: nodes.End{BevelDeg: -45}}
	sec := nodes.Section{WidthMM: 60, DepthMM: 120}
	got, err := MemberBlankMM(m, sec)
	if err != nil {
		t.Fatal(err)
	}
	if want := 1000.0 + 30 + 60; math.Abs(got-want) > 1e-9 {
		t.Errorf("blank %.12g, want %g", got, want)
	}
	ps, err := MemberPieces([]nodes.Member{m}, sec)
	if err != nil || len(ps) != 1 || ps[0].Label != "C3-M12" || ps[0].LengthMM != got {
		t.Errorf("MemberPieces = %v, %v", ps, err)
	}
	m.B.MitreDeg = 90
	if _, err := MemberBlankMM(m, sec); err == nil || !strings.Contains(err.Error(), "C3-M12") {
		t.Errorf("90° mitre: error %v, want one naming the member", err)
	}
	if _, err := MemberBlankMM(nodes.Member{Label: "A1-M01", CutLengthMM: 10}, nodes.Section{}); err == nil {
		t.Error("zero section: no error")
	}
}
