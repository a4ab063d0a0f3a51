// Package panels measures and makes flat panels: planarity measures
// (diagonal gap, planarity ratio, flatness deviation), planarization of a
// whole net by small node moves, flattening of each panel to 2D, insets,
// edge bevels and congruent panel types. It writes no files.
//
// A panel type is a promise: every two of its panels have the same number
// of corners and agree within the panel tolerance in every edge and
// diagonal of their cut outlines and within the angle tolerance in every
// corner angle, corners matched in cyclic order (reversed only where
// mirrored panels are allowed). The nominal panel is the middle of each
// value's range.
//
// Lengths are millimetres. Angles are radians inside the package and
// degrees in every exported field and constant named …Deg (fold, bevel,
// corner angles). z is up and panels run counter-clockwise seen from above
// or outside, so a panel's right-hand normal points up or out.
package panels
