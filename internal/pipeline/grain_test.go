package pipeline_test

import (
	"context"
	"fmt"
	"math"
	"testing"

	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/pipeline"
)

// TestGrainFollowsLongestEdge: on board stock that allows only turns of 0
// and 180°, with the grain rule "longest edge", every placed part has its
// longest cut edge along the sheet's x axis (checked on the placed
// outlines), and the placement's turn applied to the panel's own cut
// outline gives the placed outline.
func TestGrainFollowsLongestEdge(t *testing.T) {
	open := domeOpener(t, 120)
	text := `[net]
file = "net.obj"
[panel]
grain = "longest-edge"
edge_inset_mm = 4
[[stock]]
name = "board"
width_mm = 5000
height_mm = 2500
margin_mm = 10
spacing_mm = 8
rotation = "grain"
mirror = true
`
	j, err := job.Parse([]byte(text), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	res, err := pipeline.Run(context.Background(), j, open, pipeline.Quiet{}, pipeline.Policy{})
	if err != nil {
		t.Fatal(err)
	}
	placed, turned := 0, map[string]int{}
	for _, sh := range res.Nesting.Sheets {
		for _, p := range sh.Placements {
			fl := res.Flats[p.Part]
			long := 0
			for k, e := range fl.CutEdgeMM {
				if e > fl.CutEdgeMM[long]*(1+1e-9) {
					long = k
				}
			}
			// Corner order of a mirrored outline runs 1, k, k−1, …: edge
			// long of the panel is placed edge k−1−long.
			k := len(p.Outline)
			j := long
			if p.Mirrored {
				j = (2*k - long - 1) % k
			}
			a, b := p.Outline[j], p.Outline[(j+1)%k]
			if dy := math.Abs(b.Y - a.Y); dy > 1e-6*math.Abs(b.X-a.X)+1e-6 {
				t.Errorf("%s: longest edge not along x: %v → %v", fl.Label, a, b)
			}
			// The turn of the placement applies to the panel's own outline.
			c := fl.Cut
			if p.Mirrored {
				c = mirrorX(c)
			}
			q := c.Rotate(p.RotationDeg * math.Pi / 180)
			for i := range q {
				got := p.Outline[i]
				if p.Mirrored {
					got = p.Outline[(k-i)%k]
				}
				if math.Abs(q[i].X+p.X-got.X) > 1e-6 || math.Abs(q[i].Y+p.Y-got.Y) > 1e-6 {
					t.Fatalf("%s: turn %g° does not give the placed outline", fl.Label, p.RotationDeg)
				}
			}
			placed++
			turned[fmt.Sprintf("mirrored %v, turn %.0f", p.Mirrored, math.Mod(p.RotationDeg+fl.GrainDeg*map[bool]float64{false: 1, true: -1}[p.Mirrored]+720, 360))]++
		}
	}
	t.Logf("placements: %v", turned)
	if placed != len(res.Flats) {
		t.Errorf("%d of %d placed", placed, len(res.Flats))
	}
}

func mirrorX(p geom.Polygon) geom.Polygon {
	q := make(geom.Polygon, len(p))
	for i, v := range p {
		q[i] = geom.Vec2{X: -v.X, Y: v.Y}
	}
	return q
}
