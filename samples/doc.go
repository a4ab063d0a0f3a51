// Package samples generates the demo nets of pqfab's own invented scenario:
// a fictional town library, the Larkspur Lane Library, with a glazed
// entrance vault (the wave sample, the demo job's net), a courtyard canopy
// and a reading-room dome. Every number in this package is invented for the demo. Library
// code never imports it.
//
// Lengths are millimetres; z is up; panels run counter-clockwise seen from
// above or outside.
package samples
