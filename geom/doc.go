// Package geom holds the geometry every other pqfab package stands on:
// vectors, least-squares planes, 2D polygons, the quad net (nodes, faces,
// derived edges with panel adjacency, boundary loops, valence), readers for
// net files (Wavefront OBJ, OFF, a CSV pair), validation of what was read,
// and the plan bays that labels are made from.
//
// Conventions:
//   - Lengths are millimetres (float64). Readers convert from the caller's
//     unit (mm, cm, m) on the way in.
//   - Angles are radians inside the library.
//   - Axes: z points up. Plan views look down the z axis.
//   - Panels (faces) run counter-clockwise seen from above, or from outside
//     for closed nets, so the right-hand normal points up or out.
//
// Readers are strict and bounded: numbers are plain decimals, every
// problem is an *InputError naming the file, the line and the element,
// and input past MaxLineBytes, MaxFileBytes, MaxLines, MaxNodes or
// MaxPanels stops the reader, so no input can exhaust memory. Validate
// bounds the work of each of its checks (see its doc), and Canonical
// renumbers a valid net in an order fixed by its geometry.
//
// Vectors are gonum's spatial/r3.Vec, a small value struct (X, Y, Z); Vec
// below is an alias for it, and Vec2 is our own 2D value struct. Neither is
// ever passed by pointer.
package geom
