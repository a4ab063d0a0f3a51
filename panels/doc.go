// Package panels measures and makes flat panels: planarity measures
// (diagonal gap, planarity ratio, flatness deviation), planarization of a
// whole net by small node moves, flattening of each panel to 2D, insets,
// edge bevels and congruent panel types. It writes no files.
//
// Lengths are millimetres. Angles are radians inside the package and
// degrees in every exported field and constant named …Deg (fold, bevel,
// corner angles). z is up and panels run counter-clockwise seen from above
// or outside, so a panel's right-hand normal points up or out.
package panels
