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

// Build is the whole build of job j into the folder dir: it checks first
// that dir and its diagnostic report may be written (opt, from
// OutputOptions), then runs the
// job (Run) and writes the folder (Write). When the flatness tolerance is
// missed and pol.Continue is false it writes only the diagnostic report
// and returns the *PlanarityFailure with Path set. A successful build
// removes a stale diagnostic report that pqfab wrote for dir earlier.
func Build(ctx context.Context, j *job.Job, open Opener, dir string, opt outdir.Options, pol Policy, obs Observer) (*export.Report, error) {
	diag := DiagnosticPath(dir)
	diagOpt := outdir.Options{Force: opt.Force, Keep: opt.Keep}
	if err := outdir.CheckFolder(dir, opt); err != nil {
		return nil, err
	}
	if err := outdir.CheckFiles(diagOpt, diag); err != nil {
		return nil, err
	}
	res, err := Run(ctx, j, open, obs, pol)
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
	rep, err := Write(dir, res, opt, obs)
	if err != nil {
		return nil, err
	}
	if err := outdir.RemoveOwnFile(diag); err != nil {
		obs.Warn(fmt.Sprintf("the stale diagnostic report %s could not be removed: %v", diag, err))
	}
	return rep, nil
}
