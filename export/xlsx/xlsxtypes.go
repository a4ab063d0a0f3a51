package xlsx

import (
	"fmt"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
)

// The type sheets list what the workshop makes: each type's nominal part
// (the middle of its parts' values: what is cut), the largest deviation of
// a part from it, the count, totals and the parts.

var memberTypeHead = []string{"Type", "Count", "Cut length (mm)", "Blank length (mm)",
	"A mitre (°)", "A bevel (°)", "A setback (mm)", "B mitre (°)", "B bevel (°)", "B setback (mm)", "Twist (°)",
	"System length (mm)", "Top face (mm)", "Bottom face (mm)", "Side +y (mm)", "Side -y (mm)",
	"Largest difference from type (mm)", "Largest difference from type (°)", "Total cut length (m)", "Total weight (kg)",
	"Members", "Members whose end B is the type's end A (the tag end)"}

func memberTypeRows(rep *report.Report) func(add func(row ...any) error) error {
	return func(add func(row ...any) error) error {
		for _, t := range rep.MemberTypes {
			a, b := t.Ends[0], t.Ends[1]
			if err := add(t.Name, t.Count, t.CutLengthMM, t.BlankMM, a.MitreDeg, a.BevelDeg, a.SetbackMM, b.MitreDeg, b.BevelDeg, b.SetbackMM,
				t.TwistDeg, t.SetOutMM, t.Faces.Top, t.Faces.Bottom, t.Faces.SidePos, t.Faces.SideNeg, t.MaxDevMM, t.MaxDevDeg, t.TotalM, t.WeightKg,
				partList(t.Parts, SheetMembers), partList(t.ReadFromB, SheetMembers)); err != nil {
				return err
			}
		}
		return nil
	}
}

// nodeTypeHead returns the Node types sheet's header: an azimuth (from
// arm 1) and an elevation column per arm, as many as the most members at
// a node.
func nodeTypeHead(rep *report.Report) []string {
	head := []string{"Type", "Count", "Members at node", "Largest difference from type (°)", "Nodes"}
	k := 0
	for _, t := range rep.NodeTypes {
		k = max(k, len(t.Arms))
	}
	return append(head, numbered(k, "Arm %d azimuth from arm 1 (°)", "Arm %d elevation (°)")...)
}

func nodeTypeRows(rep *report.Report) func(add func(row ...any) error) error {
	return func(add func(row ...any) error) error {
		for _, t := range rep.NodeTypes {
			row := []any{t.Name, t.Count, t.MembersAtNode, t.MaxDevDeg, partList(t.Parts, SheetNodes)}
			for _, a := range t.Arms {
				row = append(row, a.AzimuthDeg, a.ElevationDeg)
			}
			if err := add(row...); err != nil {
				return err
			}
		}
		return nil
	}
}

// panelTypeHead returns the Panel types sheet's header, as wide as the
// largest corner count.
func panelTypeHead(rep *report.Report) []string {
	k := typeCorners(rep)
	head := []string{"Type", "Count", "Corners"}
	for i := 1; i <= k; i++ {
		head = append(head, fmt.Sprintf("Cut edge %d (mm)", i))
	}
	for _, d := range diagonalPairs(k) {
		head = append(head, fmt.Sprintf("Cut diagonal %d-%d (mm)", d[0]+1, d[1]+1))
	}
	for i := 1; i <= k; i++ {
		head = append(head, fmt.Sprintf("Cut angle %d (°)", i))
	}
	for i := 1; i <= k; i++ {
		head = append(head, fmt.Sprintf("Bevel %d least (%s)", i, layout.BevelSignHead), fmt.Sprintf("Bevel %d most (°)", i))
	}
	return append(head, "Cut area (m²)", "Cut perimeter (mm)", "Largest difference from type (mm)", "Largest difference from type (°)",
		"Total area (m²)", "Thickness (mm)", "Total weight (kg)", "Build-up", "Edge work", "Coating", "Heat treatment", "Grade", "Panels", "Panels turned over")
}

func typeCorners(rep *report.Report) int {
	k := 3
	for _, t := range rep.PanelTypes {
		k = max(k, len(t.EdgesMM))
	}
	return k
}

func panelTypeRows(rep *report.Report) func(add func(row ...any) error) error {
	k := typeCorners(rep)
	pairs := diagonalPairs(k)
	return func(add func(row ...any) error) error {
		for _, t := range rep.PanelTypes {
			row := []any{t.Name, t.Count, len(t.EdgesMM)}
			row = appendN(row, t.EdgesMM, k)
			corners := make([]string, len(t.EdgesMM))
			for i := range corners {
				corners[i] = fmt.Sprint(i + 1)
			}
			row = appendDiagonals(row, t.Diagonals, corners, pairs)
			row = appendN(row, t.AnglesDeg, k)
			for i := 0; i < k; i++ {
				if i < len(t.BevelsDeg) {
					row = append(row, t.BevelsDeg[i][0], t.BevelsDeg[i][1])
				} else {
					row = append(row, nil, nil)
				}
			}
			s := t.Spec
			thick := rep.PanelMaterial.ThicknessMM
			if s.ThicknessMM > 0 {
				thick = s.ThicknessMM
			}
			row = append(row, t.AreaM2, t.PerimeterMM, t.MaxDevMM, t.MaxDevDeg, t.TotalAreaM2, thick, t.WeightKg,
				s.BuildUp, s.EdgeWork, s.Coating, s.HeatTreatment, s.Grade, partList(t.Parts, SheetPanels), partList(t.Mirrored, SheetPanels))
			if err := add(row...); err != nil {
				return err
			}
		}
		return nil
	}
}
