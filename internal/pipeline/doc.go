// Package pipeline runs a pqfab job end to end, in one direction: read and
// check the net, planarize it, compute node axes, members and hubs, lay
// the panels flat and type them, nest them on stock sheets, and hand the
// result to the writers in package export. Each stage is a function of its
// own (LoadNet, Supports, Planarize, Structure, Panels, Nest) so that the
// single-stage commands run exactly what the whole build runs; Run chains
// them for a job file, and Build checks the output, runs the job and
// writes the output folder. Build is the one way a build starts: the
// module root's pqfab.Build is Build, and the command's build and demo
// call it.
//
// Lengths are millimetres, angles degrees in every result field named
// …Deg; z is up and panels run counter-clockwise seen from above or
// outside. The package never prints, exits or reads the clock: progress
// and warnings go to an Observer, and files are opened through an Opener.
package pipeline
