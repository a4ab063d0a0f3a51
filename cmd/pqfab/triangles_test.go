package main

import (
	"fmt"
	"os"
	"strings"
	"testing"
)

// triangleNetOBJ returns an OBJ net of nu × nv squares of 200 mm in plan,
// each split by a diagonal into two triangles, on a shallow dome (rise
// 600 mm over the plan): no two panels quite alike. 52 × 32 gives 3,328
// triangles, the size of the net from another design tool that made
// nesting slow (issue 21).
func triangleNetOBJ(nu, nv int) string {
	const edge = 200.0
	w, h := edge*float64(nu), edge*float64(nv)
	var s strings.Builder
	for j := 0; j <= nv; j++ {
		for i := 0; i <= nu; i++ {
			x, y := edge*float64(i), edge*float64(j)
			u, v := 2*x/w-1, 2*y/h-1
			fmt.Fprintf(&s, "v %g %g %g\n", x, y, 600*(1-(u*u+v*v)/2))
		}
	}
	id := func(i, j int) int { return j*(nu+1) + i + 1 }
	for j := 0; j < nv; j++ {
		for i := 0; i < nu; i++ {
			fmt.Fprintf(&s, "f %d %d %d\nf %d %d %d\n", id(i, j), id(i+1, j), id(i+1, j+1), id(i, j), id(i+1, j+1), id(i, j+1))
		}
	}
	return s.String()
}

// BenchmarkBuildTriangles times a whole build (pqfab build -q) of the
// demo job's settings on a net of 3,328 triangles with 200 mm edges
// (triangleNetOBJ): some 800 panels to a jumbo sheet. Target: at most
// 20 s on a 2-core machine.
func BenchmarkBuildTriangles(b *testing.B) {
	benchBuildNet(b, func(path string) {
		if err := os.WriteFile(path, []byte(triangleNetOBJ(52, 32)), 0o644); err != nil {
			b.Fatal(err)
		}
	})
}
