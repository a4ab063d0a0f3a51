// Package pqfab runs a gridshell fabrication job from Go, as the pqfab
// command's build and demo do: read a job file (ReadJob, ParseJob) and
// build it into an output folder (Build: read and check the net,
// planarize it, compute node axes, members, hubs, flat panels, types and
// nesting, and write the folder whole or not at all). Build is the one
// entry point; the command uses it too.
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
	"pqfab/internal/pipeline"
)

// Job is a parsed job file; see the README for its keys.
type Job = job.Job

// Options say where a build reads its net (Open; nil: from disk), which
// files it must never replace (the job and net files when read from
// disk, and Keep), whether it replaces an output folder pqfab did not
// write (Force) and whether it goes on past panels that miss the
// flatness tolerance or fit no stock (Continue).
type Options = pipeline.BuildOptions

// Policy says whether a build goes on when panels miss the flatness
// tolerance or fit no stock sheet (Options.Policy).
type Policy = pipeline.Policy

// Opener opens the net file (and the panels file of a CSV pair).
type Opener = pipeline.Opener

// Observer is told of progress and warnings.
type Observer = pipeline.Observer

// Quiet is an Observer that ignores everything.
type Quiet = pipeline.Quiet

// Report is what a build wrote: the model of every output file.
type Report = export.Report

// PlanarityFailure is the error of a build whose panels miss the flatness
// tolerance (without Continue); Path is its diagnostic report.
type PlanarityFailure = pipeline.PlanarityFailure

// ErrUnplaced and ErrMembersUnplaced are wrapped by the error of a build
// whose panels fit no stock sheet, or member blanks no bar (without
// Continue).
var (
	ErrUnplaced        = pipeline.ErrUnplaced
	ErrMembersUnplaced = pipeline.ErrMembersUnplaced
)

// ReadJob reads and checks the job file at path.
func ReadJob(path string) (*Job, error) { return job.ReadFile(path) }

// ParseJob reads and checks a job file's text; file names it in messages
// and is where the net file is looked for.
func ParseJob(data []byte, file string) (*Job, error) { return job.Parse(data, file) }

// Build runs job j and writes every output into the folder dir, whole or
// not at all. Before any work it checks that dir and its diagnostic
// report (DIR-planarity.json) may be written: an existing folder is
// replaced only when pqfab wrote it, it is empty, or opt.Force is set, and
// never when it holds an input. When the panels miss the flatness
// tolerance and opt.Continue is false, Build writes only the diagnostic
// report and returns a *PlanarityFailure. A deadline on ctx, or the job's
// nesting.seconds, stops the nesting's search early (with a warning).
func Build(ctx context.Context, j *Job, dir string, opt Options, obs Observer) (*Report, error) {
	return pipeline.Build(ctx, j, dir, opt, obs)
}
