// Package panels measures and makes flat panels: planarity measures
// (diagonal gap, planarity ratio, flatness deviation), planarization of a
// whole net by small node moves, flattening of each panel to 2D, insets,
// edge bevels and congruent panel types. It writes no files.
//
// Lengths are millimetres, angles radians; z is up and panels run
// counter-clockwise seen from above or outside.
package panels
