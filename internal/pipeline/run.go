package pipeline

import (
	"context"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"time"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/nodes"
	"pqfab/nodes/bars"
	"pqfab/panels"
	"pqfab/panels/nest"
)

// Policy says what a build does when the job cannot be met in full.
type Policy struct {
	// Continue builds from the best state reached when panels miss the
	// flatness tolerance or fit no stock sheet, listing them in warnings.
	Continue bool
}

// Result is everything a job computed.
type Result struct {
	Job       *job.Job
	NetPath   string
	Net       *geom.Net // planarized
	Topo      *geom.Topology
	Supports  []bool
	Warnings  []string
	Planarize *panels.PlanarizeResult
	Bays      geom.Bays

	Structure      *nodes.Structure
	Flats          []panels.Flat
	PanelTypes     []panels.Type
	PanelTypeBound geom.TypeBound // lower bound on the number of panel types
	// PanelTypeSetOut is each panel type's nominal set-out outline: its
	// nominal cut outline grown by the edge inset.
	PanelTypeSetOut []geom.Polygon
	// TypeSpecs is every panel type's specification (with its thickness
	// and density), by type name.
	TypeSpecs map[string]export.PanelSpec

	Stocks  []nest.Stock
	Nesting *nest.Result

	// Every member's blank (label and blank length), the bar stock and the
	// members' cutting plan (nil without [[bar]] tables).
	Blanks    []bars.Piece
	BarStocks []bars.Stock
	BarPlan   *bars.Plan

	Cost *export.Cost // nil without rates
}

// PlanarityFailure is returned by Run when the flatness tolerance cannot be
// met within the allowed move and the policy does not continue. Report is
// the diagnostic report to hand to the user.
type PlanarityFailure struct {
	Err    *panels.PlanarizeError
	Report *PlanarizeReport
	Path   string // where Build wrote Report, if it did
}

func (e *PlanarityFailure) Error() string { return e.Err.Error() }

// Unwrap returns the planarization error.
func (e *PlanarityFailure) Unwrap() error { return e.Err }

// ErrUnplaced is wrapped by the error Run returns when panels fit no stock
// sheet, or member blanks no bar, and the policy does not continue.
var (
	ErrUnplaced        = errors.New("panels are on no stock sheet")
	ErrMembersUnplaced = errors.New("members are on no bar")
)

// Run runs job j: it reads the net through open, checks and planarizes it,
// computes nodes, members, panels and types, and nests the panels. Errors
// name the file, the line and the element or job key.
//
// ctx, and the job's nesting.seconds when not 0, bound the nesting's
// search in time: when either ends, the search stops early and a warning
// says so (the layout then depends on the machine;
// without a deadline it depends only on the job).
func Run(ctx context.Context, j *job.Job, open Opener, obs Observer, pol Policy) (*Result, error) {
	res := &Result{Job: j, NetPath: j.NetPath(), Stocks: j.Stocks()}
	warn := func(msg string) {
		res.Warnings = append(res.Warnings, msg)
		obs.Warn(msg)
	}
	in, err := LoadNet(open, res.NetPath, j.Unit(), j.ValidateOptions(), j.Net.Reorient)
	if err != nil {
		return nil, err
	}
	for _, w := range in.Warnings {
		warn(w)
	}
	net, topo := in.Net, in.Topo
	res.Topo = topo
	if res.Supports, err = Supports(j.Supports.Mode, j.Supports.Nodes, net, topo); err != nil {
		key := "supports.nodes"
		if j.Supports.Mode != "list" {
			key = "supports.mode"
		}
		return nil, j.KeyError(key, err)
	}
	popt := j.PlanarizeOptions()
	popt.Fixed = res.Supports
	pres, perr := Planarize(net, topo, popt, obs)
	if pres == nil {
		return nil, perr
	}
	if perr != nil {
		var pe *panels.PlanarizeError
		if !errors.As(perr, &pe) {
			return nil, perr
		}
		if !pol.Continue {
			return nil, &PlanarityFailure{Err: pe, Report: NewPlanarizeReport(net, popt, pres)}
		}
		warn("built with panels over the flatness tolerance: " + perr.Error())
	}
	res.Planarize = pres
	res.Net = Moved(net, pres)

	st, bays, err := Structure(res.Net, topo, j.NodeOptions(), j.Nodes.BayMM)
	switch {
	case errors.Is(err, nodes.ErrHubTooLarge):
		return nil, j.KeyError("nodes.hub_radius_mm", err)
	case err != nil:
		return nil, err
	}
	res.Structure, res.Bays = st, bays
	// The members' cutting plan is worked out beside the panels and the
	// nesting (neither needs the other); its outcome is taken in, and its
	// warnings listed, before the nesting's. A cutting plan that ends the
	// job stops the nesting early: its error is the one reported, as when
	// the bars were cut first.
	nctx, stopNest := context.WithCancel(ctx)
	defer stopNest()
	waitBars, err := startCutPlan(j, res, obs, pol, stopNest)
	if err != nil {
		return nil, err
	}
	if err := panelsAndNest(nctx, j, res, obs); err != nil {
		if berr := waitBars(warn); berr != nil {
			return nil, berr
		}
		return nil, err
	}
	if err := waitBars(warn); err != nil {
		return nil, err
	}
	if res.Nesting.Stopped {
		warn(fmt.Sprintf("the nesting search was stopped by its time limit after %d of its %d steps: this layout depends on the machine's speed; without a time limit it depends only on the job",
			res.Nesting.Steps, j.NestOptions().Steps))
	}
	if un := res.Nesting.Unplaced; len(un) > 0 {
		u := un[0]
		face := res.Net.Faces[u.Part]
		if !pol.Continue {
			return nil, j.KeyError("stock", fmt.Errorf("%d %w; the first, %s (panel %s, %s line %d), is %s",
				len(un), ErrUnplaced, res.Flats[u.Part].Label, face.ID, res.NetPath, face.Line, u.Reason))
		}
		for _, u := range un {
			warn(fmt.Sprintf("panel %s is on no sheet: %s", res.Flats[u.Part].Label, u.Reason))
		}
	}
	res.Cost = cost(j, st, res.Flats, res.Nesting, res.Stocks, res.BarPlan, res.BarStocks)
	return res, nil
}

// startCutPlan starts cutting the members' blanks from the job's bar
// stock, if it has any, beside the caller, and returns the function (call
// it once) that waits for the plan and takes it in: unplaced members end
// the job, or are listed as warnings when the policy continues. When the
// plan will end the job, stop is called as soon as that is known. Only the
// caller's goroutine tells obs.
func startCutPlan(j *job.Job, res *Result, obs Observer, pol Policy, stop func()) (wait func(warn func(string)) error, err error) {
	pieces, err := bars.MemberPieces(res.Structure.Members, res.Structure.Section)
	if err != nil {
		return nil, err
	}
	res.Blanks, res.BarStocks = pieces, j.BarStocks()
	if len(res.BarStocks) == 0 {
		return func(func(string)) error { return nil }, nil
	}
	obs.Step("bars", 0, 1, fmt.Sprintf("bars: %d members on %d bar lengths", len(pieces), len(res.BarStocks)))
	type solved struct {
		plan *bars.Plan
		err  error
	}
	ch := make(chan solved, 1)
	stocks := res.BarStocks
	go func() {
		plan, err := bars.Solve(pieces, stocks, bars.Options{})
		if err != nil || (len(plan.Unplaced) > 0 && !pol.Continue) {
			stop()
		}
		ch <- solved{plan, err}
	}()
	return func(warn func(string)) error {
		var got solved
		select {
		case got = <-ch:
		default: // still cutting: say so while waiting
			obs.Step("bars", 0, 1, fmt.Sprintf("bars: finishing the cutting plan of %d members", len(pieces)))
			got = <-ch
			obs.Step("bars", 1, 1, "bars: done")
		}
		return takeCutPlan(j, res, got.plan, got.err, pol, warn)
	}, nil
}

// takeCutPlan takes in the members' cutting plan (startCutPlan).
func takeCutPlan(j *job.Job, res *Result, plan *bars.Plan, err error, pol Policy, warn func(string)) error {
	if err != nil {
		return j.KeyError("bar", err)
	}
	pieces := res.Blanks
	if un := plan.Unplaced; len(un) > 0 {
		if !pol.Continue {
			return j.KeyError("bar", fmt.Errorf("%d %w; the first is %s: %s", len(un), ErrMembersUnplaced, pieces[un[0].Piece].Label, un[0].Reason))
		}
		for _, u := range un {
			warn(fmt.Sprintf("member %s is on no bar: %s", pieces[u.Piece].Label, u.Reason))
		}
	}
	res.BarPlan = plan
	return nil
}

// panelsAndNest lays the panels flat, groups them into types and nests
// them (Run).
func panelsAndNest(ctx context.Context, j *job.Job, res *Result, obs Observer) error {
	var err error
	res.Flats, err = Panels(res.Net, res.Topo, j.Material(), res.Bays, NodeLabels(res.Structure))
	switch {
	case errors.Is(err, panels.ErrInsetTooLarge):
		return j.KeyError("panel.edge_inset_mm", err)
	case err != nil:
		return err
	}
	// Panels picked by label or bay take their table's thickness and
	// density, and never share a type with other panels.
	pick, err := pickPanels(j, res.Flats)
	if err != nil {
		return err
	}
	for f := range res.Flats {
		if pick[f] >= 0 {
			fl := &res.Flats[f]
			fl.SpecGroup = pick[f] + 1
			fl.WeightKg = panelMaterial(j, pick[f]).WeightKg(fl.AreaM2)
		}
	}
	if res.PanelTypes, res.PanelTypeBound, err = panels.Group(res.Flats, j.PanelTypeOptions()); err != nil {
		return err
	}
	// Every panel's corner 1 is its type's corner 1, so that the type
	// drawing, the cut sheets and the schedule number corners and edges
	// alike.
	for _, t := range res.PanelTypes {
		for n, f := range t.Panels {
			if err := panels.StartAt(res.Net, panelMaterial(j, pick[f]), &res.Flats[f], t.Start[n]); err != nil {
				return err
			}
			t.Start[n] = 0
		}
	}
	inset := j.Material().EdgeInsetMM
	for _, t := range res.PanelTypes {
		out := t.Outline
		if inset > 0 {
			if grown, err := panels.Inset(t.Outline, -inset); err == nil {
				out = grown
			}
		}
		res.PanelTypeSetOut = append(res.PanelTypeSetOut, out)
	}
	if res.TypeSpecs, err = typeSpecs(j, res.PanelTypes, res.Flats, pick); err != nil {
		return err
	}

	if j.Nesting.Seconds > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, time.Duration(j.Nesting.Seconds*float64(time.Second)))
		defer cancel()
	}
	res.Nesting, err = Nest(ctx, Parts(res.Flats), res.Flats, res.Stocks, j.NestOptions(), obs)
	if err != nil {
		return err
	}
	return nil
}

// Bundle returns what the writers need.
func (r *Result) Bundle() *export.Bundle {
	return &export.Bundle{Title: r.Job.Title, JobFile: r.Job.File, NetFile: r.NetPath, Settings: settings(r.Job), Warnings: r.Warnings,
		Net: r.Net, Bays: r.Bays, Supports: r.Supports, Planarize: r.Planarize, TolMM: r.Job.Flatness.TolMM,
		Structure: r.Structure, Flats: r.Flats, PanelTypes: r.PanelTypes, PanelTypeBound: r.PanelTypeBound, Stocks: r.Stocks, Nesting: r.Nesting, Cost: r.Cost,
		BarStocks: r.BarStocks, Blanks: r.Blanks, BarPlan: r.BarPlan, HubRadiusMM: r.Job.Nodes.HubRadiusMM, PanelTypeSetOut: r.PanelTypeSetOut,
		MemberMaterial: r.Job.Member.Material, MemberDensityKgM3: r.Job.Member.DensityKgM3,
		PanelMaterial: r.Job.Material(), PanelSpec: spec(r.Job.Panel.PanelSpec), TypeSpecs: r.TypeSpecs}
}

// Write writes every output of the result into the folder dir, atomically
// and only where opt allows (export.WriteFolder; list the job's files on
// disk in opt.Keep, see InputFiles), reporting each file to obs as stage
// "write", and returns the report.
func Write(dir string, r *Result, opt export.WriteOptions, obs Observer) (*export.Report, error) {
	b := r.Bundle()
	rep := export.BuildReport(b)
	err := export.WriteBuild(dir, opt, b.Net, b.Warnings, rep, func(done, total int, what string) { obs.Step("write", done, total, "write "+what) })
	if err != nil {
		return nil, err
	}
	return rep, nil
}

// InputFiles lists the files the job reads: the job file and the net
// (both files of a CSV pair). Outputs never replace them.
func (r *Result) InputFiles() []string {
	return append([]string{r.Job.File}, NetFiles(r.NetPath)...)
}

// NetFiles lists the files a net path reads: the file, and the panels
// file of a CSV pair.
func NetFiles(path string) []string {
	if pp, err := geom.PanelsPathFor(path); err == nil && strings.EqualFold(filepath.Ext(path), ".csv") {
		return []string{path, pp}
	}
	return []string{path}
}

// spec turns a job's panel specification into the report's.
func spec(s job.PanelSpec) export.PanelSpec {
	return export.PanelSpec{BuildUp: s.BuildUp, EdgeWork: s.EdgeWork, Coating: s.Coating, HeatTreatment: s.HeatTreatment, Grade: s.Grade}
}

// settings lists the job's settings for the summary sheet.
func settings(j *job.Job) []export.Setting {
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
		{Name: "Panel edges bevelled (bevels part of each panel type)", Value: fmt.Sprint(j.Panel.BevelledEdges)},
		{Name: "Bay size (mm)", Value: f(j.Nodes.BayMM)},
		{Name: "Type tolerances", Value: fmt.Sprintf("%g mm, %g°, panels %g mm", j.Types.LengthTolMM, j.Types.AngleTolDeg, j.Types.PanelTolMM)},
	}
	for _, st := range j.Stock {
		s = append(s, export.Setting{Name: "Stock " + st.Name, Value: fmt.Sprintf("%g x %g mm, margin %g, spacing %g, rotation %s, mirror %v, cuts %s, count %d, price %g",
			st.WidthMM, st.HeightMM, st.MarginMM, st.SpacingMM, st.Rotation, st.Mirror, st.Cuts, st.Count, st.Price)})
	}
	limit := "none"
	if j.Nesting.Seconds > 0 {
		limit = fmt.Sprintf("%g s", j.Nesting.Seconds)
	}
	s = append(s, export.Setting{Name: "Nesting search", Value: fmt.Sprintf("%d steps, time limit %s", j.NestOptions().Steps, limit)})
	return s
}

// cost turns the job's unit rates into a cost summary (nil without rates).
func cost(j *job.Job, st *nodes.Structure, flats []panels.Flat, nres *nest.Result, stocks []nest.Stock, plan *bars.Plan, barStocks []bars.Stock) *export.Cost {
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
	if plan != nil {
		for _, u := range plan.Stocks {
			if u.Bars > 0 {
				add("Bars "+barStocks[u.Stock].Name, float64(u.Bars), "bar", barStocks[u.Stock].Price)
			}
		}
	}
	c.Total = math.Round(c.Total*100) / 100
	return c
}
