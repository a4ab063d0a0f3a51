// Package geom holds the geometry every other pqfab package stands on:
// vectors, least-squares planes and frames, 2D polygons (area, hull,
// intersections, the smallest enclosing rectangle), the fold angle between
// panels, conjugate-gradient solvers, and FieldError, the error an
// options struct's Validate returns. The panel net, its readers and its
// checks are in package quadnet.
//
// Conventions:
//   - Lengths are millimetres (float64).
//   - Angles are radians inside the library.
//   - Axes: z points up. Plan views look down the z axis.
//   - Panels (faces) run counter-clockwise seen from above, or from outside
//     for closed nets, so the right-hand normal points up or out.
//
// Vectors are gonum's spatial/r3.Vec, a small value struct (X, Y, Z); Vec
// below is an alias for it, and Vec2 is our own 2D value struct. Neither is
// ever passed by pointer.
package geom
