package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"pqfab/geom"
	"pqfab/internal/pipeline"
	"pqfab/nodes"
	"pqfab/nodes/bars"
	"pqfab/panels"
	"pqfab/parttype"
)

// boundRow turns a bound on the number of types of parts (the noun, such
// as "members"; apart says which of them never share a type) into a row
// with its reason in words.
func boundRow(b parttype.Bound, noun, apart string) TypeBoundRow {
	return TypeBoundRow{Count: b.Count, Quantity: b.Quantity, Reason: boundReason(b, noun, apart)}
}

// boundReason says in words why no grouping has fewer types than b.Count:
// "at least 37 types: 37 of the members differ pairwise by more than the
// tolerances, so no two of them can share a type", or "… by cut length
// alone the members need at least 37 types"; a bound that adds up sets of
// parts that never share a type gives each set's share.
func boundReason(b parttype.Bound, noun, apart string) string {
	types := func(n int) string {
		if n == 1 {
			return "1 type"
		}
		return strconv.Itoa(n) + " types"
	}
	switch len(b.Terms) {
	case 0:
		return ""
	case 1:
		t := b.Terms[0]
		parts := t.Parts
		if parts == "" {
			parts = noun
		}
		if t.Key != "" && t.Count > 1 {
			return fmt.Sprintf("at least %s: by %s alone the %s need at least %s (values further apart than the tolerance cannot share a type)", types(b.Count), t.Key, parts, types(t.Count))
		}
		if t.Count == 1 {
			return fmt.Sprintf("at least 1 type: there are %s", parts)
		}
		return fmt.Sprintf("at least %s: %d of the %s differ pairwise by more than the tolerances, so no two of them can share a type", types(b.Count), t.Count, parts)
	}
	each := make([]string, len(b.Terms))
	for i, t := range b.Terms {
		switch {
		case t.Key != "" && t.Count > 1:
			each[i] = fmt.Sprintf("%s need at least %s (by %s alone)", t.Parts, types(t.Count), t.Key)
		case t.Count == 1:
			each[i] = fmt.Sprintf("%s need at least 1 type", t.Parts)
		default:
			each[i] = fmt.Sprintf("%s need at least %s (%d of them differ pairwise by more than the tolerances)", t.Parts, types(t.Count), t.Count)
		}
	}
	return fmt.Sprintf("at least %s: %s; %s", types(b.Count), apart, strings.Join(each, ", "))
}

// buildTypes fills the type rows: the nominal part of every type, its
// deviation, totals and parts.
func (rep *Report) buildTypes(res *pipeline.Result) {
	s := res.Structure
	hub := res.Job.Nodes.HubRadiusMM
	kgm := res.Job.Member.KgPerM()
	rep.MemberTypes = make([]MemberTypeRow, 0, len(s.MemberTypes))
	for _, t := range s.MemberTypes {
		row := MemberTypeRow{Name: t.Name, Count: len(t.Parts), CutLengthMM: r(t.CutLengthMM, LenDigits),
			TwistDeg: r(t.TwistDeg, AngleDigits), MaxDevMM: r(t.MaxDevMM, LenDigits), MaxDevDeg: r(t.MaxDevDeg, AngleDigits),
			TotalM: r(t.TotalCutLengthMM/1000, 3), WeightKg: r(kgm*t.TotalCutLengthMM/1000, WeightDigits),
			ReadFromB: []string{}}
		blank := t.CutLengthMM
		for k, e := range []struct{ MitreDeg, BevelDeg float64 }{{t.A.MitreDeg, t.A.BevelDeg}, {t.B.MitreDeg, t.B.BevelDeg}} {
			row.Ends[k] = TypeEndRow{MitreDeg: r(e.MitreDeg, AngleDigits), BevelDeg: r(e.BevelDeg, AngleDigits),
				SetbackMM: r(nodes.SetbackMM(hub, e.MitreDeg, e.BevelDeg), LenDigits)}
			blank += bars.EndAllowanceMM(s.Section.WidthMM, s.Section.DepthMM, e.MitreDeg, e.BevelDeg)
		}
		row.BlankMM = r(blank, LenDigits)
		row.SetOutMM = r(t.CutLengthMM+nodes.SetbackMM(hub, t.A.MitreDeg, t.A.BevelDeg)+nodes.SetbackMM(hub, t.B.MitreDeg, t.B.BevelDeg), LenDigits)
		face := func(y, z float64) float64 {
			return r(faceLength(t.CutLengthMM, t.A.MitreDeg, t.A.BevelDeg, t.B.MitreDeg, t.B.BevelDeg, y, z), LenDigits)
		}
		w, d := s.Section.WidthMM/2, s.Section.DepthMM/2
		row.Faces = FaceLengthsRow{Top: face(0, d), Bottom: face(0, -d), SidePos: face(w, 0), SideNeg: face(-w, 0)}
		for k, i := range t.Parts {
			row.Parts = append(row.Parts, s.Members[i].Label)
			if t.Reversed[k] {
				row.ReadFromB = append(row.ReadFromB, s.Members[i].Label)
			}
		}
		rep.MemberTypes = append(rep.MemberTypes, row)
	}
	rep.NodeTypes = make([]NodeTypeRow, 0, len(s.NodeTypes))
	for _, t := range s.NodeTypes {
		row := NodeTypeRow{Name: t.Name, Count: len(t.Parts), MembersAtNode: t.MembersAtNode, MaxDevDeg: r(t.MaxDevDeg, AngleDigits)}
		for _, a := range t.Arms {
			row.Arms = append(row.Arms, TypeArmRow{AzimuthDeg: r(a.AzimuthDeg, AngleDigits), ElevationDeg: r(a.ElevationDeg, AngleDigits)})
		}
		for _, i := range t.Parts {
			row.Parts = append(row.Parts, s.Nodes[i].Label)
		}
		rep.NodeTypes = append(rep.NodeTypes, row)
	}
	rep.PanelTypes = make([]PanelTypeRow, 0, len(res.PanelTypes))
	for ti, t := range res.PanelTypes {
		k := len(t.EdgeMM)
		// The numbers of a type are its nominal outline's, as measured on
		// it: the drawing and the schedule print one value, and the
		// deviations are the panels' from those numbers.
		edges, angles, diags := panels.OutlineNumbers(t.Outline)
		row := PanelTypeRow{Name: t.Name, Count: len(t.Panels), EdgesMM: round(edges, LenDigits), AnglesDeg: round(angles, AngleDigits),
			AreaM2: r(t.AreaM2, AreaDigits), PerimeterMM: r(t.PerimeterMM, LenDigits), MaxDevMM: r(t.OutlineDevMM, LenDigits),
			MaxDevDeg: r(t.OutlineDevDeg, AngleDigits), TotalAreaM2: r(t.TotalAreaM2, AreaDigits), WeightKg: r(t.TotalWeightKg, WeightDigits),
			Spec: specOf(res, t.Name), Diagonals: cornerDiagonals(diags), Mirrored: []string{}}
		row.BevelsDeg = make([][2]float64, k)
		for e := 0; e < k; e++ {
			row.BevelsDeg[e] = [2]float64{math.Inf(1), math.Inf(-1)}
		}
		for n, f := range t.Panels {
			fl := res.Flats[f]
			row.Parts = append(row.Parts, fl.Label)
			if t.Mirrored[n] {
				row.Mirrored = append(row.Mirrored, fl.Label)
			}
			pb := PartBevelsRow{Panel: fl.Label, BevelsDeg: make([]float64, k)}
			for e, bv := range panels.TypeBevels(&res.PanelTypes[ti], n, fl) {
				pb.BevelsDeg[e] = r(bv, 2)
				row.BevelsDeg[e] = [2]float64{min(row.BevelsDeg[e][0], bv), max(row.BevelsDeg[e][1], bv)}
			}
			row.PartBevels = append(row.PartBevels, pb)
		}
		for e := range row.BevelsDeg {
			row.BevelsDeg[e] = [2]float64{r(row.BevelsDeg[e][0], 2), r(row.BevelsDeg[e][1], 2)}
		}
		row.Drawing = PanelDrawingRow{CutMM: pointsTo(t.Outline, drawingDigits), EdgesMM: row.EdgesMM, AnglesDeg: row.AnglesDeg,
			Diagonals: row.Diagonals}
		if ti < len(res.PanelTypeSetOut) {
			row.Drawing.SetOutMM = pointsTo(res.PanelTypeSetOut[ti], drawingDigits)
		}
		rep.PanelTypes = append(rep.PanelTypes, row)
	}
}

// faceLength is the length of a member's long line through section
// point (y, z) between its end cuts: the cut length on the axis, with
// each end cut's offset along the member at that point (TypeEndRow.Offset).
func faceLength(cut, mA, bA, mB, bB, y, z float64) float64 {
	a := TypeEndRow{MitreDeg: mA, BevelDeg: bA}
	b := TypeEndRow{MitreDeg: mB, BevelDeg: bB}
	return cut + b.Offset(y, z) - a.Offset(y, z)
}

// Offset returns how far along the member axis the end cut at section
// point (y, z) lies from the cut's axis point, for a plane with the end's
// mitre and bevel (normal oriented along +x): x = −y·tan(mitre) − z·tan(bevel).
func (e TypeEndRow) Offset(y, z float64) float64 {
	return -y*math.Tan(e.MitreDeg*math.Pi/180) - z*math.Tan(e.BevelDeg*math.Pi/180)
}

// specOf returns the specification of a panel type: the type's own where
// the job gives one, else the job's.
func specOf(res *pipeline.Result, typeName string) PanelSpec {
	if s, ok := res.TypeSpecs[typeName]; ok {
		return s
	}
	return pipeline.Spec(res.Job.Panel.PanelSpec)
}

// drawingDigits: the type drawings' outlines are given to 0.001 mm, so
// that lengths measured on them agree with the drawings' texts (0.01 mm).
const drawingDigits = 3

// pointsTo writes a polygon's corners rounded to d decimals.
func pointsTo(p geom.Polygon, d int) [][2]float64 {
	out := make([][2]float64, len(p))
	for i, v := range p {
		out[i] = [2]float64{r(v.X, d), r(v.Y, d)}
	}
	return out
}

// cornerDiagonals lists diagonals between corner numbers (from 1).
func cornerDiagonals(ds []panels.Diagonal) []DiagonalRow {
	out := make([]DiagonalRow, len(ds))
	for i, d := range ds {
		out[i] = DiagonalRow{From: strconv.Itoa(d.I + 1), To: strconv.Itoa(d.J + 1), MM: r(d.MM, LenDigits)}
	}
	return out
}
