package export

import (
	"fmt"
	"strings"
)

// The type sheets list what the workshop makes: each type's nominal part
// (the middle of its parts' values: what is cut), the largest deviation of
// a part from it, the count, totals and the parts.

var memberTypeHead = []string{"Type", "Count", "Cut length (mm)", "Blank length (mm)",
	"A mitre (°)", "A bevel (°)", "A setback (mm)", "B mitre (°)", "B bevel (°)", "B setback (mm)", "Twist (°)",
	"Largest deviation (mm)", "Largest deviation (°)", "Total cut length (m)", "Total weight (kg)",
	"Members", "Members read from end B"}

func memberTypeRows(rep *Report) func(add func(row ...any) error) error {
	return func(add func(row ...any) error) error {
		for _, t := range rep.MemberTypes {
			a, b := t.Ends[0], t.Ends[1]
			if err := add(t.Name, t.Count, t.CutLengthMM, t.BlankMM, a.MitreDeg, a.BevelDeg, a.SetbackMM, b.MitreDeg, b.BevelDeg, b.SetbackMM,
				t.TwistDeg, t.MaxDevMM, t.MaxDevDeg, t.TotalM, t.WeightKg,
				partList(t.Parts, SheetMembers), partList(t.ReadFromB, SheetMembers)); err != nil {
				return err
			}
		}
		return nil
	}
}

var nodeTypeHead = []string{"Type", "Count", "Members at node", "Arms (azimuth° from arm 1, elevation°)", "Largest deviation (°)", "Nodes"}

func nodeTypeRows(rep *Report) func(add func(row ...any) error) error {
	return func(add func(row ...any) error) error {
		for _, t := range rep.NodeTypes {
			arms := make([]string, len(t.Arms))
			for i, a := range t.Arms {
				arms[i] = fmt.Sprintf("%s/%s", fixed(a.AzimuthDeg, 3), fixed(a.ElevationDeg, 3))
			}
			if err := add(t.Name, t.Count, t.MembersAtNode, strings.Join(arms, "; "), t.MaxDevDeg, partList(t.Parts, SheetNodes)); err != nil {
				return err
			}
		}
		return nil
	}
}

// panelTypeHead returns the Panel types sheet's header, as wide as the
// largest corner count.
func panelTypeHead(rep *Report) []string {
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
		head = append(head, fmt.Sprintf("Bevel %d (least to most; %s)", i, BevelSignHead))
	}
	return append(head, "Cut area (m²)", "Cut perimeter (mm)", "Largest deviation (mm)", "Largest deviation (°)",
		"Total area (m²)", "Thickness (mm)", "Total weight (kg)", "Build-up", "Edge work", "Coating", "Heat treatment", "Grade", "Panels", "Panels turned over")
}

func typeCorners(rep *Report) int {
	k := 3
	for _, t := range rep.PanelTypes {
		k = max(k, len(t.EdgesMM))
	}
	return k
}

func panelTypeRows(rep *Report) func(add func(row ...any) error) error {
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
					bv := t.BevelsDeg[i]
					row = append(row, signedFixed(bv[0], 2)+" to "+signedFixed(bv[1], 2))
				} else {
					row = append(row, nil)
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
