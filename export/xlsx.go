package export

import (
	"bytes"
	"fmt"
	"io"
	"strings"

	"github.com/xuri/excelize/v2"
)

// Schedule sheet names.
const (
	SheetSummary     = "Summary"
	SheetPanels      = "Panels"
	SheetMembers     = "Members"
	SheetNodes       = "Nodes"
	SheetMemberTypes = "Member types"
	SheetPanelTypes  = "Panel types"
	SheetSheets      = "Sheets"
)

// WriteSchedule writes schedule.xlsx from the report model: a summary with
// the cautions and costs, then one table per part kind with a frozen
// header row, filters, units in the headers and numbers as numbers. Rows
// are streamed, so big nets need little memory.
func WriteSchedule(w io.Writer, rep *Report) (err error) {
	f := excelize.NewFile()
	defer func() {
		if cerr := f.Close(); err == nil {
			err = cerr
		}
	}()
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	if err := f.SetSheetName("Sheet1", SheetSummary); err != nil {
		return err
	}
	if err := writeSummary(f, rep, bold); err != nil {
		return err
	}
	tables := []struct {
		name   string
		header []string
		rows   func(add func(row ...any) error) error
	}{
		{SheetPanels, []string{"Label", "Id", "Type", "Sheet", "Corners", "Area (m²)", "Perimeter (mm)", "Weight (kg)",
			"Diagonal 1 (mm)", "Diagonal 2 (mm)", "Edge 1 (mm)", "Edge 2 (mm)", "Edge 3 (mm)", "Edge 4 (mm)",
			"Bevel 1 (°)", "Bevel 2 (°)", "Bevel 3 (°)", "Bevel 4 (°)", "Flatness before (mm)", "Flatness after (mm)"},
			func(add func(row ...any) error) error {
				for _, p := range rep.Panels {
					row := []any{p.Label, p.ID, p.Type, p.Sheet, strings.Join(p.Corners, " ")}
					row = append(row, p.AreaM2, p.PerimeterMM, p.WeightKg)
					row = append(row, nth(p.Diagonals, 0, func(d DiagonalRow) any { return d.MM }), nth(p.Diagonals, 1, func(d DiagonalRow) any { return d.MM }))
					for k := 0; k < 4; k++ {
						row = append(row, nth(p.Edges, k, func(e EdgeRow) any { return e.LengthMM }))
					}
					for k := 0; k < 4; k++ {
						row = append(row, nth(p.Edges, k, func(e EdgeRow) any { return e.BevelDeg }))
					}
					row = append(row, p.FlatnessBeforeMM, p.FlatnessMM)
					if err := add(row...); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetMembers, []string{"Label", "Type", "Node A", "Node B", "System length (mm)", "Cut length (mm)", "Twist (°)",
			"Dihedral (°)", "A elevation (°)", "A setback (mm)", "A mitre (°)", "A bevel (°)",
			"B elevation (°)", "B setback (mm)", "B mitre (°)", "B bevel (°)"},
			func(add func(row ...any) error) error {
				for _, m := range rep.Members {
					a, b := m.Ends[0], m.Ends[1]
					if err := add(m.Label, m.Type, m.NodeA, m.NodeB, m.LengthMM, m.CutLengthMM, m.TwistDeg, m.DihedralDeg,
						a.ElevationDeg, a.SetbackMM, a.MitreDeg, a.BevelDeg, b.ElevationDeg, b.SetbackMM, b.MitreDeg, b.BevelDeg); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetNodes, []string{"Label", "Id", "Type", "Valence", "X (mm)", "Y (mm)", "Z (mm)", "Axis x", "Axis y", "Axis z",
			"Support", "Move (mm)", "Move x (mm)", "Move y (mm)", "Move z (mm)", "Hub arms (member azimuth° elevation°)"},
			func(add func(row ...any) error) error {
				for _, n := range rep.Nodes {
					var arms []string
					for _, a := range n.Arms {
						arms = append(arms, fmt.Sprintf("%s %.3f %.3f", a.Member, a.AzimuthDeg, a.ElevationDeg))
					}
					sup := "no"
					if n.Support {
						sup = "yes"
					}
					if err := add(n.Label, n.ID, n.Type, n.Valence, n.Pos[0], n.Pos[1], n.Pos[2], n.Axis[0], n.Axis[1], n.Axis[2],
						sup, n.MoveMM, n.Move[0], n.Move[1], n.Move[2], strings.Join(arms, "; ")); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetMemberTypes, []string{"Type", "Count", "Cut length (mm)", "Members"}, typeRows(rep.MemberTypes, SheetMembers)},
		{SheetPanelTypes, []string{"Type", "Count", "Area (m²)", "Panels"}, typeRows(rep.PanelTypes, SheetPanels)},
		{SheetSheets, []string{"Sheet", "Stock", "Width (mm)", "Height (mm)", "Parts", "Utilization (%)", "Panels"},
			func(add func(row ...any) error) error {
				for _, s := range rep.Sheets {
					var labels []string
					for _, p := range s.Placements {
						labels = append(labels, p.Panel)
					}
					if err := add(s.Name, s.Stock, s.WidthMM, s.HeightMM, len(s.Placements), r(100*s.Utilization, 2), strings.Join(labels, " ")); err != nil {
						return err
					}
				}
				for _, u := range rep.Unplaced {
					if err := add("unplaced", u.Reason, nil, nil, 1, nil, u.Panel); err != nil {
						return err
					}
				}
				return nil
			}},
	}
	for i, t := range tables {
		if _, err := f.NewSheet(t.name); err != nil {
			return err
		}
		if err := writeTable(f, t.name, fmt.Sprintf("t%d", i+1), t.header, bold, t.rows); err != nil {
			return fmt.Errorf("schedule sheet %s: %w", t.name, err)
		}
	}
	var buf bytes.Buffer
	if err := f.Write(&buf); err != nil {
		return err
	}
	return writeSortedZip(w, buf.Bytes())
}

func nth[T any](xs []T, k int, get func(T) any) any {
	if k < len(xs) {
		return get(xs[k])
	}
	return nil
}

func typeRows(ts []TypeRow, partsSheet string) func(add func(row ...any) error) error {
	return func(add func(row ...any) error) error {
		for _, t := range ts {
			if err := add(t.Name, t.Count, t.Size, partList(t.Parts, partsSheet)); err != nil {
				return err
			}
		}
		return nil
	}
}

// partList joins part labels for one cell; a list too long for a cell is
// named by where it stands in full instead.
func partList(labels []string, sheet string) string {
	s := strings.Join(labels, " ")
	if len(s) > MaxCellChars {
		return fmt.Sprintf("%d parts: too many for one cell; the %s sheet gives each part's type", len(labels), sheet)
	}
	return s
}

// safeCells makes every text value of a row safe for a cell (cellText),
// refusing text too long for one.
func safeCells(row []any) error {
	for i, v := range row {
		if s, ok := v.(string); ok {
			t, err := cellText(s)
			if err != nil {
				return err
			}
			row[i] = t
		}
	}
	return nil
}

// writeTable streams a header and rows into a sheet, freezes the header
// and puts filters on it.
func writeTable(f *excelize.File, sheet, table string, header []string, bold int, rows func(add func(row ...any) error) error) error {
	sw, err := f.NewStreamWriter(sheet)
	if err != nil {
		return err
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	if err := sw.SetColWidth(1, len(header), 14); err != nil {
		return err
	}
	head := make([]any, len(header))
	for i, h := range header {
		head[i] = excelize.Cell{StyleID: bold, Value: h}
	}
	if err := sw.SetRow("A1", head); err != nil {
		return err
	}
	n := 1
	err = rows(func(row ...any) error {
		n++
		cell, err := excelize.CoordinatesToCellName(1, n)
		if err != nil {
			return err
		}
		if err := safeCells(row); err != nil {
			return fmt.Errorf("row %d: %w", n, err)
		}
		return sw.SetRow(cell, row)
	})
	if err != nil {
		return err
	}
	if n >= 2 {
		last, err := excelize.CoordinatesToCellName(len(header), n)
		if err != nil {
			return err
		}
		off := false
		if err := sw.AddTable(&excelize.Table{Range: "A1:" + last, Name: table, StyleName: "TableStyleLight1", ShowRowStripes: &off}); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// writeSummary writes the cautions, the job, the counts and the costs.
func writeSummary(f *excelize.File, rep *Report, bold int) error {
	sh := SheetSummary
	row := 0
	put := func(vals ...any) error {
		row++
		cell, err := excelize.CoordinatesToCellName(1, row)
		if err != nil {
			return err
		}
		if err := safeCells(vals); err != nil {
			return fmt.Errorf("summary row %d: %w", row, err)
		}
		return f.SetSheetRow(sh, cell, &vals)
	}
	head := func(title string) error {
		if err := put(); err != nil {
			return err
		}
		if err := put(title); err != nil {
			return err
		}
		cell, _ := excelize.CoordinatesToCellName(1, row)
		return f.SetCellStyle(sh, cell, cell, bold)
	}
	steps := []func() error{
		func() error { return put(rep.Title) },
		func() error { return put("CAUTION", rep.Caution) },
		func() error { return head("Job") },
		func() error { return put("Job file", rep.Job) },
		func() error { return put("Net file", rep.Net) },
	}
	for _, s := range rep.Settings {
		s := s
		steps = append(steps, func() error { return put(s.Name, s.Value) })
	}
	c := rep.Counts
	steps = append(steps,
		func() error { return head("Counts") },
		func() error { return put("Nodes", c.Nodes) },
		func() error { return put("Members", c.Members) },
		func() error { return put("Panels", c.Panels) },
		func() error { return put("Member types", c.MemberTypes) },
		func() error { return put("Node types", c.NodeTypes) },
		func() error { return put("Panel types", c.PanelTypes) },
		func() error { return put("Stock sheets", c.Sheets) },
		func() error { return put("Unplaced panels", c.Unplaced) },
		func() error { return head("Planarity") },
		func() error { return put("Flatness tolerance (mm)", rep.Planarity.ToleranceMM) },
		func() error { return put("Flatness before, max (mm)", rep.Planarity.FlatBeforeMM.Max) },
		func() error { return put("Flatness after, max (mm)", rep.Planarity.FlatAfterMM.Max) },
		func() error { return put("Largest node move (mm)", rep.Planarity.MaxMoveMM) },
		func() error { return put("RMS node move (mm)", rep.Planarity.RMSMoveMM) },
		func() error { return put("Largest |twist| (°)", rep.Planarity.MaxTwistDeg) },
	)
	for _, s := range rep.Stocks {
		s := s
		steps = append(steps, func() error {
			return put("Stock "+s.Name+": sheets / area bound", s.Sheets, s.AreaBound)
		})
	}
	if rep.Cost != nil {
		steps = append(steps, func() error { return head("Cost estimate (" + rep.Cost.Currency + ")") },
			func() error { return put("Item", "Quantity", "Unit", "Rate", "Amount") })
		for _, l := range rep.Cost.Lines {
			l := l
			steps = append(steps, func() error { return put(l.Item, l.Quantity, l.Unit, l.Rate, l.Amount) })
		}
		steps = append(steps, func() error { return put("Total", nil, nil, nil, rep.Cost.Total) })
	}
	for _, w := range rep.Warnings {
		w := w
		steps = append(steps, func() error { return put("Warning", w) })
	}
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	if err := f.SetColWidth(sh, "A", "A", 34); err != nil {
		return err
	}
	return f.SetColWidth(sh, "B", "E", 18)
}
