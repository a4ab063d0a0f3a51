// Package nest places flat outlines on stock sheets. It knows nothing about
// 3D.
//
// Two methods lay the parts out and the better layout wins (fewer parts
// unplaced, then lower cost, then less sheet area):
//
//   - The free-piece packer (guillotine.go, cuts.go, sheetsearch.go,
//     pack.go) fills one sheet at a time by a tree search: each part goes
//     flush into a corner of a convex piece of the sheet and is cut free
//     along its edges, each cut straight across the whole piece it splits.
//     Its layouts are the ones stocks with edge-to-edge cuts (float and
//     laminated glass) need, and it also serves other stocks.
//   - The no-fit polygon driver (place.go, fill.go) places parts by their
//     true outlines (split into convex pieces), bottom-left, in a few
//     orders of the parts; a part may lie in the notch of another. Its
//     work for one part does not grow with the parts on the sheet: it
//     looks at one band of the sheet at a time, among the parts near it,
//     and skips where parts of a size and turn found no room before.
//
// An improvement phase (improve.go) then tries to empty the worst sheets
// by laying their parts onto others. The effort is counted in steps
// (Options.Steps), never in time, and the costly parts of the search
// (other orders of the parts, repacking sheets of hundreds of parts) run
// only when the steps pay for them: the same input gives the same layout,
// whatever the machine; a context deadline only stops the search early,
// and the result says so.
//
// Lengths are millimetres in the sheet's frame: x along the sheet's width,
// y along its height, origin at the lower-left corner. Outlines run
// counter-clockwise. Rotations are degrees, counter-clockwise.
package nest
