package main

import (
	"fmt"
	"io"
	"strings"

	"pqfab/export"
	"pqfab/internal/outdir"
	"pqfab/samples"
)

func runSample(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("sample", "NAME -o FILE", stderr)
	out := fs.String("o", "", "output OBJ file (required)")
	force := fs.Bool("force", false, "replace an existing file that pqfab did not write")
	count := fs.Int("panels", samples.DefaultPanels, fmt.Sprintf("about how many panels (%d to %d)", samples.MinPanels, samples.MaxPanels))
	pos, err := parseCommand(fs, args, 1, "one name ("+strings.Join(samples.Names(), ", ")+")")
	if err != nil {
		return err
	}
	if *out == "" {
		return usagef("sample needs -o FILE")
	}
	net, err := samples.Make(pos[0], *count)
	if err != nil {
		return usagef("%v", err)
	}
	if err := outdir.WriteFileAtomic(*out, outdir.ForInputs(*force), func(w io.Writer) error {
		return export.WriteOBJ(w, net, fmt.Sprintf("pqfab sample %s: %s", pos[0], samples.Describe(pos[0])))
	}); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s: %d nodes, %d panels\n", *out, len(net.Nodes), len(net.Faces))
	return nil
}
