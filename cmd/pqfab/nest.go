package main

import (
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
)

// parseSheet reads a stock size "WIDTHxHEIGHT" in mm.
func parseSheet(s string) (float64, float64, error) {
	w, h, ok := strings.Cut(strings.ToLower(s), "x")
	if !ok {
		return 0, 0, fmt.Errorf("sheet size %q: want WIDTHxHEIGHT in mm, such as 6000x3210", s)
	}
	wf, err1 := strconv.ParseFloat(strings.TrimSpace(w), 64)
	hf, err2 := strconv.ParseFloat(strings.TrimSpace(h), 64)
	if err1 != nil || err2 != nil || !(wf > 0) || !(hf > 0) {
		return 0, 0, fmt.Errorf("sheet size %q: want two positive numbers in mm", s)
	}
	return wf, hf, nil
}

// flatParts lays the panels of a net flat, labels them by their bays and
// returns them as parts to nest.
func flatParts(net *geom.Net, topo *geom.Topology, mat panels.Material, bays geom.Bays, nodeLabels []string) ([]panels.Flat, []nest.Part, error) {
	labels := panels.Labels(net, bays, nodeLabels)
	flats, err := panels.Flatten(net, topo, mat, labels)
	if err != nil {
		return nil, nil, err
	}
	parts := make([]nest.Part, len(flats))
	for i, f := range flats {
		parts[i] = nest.Part{Label: f.Label, Outline: f.Cut}
	}
	return flats, parts, nil
}

func runNest(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("nest", "NET", stderr)
	var nf netFlags
	nf.register(fs)
	sheet := fs.String("sheet", "6000x3210", "stock sheet WIDTHxHEIGHT (mm)")
	margin := fs.Float64("margin", 20, "clear edge strip of the sheet (mm)")
	spacing := fs.Float64("spacing", 6, "least distance between parts: kerf plus clearance (mm)")
	rotation := fs.String("rotation", "free", "turns allowed: free, quarter or grain (0/180 only)")
	mirror := fs.Bool("mirror", false, "parts may be turned over")
	inset := fs.Float64("inset", 0, "edge inset of the cut outline (mm)")
	bay := fs.Float64("bay", geom.DefaultBaySizeMM, "bay size for labels (mm)")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if errors.Is(err, errHelp) {
		return nil
	} else if err != nil {
		return err
	}
	w, h, err := parseSheet(*sheet)
	if err != nil {
		return usagef("--sheet: %v", err)
	}
	net, topo, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	bays, err := geom.NewBays(net.Positions(), *bay, *bay)
	if err != nil {
		return usagef("--bay: %v", err)
	}
	mat := panels.Material{Name: "panel", ThicknessMM: panels.DefaultThicknessMM, DensityKgM3: panels.DefaultDensityKgM3, EdgeInsetMM: *inset}
	nodeLabels, _ := nodes.Labels(net, topo, bays)
	flats, parts, err := flatParts(net, topo, mat, bays, nodeLabels)
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
	stock := nest.Stock{Name: "sheet", WidthMM: w, HeightMM: h, MarginMM: *margin, SpacingMM: *spacing, Rotation: nest.Rotation(*rotation), Mirror: *mirror}
	res, err := nest.Nest(parts, []nest.Stock{stock})
	if err != nil {
		return usagef("%v", err)
	}
	printNest(stdout, res, []nest.Stock{stock}, parts)
	return nil
}

func printNest(w io.Writer, res *nest.Result, stocks []nest.Stock, parts []nest.Part) {
	placed := 0
	for _, sh := range res.Sheets {
		placed += len(sh.Placements)
	}
	fmt.Fprintf(w, "%d parts, %.2f m² in all; %d placed on %d sheets (%s ordering), %d unplaced\n",
		len(parts), res.PartAreaMM2/1e6, placed, len(res.Sheets), res.Ordering, len(res.Unplaced))
	for _, u := range res.Stocks {
		s := stocks[u.Stock]
		if u.Sheets == 0 {
			continue
		}
		fmt.Fprintf(w, "stock %s: %d sheets, area bound %d (ratio %.3f)\n", s.Describe(), u.Sheets, u.AreaBound, float64(u.Sheets)/float64(u.AreaBound))
	}
	fmt.Fprintf(w, "  %-6s %-24s %6s %12s\n", "sheet", "stock", "parts", "utilization")
	var total float64
	for i, sh := range res.Sheets {
		fmt.Fprintf(w, "  %-6s %-24s %6d %11.1f%%\n", export.SheetName(i, len(res.Sheets)), stocks[sh.Stock].Describe(), len(sh.Placements), 100*sh.Utilization)
		total += sh.Utilization
	}
	if len(res.Sheets) > 0 {
		fmt.Fprintf(w, "  mean utilization %.1f%%\n", 100*total/float64(len(res.Sheets)))
	}
	for _, u := range res.Unplaced {
		fmt.Fprintf(w, "  unplaced %s: %s\n", parts[u.Part].Label, u.Reason)
	}
}
