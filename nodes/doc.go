// Package nodes computes what the structure's members and nodes need for
// fabrication: node axes (normal or least-twist), members with system and
// cut lengths, twist, member frames and end cuts (mitre and bevel at a hub),
// node hub angles, labels from plan bays, and member and node types. It
// writes no files.
//
// Lengths are millimetres; angles are radians inside and degrees in every
// exported field named …Deg. z is up; panels run counter-clockwise seen
// from above or outside, so node axes point up or out.
package nodes
