// Package parttype sorts parts into types: the congruent-part counting
// that member, node and panel types share.
//
// A type is a promise. Each part is a vector of coordinates (a member's
// cut length, end mitres and bevels, twist; a panel's edges, diagonals and
// corner angles; a node's arm directions), each with its tolerance, and
// can be read in several ways (a member from either end, a panel from any
// start corner): one reading, or variant, for each element of a finite
// symmetry group. A type is a set of parts, each read in a chosen variant,
// over which every coordinate ranges within its tolerance. So every pair
// of parts in a type agrees within every tolerance, and every part lies
// within half the tolerance of the type's nominal part (the middle of each
// coordinate's range: what is cut).
//
// Fewest types: Solve finds a grouping that keeps the promise with as few
// types as it can (a sweep along the most spread key, then merging and
// emptying types). With two or more coordinates the exact fewest is a box
// cover, NP-hard, so beside the count Solve returns a lower bound (Bound):
// no grouping that keeps the tolerances has fewer types. The bound is the
// larger of the greedy interval cover of a key (CoverCount, optimal for
// one quantity) and a set of parts pairwise out of tolerance; Bound says
// in words which gave it. The count equals the bound when the grouping is
// provably the fewest.
//
// Same structure, same answer: the order of the work is decided on values
// rounded to Resolution, so the types do not depend on the order of the
// parts or on which variant each is given in.
//
// Units are the coordinates' own (millimetres, degrees); the package knows
// nothing of geometry, nets or files.
package parttype
