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
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"path/filepath"

	"pqfab/export"
	"pqfab/internal/job"
	"pqfab/internal/outdir"
	"pqfab/internal/pipeline"
	"pqfab/internal/report"
)

// Job is a parsed job file; see the README for its keys.
type Job = job.Job

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
type Report = report.Report

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

// Options say where a build reads its net, what it may replace and
// whether it goes on past panels that miss the flatness tolerance or fit
// no stock (Policy).
type Options struct {
	// Open reads the net file (and the panels file of a CSV pair). Nil
	// reads them from disk (pipeline.OpenFile), and then the job file and the net
	// files are inputs no output may replace (outdir.ForInputs).
	Open Opener
	// Keep lists more files no output may replace, such as the files on
	// disk that Open reads.
	Keep []string
	// Force replaces an output folder or diagnostic report that pqfab did
	// not write; never an input.
	Force bool
	// OnTemp, if set, is told the temporary output folder's path before
	// anything is written into it, so that a signal handler can remove it
	// (outdir.TempFolder).
	OnTemp func(path string)
	Policy
}

// Build runs job j and writes every output into the folder dir, whole or
// not at all; it is the one way a build starts (the command's build and
// demo call it). It checks first that dir and its diagnostic report
// (DIR-planarity.json) may be written: an existing folder is replaced only
// when pqfab wrote it, it is empty, or opt.Force is set, and never when it
// holds an input (outdir.ForInputs). Then it runs the job
// (pipeline.Run), fills the report from the result (report.New) and writes
// every file from the report (export.WriteBuild). A deadline on ctx, or the
// job's nesting.seconds, stops the nesting's search early (with a warning).
// When the flatness tolerance is missed and opt.Continue is false it
// writes only the diagnostic report and returns the *PlanarityFailure
// with Path set. A successful build removes a stale diagnostic report
// that pqfab wrote for dir earlier.
func Build(ctx context.Context, j *Job, dir string, opt Options, obs Observer) (*Report, error) {
	open, inputs := opt.Open, opt.Keep
	if open == nil {
		open, inputs = pipeline.OpenFile, append([]string{j.File, j.NetPath()}, opt.Keep...)
	}
	diag := diagnosticPath(dir)
	diagOpt := outdir.ForInputs(opt.Force, inputs...)
	wopt := diagOpt
	wopt.OnTemp = opt.OnTemp
	if err := outdir.CheckFolder(dir, wopt); err != nil {
		return nil, err
	}
	if err := outdir.CheckFiles(diagOpt, diag); err != nil {
		return nil, err
	}
	res, err := pipeline.Run(ctx, j, open, obs, opt.Policy)
	var pf *PlanarityFailure
	if errors.As(err, &pf) {
		pf.Path = diag
		if werr := outdir.WriteFileAtomic(diag, diagOpt, func(w io.Writer) error {
			enc := json.NewEncoder(w)
			enc.SetIndent("", " ")
			return enc.Encode(pf.Report)
		}); werr != nil {
			return nil, fmt.Errorf("%v (and the diagnostic report could not be written: %v)", err, werr)
		}
		return nil, pf
	} else if err != nil {
		return nil, err
	}
	rep := report.New(res)
	if err := export.WriteBuild(dir, wopt, res.FileNet(), res.Warnings, rep, func(done, total int, what string) { obs.Step("write", done, total, "write "+what) }); err != nil {
		return nil, err
	}
	if err := outdir.RemoveOwnFile(diag); err != nil {
		obs.Warn(fmt.Sprintf("the stale diagnostic report %s could not be removed: %v", diag, err))
	}
	return rep, nil
}

// diagnosticPath returns where a build into dir that misses the flatness
// tolerance writes its diagnostic report: DIR-planarity.json beside dir.
func diagnosticPath(dir string) string { return filepath.Clean(dir) + "-planarity.json" }
