package main

import (
	"context"
	"fmt"
	"io"
	"strconv"
	"strings"

	"pqfab/internal/pipeline"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/quadnet"
)

// parseSheet reads a stock size "WIDTHxHEIGHT" in mm.
func parseSheet(s string) (w, h float64, err error) {
	a, b, _ := strings.Cut(strings.ToLower(s), "x")
	if w, err = strconv.ParseFloat(strings.TrimSpace(a), 64); err == nil {
		h, err = strconv.ParseFloat(strings.TrimSpace(b), 64)
	}
	if err != nil {
		err = fmt.Errorf("sheet size %q: want WIDTHxHEIGHT in mm, such as 6000x3210", s)
	}
	return w, h, err
}

func runNest(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs, names := newFlags("nest", "NET", stderr), fieldFlags{"WidthMM": "sheet", "HeightMM": "sheet"}
	var nf netFlags
	nf.register(fs)
	stock := nest.DefaultStock("sheet")
	sheet := fs.String("sheet", fmt.Sprintf("%gx%g", stock.WidthMM, stock.HeightMM), "stock sheet WIDTHxHEIGHT (mm)")
	names.float(fs, &stock.MarginMM, "margin", "MarginMM", "clear edge strip of the sheet (mm)")
	names.float(fs, &stock.SpacingMM, "spacing", "SpacingMM", "least distance between parts: kerf plus clearance (mm)")
	names.text(fs, (*string)(&stock.Rotation), "rotation", "Rotation", "turns allowed: free, quarter or grain (0/180 only)")
	fs.BoolVar(&stock.Mirror, "mirror", stock.Mirror, "parts may be turned over")
	mat := panels.DefaultMaterial()
	names.float(fs, &mat.EdgeInsetMM, "inset", "EdgeInsetMM", "edge inset of the cut outline (mm)")
	bay := fs.Float64("bay", quadnet.DefaultBaySizeMM, "bay size for labels (mm)")
	asJSON := fs.Bool("json", false, "print JSON for machines")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	if stock.WidthMM, stock.HeightMM, err = parseSheet(*sheet); err != nil {
		return usagef("--sheet: %v", err)
	}
	if err := names.check(stock.Validate(), mat.Validate()); err != nil {
		return err
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	sum, worst, err := pipeline.NestNet(context.Background(), in, mat, []nest.Stock{stock}, *bay)
	if err != nil {
		return err
	}
	if worst > panels.DefaultFlatTolMM {
		fmt.Fprintf(stderr, "pqfab: warning: panels are up to %.2f mm off flat; outlines are their projections (run planarize first)\n", worst)
	}
	if err := show(stdout, *asJSON, sum); err != nil || len(sum.Unplaced) == 0 {
		return err
	}
	return fmt.Errorf("%d of %d panels fit no sheet (listed above)", len(sum.Unplaced), sum.Parts)
}
