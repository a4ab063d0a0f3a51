package report

import (
	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/pipeline"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
)

func vec(v r3.Vec, d int) [3]float64 { return [3]float64{r(v.X, d), r(v.Y, d), r(v.Z, d)} }

// New fills the report model, that every output file is written from,
// straight from a build's result.
func New(res *pipeline.Result) *Report {
	s := res.Structure
	n := res.Net
	j := res.Job
	rep := &Report{Title: j.Title, Caution: pipeline.Caution, Job: j.File, Net: res.NetPath,
		Units:    map[string]string{"length": "mm", "angle": "degree", "area": "m2", "weight": "kg"},
		Settings: settingsOf(j), Warnings: append([]string{}, res.Warnings...),
		Sheets: []SheetRow{}, Unplaced: []UnplacedRow{}, Stocks: []StockRow{}, TagSize: j.Site.TagSize}
	nodeLabel := func(i int) string { return s.Nodes[i].Label }
	rep.Section = Section{WidthMM: s.Section.WidthMM, DepthMM: s.Section.DepthMM, WallMM: s.Section.WallMM}
	rep.Counts = Counts{Nodes: len(n.Nodes), Members: len(s.Members), Panels: len(n.Faces),
		MemberTypes: len(s.MemberTypes), NodeTypes: len(s.NodeTypes), PanelTypes: len(res.PanelTypes),
		MemberTypesBound: boundRow(s.MemberTypeBound, "members", ""),
		NodeTypesBound:   boundRow(s.NodeTypeBound, "nodes", "nodes with different numbers of members never share a type"),
		PanelTypesBound:  boundRow(res.PanelTypeBound, "panels", "panels with different numbers of corners never share a type")}
	pl := res.Planarize
	rep.Planarity = Planarity{ToleranceMM: j.Flatness.TolMM, Converged: pl.Converged, Iterations: pl.Iterations,
		MaxMoveMM: r(pl.MaxMoveMM, 3), RMSMoveMM: r(pl.RMSMoveMM, 3),
		FlatBeforeMM: panels.SpreadOf(pl.Before).Rounded(3), FlatAfterMM: panels.SpreadOf(pl.After).Rounded(4),
		MaxTwistDeg: r(nodes.MaxAbsTwist(s.Members), AngleDigits), MaxTwistNormalDeg: r(s.TwistNormalDeg, AngleDigits)}
	rep.Nodes = make([]NodeRow, 0, len(s.Nodes))
	for i, nd := range s.Nodes {
		row := NodeRow{Label: nd.Label, ID: n.Nodes[i].ID, Pos: vec(n.Nodes[i].Pos, LenDigits), Axis: vec(nd.Axis, 6),
			MembersAtNode: nd.Valence, Type: s.NodeTypes[nd.Type].Name, Support: res.Supports[i],
			MoveMM: r(r3.Norm(pl.Moves[i]), LenDigits), Move: vec(pl.Moves[i], LenDigits),
			AzimuthZero: nd.Zero, AxisTiltDeg: r(nd.TiltDeg, AngleDigits), AxisTiltTowardDeg: r(nd.TiltTowardDeg, AngleDigits)}
		if len(nd.Arms) > 0 {
			row.Arms = make([]ArmRow, 0, len(nd.Arms))
		}
		for _, a := range nd.Arms {
			row.Arms = append(row.Arms, ArmRow{Member: s.Members[a.Member].Label, AzimuthDeg: r(a.AzimuthDeg, AngleDigits), ElevationDeg: r(a.ElevationDeg, AngleDigits)})
		}
		rep.Nodes = append(rep.Nodes, row)
	}
	barOf := rep.buildBars(res)
	kgm := j.Member.KgPerM()
	rep.Members = make([]MemberRow, 0, len(s.Members))
	fromB := make([]bool, len(s.Members))
	for _, t := range s.MemberTypes {
		for k, i := range t.Parts {
			fromB[i] = t.Reversed[k]
		}
	}
	for k, m := range s.Members {
		end := func(e nodes.End) EndRow {
			return EndRow{Node: nodeLabel(e.Node), ElevationDeg: r(e.ElevationDeg, AngleDigits), SetbackMM: r(e.SetbackMM, LenDigits), MitreDeg: r(e.MitreDeg, AngleDigits), BevelDeg: r(e.BevelDeg, AngleDigits)}
		}
		rep.Members = append(rep.Members, MemberRow{Label: m.Label, NodeA: nodeLabel(m.A.Node), NodeB: nodeLabel(m.B.Node),
			LengthMM: r(m.LengthMM, LenDigits), CutLengthMM: r(m.CutLengthMM, LenDigits), TwistDeg: r(m.TwistDeg, AngleDigits),
			FoldDeg: r(memberFold(m), AngleDigits), Type: s.MemberTypes[m.Type].Name,
			Ends: [2]EndRow{end(m.A), end(m.B)}, TagEnd: map[bool]string{false: "A", true: "B"}[fromB[k]], FrameY: vec(m.Frame.Y, 6), FrameZ: vec(m.Frame.Z, 6),
			BlankMM: r(blankOf(res, k), LenDigits), Bar: barOf[k], WeightKg: r(kgm*m.CutLengthMM/1000, WeightDigits)})
		rep.Weights.MembersKg += kgm * m.CutLengthMM / 1000
	}
	rep.MemberMaterial = MemberMaterial{Name: j.Member.Material, DensityKgM3: j.Member.DensityKgM3, Section: j.Member.Section, KgPerM: r(kgm, 3)}
	rep.PanelSpec = pipeline.Spec(j.Panel.PanelSpec)
	pm := j.Material()
	rep.PanelMaterial = PanelMaterial{Name: pm.Name, ThicknessMM: pm.ThicknessMM,
		DensityKgM3: pm.DensityKgM3, EdgeInsetMM: pm.EdgeInsetMM, BevelledEdges: pm.BevelledEdges}
	sheetOf := sheetsOf(res)
	rep.Panels = make([]PanelRow, 0, len(res.Flats))
	for f, fl := range res.Flats {
		face := n.Faces[f]
		row := PanelRow{Label: fl.Label, ID: face.ID, AreaM2: r(fl.AreaM2, AreaDigits), PerimeterMM: r(fl.PerimeterMM, LenDigits),
			WeightKg: r(fl.WeightKg, WeightDigits), FlatnessBeforeMM: r(pl.Before[f], 3), FlatnessMM: r(pl.After[f], 4),
			Type: res.PanelTypes[fl.Type].Name}
		// The flat's corner i is the face's corner Start+i (corner 1 of
		// the panel is corner 1 of its type).
		kc := len(face.Corners)
		corner := func(i int) string { return nodeLabel(face.Corners[(fl.Start+i)%kc]) }
		row.Corners = make([]string, kc)
		for i := range face.Corners {
			row.Corners[i] = corner(i)
		}
		row.Cut = CutRow{EdgesMM: round(fl.CutEdgeMM, LenDigits), AnglesDeg: round(fl.CutAngleDeg, AngleDigits), Diagonals: []DiagonalRow{},
			BoxMM: [2]float64{r(fl.BoxMM[0], LenDigits), r(fl.BoxMM[1], LenDigits)}}
		for _, d := range fl.CutDiagonals {
			row.Cut.Diagonals = append(row.Cut.Diagonals, DiagonalRow{From: corner(d.I), To: corner(d.J), MM: r(d.MM, LenDigits)})
		}
		row.GrainDeg = r(fl.GrainDeg, AngleDigits)
		rep.Weights.PanelsKg += fl.WeightKg
		row.Edges, row.AnglesDeg = make([]EdgeRow, 0, kc), make([]float64, 0, kc)
		for k := range face.Corners {
			nb := ""
			if g := fl.Neighbour[k]; g >= 0 {
				nb = res.Flats[g].Label
			}
			row.Edges = append(row.Edges, EdgeRow{LengthMM: r(fl.EdgeMM[k], LenDigits), FoldDeg: r(fl.FoldDeg[k], AngleDigits), BevelDeg: r(fl.BevelDeg[k], AngleDigits), Neighbour: nb})
			row.AnglesDeg = append(row.AnglesDeg, r(fl.AngleDeg[k], AngleDigits))
		}
		row.Diagonals = make([]DiagonalRow, 0, len(fl.Diagonals))
		for _, d := range fl.Diagonals {
			row.Diagonals = append(row.Diagonals, DiagonalRow{From: corner(d.I), To: corner(d.J), MM: r(d.MM, LenDigits)})
		}
		if sheetOf[f] >= 0 {
			row.Sheet = nest.SheetName(sheetOf[f], len(res.Nesting.Sheets))
		}
		row.Outline = points(fl.Cut)
		rep.Panels = append(rep.Panels, row)
	}
	rep.buildTypes(res)
	if nr := res.Nesting; nr != nil {
		rep.Sheets = make([]SheetRow, 0, len(nr.Sheets))
		for si, sh := range nr.Sheets {
			st := res.Stocks[sh.Stock]
			row := SheetRow{Name: nest.SheetName(si, len(nr.Sheets)), Stock: st.Name, WidthMM: st.WidthMM, HeightMM: st.HeightMM,
				MarginMM: st.MarginMM, Rotation: string(st.Rotation), Utilization: r(sh.Utilization, 4)}
			for _, c := range sh.Cuts {
				row.Cuts = append(row.Cuts, SheetCutRow{Piece: c.Piece, From: [2]float64{r(c.From.X, 3), r(c.From.Y, 3)}, To: [2]float64{r(c.To.X, 3), r(c.To.Y, 3)}})
			}
			row.CutLengthMM = r(sh.CutLengthMM, LenDigits)
			if len(sh.Placements) > 0 {
				row.Placements = make([]PlacementRow, 0, len(sh.Placements))
			}
			for _, p := range sh.Placements {
				row.Placements = append(row.Placements, PlacementRow{Panel: res.Flats[p.Part].Label, X: r(p.X, LenDigits), Y: r(p.Y, LenDigits),
					RotationDeg: r(p.RotationDeg, AngleDigits), Mirrored: p.Mirrored, Outline: points(p.Outline)})
			}
			rep.Sheets = append(rep.Sheets, row)
		}
		for _, u := range nr.Unplaced {
			rep.Unplaced = append(rep.Unplaced, UnplacedRow{Panel: res.Flats[u.Part].Label, Reason: u.Reason.String()})
		}
		for _, u := range nr.Stocks {
			st := res.Stocks[u.Stock]
			cuts := string(st.Cuts)
			if cuts == "" {
				cuts = "any"
			}
			rep.Stocks = append(rep.Stocks, StockRow{Name: st.Name, WidthMM: st.WidthMM, HeightMM: st.HeightMM, MarginMM: st.MarginMM,
				SpacingMM: st.SpacingMM, Rotation: string(st.Rotation), Mirror: st.Mirror, Cuts: cuts, Count: st.Count,
				Sheets: u.Sheets, AreaBound: u.AreaBound, Price: st.Price, Cost: r(u.Cost, 2)})
		}
		rep.Counts.Sheets = len(nr.Sheets)
		rep.Counts.Unplaced = len(nr.Unplaced)
	}
	rep.panelOf = make(map[string]*PanelRow, len(rep.Panels))
	for i := range rep.Panels {
		rep.panelOf[rep.Panels[i].Label] = &rep.Panels[i]
	}
	rep.Weights = Weights{PanelsKg: r(rep.Weights.PanelsKg, WeightDigits), MembersKg: r(rep.Weights.MembersKg, WeightDigits),
		TotalKg: r(rep.Weights.PanelsKg+rep.Weights.MembersKg, WeightDigits)}
	rep.Cost = costOf(res)
	rep.Bays = BayGridOf(res.Bays)
	rep.Warnings = append(rep.Warnings, SiteWarnings(rep)...)
	return rep
}

// memberFold returns the fold between the panels at a member (0 on the
// boundary): 180° less the angle between them through the inside.
func memberFold(m nodes.Member) float64 {
	if m.DihedralDeg == 0 {
		return 0
	}
	return 180 - m.DihedralDeg
}

// blankOf returns member k's blank length, or its cut length when the
// result has no blanks.
func blankOf(res *pipeline.Result, k int) float64 {
	if k < len(res.Blanks) {
		return res.Blanks[k].LengthMM
	}
	return res.Structure.Members[k].CutLengthMM
}

// round rounds every value to d decimals.
func round(xs []float64, d int) []float64 {
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i] = r(x, d)
	}
	return out
}

func points(p geom.Polygon) [][2]float64 {
	out := make([][2]float64, len(p))
	for i, v := range p {
		out[i] = [2]float64{r(v.X, LenDigits), r(v.Y, LenDigits)}
	}
	return out
}

// sheetsOf returns, per face, the sheet index it lies on or -1.
func sheetsOf(res *pipeline.Result) []int {
	out := make([]int, len(res.Flats))
	for i := range out {
		out[i] = -1
	}
	if res.Nesting == nil {
		return out
	}
	for s, sh := range res.Nesting.Sheets {
		for _, p := range sh.Placements {
			out[p.Part] = s
		}
	}
	return out
}
