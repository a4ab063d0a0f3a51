package pipeline

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/outdir"
)

// DiagnosticPath returns where a build into dir that misses the flatness
// tolerance writes its diagnostic report: DIR-planarity.json beside dir.
func DiagnosticPath(dir string) string { return filepath.Clean(dir) + "-planarity.json" }

// OutputOptions returns the rules every command writes its outputs by
// (build and demo, planarize -o and --report, sample -o): an existing
// output is replaced only when pqfab wrote it, or with force; never an
// input read from disk (each of inputs, such as the job file and the net
// file, and the panels file of a CSV net pair), a folder holding one, the
// current folder or the home folder or a folder above them, or the root
// (see outdir). Empty inputs are skipped.
func OutputOptions(force bool, inputs ...string) outdir.Options {
	opt := outdir.Options{Force: force}
	for _, in := range inputs {
		if in == "" {
			continue
		}
		opt.Keep = append(opt.Keep, in)
		if pp, err := geom.PanelsPathFor(in); err == nil && strings.EqualFold(filepath.Ext(in), ".csv") {
			opt.Keep = append(opt.Keep, pp)
		}
	}
	return opt
}

// BuildOptions say where a build reads its net, what it may replace and
// whether it goes on past panels that miss the flatness tolerance or fit
// no stock (Policy).
type BuildOptions struct {
	// Open reads the net file (and the panels file of a CSV pair). Nil
	// reads them from disk (OpenFile), and then the job file and the net
	// files are inputs no output may replace (OutputOptions).
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

// Build is the whole build of job j into the folder dir (the module
// root's pqfab.Build is its public name, and the command's build and demo
// call that): it checks first that dir and its diagnostic report may be
// written (OutputOptions), then runs the job (Run) and writes the folder.
// When the flatness tolerance is missed and opt.Continue is false it
// writes only the diagnostic report and returns the *PlanarityFailure
// with Path set. A successful build removes a stale diagnostic report
// that pqfab wrote for dir earlier.
func Build(ctx context.Context, j *job.Job, dir string, opt BuildOptions, obs Observer) (*export.Report, error) {
	open, inputs := opt.Open, opt.Keep
	if open == nil {
		open, inputs = OpenFile, append([]string{j.File, j.NetPath()}, opt.Keep...)
	}
	diag := DiagnosticPath(dir)
	diagOpt := OutputOptions(opt.Force, inputs...)
	wopt := diagOpt
	wopt.OnTemp = opt.OnTemp
	if err := outdir.CheckFolder(dir, wopt); err != nil {
		return nil, err
	}
	if err := outdir.CheckFiles(diagOpt, diag); err != nil {
		return nil, err
	}
	res, err := Run(ctx, j, open, obs, opt.Policy)
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
	rep, err := write(dir, res, wopt, obs)
	if err != nil {
		return nil, err
	}
	if err := outdir.RemoveOwnFile(diag); err != nil {
		obs.Warn(fmt.Sprintf("the stale diagnostic report %s could not be removed: %v", diag, err))
	}
	return rep, nil
}
