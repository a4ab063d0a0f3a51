// Package pipeline runs a pqfab job end to end, in one direction: read and
// check the net, planarize it, compute node axes, members and hubs, lay
// the panels flat and type them, and nest them on stock sheets, into one
// Result; it writes nothing (package report turns the Result into the
// model the writers in package export read). Each stage is a function of
// its own (LoadNet, Supports, Planarize, Structure, Panels, Nest) so that
// the single-stage commands run exactly what the whole build runs; Run
// chains them for a job file. A build starts in one place, the module
// root's pqfab.Build, which checks the output folder, runs the job, fills
// the report and writes the folder; the command's build and demo call it.
//
// Lengths are millimetres, angles degrees in every result field named
// …Deg; z is up and panels run counter-clockwise seen from above or
// outside. The package never prints, exits or reads the clock: progress
// and warnings go to an Observer, and files are opened through an Opener.
package pipeline

// Caution is printed in every report, schedule, drawing and plan, and by
// the command.
const Caution = "pqfab computes geometry only. It does not check strength, stability, glass safety or " +
	"connections. A qualified structural engineer must check the design; local building codes and " +
	"licensed practice decide. Check every figure before cutting."
