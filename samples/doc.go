// Package samples generates the demo nets of pqfab's own invented scenario:
// a glazed courtyard canopy for a fictional town library, the Larkspur Lane
// Library. Every number in this package is invented for the demo. Library
// code never imports it.
//
// Lengths are millimetres; z is up; panels run counter-clockwise seen from
// above or outside.
package samples
