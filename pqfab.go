// Package pqfab runs a gridshell fabrication job from Go, as the pqfab
// command's build does: parse a job file (ParseJob), run it (Run: read and
// check the net, planarize it, compute node axes, members, hubs, flat
// panels, types and nesting) and write the output folder (Write).
//
// Lengths are millimetres and angles degrees in every result field named
// …Deg; z is up and panels run counter-clockwise seen from above or
// outside. pqfab computes geometry only: it does not check strength,
// stability, glass safety or connections; a qualified structural engineer,
// local codes and licensed practice decide.
package pqfab

import (
	"context"
	"pqfab/export"
	"pqfab/internal/job"
	"pqfab/internal/outdir"
	"pqfab/internal/pipeline"
)

// Job is a parsed job file; see the README for its keys.
type Job = job.Job

// Result is everything a job computed.
type Result = pipeline.Result

// Observer is told of progress and warnings.
type Observer = pipeline.Observer

// Opener opens the net file (and the panels file of a CSV pair).
type Opener = pipeline.Opener

// Policy says whether a build goes on when panels miss the flatness
// tolerance or fit no stock sheet.
type Policy = pipeline.Policy

// WriteOptions say what Write may replace (Force) and which input files
// it must keep (Keep).
type WriteOptions = outdir.Options

// ParseJob reads and checks a job file's text; file names it in messages
// and is where the net file is looked for.
func ParseJob(data []byte, file string) (*Job, error) { return job.Parse(data, file) }

// Run runs a job; open reads the net (pipeline.OpenFile reads from disk).
// A deadline on ctx stops the nesting's search early (with a warning).
func Run(ctx context.Context, j *Job, open Opener, obs Observer, pol Policy) (*Result, error) {
	return pipeline.Run(ctx, j, open, obs, pol)
}

// Write writes every output of a result into the folder dir, atomically,
// and returns the report model. It replaces an existing folder only when
// pqfab wrote it, it is empty, or opt.Force is set, and never a folder
// holding the job's input files.
func Write(dir string, r *Result, opt WriteOptions, obs Observer) (*export.Report, error) {
	opt.Keep = append(opt.Keep, pipeline.OutputOptions(opt.Force, r.Job.File, r.NetPath).Keep...)
	return pipeline.Write(dir, r, opt, obs)
}
