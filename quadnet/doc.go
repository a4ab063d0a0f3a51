// Package quadnet holds the panel net pqfab builds from: its nodes and
// panels (Node, Face, Net), the edges, panel adjacency, boundary loops and
// members at each node derived from them (Topology), the readers for net
// files (Wavefront OBJ, OFF, a CSV pair of nodes and panels) with the unit
// a file is written in, the checks of what was read (Validate: a wrong
// unit, bow-tie and zero-area panels, coincident nodes, T-junctions,
// pinches, orientation), the canonical order (Canonical), the plan bays that part
// labels are named by (Bays), and InputError, the one error type for a
// bad element of any input file. Geometry it stands on (vectors, planes,
// polygons) lives in package geom.
//
// Conventions are geom's: lengths in millimetres (readers convert from
// the file's unit on the way in), z up, and panels counter-clockwise seen
// from above, or from outside for closed nets.
//
// Invariants:
//   - Every problem with an element of the input is an *InputError naming
//     the file, the line and the element ("file:line: panel 214: what is
//     wrong"), with no Go package name in the message; ValidationError
//     lists every one a check found.
//   - Readers are strict and bounded: numbers are plain decimals, and
//     input past MaxLineBytes, MaxFileBytes, MaxLines, MaxNodes or
//     MaxPanels stops the reader, so no input can exhaust memory. Validate
//     bounds the work of each of its checks (see its doc).
//   - Canonical renumbers a valid net in an order fixed by its geometry
//     alone, so nothing later depends on the order of nodes and panels in
//     the file or on the corner a panel starts at; Bays.Label likewise
//     depends only on positions and keys.
package quadnet
