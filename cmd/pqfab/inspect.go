package main

import (
	"io"

	"pqfab/internal/pipeline"
)

func runInspect(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("inspect", "NET", stderr)
	var nf netFlags
	nf.register(fs)
	asJSON := fs.Bool("json", false, "print JSON for machines")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	ins, err := pipeline.Inspect(pos[0], in.Net, in.Topo)
	if err != nil {
		return err
	}
	return show(stdout, *asJSON, ins)
}
