// Package nodes computes what the structure's members and nodes need for
// fabrication: node axes (normal or least-twist), members with system and
// cut lengths, twist, member frames and end cuts (mitre and bevel at a hub),
// node hub angles, labels from plan bays, and member and node types. It
// writes no files.
//
// A type is a promise: every two members of a member type agree within
// the length tolerance in cut length and within the angle tolerance in
// both ends' mitre and bevel and in twist, each read from the end its type
// says (ends swapped, bevels turned); every two nodes of a node type have
// the same members at node and agree within the angle tolerance in every
// arm's elevation and azimuth from the type's first arm. Each type's
// nominal part is the middle of each value's range, so every part lies
// within half the tolerance of it. See parttype.Solve for the method.
//
// Lengths are millimetres; angles are radians inside and degrees in every
// exported field named …Deg. z is up; panels run counter-clockwise seen
// from above or outside, so node axes point up or out.
package nodes
