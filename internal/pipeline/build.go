package pipeline

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
)

// DiagnosticPath returns where a build into dir that misses the flatness
// tolerance writes its diagnostic report: DIR-planarity.json beside dir.
func DiagnosticPath(dir string) string { return filepath.Clean(dir) + "-planarity.json" }

// Build is the whole build of job j into the folder dir: it checks first
// that dir and its diagnostic report may be written (opt), then runs the
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
