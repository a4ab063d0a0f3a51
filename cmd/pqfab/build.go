package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"

	"pqfab"
	"pqfab/internal/outdir"
	"pqfab/internal/report"
	"pqfab/samples"
)

// buildFlags are the options of build and demo.
type buildFlags struct {
	out                string
	quiet, cont, force bool
	nestSeconds        float64
}

func (bf *buildFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&bf.out, "o", "", "output folder (required); written whole or not at all")
	fs.BoolVar(&bf.quiet, "q", false, "no progress bars")
	fs.BoolVar(&bf.cont, "continue", false, "build even when some panels miss the flatness tolerance or fit no sheet")
	fs.BoolVar(&bf.force, "force", false, "replace an existing output folder that pqfab did not write")
	fs.Float64Var(&bf.nestSeconds, "nest-seconds", -1, "stop the nesting search after this many seconds (default: the job's nesting.seconds; 0: no limit)")
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
	j, err := pqfab.ReadJob(pos[0])
	if err != nil {
		return err
	}
	return build(j, nil, bf, stdout, stderr) // nil: the job's net is read from disk
}

func runDemo(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	bf, _, err := parseBuild("demo", "-o DIR", args, 0, "no arguments, only -o DIR", stderr)
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	j, err := pqfab.ParseJob(samples.DemoJob(), samples.DemoJobName)
	if err != nil {
		return err
	}
	return build(j, samples.OpenDemo, bf, stdout, stderr) // the demo reads nothing from disk
}

// build runs the job and writes the output folder (pqfab.Build). SIGINT
// and SIGTERM remove the temporary folder before pqfab ends.
func build(j *pqfab.Job, open pqfab.Opener, bf buildFlags, stdout, stderr io.Writer) error {
	obs := &observer{stderr: stderr, quiet: bf.quiet}
	defer obs.finish()
	var tmp outdir.TempFolder
	stop := onSignal(func() {
		tmp.Remove() // holds tmp's lock until the exit: build cannot return meanwhile
		fmt.Fprintln(stderr, "pqfab: interrupted; nothing written")
		os.Exit(130)
	})
	defer stop()
	defer tmp.Done() // waits for a signal handler that has begun: it exits
	opt := pqfab.Options{Open: open, Force: bf.force, OnTemp: tmp.Set, Policy: pqfab.Policy{Continue: bf.cont}}
	if bf.nestSeconds >= 0 {
		j.Nesting.Seconds = bf.nestSeconds // the flag overrides the job
	}
	rep, err := pqfab.Build(context.Background(), j, bf.out, opt, obs)
	var pf *pqfab.PlanarityFailure
	switch {
	case errors.As(err, &pf):
		return obs.attach(fmt.Errorf("%v; nothing built (diagnostic report: %s; --continue builds anyway)", err, pf.Path))
	case errors.Is(err, pqfab.ErrUnplaced), errors.Is(err, pqfab.ErrMembersUnplaced):
		return obs.attach(fmt.Errorf("%w; add a larger or more stock, or --continue lists them as unplaced", err))
	case err != nil:
		return obs.attach(err)
	}
	obs.finish()
	report.WriteText(stdout, bf.out, rep)
	obs.flush()
	return nil
}
