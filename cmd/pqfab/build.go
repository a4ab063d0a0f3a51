package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path"
	"path/filepath"
	"strings"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
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
	fs.BoolVar(&bf.cont, "continue", false, "build even when some panels miss the flatness tolerance")
}

func runBuild(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("build", "JOB.toml -o DIR", stderr)
	var bf buildFlags
	bf.register(fs)
	pos, err := parseCommand(fs, args, 1, "one job file")
	if errors.Is(err, errHelp) {
		return nil
	} else if err != nil {
		return err
	}
	if bf.out == "" {
		return usagef("build needs -o DIR")
	}
	data, err := os.ReadFile(pos[0])
	if err != nil {
		return &geom.InputError{File: pos[0], Msg: strings.TrimPrefix(err.Error(), "open "+pos[0]+": ")}
	}
	job, err := ParseJob(data, pos[0])
	if err != nil {
		return err
	}
	netPath := job.Net.File
	if !filepath.IsAbs(netPath) {
		netPath = filepath.Join(filepath.Dir(pos[0]), netPath)
	}
	open := func(name string) (io.ReadCloser, error) { return os.Open(name) }
	return build(job, open, netPath, bf, stdout, stderr)
}

func runDemo(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("demo", "-o DIR", stderr)
	var bf buildFlags
	bf.register(fs)
	_, err := parseCommand(fs, args, 0, "no arguments, only -o DIR")
	if errors.Is(err, errHelp) {
		return nil
	} else if err != nil {
		return err
	}
	if bf.out == "" {
		return usagef("demo needs -o DIR")
	}
	job, err := ParseJob(samples.DemoJob(), samples.DemoJobName)
	if err != nil {
		return err
	}
	return build(job, samples.OpenDemo, path.Join(path.Dir(samples.DemoJobName), job.Net.File), bf, stdout, stderr)
}

// build runs the whole job and writes the output folder.
func build(job *Job, open func(string) (io.ReadCloser, error), netPath string, bf buildFlags, stdout, stderr io.Writer) error {
	unit, _ := geom.ParseUnit(job.Net.Unit)
	net, err := geom.ReadFrom(open, netPath, unit)
	if err != nil {
		return err
	}
	topo, warnings, err := checkNet(net, job.Net.MergeTolMM, job.Net.Reorient, stderr)
	if err != nil {
		return err
	}

	// Supports and planarization.
	choice := job.Supports.Mode
	if choice == "list" {
		choice = strings.Join(job.Supports.Nodes, ",")
	}
	fixed, err := supportMask(choice, net, topo)
	if err != nil {
		return job.errorf("supports.nodes", "%v", err)
	}
	popt := panels.PlanarizeOptions{TolMM: job.Flatness.TolMM, MaxMoveMM: job.Flatness.MaxMoveMM, Fairness: job.Flatness.Fairness,
		Vertical: job.Flatness.VerticalOnly, MaxIter: job.Flatness.MaxIter, Fixed: fixed}
	pres, perr := planarizeNet(net, topo, popt, stderr, bf.quiet)
	if pres == nil {
		return perr
	}
	if perr != nil {
		if !bf.cont {
			diag := filepath.Clean(bf.out) + "-planarity.json"
			rep := newPlanarizeReport(net, popt, pres, 0)
			rep.Seconds = 0
			if err := export.WriteFileAtomic(diag, func(w io.Writer) error { return writeJSON(w, rep) }); err != nil {
				return fmt.Errorf("%v (and the diagnostic report could not be written: %v)", perr, err)
			}
			return fmt.Errorf("%v; nothing built (diagnostic report: %s; --continue builds anyway)", perr, diag)
		}
		warnings = append(warnings, "built with panels over the flatness tolerance: "+perr.Error())
		fmt.Fprintln(stderr, "pqfab: warning: continuing:", perr)
	}
	flat := net.Clone()
	for i := range flat.Nodes {
		flat.Nodes[i].Pos = pres.Positions[i]
	}

	// Nodes, members, panels.
	bays, err := geom.NewBays(flat.Positions(), job.Nodes.BayMM, job.Nodes.BayMM)
	if err != nil {
		return job.errorf("nodes.bay_mm", "%v", err)
	}
	st, err := nodes.Build(flat, topo, nodes.Options{Axis: nodes.AxisMethod(job.Nodes.Axis), HubRadiusMM: job.Nodes.HubRadiusMM,
		Section: nodes.Section{WidthMM: job.Member.WidthMM, DepthMM: job.Member.DepthMM}, Bays: bays,
		Types: nodes.TypeOptions{LengthTolMM: job.Types.LengthTolMM, AngleTolDeg: job.Types.AngleTolDeg}})
	if errors.Is(err, nodes.ErrHubTooLarge) {
		return job.errorf("nodes.hub_radius_mm", "%v", err)
	} else if err != nil {
		return err
	}
	nodeLabels := make([]string, len(st.Nodes))
	for i, nd := range st.Nodes {
		nodeLabels[i] = nd.Label
	}
	mat := panels.Material{Name: job.Panel.Material, ThicknessMM: job.Panel.ThicknessMM, DensityKgM3: job.Panel.DensityKgM3,
		EdgeInsetMM: job.Panel.EdgeInsetMM, BoundaryBevelDeg: job.Panel.BoundaryBevelDeg}
	flats, parts, err := flatParts(flat, topo, mat, bays, nodeLabels)
	if errors.Is(err, panels.ErrInsetTooLarge) {
		return job.errorf("panel.edge_inset_mm", "%v", err)
	} else if err != nil {
		return err
	}
	ptypes, err := panels.PanelTypes(flats, job.Types.PanelTolMM, job.Panel.Mirror)
	if err != nil {
		return err
	}

	// Nesting.
	stocks := job.stocks()
	bar := newProgress(stderr, bf.quiet, 1, "nest")
	bar.set(0, fmt.Sprintf("nest: %d panels on %d stock sizes", len(parts), len(stocks)))
	nres, err := nest.Nest(parts, stocks)
	bar.done()
	if err != nil {
		return err
	}
	if len(nres.Unplaced) > 0 {
		u := nres.Unplaced[0]
		face := flat.Faces[u.Part]
		msg := fmt.Sprintf("%d panels are on no stock sheet; the first, %s (panel %s, %s line %d), is %s",
			len(nres.Unplaced), flats[u.Part].Label, face.ID, netPath, face.Line, u.Reason)
		if !bf.cont {
			return job.errorf("stock", "%s; add a larger or more stock, or --continue lists them as unplaced", msg)
		}
		for _, u := range nres.Unplaced {
			warnings = append(warnings, fmt.Sprintf("panel %s is on no sheet: %s", flats[u.Part].Label, u.Reason))
		}
	}

	b := &export.Bundle{Title: job.Title, JobFile: job.file, NetFile: netPath, Settings: job.settings(), Warnings: warnings,
		Net: flat, Bays: bays, Supports: fixed, Planarize: pres, TolMM: job.Flatness.TolMM,
		Structure: st, Flats: flats, PanelTypes: ptypes, Stocks: stocks, Nesting: nres, Cost: job.cost(st, flats, nres, stocks)}
	rep := export.BuildReport(b)
	wbar := newProgress(stderr, bf.quiet, 5+export.SiteFiles+len(rep.Sheets), "write")
	err = export.WriteBuild(bf.out, b, rep, func(done, total int, what string) { wbar.set(done, "write "+what) })
	wbar.done()
	if err != nil {
		return err
	}
	printBuildSummary(stdout, bf.out, rep)
	return nil
}

func printBuildSummary(w io.Writer, dir string, rep *export.Report) {
	c := rep.Counts
	fmt.Fprintf(w, "built %s into %s\n", rep.Title, dir)
	fmt.Fprintf(w, "  nodes    %6d in %d types\n", c.Nodes, c.NodeTypes)
	fmt.Fprintf(w, "  members  %6d in %d types\n", c.Members, c.MemberTypes)
	fmt.Fprintf(w, "  panels   %6d in %d types\n", c.Panels, c.PanelTypes)
	fmt.Fprintf(w, "  flatness before max %.3f mm, after max %.4f mm (tolerance %g mm); largest node move %.2f mm\n",
		rep.Planarity.FlatBeforeMM.Max, rep.Planarity.FlatAfterMM.Max, rep.Planarity.ToleranceMM, rep.Planarity.MaxMoveMM)
	fmt.Fprintf(w, "  largest member twist %.3f° (normal axes: %.3f°)\n", rep.Planarity.MaxTwistDeg, rep.Planarity.MaxTwistNormD)
	for _, s := range rep.Stocks {
		if s.Sheets > 0 {
			fmt.Fprintf(w, "  stock %-10s %4d sheets (area bound %d)\n", s.Name, s.Sheets, s.AreaBound)
		}
	}
	var util float64
	for _, s := range rep.Sheets {
		util += s.Utilization
	}
	if len(rep.Sheets) > 0 {
		fmt.Fprintf(w, "  mean sheet utilization %.1f %%, %d panels unplaced\n", 100*util/float64(len(rep.Sheets)), c.Unplaced)
	}
	if rep.Cost != nil {
		fmt.Fprintf(w, "  cost estimate %.2f %s\n", rep.Cost.Total, rep.Cost.Currency)
	}
	fmt.Fprintln(w, "\n"+caution)
}

// settings lists the job's settings for the summary sheet.
func (j *Job) settings() []export.Setting {
	f := func(v float64) string { return fmt.Sprintf("%g", v) }
	s := []export.Setting{
		{Name: "Net unit", Value: j.Net.Unit},
		{Name: "Supports", Value: j.Supports.Mode},
		{Name: "Flatness tolerance (mm)", Value: f(j.Flatness.TolMM)},
		{Name: "Allowed node move (mm)", Value: f(j.Flatness.MaxMoveMM)},
		{Name: "Fairness", Value: f(j.Flatness.Fairness)},
		{Name: "Node axes", Value: j.Nodes.Axis},
		{Name: "Hub radius (mm)", Value: f(j.Nodes.HubRadiusMM)},
		{Name: "Member section (mm)", Value: f(j.Member.WidthMM) + " x " + f(j.Member.DepthMM)},
		{Name: "Panel material", Value: j.Panel.Material},
		{Name: "Panel thickness (mm)", Value: f(j.Panel.ThicknessMM)},
		{Name: "Panel edge inset (mm)", Value: f(j.Panel.EdgeInsetMM)},
		{Name: "Mirrored panels allowed", Value: fmt.Sprint(j.Panel.Mirror)},
		{Name: "Bay size (mm)", Value: f(j.Nodes.BayMM)},
		{Name: "Type tolerances", Value: fmt.Sprintf("%g mm, %g°, panels %g mm", j.Types.LengthTolMM, j.Types.AngleTolDeg, j.Types.PanelTolMM)},
	}
	for _, st := range j.Stock {
		s = append(s, export.Setting{Name: "Stock " + st.Name, Value: fmt.Sprintf("%g x %g mm, margin %g, spacing %g, rotation %s, mirror %v, count %d, price %g",
			st.WidthMM, st.HeightMM, st.MarginMM, st.SpacingMM, st.Rotation, st.Mirror, st.Count, st.Price)})
	}
	return s
}

// cost turns the job's unit rates into a cost summary (nil without rates).
func (j *Job) cost(st *nodes.Structure, flats []panels.Flat, nres *nest.Result, stocks []nest.Stock) *export.Cost {
	rt := j.Rates
	if rt == nil {
		return nil
	}
	c := &export.Cost{Currency: rt.Currency}
	add := func(item string, q float64, unit string, rate float64) {
		amount := math.Round(q*rate*100) / 100
		c.Lines = append(c.Lines, export.CostLine{Item: item, Quantity: math.Round(q*1000) / 1000, Unit: unit, Rate: rate, Amount: amount})
		c.Total += amount
	}
	var metres, area float64
	for _, m := range st.Members {
		metres += m.CutLengthMM / 1000
	}
	for _, f := range flats {
		area += f.AreaM2
	}
	add("Members (cut length)", metres, "m", rt.MemberPerM)
	add("Nodes", float64(len(st.Nodes)), "each", rt.NodeEach)
	add("Panels (cut area)", area, "m²", rt.PanelPerM2)
	for _, u := range nres.Stocks {
		if u.Sheets == 0 {
			continue
		}
		price := stocks[u.Stock].Price
		if price == 0 {
			price = rt.SheetEach
		}
		add("Stock sheets "+stocks[u.Stock].Name, float64(u.Sheets), "sheet", price)
	}
	c.Total = math.Round(c.Total*100) / 100
	return c
}
