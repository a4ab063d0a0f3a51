package export

import (
	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
)

func vec(v r3.Vec, d int) [3]float64 { return [3]float64{r(v.X, d), r(v.Y, d), r(v.Z, d)} }

// BuildReport turns a bundle into the report model that report.json, the
// schedule and the HTML page share.
func BuildReport(b *Bundle) *Report {
	s := b.Structure
	n := b.Net
	rep := &Report{Title: b.Title, Caution: Caution, Job: b.JobFile, Net: b.NetFile,
		Units:    map[string]string{"length": "mm", "angle": "degree", "area": "m2", "weight": "kg"},
		Settings: b.Settings, Warnings: append([]string{}, b.Warnings...),
		Sheets: []SheetRow{}, Unplaced: []UnplacedRow{}, Stocks: []StockRow{}, TagSize: b.TagSize}
	nodeLabel := func(i int) string { return s.Nodes[i].Label }
	rep.Section = Section{WidthMM: s.Section.WidthMM, DepthMM: s.Section.DepthMM, WallMM: s.Section.WallMM}
	rep.Counts = Counts{Nodes: len(n.Nodes), Members: len(s.Members), Panels: len(n.Faces),
		MemberTypes: len(s.MemberTypes), NodeTypes: len(s.NodeTypes), PanelTypes: len(b.PanelTypes),
		MemberTypesBound: boundRow(s.MemberTypeBound, "members", ""),
		NodeTypesBound:   boundRow(s.NodeTypeBound, "nodes", "nodes with different numbers of members never share a type"),
		PanelTypesBound:  boundRow(b.PanelTypeBound, "panels", "panels with different numbers of corners never share a type")}
	pl := b.Planarize
	rep.Planarity = Planarity{ToleranceMM: b.TolMM, Converged: pl.Converged, Iterations: pl.Iterations,
		MaxMoveMM: r(pl.MaxMoveMM, 3), RMSMoveMM: r(pl.RMSMoveMM, 3),
		FlatBeforeMM: spread(panels.SpreadOf(pl.Before), 3), FlatAfterMM: spread(panels.SpreadOf(pl.After), 4),
		MaxTwistDeg: r(nodes.MaxAbsTwist(s.Members), angleDigits), MaxTwistNormalDeg: r(s.TwistNormalDeg, angleDigits)}
	rep.Nodes = make([]NodeRow, 0, len(s.Nodes))
	for i, nd := range s.Nodes {
		row := NodeRow{Label: nd.Label, ID: n.Nodes[i].ID, Pos: vec(n.Nodes[i].Pos, lenDigits), Axis: vec(nd.Axis, 6),
			MembersAtNode: nd.Valence, Type: s.NodeTypes[nd.Type].Name, Support: b.Supports[i],
			MoveMM: r(r3.Norm(pl.Moves[i]), lenDigits), Move: vec(pl.Moves[i], lenDigits),
			AzimuthZero: nd.Zero, AxisTiltDeg: r(nd.TiltDeg, angleDigits), AxisTiltTowardDeg: r(nd.TiltTowardDeg, angleDigits)}
		if len(nd.Arms) > 0 {
			row.Arms = make([]ArmRow, 0, len(nd.Arms))
		}
		for _, a := range nd.Arms {
			row.Arms = append(row.Arms, ArmRow{Member: s.Members[a.Member].Label, AzimuthDeg: r(a.AzimuthDeg, angleDigits), ElevationDeg: r(a.ElevationDeg, angleDigits)})
		}
		rep.Nodes = append(rep.Nodes, row)
	}
	barOf := rep.buildBars(b)
	kgm := b.MemberKgPerM
	rep.Members = make([]MemberRow, 0, len(s.Members))
	fromB := make([]bool, len(s.Members))
	for _, t := range s.MemberTypes {
		for k, i := range t.Parts {
			fromB[i] = t.Reversed[k]
		}
	}
	for k, m := range s.Members {
		end := func(e nodes.End) EndRow {
			return EndRow{Node: nodeLabel(e.Node), ElevationDeg: r(e.ElevationDeg, angleDigits), SetbackMM: r(e.SetbackMM, lenDigits), MitreDeg: r(e.MitreDeg, angleDigits), BevelDeg: r(e.BevelDeg, angleDigits)}
		}
		rep.Members = append(rep.Members, MemberRow{Label: m.Label, NodeA: nodeLabel(m.A.Node), NodeB: nodeLabel(m.B.Node),
			LengthMM: r(m.LengthMM, lenDigits), CutLengthMM: r(m.CutLengthMM, lenDigits), TwistDeg: r(m.TwistDeg, angleDigits),
			FoldDeg: r(memberFold(m), angleDigits), Type: s.MemberTypes[m.Type].Name,
			Ends: [2]EndRow{end(m.A), end(m.B)}, TagEnd: map[bool]string{false: "A", true: "B"}[fromB[k]], FrameY: vec(m.Frame.Y, 6), FrameZ: vec(m.Frame.Z, 6),
			BlankMM: r(blankOf(b, k), lenDigits), Bar: barOf[k], WeightKg: r(kgm*m.CutLengthMM/1000, weightDigits)})
		rep.Weights.MembersKg += kgm * m.CutLengthMM / 1000
	}
	rep.MemberMaterial = MemberMaterial{Name: b.MemberMaterial, DensityKgM3: b.MemberDensityKgM3, Section: b.MemberSection, KgPerM: r(kgm, 3)}
	rep.PanelSpec = b.PanelSpec
	rep.PanelMaterial = PanelMaterial{Name: b.PanelMaterial.Name, ThicknessMM: b.PanelMaterial.ThicknessMM,
		DensityKgM3: b.PanelMaterial.DensityKgM3, EdgeInsetMM: b.PanelMaterial.EdgeInsetMM, BevelledEdges: b.PanelMaterial.BevelledEdges}
	sheetOf := b.sheetOf()
	rep.Panels = make([]PanelRow, 0, len(b.Flats))
	for f, fl := range b.Flats {
		face := n.Faces[f]
		row := PanelRow{Label: fl.Label, ID: face.ID, AreaM2: r(fl.AreaM2, areaDigits), PerimeterMM: r(fl.PerimeterMM, lenDigits),
			WeightKg: r(fl.WeightKg, weightDigits), FlatnessBeforeMM: r(pl.Before[f], 3), FlatnessMM: r(pl.After[f], 4),
			Type: b.PanelTypes[fl.Type].Name}
		// The flat's corner i is the face's corner Start+i (corner 1 of
		// the panel is corner 1 of its type).
		kc := len(face.Corners)
		corner := func(i int) string { return nodeLabel(face.Corners[(fl.Start+i)%kc]) }
		row.Corners = make([]string, kc)
		for i := range face.Corners {
			row.Corners[i] = corner(i)
		}
		row.Cut = CutRow{EdgesMM: round(fl.CutEdgeMM, lenDigits), AnglesDeg: round(fl.CutAngleDeg, angleDigits), Diagonals: []DiagonalRow{},
			BoxMM: [2]float64{r(fl.BoxMM[0], lenDigits), r(fl.BoxMM[1], lenDigits)}}
		for _, d := range fl.CutDiagonals {
			row.Cut.Diagonals = append(row.Cut.Diagonals, DiagonalRow{From: corner(d.I), To: corner(d.J), MM: r(d.MM, lenDigits)})
		}
		row.GrainDeg = r(fl.GrainDeg, angleDigits)
		rep.Weights.PanelsKg += fl.WeightKg
		row.Edges, row.AnglesDeg = make([]EdgeRow, 0, kc), make([]float64, 0, kc)
		for k := range face.Corners {
			nb := ""
			if g := fl.Neighbour[k]; g >= 0 {
				nb = b.Flats[g].Label
			}
			row.Edges = append(row.Edges, EdgeRow{LengthMM: r(fl.EdgeMM[k], lenDigits), FoldDeg: r(fl.FoldDeg[k], angleDigits), BevelDeg: r(fl.BevelDeg[k], angleDigits), Neighbour: nb})
			row.AnglesDeg = append(row.AnglesDeg, r(fl.AngleDeg[k], angleDigits))
		}
		row.Diagonals = make([]DiagonalRow, 0, len(fl.Diagonals))
		for _, d := range fl.Diagonals {
			row.Diagonals = append(row.Diagonals, DiagonalRow{From: corner(d.I), To: corner(d.J), MM: r(d.MM, lenDigits)})
		}
		if sheetOf[f] >= 0 {
			row.Sheet = SheetName(sheetOf[f], len(b.Nesting.Sheets))
		}
		row.Outline = points(fl.Cut)
		rep.Panels = append(rep.Panels, row)
	}
	rep.buildTypes(b)
	if nr := b.Nesting; nr != nil {
		rep.Sheets = make([]SheetRow, 0, len(nr.Sheets))
		for si, sh := range nr.Sheets {
			st := b.Stocks[sh.Stock]
			row := SheetRow{Name: SheetName(si, len(nr.Sheets)), Stock: st.Name, WidthMM: st.WidthMM, HeightMM: st.HeightMM,
				MarginMM: st.MarginMM, Rotation: string(st.Rotation), Utilization: r(sh.Utilization, 4)}
			for _, c := range sh.Cuts {
				row.Cuts = append(row.Cuts, SheetCutRow{Piece: c.Piece, From: [2]float64{r(c.From.X, 3), r(c.From.Y, 3)}, To: [2]float64{r(c.To.X, 3), r(c.To.Y, 3)}})
			}
			row.CutLengthMM = r(sh.CutLengthMM, lenDigits)
			if len(sh.Placements) > 0 {
				row.Placements = make([]PlacementRow, 0, len(sh.Placements))
			}
			for _, p := range sh.Placements {
				row.Placements = append(row.Placements, PlacementRow{Panel: b.Flats[p.Part].Label, X: r(p.X, lenDigits), Y: r(p.Y, lenDigits),
					RotationDeg: r(p.RotationDeg, angleDigits), Mirrored: p.Mirrored, Outline: points(p.Outline)})
			}
			rep.Sheets = append(rep.Sheets, row)
		}
		for _, u := range nr.Unplaced {
			rep.Unplaced = append(rep.Unplaced, UnplacedRow{Panel: b.Flats[u.Part].Label, Reason: u.Reason.String()})
		}
		for _, u := range nr.Stocks {
			st := b.Stocks[u.Stock]
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
	rep.Weights = Weights{PanelsKg: r(rep.Weights.PanelsKg, weightDigits), MembersKg: r(rep.Weights.MembersKg, weightDigits),
		TotalKg: r(rep.Weights.PanelsKg+rep.Weights.MembersKg, weightDigits)}
	rep.Cost = b.Cost
	rep.Bays = bayGridOf(b.Bays)
	rep.Warnings = append(rep.Warnings, siteWarnings(rep)...)
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
// bundle has no blanks.
func blankOf(b *Bundle, k int) float64 {
	if k < len(b.Blanks) {
		return b.Blanks[k].LengthMM
	}
	return b.Structure.Members[k].CutLengthMM
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
		out[i] = [2]float64{r(v.X, lenDigits), r(v.Y, lenDigits)}
	}
	return out
}
