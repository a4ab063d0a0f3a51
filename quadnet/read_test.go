package quadnet

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/testnets"
)

func TestReadOBJForms(t *testing.T) {
	src := `# a quad and a triangle in every corner form
mtllib canopy.mtl
o canopy
g glass
v 0 0 0
v 1 0 0
v 1 1 0
v 0 1 0   # trailing comment
vt 0 0
vn 0 0 1
v 2 0 0
usemtl clear
s off
f 1/1/1 2/1/1 3/1/1 4//1
f -4/1 -1 -3
`
	n, err := ReadOBJ(strings.NewReader(src), "forms.obj", M)
	if err != nil {
		t.Fatal(err)
	}
	if len(n.Nodes) != 5 || len(n.Faces) != 2 {
		t.Fatalf("got %d nodes, %d faces", len(n.Nodes), len(n.Faces))
	}
	if got := n.Nodes[1].Pos.X; got != 1000 {
		t.Errorf("unit m: x got %g mm, want 1000", got)
	}
	if got, want := n.Faces[1].Corners, []int{1, 4, 2}; !equalInts(got, want) {
		t.Errorf("negative indices: got %v want %v", got, want)
	}
	if n.Faces[0].Line != 14 || n.Nodes[3].Line != 8 {
		t.Errorf("lines: face %d node %d", n.Faces[0].Line, n.Nodes[3].Line)
	}
}

func TestReadOFF(t *testing.T) {
	src := "OFF\n# square\n4 1 4\n0 0 0\n10 0 0\n10 10 0\n0 10 0 1 0 0\n4 0 1 2 3 255 0 0\n"
	n, err := ReadOFF(strings.NewReader(src), "sq.off", CM)
	if err != nil {
		t.Fatal(err)
	}
	if len(n.Nodes) != 4 || len(n.Faces) != 1 || n.Nodes[2].Pos.Y != 100 {
		t.Fatalf("got %+v", n)
	}
	n2, err := ReadOFF(strings.NewReader("OFF 3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 2\n"), "t.off", MM)
	if err != nil || len(n2.Faces) != 1 {
		t.Fatalf("counts on header line: %v", err)
	}
}

func TestReadCSV(t *testing.T) {
	nodes := "id,x,y,z,support\nN1,0,0,0,1\nN2,1,0,0,0\nN3,1,1,0,\nN4,0,1,0,yes\nN5,2,0,0\n"
	panels := "id,n1,n2,n3,n4\nP1,N1,N2,N3,N4\nP2,N2,N5,N3,\n"
	n, err := ReadCSV(strings.NewReader(nodes), "n.csv", strings.NewReader(panels), "p.csv", M)
	if err != nil {
		t.Fatal(err)
	}
	if len(n.Faces) != 2 || len(n.Faces[1].Corners) != 3 {
		t.Fatalf("faces %+v", n.Faces)
	}
	var sup []string
	for _, nd := range n.Nodes {
		if nd.Support {
			sup = append(sup, nd.ID)
		}
	}
	if strings.Join(sup, ",") != "N1,N4" {
		t.Errorf("supports %v", sup)
	}
	if n.Faces[1].ID != "P2" || n.Faces[1].Line != 3 {
		t.Errorf("face id/line %q %d", n.Faces[1].ID, n.Faces[1].Line)
	}
	if p, err := PanelsPathFor("job/canopy-nodes.csv"); err != nil || p != "job/canopy-panels.csv" {
		t.Errorf("partner %q %v", p, err)
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestPolyhedra reads closed polyhedra written as OBJ text, validates them
// and checks every face is planar, with the face count, edge count and
// Euler characteristic V - E + F = 2 of a sphere-like polyhedron.
// Reference counts (handbook values): cube 8/12/6, rhombic dodecahedron
// 14/24/12, rhombic triacontahedron 32/60/30.
func TestPolyhedra(t *testing.T) {
	tests := []struct {
		name    string
		p       testnets.Polyhedron
		v, e, f int
	}{
		{"cube", testnets.Cube(1000), 8, 12, 6},
		{"rhombic dodecahedron", testnets.RhombicDodecahedron(500), 14, 24, 12},
		{"rhombic triacontahedron", testnets.RhombicTriacontahedron(500), 32, 60, 30},
	}
	for _, tc := range tests {
		n, err := ReadOBJ(strings.NewReader(tc.p.OBJ()), tc.name+".obj", MM)
		if err != nil {
			t.Fatal(err)
		}
		topo, fd := Validate(n, DefaultValidateOptions())
		if err := fd.Err(); err != nil || len(fd.Warnings) > 0 || len(fd.Misoriented) > 0 {
			t.Fatalf("%s: %v %v %v", tc.name, err, fd.Warnings, fd.Misoriented)
		}
		if len(n.Nodes) != tc.v || len(topo.Edges) != tc.e || len(n.Faces) != tc.f {
			t.Errorf("%s: V E F got %d %d %d want %d %d %d", tc.name, len(n.Nodes), len(topo.Edges), len(n.Faces), tc.v, tc.e, tc.f)
		}
		if len(topo.Loops) != 0 {
			t.Errorf("%s: closed net has %d boundary loops", tc.name, len(topo.Loops))
		}
		var pts []geom.Vec
		for f := range n.Faces {
			pts = n.FacePoints(pts[:0], f)
			fit, err := geom.FitPlane(pts)
			if err != nil {
				t.Fatal(err)
			}
			if fit.MaxDist > 1e-9*500 {
				t.Errorf("%s: face %d off plane by %g mm", tc.name, f, fit.MaxDist)
			}
			if r3.Dot(fit.Normal, r3.Sub(fit.Origin, geom.Vec{})) <= 0 {
				t.Errorf("%s: face %d faces inward", tc.name, f)
			}
		}
	}
}

// TestRhombicDodecahedronAngles checks the face angles 109.47° and 70.53°
// (arccos(∓1/3), handbook values for the rhombic dodecahedron).
func TestRhombicDodecahedronAngles(t *testing.T) {
	p := testnets.RhombicDodecahedron(500)
	for _, f := range p.Faces {
		for k := range f {
			a, b, c := p.Points[f[(k+3)%4]], p.Points[f[k]], p.Points[f[(k+1)%4]]
			ang := math.Acos(r3.Cos(r3.Sub(a, b), r3.Sub(c, b))) * 180 / math.Pi
			if math.Abs(ang-109.4712206) > 1e-6 && math.Abs(ang-70.5287794) > 1e-6 {
				t.Fatalf("face angle %.7f°", ang)
			}
		}
	}
}
