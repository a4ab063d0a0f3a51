package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sync"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/samples"
)

// buildFlags are the options of build and demo.
type buildFlags struct {
	out                string
	quiet, cont, force bool
}

func (bf *buildFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&bf.out, "o", "", "output folder (required); written whole or not at all")
	fs.BoolVar(&bf.quiet, "q", false, "no progress bars")
	fs.BoolVar(&bf.cont, "continue", false, "build even when some panels miss the flatness tolerance or fit no sheet")
	fs.BoolVar(&bf.force, "force", false, "replace an existing output folder that pqfab did not write")
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
	data, err := readJobFile(pos[0])
	if err != nil {
		return err
	}
	j, err := job.Parse(data, pos[0])
	if err != nil {
		return err
	}
	return build(j, pipeline.OpenFile, (&pipeline.Result{Job: j, NetPath: j.NetPath()}).InputFiles(), bf, stdout, stderr)
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
	return build(j, samples.OpenDemo, nil, bf, stdout, stderr)
}

// build runs the job and writes the output folder; a planarization that
// misses the tolerance writes only the diagnostic report beside it. The
// output folder is checked before the work starts; SIGINT and SIGTERM
// remove the temporary folder before pqfab ends.
func build(j *job.Job, open pipeline.Opener, keep []string, bf buildFlags, stdout, stderr io.Writer) error {
	obs := &observer{stderr: stderr, quiet: bf.quiet, hold: true}
	defer obs.finish()
	var mu sync.Mutex
	tmp := ""
	opt := export.WriteOptions{Force: bf.force, Keep: keep, OnTemp: func(p string) { mu.Lock(); tmp = p; mu.Unlock() }}
	stop := onSignal(func() {
		mu.Lock() // held until the exit: build cannot return meanwhile
		if tmp != "" {
			export.RemoveTemp(tmp)
		}
		fmt.Fprintln(stderr, "pqfab: interrupted; nothing written")
		os.Exit(130)
	})
	defer stop()
	defer func() {
		mu.Lock() // wait for a signal handler that has begun: it exits
		tmp = ""
		mu.Unlock()
	}()
	diag := filepath.Clean(bf.out) + "-planarity.json"
	diagOpt := export.WriteOptions{Force: bf.force, Keep: keep}
	if err := export.CheckFolder(bf.out, opt); err != nil {
		return err
	}
	if err := export.CheckFile(diag, diagOpt); err != nil {
		return err
	}
	res, err := pipeline.Run(j, open, obs, pipeline.Policy{Continue: bf.cont})
	var pf *pipeline.PlanarityFailure
	switch {
	case errors.As(err, &pf):
		if werr := export.WriteFileAtomic(diag, diagOpt, func(w io.Writer) error { return writeJSON(w, pf.Report) }); werr != nil {
			return obs.attach(fmt.Errorf("%v (and the diagnostic report could not be written: %v)", err, werr))
		}
		return obs.attach(fmt.Errorf("%v; nothing built (diagnostic report: %s; --continue builds anyway)", err, diag))
	case errors.Is(err, pipeline.ErrUnplaced):
		return obs.attach(fmt.Errorf("%w; add a larger or more stock, or --continue lists them as unplaced", err))
	case err != nil:
		return obs.attach(err)
	}
	rep, err := pipeline.Write(bf.out, res, opt, obs)
	if err != nil {
		return obs.attach(err)
	}
	obs.finish()
	if err := export.RemoveOwnFile(diag); err != nil {
		obs.Warn(fmt.Sprintf("the stale diagnostic report %s could not be removed: %v", diag, err))
	}
	pipeline.WriteBuildText(stdout, bf.out, rep)
	obs.flush()
	return nil
}

// readJobFile reads a job file: a regular file of at most job.MaxFileBytes.
func readJobFile(path string) ([]byte, error) {
	st, err := os.Stat(path)
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return nil, &geom.InputError{File: path, Msg: err.Error()}
	}
	if !st.Mode().IsRegular() {
		return nil, &geom.InputError{File: path, Msg: "is not a regular file (a folder, FIFO, device or socket)"}
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &geom.InputError{File: path, Msg: errors.Unwrap(err).Error()}
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, job.MaxFileBytes+1))
	if err != nil {
		return nil, &geom.InputError{File: path, Msg: "read failed: " + err.Error()}
	}
	return data, nil
}
