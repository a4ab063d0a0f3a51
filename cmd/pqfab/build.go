package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/samples"
)

// buildFlags are the options of build and demo.
type buildFlags struct {
	out   string
	quiet bool
	cont  bool
}

func (bf *buildFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&bf.out, "o", "", "output folder (required); written whole or not at all")
	fs.BoolVar(&bf.quiet, "q", false, "no progress bars")
	fs.BoolVar(&bf.cont, "continue", false, "build even when some panels miss the flatness tolerance or fit no sheet")
}

// parseBuild parses the flags of build or demo.
func parseBuild(name, args string, argv []string, want int, what string, stderr io.Writer) (buildFlags, []string, error) {
	fs := newFlags(name, args, stderr)
	var bf buildFlags
	bf.register(fs)
	pos, err := parseCommand(fs, argv, want, what)
	if err == nil && bf.out == "" {
		err = usagef("%s needs -o DIR", name)
	}
	return bf, pos, err
}

func runBuild(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	bf, pos, err := parseBuild("build", "JOB.toml -o DIR", args, 1, "one job file", stderr)
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	data, err := os.ReadFile(pos[0])
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return &geom.InputError{File: pos[0], Msg: err.Error()}
	}
	j, err := job.Parse(data, pos[0])
	if err != nil {
		return err
	}
	return build(j, pipeline.OpenFile, bf, stdout, stderr)
}

func runDemo(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	bf, _, err := parseBuild("demo", "-o DIR", args, 0, "no arguments, only -o DIR", stderr)
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	j, err := job.Parse(samples.DemoJob(), samples.DemoJobName)
	if err != nil {
		return err
	}
	return build(j, samples.OpenDemo, bf, stdout, stderr)
}

// build runs the job and writes the output folder; a planarization that
// misses the tolerance writes only the diagnostic report beside it.
func build(j *job.Job, open pipeline.Opener, bf buildFlags, stdout, stderr io.Writer) error {
	obs := &observer{stderr: stderr, quiet: bf.quiet}
	defer obs.finish()
	res, err := pipeline.Run(j, open, obs, pipeline.Policy{Continue: bf.cont})
	var pf *pipeline.PlanarityFailure
	switch {
	case errors.As(err, &pf):
		diag := filepath.Clean(bf.out) + "-planarity.json"
		if werr := export.WriteFileAtomic(diag, func(w io.Writer) error { return writeJSON(w, pf.Report) }); werr != nil {
			return fmt.Errorf("%v (and the diagnostic report could not be written: %v)", err, werr)
		}
		return fmt.Errorf("%v; nothing built (diagnostic report: %s; --continue builds anyway)", err, diag)
	case errors.Is(err, pipeline.ErrUnplaced):
		return fmt.Errorf("%w; add a larger or more stock, or --continue lists them as unplaced", err)
	case err != nil:
		return err
	}
	rep, err := pipeline.Write(bf.out, res, obs)
	if err != nil {
		return err
	}
	obs.finish()
	pipeline.WriteBuildText(stdout, bf.out, rep)
	return nil
}
