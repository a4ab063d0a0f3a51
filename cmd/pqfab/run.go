package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"pqfab/internal/pipeline"
)

// usageError marks a mistake in the command line (exit code 2).
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, args ...any) error { return &usageError{fmt.Sprintf(format, args...)} }

func exitCode(err error) int {
	var u *usageError
	if errors.As(err, &u) {
		return 2
	}
	return 1
}

type command struct {
	name, args, help string
	run              func(args []string, stdin io.Reader, stdout, stderr io.Writer) error
}

func commands() []command {
	return []command{
		{"demo", "-o DIR", "run the built-in demo job (the entrance vault of the invented Larkspur Lane Library) into DIR", runDemo},
		{"build", "JOB.toml -o DIR", "run a whole job: flat panels, members, nesting, DXF, XLSX, JSON", runBuild},
		{"inspect", "NET", "read and check a net; print counts, bounds, members at node and planarity", runInspect},
		{"sample", "NAME -o FILE", "write a sample net as OBJ (canopy, dome, wave)", runSample},
		{"members", "NET", "node axes, member lengths, twist and end cuts; twist spread and type counts", runMembers},
		{"nest", "NET", "lay the panels flat and nest them on stock sheets; per-sheet utilization", runNest},
		{"planarize", "NET -o OUT.obj", "make every panel flat by the smallest smooth node moves", runPlanarize},
	}
}

// run is the whole program: it parses args and runs one command.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	if len(args) == 0 || args[0] == "help" || args[0] == "-h" || args[0] == "--help" {
		printUsage(stdout)
		if len(args) == 0 {
			return usagef("no command given")
		}
		return nil
	}
	for _, c := range commands() {
		if c.name == args[0] {
			if err := c.run(args[1:], stdin, stdout, stderr); !errors.Is(err, flag.ErrHelp) {
				return err
			}
			return nil // the flag set printed the help asked for
		}
	}
	return usagef("unknown command %q (run `pqfab help`)", args[0])
}

func printUsage(w io.Writer) {
	fmt.Fprint(w, "pqfab: fabrication data for planar-quad gridshells\n\nUsage: pqfab COMMAND [options]\n\nCommands:\n")
	for _, c := range commands() {
		fmt.Fprintf(w, "  %-10s %-22s %s\n", c.name, c.args, c.help)
	}
	fmt.Fprint(w, "\nRun `pqfab COMMAND -h` for a command's options.\n\nCaution: "+pipeline.Caution+"\n")
}

// newFlags returns a flag set that reports errors instead of exiting.
func newFlags(name, args string, stderr io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() {
		fmt.Fprintf(stderr, "Usage: pqfab %s %s [options]\n", name, args)
		fs.PrintDefaults()
	}
	return fs
}

// parseCommand parses a command's flags and checks it got want positional
// arguments, described by what ("one net file").
func parseCommand(fs *flag.FlagSet, args []string, want int, what string) ([]string, error) {
	pos, err := parseFlags(fs, args)
	if err != nil {
		return nil, err
	}
	if len(pos) != want {
		return nil, usagef("%s takes %s, got %d arguments", fs.Name(), what, len(pos))
	}
	return pos, nil
}

// parseFlags parses flags that may come before or after positional args.
func parseFlags(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return nil, err
			}
			return nil, &usageError{err.Error()}
		}
		args = fs.Args()
		if len(args) == 0 {
			return pos, nil
		}
		if args[0] == "--" {
			return append(pos, args[1:]...), nil
		}
		pos = append(pos, args[0])
		args = args[1:]
	}
}
