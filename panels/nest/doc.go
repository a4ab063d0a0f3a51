// Package nest places flat outlines on stock sheets: no-fit polygons of
// convex outlines (their hulls for non-convex parts), bottom-left
// placement, a few part orderings, and the cheapest mix of stock sizes
// that fits. It knows nothing about 3D.
//
// Lengths are millimetres in the sheet's frame: x along the sheet's width,
// y along its height, origin at the lower-left corner. Rotations are
// degrees, counter-clockwise.
package nest
