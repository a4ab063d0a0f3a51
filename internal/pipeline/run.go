package pipeline

import (
	"context"
	"errors"
	"fmt"
	"math"
	"time"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/outdir"
	"pqfab/nodes"
	"pqfab/nodes/bars"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/parttype"
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
	Net       *geom.Net  // planarized, in canonical order
	Order     *FileOrder // maps Net back to the net file's order (nil: Net is in it)
	Topo      *geom.Topology
	Supports  []bool
	Warnings  []string
	Planarize *panels.PlanarizeResult
	Bays      geom.Bays

	Structure      *nodes.Structure
	Flats          []panels.Flat
	PanelTypes     []panels.Type
	PanelTypeBound parttype.Bound // lower bound on the number of panel types
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

// Run computes job j and writes nothing (Build runs it, then writes): it
// reads the net through open, checks and planarizes it, computes nodes,
// members, panels and types, and nests the panels. Errors name the file,
// the line and the element or job key.
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
	res.Topo, res.Order = topo, in.Order
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
	res.Cost = cost(j, st, res.Flats, res.Nesting, res.Stocks, res.BarPlan, res.BarStocks, res.Blanks, len(res.PanelTypes))
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

// setOutlines returns each panel type's set-out outline: its nominal cut
// outline grown back by the edge inset d (the inset's edge lines moved
// out again). For a triangle or a quad, convex or not, this cannot fail:
// growing lengthens each edge by d·(cot(a/2) + cot(b/2)) for the inner
// angles a, b at its ends (a square's edges grow by 2d), positive since
// a + b < 360° (a quad's four angles sum to 360°). With five or more
// corners an edge between two reflex corners shortens and can vanish;
// the error names the type.
func setOutlines(types []panels.Type, insetMM float64) ([]geom.Polygon, error) {
	var out []geom.Polygon
	for _, t := range types {
		grown := t.Outline
		if insetMM > 0 {
			var err error
			if grown, err = panels.Inset(t.Outline, -insetMM); err != nil {
				return nil, fmt.Errorf("panel type %s: its nominal outline cannot be grown back by the %g mm edge inset: %w", t.Name, insetMM, err)
			}
		}
		out = append(out, grown)
	}
	return out, nil
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
	if res.PanelTypeSetOut, err = setOutlines(res.PanelTypes, j.Material().EdgeInsetMM); err != nil {
		return j.KeyError("panel.edge_inset_mm", err)
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

// FileNet returns the planarized net in the net file's order: node i and
// panel j are the file's node i and panel j, each panel starting at the
// file's first corner (see FileOrder).
func (r *Result) FileNet() *geom.Net {
	if r.Order == nil {
		return r.Net
	}
	return r.Order.Apply(r.Net)
}

// Bundle returns what the writers need.
func (r *Result) Bundle() *export.Bundle {
	return &export.Bundle{Title: r.Job.Title, JobFile: r.Job.File, NetFile: r.NetPath, Settings: settings(r.Job), Warnings: r.Warnings,
		Net: r.Net, Bays: r.Bays, Supports: r.Supports, Planarize: r.Planarize, TolMM: r.Job.Flatness.TolMM,
		Structure: r.Structure, Flats: r.Flats, PanelTypes: r.PanelTypes, PanelTypeBound: r.PanelTypeBound, Stocks: r.Stocks, Nesting: r.Nesting, Cost: r.Cost,
		BarStocks: r.BarStocks, Blanks: r.Blanks, BarPlan: r.BarPlan, HubRadiusMM: r.Job.Nodes.HubRadiusMM, PanelTypeSetOut: r.PanelTypeSetOut,
		MemberMaterial: r.Job.Member.Material, MemberDensityKgM3: r.Job.Member.DensityKgM3,
		MemberSection: r.Job.Member.Section, MemberKgPerM: r.Job.Member.KgPerM(), TagSize: r.Job.Site.TagSize,
		PanelMaterial: r.Job.Material(), PanelSpec: spec(r.Job.Panel.PanelSpec), TypeSpecs: r.TypeSpecs}
}

// write writes every output of the result into the folder dir, atomically
// and only where opt allows (outdir.WriteFolder), reporting each file to obs as stage
// "write", and returns the report. The planarized net (net-flat.obj) is
// written in the net file's order (FileNet).
func write(dir string, r *Result, opt outdir.Options, obs Observer) (*export.Report, error) {
	b := r.Bundle()
	rep := export.BuildReport(b)
	err := export.WriteBuild(dir, opt, r.FileNet(), b.Warnings, rep, func(done, total int, what string) { obs.Step("write", done, total, "write "+what) })
	if err != nil {
		return nil, err
	}
	return rep, nil
}

// spec turns a job's panel specification into the report's.
func spec(s job.PanelSpec) export.PanelSpec {
	return export.PanelSpec{BuildUp: s.BuildUp, EdgeWork: s.EdgeWork, Coating: s.Coating, HeatTreatment: s.HeatTreatment, Grade: s.Grade}
}

// settings lists the job's settings for the summary sheet: numbers as
// numbers, units in the names. The stock sizes are in the report's stock
// rows.
func settings(j *job.Job) []export.Setting {
	yes := func(b bool) string {
		if b {
			return "yes"
		}
		return "no"
	}
	return []export.Setting{
		{Name: "Geometry unit", Value: j.Net.Unit},
		{Name: "Supports", Value: j.Supports.Mode},
		{Name: "Flatness tolerance (mm)", Value: j.Flatness.TolMM},
		{Name: "Allowed node move (mm)", Value: j.Flatness.MaxMoveMM},
		{Name: "Smooth moves against small moves (fairness)", Value: j.Flatness.Fairness},
		{Name: "Node axes", Value: j.Nodes.Axis},
		{Name: "Hub radius (mm)", Value: j.Nodes.HubRadiusMM},
		{Name: "Member section", Value: j.Member.Section},
		{Name: "Member width (mm)", Value: j.Member.WidthMM},
		{Name: "Member depth (mm)", Value: j.Member.DepthMM},
		{Name: "Member wall (mm, hollow sections)", Value: j.Member.WallMM},
		{Name: "Member mass (kg/m)", Value: export.Round(j.Member.KgPerM(), 3)},
		{Name: "Panel material", Value: j.Panel.Material},
		{Name: "Panel thickness (mm)", Value: j.Panel.ThicknessMM},
		{Name: "Panel edge inset (mm)", Value: j.Panel.EdgeInsetMM},
		{Name: "Mirrored panels allowed", Value: yes(j.Panel.Mirror)},
		{Name: "Panel edges bevelled (bevels part of each panel type)", Value: yes(j.Panel.BevelledEdges)},
		{Name: "Bay size (mm)", Value: j.Nodes.BayMM},
		{Name: "Type tolerance, member cut length (mm)", Value: j.Types.LengthTolMM},
		{Name: "Type tolerance, angles (°)", Value: j.Types.AngleTolDeg},
		{Name: "Type tolerance, panel edges and diagonals (mm)", Value: j.Types.PanelTolMM},
		{Name: "Nesting search steps", Value: j.NestOptions().Steps},
		{Name: "Nesting time limit (s, 0: none)", Value: j.Nesting.Seconds},
	}
}

// cost turns the job's rates into a cost summary (nil without rates).
// Each quantity is charged once: making rates cover processing only, the
// material comes from the bar and sheet prices (or, for a stock without a
// price, from the material rates), a node is one charge, and the type
// rates are a setup charge per distinct type. Amounts are rounded to the
// cent and the total is their sum.
func cost(j *job.Job, st *nodes.Structure, flats []panels.Flat, nres *nest.Result, stocks []nest.Stock, plan *bars.Plan, barStocks []bars.Stock, blanks []bars.Piece, panelTypes int) *export.Cost {
	rt := j.Rates
	if rt == nil {
		return nil
	}
	c := &export.Cost{Currency: rt.Currency}
	var cents int64
	add := func(kind, item string, q float64, unit string, rate float64) {
		q = math.Round(q*1000) / 1000 // the quantity shown is the one charged
		ct := int64(math.Round(q * rate * 100))
		c.Lines = append(c.Lines, export.CostLine{Kind: kind, Item: item, Quantity: q, Unit: unit, Rate: rate, Amount: float64(ct) / 100})
		cents += ct
	}
	// Members: material from the bars, making by cut length, setup by type.
	var metres float64
	for _, m := range st.Members {
		metres += m.CutLengthMM / 1000
	}
	onBar := make([]bool, len(blanks))
	if plan != nil {
		for _, u := range plan.Stocks {
			if u.Bars == 0 {
				continue
			}
			s := barStocks[u.Stock]
			switch {
			case s.Price > 0 || rt.BarPerM == 0:
				add(export.CostMaterial, fmt.Sprintf("Member material: bars %s (%g mm), at the bar price", s.Name, s.LengthMM), float64(u.Bars), "bar", s.Price)
			default:
				add(export.CostMaterial, fmt.Sprintf("Member material: bars %s (%g mm), no bar price: by bar length", s.Name, s.LengthMM), float64(u.Bars)*s.LengthMM/1000, "m", rt.BarPerM)
			}
		}
		for _, b := range plan.Bars {
			for _, p := range b.Pieces {
				onBar[p] = true
			}
		}
	}
	var loose float64
	for i, p := range blanks {
		if !onBar[i] {
			loose += p.LengthMM / 1000
		}
	}
	if loose > 0 && rt.BarPerM > 0 {
		add(export.CostMaterial, "Member material: members on no bar, by blank length", loose, "m", rt.BarPerM)
	}
	add(export.CostMaking, "Member making: cutting and end cuts, by cut length", metres, "m", rt.MemberPerM)
	if rt.MemberTypeEach > 0 {
		add(export.CostSetup, "Member types: setup and drawing", float64(len(st.MemberTypes)), "type", rt.MemberTypeEach)
	}
	// Nodes: one charge each, supplied and made.
	add(export.CostMaking, "Nodes: supplied and made", float64(len(st.Nodes)), "each", rt.NodeEach)
	if rt.NodeTypeEach > 0 {
		add(export.CostSetup, "Node types: setup and drawing", float64(len(st.NodeTypes)), "type", rt.NodeTypeEach)
	}
	// Panels: material from the sheets, making by cut area, setup by type.
	for _, u := range nres.Stocks {
		if u.Sheets == 0 {
			continue
		}
		s := stocks[u.Stock]
		switch {
		case s.Price > 0:
			add(export.CostMaterial, "Panel material: sheets "+s.Name+", at the sheet price", float64(u.Sheets), "sheet", s.Price)
		case rt.SheetPerM2 > 0:
			add(export.CostMaterial, "Panel material: sheets "+s.Name+", no sheet price: by sheet area", float64(u.Sheets)*s.WidthMM*s.HeightMM/1e6, "m²", rt.SheetPerM2)
		default:
			add(export.CostMaterial, "Panel material: sheets "+s.Name+", no sheet price: per sheet", float64(u.Sheets), "sheet", rt.SheetEach)
		}
	}
	var area float64
	for _, f := range flats {
		area += f.AreaM2
	}
	add(export.CostMaking, "Panel making: cutting and edge work, by cut area", area, "m²", rt.PanelPerM2)
	if rt.PanelTypeEach > 0 {
		add(export.CostSetup, "Panel types: setup and drawing", float64(panelTypes), "type", rt.PanelTypeEach)
	}
	c.Total = float64(cents) / 100
	return c
}
