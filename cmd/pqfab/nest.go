package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"pqfab/geom"
	"pqfab/internal/pipeline"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
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

// stockFlagNames maps stock fields to their flags.
var stockFlagNames = map[string]string{"WidthMM": "sheet", "HeightMM": "sheet", "MarginMM": "margin", "SpacingMM": "spacing", "Rotation": "rotation"}

func runNest(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("nest", "NET", stderr)
	var nf netFlags
	nf.register(fs)
	sheet := fs.String("sheet", "6000x3210", "stock sheet WIDTHxHEIGHT (mm)")
	stock := nest.Stock{Name: "sheet"}
	fs.Float64Var(&stock.MarginMM, "margin", 20, "clear edge strip of the sheet (mm)")
	fs.Float64Var(&stock.SpacingMM, "spacing", 6, "least distance between parts: kerf plus clearance (mm)")
	rotation := fs.String("rotation", "free", "turns allowed: free, quarter or grain (0/180 only)")
	fs.BoolVar(&stock.Mirror, "mirror", false, "parts may be turned over")
	mat := panels.Material{Name: "panel", ThicknessMM: panels.DefaultThicknessMM, DensityKgM3: panels.DefaultDensityKgM3}
	fs.Float64Var(&mat.EdgeInsetMM, "inset", 0, "edge inset of the cut outline (mm)")
	bay := fs.Float64("bay", geom.DefaultBaySizeMM, "bay size for labels (mm)")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if err != nil {
		return err // flag.ErrHelp after -h: run ends without an error
	}
	if stock.WidthMM, stock.HeightMM, err = parseSheet(*sheet); err != nil {
		return usagef("--sheet: %v", err)
	}
	stock.Rotation = nest.Rotation(*rotation)
	if err := stock.Validate(); err != nil {
		return flagError(err, stockFlagNames)
	}
	if err := mat.Validate(); err != nil {
		return flagError(err, map[string]string{"EdgeInsetMM": "inset"})
	}
	in, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	bays, err := geom.NewBays(in.Net.Positions(), *bay, *bay)
	if err != nil {
		return usagef("--bay: %v", err)
	}
	nodeLabels, _ := nodes.Labels(in.Net, in.Topo, bays)
	flats, err := pipeline.Panels(in.Net, in.Topo, mat, bays, nodeLabels)
	if err != nil {
		return err
	}
	worst := 0.0
	for _, f := range flats {
		worst = max(worst, f.FlatnessMM)
	}
	if worst > panels.DefaultFlatTolMM {
		fmt.Fprintf(stderr, "pqfab: warning: panels are up to %.2f mm off flat; outlines are their projections (run planarize first)\n", worst)
	}
	parts := pipeline.Parts(flats)
	res, err := pipeline.Nest(parts, []nest.Stock{stock}, pipeline.Quiet{})
	if err != nil {
		return err
	}
	pipeline.WriteNestText(stdout, res, []nest.Stock{stock}, parts)
	if n := len(res.Unplaced); n > 0 {
		return fmt.Errorf("%d of %d panels fit no sheet (listed above)", n, len(parts))
	}
	return nil
}
