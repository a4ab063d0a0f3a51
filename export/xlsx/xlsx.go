package xlsx

import (
	"archive/zip"
	"compress/flate"
	"fmt"
	"io"
	"math"
	"pqfab/internal/report"
	"pqfab/nodes"
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
	SheetNodeTypes   = "Node types"
	SheetPanelTypes  = "Panel types"
	SheetSheets      = "Sheets"
	SheetCuts        = "Cuts"
	SheetBars        = "Bars"
	SheetGlossary    = "Glossary"
)

// WriteSchedule writes schedule.xlsx from the report model: a summary with
// the cautions and costs, then one table per part kind with a frozen
// header row, filters, units in the headers and numbers as numbers. Rows
// are streamed, so big nets need little memory.
func WriteSchedule(w io.Writer, rep *report.Report) (err error) {
	f := excelize.NewFile()
	// The fastest deflate level: a schedule of a large net is mostly
	// numbers, and compressing it harder costs more time than it saves
	// space. Output stays the same for the same input.
	f.SetZipWriter(func(w io.Writer) excelize.ZipWriter {
		zw := zip.NewWriter(w)
		zw.RegisterCompressor(zip.Deflate, func(out io.Writer) (io.WriteCloser, error) { return flate.NewWriter(out, flate.BestSpeed) })
		return zw
	})
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
	panelHead, panelRows := panelsTable(rep)
	cuts := 0
	for _, s := range rep.Sheets {
		cuts += len(s.Cuts)
	}
	tables := []struct {
		name   string
		header []string
		n      int // rows, the header aside
		rows   func(add func(row ...any) error) error
	}{
		{SheetPanels, panelHead, len(rep.Panels), panelRows},
		{SheetMembers, []string{"Label", "Type", "Node A", "Node B", "Tag end (A or B: the type's end A)", "Cut length (mm)", "Blank length (mm)", "Bar",
			"A mitre (°)", "A bevel (°)", "B mitre (°)", "B bevel (°)", "Twist (°)", "A setback (mm)", "B setback (mm)",
			"A elevation (°)", "B elevation (°)", "System length (mm)", "Fold (°)", "Weight (kg)"}, len(rep.Members),
			func(add func(row ...any) error) error {
				for _, m := range rep.Members {
					a, b := m.Ends[0], m.Ends[1]
					if err := add(m.Label, m.Type, m.NodeA, m.NodeB, m.TagEnd, m.CutLengthMM, m.BlankMM, m.Bar,
						a.MitreDeg, a.BevelDeg, b.MitreDeg, b.BevelDeg, m.TwistDeg, a.SetbackMM, b.SetbackMM,
						a.ElevationDeg, b.ElevationDeg, m.LengthMM, m.FoldDeg, m.WeightKg); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetNodes, nodeHead(rep), len(rep.Nodes),
			func(add func(row ...any) error) error {
				for _, n := range rep.Nodes {
					sup := "no"
					if n.Support {
						sup = "yes"
					}
					row := []any{n.Label, n.ID, n.Type, n.MembersAtNode, n.Pos[0], n.Pos[1], n.Pos[2], n.Axis[0], n.Axis[1], n.Axis[2],
						n.AxisTiltDeg, n.AxisTiltTowardDeg, azimuthZeroText(n.AzimuthZero), sup, n.MoveMM, n.Move[0], n.Move[1], n.Move[2]}
					for _, a := range n.Arms {
						row = append(row, a.Member, a.AzimuthDeg, a.ElevationDeg)
					}
					if err := add(row...); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetMemberTypes, memberTypeHead, len(rep.MemberTypes), memberTypeRows(rep)},
		{SheetNodeTypes, nodeTypeHead(rep), len(rep.NodeTypes), nodeTypeRows(rep)},
		{SheetPanelTypes, panelTypeHead(rep), len(rep.PanelTypes), panelTypeRows(rep)},
		{SheetSheets, []string{"Sheet", "Stock", "Width (mm)", "Height (mm)", "Parts", "Utilization (%)", "Cuts", "Cut length (m)", "Panels"},
			len(rep.Sheets) + len(rep.Unplaced),
			func(add func(row ...any) error) error {
				for _, s := range rep.Sheets {
					var labels []string
					for _, p := range s.Placements {
						labels = append(labels, p.Panel)
					}
					var cuts, cutM any
					if len(s.Cuts) > 0 {
						cuts, cutM = len(s.Cuts), r(s.CutLengthMM/1000, 3)
					}
					if err := add(s.Name, s.Stock, s.WidthMM, s.HeightMM, len(s.Placements), r(100*s.Utilization, 2), cuts, cutM, strings.Join(labels, " ")); err != nil {
						return err
					}
				}
				for _, u := range rep.Unplaced {
					if err := add("unplaced", u.Reason, nil, nil, 1, nil, nil, nil, u.Panel); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetCuts, []string{"Sheet", "Cut", "Splits piece", "Piece left", "Piece right", "From x (mm)", "From y (mm)", "To x (mm)", "To y (mm)", "Length (mm)"}, cuts,
			func(add func(row ...any) error) error {
				for _, s := range rep.Sheets {
					for i, c := range s.Cuts {
						l := math.Hypot(c.To[0]-c.From[0], c.To[1]-c.From[1])
						if err := add(s.Name, i+1, c.Piece, 2*i+1, 2*i+2, c.From[0], c.From[1], c.To[0], c.To[1], r(l, 2)); err != nil {
							return err
						}
					}
				}
				return nil
			}},
		{SheetBars, barHead(rep), len(rep.Bars),
			func(add func(row ...any) error) error {
				for _, b := range rep.Bars {
					row := []any{b.Name, b.Stock, b.LengthMM, len(b.Pieces), b.UsedMM, b.OffcutMM, b.WasteMM}
					for _, p := range b.Pieces {
						row = append(row, p.Member, p.BlankMM)
					}
					if err := add(row...); err != nil {
						return err
					}
				}
				return nil
			}},
		{SheetGlossary, []string{"Term", "Meaning"}, len(report.Glossary),
			func(add func(row ...any) error) error {
				for _, g := range report.Glossary {
					if err := add(g.Term, g.Meaning); err != nil {
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
		if err := writeTable(f, t.name, fmt.Sprintf("t%d", i+1), t.header, t.n, bold, t.rows); err != nil {
			return fmt.Errorf("schedule sheet %s: %w", t.name, err)
		}
	}
	// excelize builds the archive in a growing buffer; a compact copy of
	// it in fixed chunks lets that buffer go while the archive is re-packed
	// (measured at 100k panels: 1.53 GB peak from the buffer, 1.39 GB
	// with the copy).
	var buf chunks
	if err := f.Write(&buf); err != nil {
		return err
	}
	return writeSortedZip(w, &buf, buf.size)
}

// nodeHead returns the Nodes sheet's header: a member, azimuth and
// elevation column per arm, as many as the most members at a node.
func nodeHead(rep *report.Report) []string {
	head := []string{"Label", "Id", "Type", "Members at node", "X (mm)", "Y (mm)", "Z (mm)", "Axis x", "Axis y", "Axis z",
		"Axis tilt (°)", "Tilt toward (° counter-clockwise from grid north)", "Azimuth 0",
		"Support", "Move (mm)", "Move x (mm)", "Move y (mm)", "Move z (mm)"}
	k := 0
	for _, n := range rep.Nodes {
		k = max(k, len(n.Arms))
	}
	// Arms going round the hub, azimuth from the hub's azimuth 0.
	return append(head, numbered(k, "Arm %d member", "Arm %d azimuth (°)", "Arm %d elevation (°)")...)
}

// barHead returns the Bars sheet's header: a member and blank length
// column per piece in cutting order, as many as the fullest bar holds.
func barHead(rep *report.Report) []string {
	head := []string{"Bar", "Stock", "Stock length (mm)", "Members", "Used (mm)", "Offcut (mm)", "Waste (mm)"}
	k := 0
	for _, b := range rep.Bars {
		k = max(k, len(b.Pieces))
	}
	return append(head, numbered(k, "Piece %d member", "Piece %d blank length (mm)")...)
}

// numbered returns the column names for k repeated groups of columns:
// each format with 1, then each with 2, and so on.
func numbered(k int, formats ...string) []string {
	out := make([]string, 0, k*len(formats))
	for i := 1; i <= k; i++ {
		for _, f := range formats {
			out = append(out, fmt.Sprintf(f, i))
		}
	}
	return out
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

// writeTable streams a header and n rows, each no wider than the header,
// into a sheet, freezes the header and puts filters on it.
func writeTable(f *excelize.File, sheet, table string, header []string, n int, bold int, rows func(add func(row ...any) error) error) error {
	// The stream writes the used range before the rows.
	if err := setDimension(f, sheet, len(header), 1+n); err != nil {
		return err
	}
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
	if sheet == SheetGlossary { // a column of sentences
		if err := sw.SetColWidth(1, 1, 24); err != nil {
			return err
		}
		if err := sw.SetColWidth(2, 2, 150); err != nil {
			return err
		}
	}
	head := make([]any, len(header))
	for i, h := range header {
		head[i] = excelize.Cell{StyleID: bold, Value: h}
	}
	if err := sw.SetRow("A1", head); err != nil {
		return err
	}
	at := 1 // the row written last
	err = rows(func(row ...any) error {
		if at++; at > 1+n || len(row) > len(header) {
			return fmt.Errorf("row %d: %d cells, beyond the %d rows of %d cells declared", at, len(row), n, len(header))
		}
		cell, err := excelize.CoordinatesToCellName(1, at)
		if err != nil {
			return err
		}
		if err := safeCells(row); err != nil {
			return fmt.Errorf("row %d: %w", at, err)
		}
		return sw.SetRow(cell, row)
	})
	if err != nil {
		return err
	}
	if at != 1+n {
		return fmt.Errorf("%d rows written, %d declared", at-1, n)
	}
	if n > 0 {
		last, err := excelize.CoordinatesToCellName(len(header), at)
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
func writeSummary(f *excelize.File, rep *report.Report, bold int) error {
	sh := SheetSummary
	row, cols := 0, 1
	put := func(vals ...any) error {
		row++
		cols = max(cols, len(vals))
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
		func() error { return put("Geometry file", rep.Net) },
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
		func() error {
			return put("Types", "Count", "Fewest possible", "Why no grouping has fewer")
		},
		func() error {
			return put("Member types", c.MemberTypes, c.MemberTypesBound.Count, c.MemberTypesBound.Reason)
		},
		func() error { return put("Node types", c.NodeTypes, c.NodeTypesBound.Count, c.NodeTypesBound.Reason) },
		func() error {
			return put("Panel types", c.PanelTypes, c.PanelTypesBound.Count, c.PanelTypesBound.Reason)
		},
		func() error { return put("Stock sheets", c.Sheets) },
		func() error { return put("Unplaced panels", c.Unplaced) },
		func() error { return put("Bars", len(rep.Bars)) },
		func() error { return head("Making the panels flat") },
		func() error { return put("Flatness tolerance (mm)", rep.Planarity.ToleranceMM) },
		func() error { return put("Flatness before, max (mm)", rep.Planarity.FlatBeforeMM.Max) },
		func() error { return put("Flatness after, max (mm)", rep.Planarity.FlatAfterMM.Max) },
		func() error { return put("Largest node move (mm)", rep.Planarity.MaxMoveMM) },
		func() error { return put("RMS node move (mm)", rep.Planarity.RMSMoveMM) },
		func() error { return put("Largest |twist| (°)", rep.Planarity.MaxTwistDeg) },
	)
	steps = append(steps, func() error { return head("Sheet stock") },
		func() error {
			return put("Stock", "Width (mm)", "Height (mm)", "Edge margin (mm)", "Spacing (mm)", "Turns allowed", "Mirrored parts",
				"Cuts", "In stock (0: no limit)", "Price per sheet", "Sheets used", "Fewest sheets by area")
		})
	for _, s := range rep.Stocks {
		steps = append(steps, func() error {
			mirror := "no"
			if s.Mirror {
				mirror = "yes"
			}
			return put(s.Name, s.WidthMM, s.HeightMM, s.MarginMM, s.SpacingMM, s.Rotation, mirror, s.Cuts, s.Count, s.Price, s.Sheets, s.AreaBound)
		})
	}
	steps = append(steps, func() error { return head("Bars (member stock)") })
	if len(rep.BarStocks) == 0 {
		steps = append(steps, func() error { return put("No bar stock in the job: no cutting plan") })
	}
	var stockMM, offcutMM, wasteMM float64
	for _, b := range rep.Bars {
		stockMM, offcutMM, wasteMM = stockMM+b.LengthMM, offcutMM+b.OffcutMM, wasteMM+b.WasteMM
	}
	if len(rep.BarStocks) > 0 {
		steps = append(steps, func() error {
			return put("Bar stock", "Length (mm)", "Kerf (mm)", "Trim at each end (mm)", "Price per bar", "Bars used", "Fewest bars by length")
		})
	}
	for _, b := range rep.BarStocks {
		steps = append(steps, func() error {
			return put(b.Name, b.LengthMM, b.KerfMM, b.TrimMM, b.Price, b.Bars, b.FewestByLength)
		})
	}
	if len(rep.BarStocks) > 0 {
		steps = append(steps, func() error { return put() },
			func() error { return put("Bar stock length (m)", r(stockMM/1000, 3)) },
			func() error { return put("Offcuts (m)", r(offcutMM/1000, 3)) },
			func() error { return put("Waste: kerfs, trims, slivers (m)", r(wasteMM/1000, 3)) })
	}
	steps = append(steps,
		func() error { return head("Weights") },
		func() error { return put("Panels (kg)", rep.Weights.PanelsKg) },
		func() error {
			return put(fmt.Sprintf("Members, %s, %s section, %g kg/m (kg)", rep.MemberMaterial.Name, rep.MemberMaterial.Section, rep.MemberMaterial.KgPerM), rep.Weights.MembersKg)
		},
		func() error { return put("Total (kg)", rep.Weights.TotalKg) })
	if rep.Cost != nil {
		steps = append(steps, func() error { return head("Cost estimate (" + rep.Cost.Currency + ")") },
			func() error { return put(report.CostNote) },
			func() error { return put("Item", "Quantity", "Unit", "Rate", "Amount", "Kind") })
		for _, l := range rep.Cost.Lines {
			l := l
			steps = append(steps, func() error { return put(l.Item, l.Quantity, l.Unit, l.Rate, l.Amount, l.Kind) })
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
	if err := setDimension(f, sh, cols, row); err != nil {
		return err
	}
	if err := f.SetColWidth(sh, "A", "A", 34); err != nil {
		return err
	}
	return f.SetColWidth(sh, "B", "L", 18)
}

// setDimension records the range a sheet uses, A1 to column cols, row
// rows: readers that read a sheet without loading it all trust it.
func setDimension(f *excelize.File, sheet string, cols, rows int) error {
	last, err := excelize.CoordinatesToCellName(cols, max(rows, 1))
	if err != nil {
		return err
	}
	return f.SetSheetDimension(sheet, "A1:"+last)
}

// azimuthZeroText names a hub's azimuth 0 for the schedule.
func azimuthZeroText(zero string) string {
	if zero == nodes.ZeroUp {
		return "up (+z) on the plane square to the axis"
	}
	return "grid north (+y) on the plane square to the axis"
}
