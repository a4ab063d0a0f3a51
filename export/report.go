package export

import (
	"encoding/json"
	"io"
	"strconv"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
)

// Digits of the numbers in every output: lengths to 0.01 mm, angles to
// 0.001°, areas to 0.0001 m², weights to 0.01 kg.
const (
	lenDigits    = 2
	angleDigits  = 3
	areaDigits   = 4
	weightDigits = 2
)

func itoa(i int) string { return strconv.Itoa(i) }

// Report is report.json: everything, machine-readable. Lengths mm, angles
// degrees, areas m², weights kg.
type Report struct {
	Title       string            `json:"title"`
	Caution     string            `json:"caution"`
	Job         string            `json:"job"`
	Net         string            `json:"net"`
	Units       map[string]string `json:"units"`
	Settings    []Setting         `json:"settings"`
	Warnings    []string          `json:"warnings"`
	Counts      Counts            `json:"counts"`
	Planarity   Planarity         `json:"planarity"`
	Nodes       []NodeRow         `json:"nodes"`
	Members     []MemberRow       `json:"members"`
	Panels      []PanelRow        `json:"panels"`
	MemberTypes []TypeRow         `json:"member_types"`
	NodeTypes   []TypeRow         `json:"node_types"`
	PanelTypes  []TypeRow         `json:"panel_types"`
	Section     Section           `json:"member_section_mm"`
	Sheets      []SheetRow        `json:"sheets"`
	Unplaced    []UnplacedRow     `json:"unplaced"`
	Stocks      []StockRow        `json:"stocks"`
	Cost        *Cost             `json:"cost,omitempty"`
	Bays        BayGrid           `json:"bays"`

	stockInfo []StockInfo // margins for the cut sheets
	typeOf    map[string]string
}

// Section is the members' cross-section (mm).
type Section struct {
	Width float64 `json:"width"`
	Depth float64 `json:"depth"`
}

// StockInfo is what the cut sheets need of a stock size.
type StockInfo struct {
	Name     string
	MarginMM float64
}

// Counts are the headline numbers.
type Counts struct {
	Nodes       int `json:"nodes"`
	Members     int `json:"members"`
	Panels      int `json:"panels"`
	Sheets      int `json:"sheets"`
	Unplaced    int `json:"unplaced"`
	MemberTypes int `json:"member_types"`
	NodeTypes   int `json:"node_types"`
	PanelTypes  int `json:"panel_types"`
}

// Planarity sums up the planarization.
type Planarity struct {
	ToleranceMM   float64       `json:"tolerance_mm"`
	Converged     bool          `json:"converged"`
	Iterations    int           `json:"iterations"`
	MaxMoveMM     float64       `json:"max_move_mm"`
	RMSMoveMM     float64       `json:"rms_move_mm"`
	FlatBeforeMM  panels.Spread `json:"flatness_before_mm"`
	FlatAfterMM   panels.Spread `json:"flatness_after_mm"`
	MaxTwistDeg   float64       `json:"max_abs_twist_deg"`
	MaxTwistNormD float64       `json:"max_abs_twist_normal_axes_deg"`
}

// NodeRow is one node.
type NodeRow struct {
	Label   string     `json:"label"`
	ID      string     `json:"id"`
	Pos     [3]float64 `json:"position_mm"`
	Axis    [3]float64 `json:"axis"`
	Valence int        `json:"valence"`
	Type    string     `json:"type"`
	Support bool       `json:"support"`
	MoveMM  float64    `json:"move_mm"`
	Move    [3]float64 `json:"move_vector_mm"`
	Arms    []ArmRow   `json:"arms"`
}

// ArmRow is one member at a node's hub.
type ArmRow struct {
	Member       string  `json:"member"`
	AzimuthDeg   float64 `json:"azimuth_deg"`
	ElevationDeg float64 `json:"elevation_deg"`
}

// MemberRow is one member.
type MemberRow struct {
	Label       string    `json:"label"`
	NodeA       string    `json:"node_a"`
	NodeB       string    `json:"node_b"`
	LengthMM    float64   `json:"system_length_mm"`
	CutLengthMM float64   `json:"cut_length_mm"`
	TwistDeg    float64   `json:"twist_deg"`
	DihedralDeg float64   `json:"dihedral_deg"`
	Type        string    `json:"type"`
	Ends        [2]EndRow `json:"ends"`
	// Frame axes of the member: X along it (A to B), Z the top of the
	// section, Y = Z × X.
	FrameY [3]float64 `json:"frame_y"`
	FrameZ [3]float64 `json:"frame_z"`
}

// EndRow is one end cut.
type EndRow struct {
	Node         string  `json:"node"`
	ElevationDeg float64 `json:"elevation_deg"`
	SetbackMM    float64 `json:"setback_mm"`
	MitreDeg     float64 `json:"mitre_deg"`
	BevelDeg     float64 `json:"bevel_deg"`
}

// PanelRow is one panel.
type PanelRow struct {
	Label            string        `json:"label"`
	ID               string        `json:"id"`
	Corners          []string      `json:"corners"`
	AreaM2           float64       `json:"area_m2"`
	PerimeterMM      float64       `json:"perimeter_mm"`
	WeightKg         float64       `json:"weight_kg"`
	FlatnessBeforeMM float64       `json:"flatness_before_mm"`
	FlatnessMM       float64       `json:"flatness_mm"`
	Edges            []EdgeRow     `json:"edges"`
	AnglesDeg        []float64     `json:"corner_angles_deg"`
	Diagonals        []DiagonalRow `json:"diagonals"`
	Type             string        `json:"type"`
	Sheet            string        `json:"sheet"`
	Outline          [][2]float64  `json:"cut_outline_mm"`
}

// EdgeRow is one panel edge.
type EdgeRow struct {
	LengthMM  float64 `json:"length_mm"`
	FoldDeg   float64 `json:"fold_deg"`
	BevelDeg  float64 `json:"bevel_deg"`
	Neighbour string  `json:"neighbour"`
}

// DiagonalRow is one diagonal.
type DiagonalRow struct {
	From string  `json:"from"`
	To   string  `json:"to"`
	MM   float64 `json:"length_mm"`
}

// TypeRow is one type of part.
type TypeRow struct {
	Name  string   `json:"name"`
	Count int      `json:"count"`
	Size  float64  `json:"size"` // cut length (mm), valence, or area (m²)
	Parts []string `json:"parts"`
}

// SheetRow is one stock sheet.
type SheetRow struct {
	Name        string         `json:"name"`
	Stock       string         `json:"stock"`
	WidthMM     float64        `json:"width_mm"`
	HeightMM    float64        `json:"height_mm"`
	Utilization float64        `json:"utilization"`
	Placements  []PlacementRow `json:"placements"`
}

// PlacementRow is one part on a sheet.
type PlacementRow struct {
	Panel       string       `json:"panel"`
	X           float64      `json:"x_mm"`
	Y           float64      `json:"y_mm"`
	RotationDeg float64      `json:"rotation_deg"`
	Mirrored    bool         `json:"mirrored"`
	Outline     [][2]float64 `json:"outline_mm"`
}

// UnplacedRow is a panel on no sheet.
type UnplacedRow struct {
	Panel  string `json:"panel"`
	Reason string `json:"reason"`
}

// StockRow sums up one stock size.
type StockRow struct {
	Name      string  `json:"name"`
	Sheets    int     `json:"sheets"`
	AreaBound int     `json:"area_bound"`
	Cost      float64 `json:"cost"`
}

func vec(v r3.Vec, d int) [3]float64 { return [3]float64{r(v.X, d), r(v.Y, d), r(v.Z, d)} }

// BuildReport turns a bundle into the report model that report.json, the
// schedule and the HTML page share.
func BuildReport(b *Bundle) *Report {
	s := b.Structure
	n := b.Net
	rep := &Report{Title: b.Title, Caution: Caution, Job: b.JobFile, Net: b.NetFile,
		Units:    map[string]string{"length": "mm", "angle": "degree", "area": "m2", "weight": "kg"},
		Settings: b.Settings, Warnings: append([]string{}, b.Warnings...),
		Sheets: []SheetRow{}, Unplaced: []UnplacedRow{}, Stocks: []StockRow{}}
	nodeLabel := func(i int) string { return s.Nodes[i].Label }
	rep.Section = Section{Width: s.Section.WidthMM, Depth: s.Section.DepthMM}
	rep.Counts = Counts{Nodes: len(n.Nodes), Members: len(s.Members), Panels: len(n.Faces),
		MemberTypes: len(s.MemberTypes), NodeTypes: len(s.NodeTypes), PanelTypes: len(b.PanelTypes)}
	pl := b.Planarize
	rep.Planarity = Planarity{ToleranceMM: b.TolMM, Converged: pl.Converged, Iterations: pl.Iterations,
		MaxMoveMM: r(pl.MaxMoveMM, 3), RMSMoveMM: r(pl.RMSMoveMM, 3),
		FlatBeforeMM: spread(panels.SpreadOf(pl.Before), 3), FlatAfterMM: spread(panels.SpreadOf(pl.After), 4),
		MaxTwistDeg: r(nodes.MaxAbsTwist(s.Members), angleDigits), MaxTwistNormD: r(s.TwistNormalDeg, angleDigits)}
	for i, nd := range s.Nodes {
		row := NodeRow{Label: nd.Label, ID: n.Nodes[i].ID, Pos: vec(n.Nodes[i].Pos, lenDigits), Axis: vec(nd.Axis, 6),
			Valence: nd.Valence, Type: s.NodeTypes[nd.Type].Name, Support: b.Supports[i],
			MoveMM: r(r3.Norm(pl.Moves[i]), lenDigits), Move: vec(pl.Moves[i], lenDigits)}
		for _, a := range nd.Arms {
			row.Arms = append(row.Arms, ArmRow{Member: s.Members[a.Member].Label, AzimuthDeg: r(a.AzimuthDeg, angleDigits), ElevationDeg: r(a.ElevationDeg, angleDigits)})
		}
		rep.Nodes = append(rep.Nodes, row)
	}
	for _, m := range s.Members {
		end := func(e nodes.End) EndRow {
			return EndRow{Node: nodeLabel(e.Node), ElevationDeg: r(e.ElevationDeg, angleDigits), SetbackMM: r(e.SetbackMM, lenDigits), MitreDeg: r(e.MitreDeg, angleDigits), BevelDeg: r(e.BevelDeg, angleDigits)}
		}
		rep.Members = append(rep.Members, MemberRow{Label: m.Label, NodeA: nodeLabel(m.A.Node), NodeB: nodeLabel(m.B.Node),
			LengthMM: r(m.LengthMM, lenDigits), CutLengthMM: r(m.CutLengthMM, lenDigits), TwistDeg: r(m.TwistDeg, angleDigits),
			DihedralDeg: r(m.DihedralDeg, angleDigits), Type: s.MemberTypes[m.Type].Name,
			Ends: [2]EndRow{end(m.A), end(m.B)}, FrameY: vec(m.Frame.Y, 6), FrameZ: vec(m.Frame.Z, 6)})
	}
	sheetOf := b.sheetOf()
	for f, fl := range b.Flats {
		face := n.Faces[f]
		row := PanelRow{Label: fl.Label, ID: face.ID, AreaM2: r(fl.AreaM2, areaDigits), PerimeterMM: r(fl.PerimeterMM, lenDigits),
			WeightKg: r(fl.WeightKg, weightDigits), FlatnessBeforeMM: r(pl.Before[f], 3), FlatnessMM: r(pl.After[f], 4),
			Type: b.PanelTypes[fl.Type].Name}
		for _, c := range face.Corners {
			row.Corners = append(row.Corners, nodeLabel(c))
		}
		for k := range face.Corners {
			nb := ""
			if g := fl.Neighbour[k]; g >= 0 {
				nb = b.Flats[g].Label
			}
			row.Edges = append(row.Edges, EdgeRow{LengthMM: r(fl.EdgeMM[k], lenDigits), FoldDeg: r(fl.FoldDeg[k], angleDigits), BevelDeg: r(fl.BevelDeg[k], angleDigits), Neighbour: nb})
			row.AnglesDeg = append(row.AnglesDeg, r(fl.AngleDeg[k], angleDigits))
		}
		for _, d := range fl.Diagonals {
			row.Diagonals = append(row.Diagonals, DiagonalRow{From: nodeLabel(face.Corners[d.I]), To: nodeLabel(face.Corners[d.J]), MM: r(d.MM, lenDigits)})
		}
		if sheetOf[f] >= 0 {
			row.Sheet = SheetName(sheetOf[f], len(b.Nesting.Sheets))
		}
		row.Outline = points(fl.Cut)
		rep.Panels = append(rep.Panels, row)
	}
	for _, t := range s.MemberTypes {
		row := TypeRow{Name: t.Name, Count: len(t.Members), Size: r(s.Members[t.Rep].CutLengthMM, lenDigits)}
		for _, i := range t.Members {
			row.Parts = append(row.Parts, s.Members[i].Label)
		}
		rep.MemberTypes = append(rep.MemberTypes, row)
	}
	for _, t := range s.NodeTypes {
		row := TypeRow{Name: t.Name, Count: len(t.Members), Size: float64(s.Nodes[t.Rep].Valence)}
		for _, i := range t.Members {
			row.Parts = append(row.Parts, s.Nodes[i].Label)
		}
		rep.NodeTypes = append(rep.NodeTypes, row)
	}
	for _, t := range b.PanelTypes {
		row := TypeRow{Name: t.Name, Count: len(t.Panels), Size: r(b.Flats[t.Rep].AreaM2, areaDigits)}
		for _, i := range t.Panels {
			row.Parts = append(row.Parts, b.Flats[i].Label)
		}
		rep.PanelTypes = append(rep.PanelTypes, row)
	}
	if nr := b.Nesting; nr != nil {
		for si, sh := range nr.Sheets {
			st := b.Stocks[sh.Stock]
			row := SheetRow{Name: SheetName(si, len(nr.Sheets)), Stock: st.Name, WidthMM: st.WidthMM, HeightMM: st.HeightMM, Utilization: r(sh.Utilization, 4)}
			for _, p := range sh.Placements {
				row.Placements = append(row.Placements, PlacementRow{Panel: b.Flats[p.Part].Label, X: r(p.X, lenDigits), Y: r(p.Y, lenDigits),
					RotationDeg: r(p.RotationDeg, angleDigits), Mirrored: p.Mirrored, Outline: points(p.Outline)})
			}
			rep.Sheets = append(rep.Sheets, row)
		}
		for _, u := range nr.Unplaced {
			rep.Unplaced = append(rep.Unplaced, UnplacedRow{Panel: b.Flats[u.Part].Label, Reason: u.Reason})
		}
		for _, u := range nr.Stocks {
			rep.Stocks = append(rep.Stocks, StockRow{Name: b.Stocks[u.Stock].Name, Sheets: u.Sheets, AreaBound: u.AreaBound, Cost: r(u.Cost, 2)})
		}
		rep.Counts.Sheets = len(nr.Sheets)
		rep.Counts.Unplaced = len(nr.Unplaced)
	}
	rep.Cost = b.Cost
	for _, st := range b.Stocks {
		rep.stockInfo = append(rep.stockInfo, StockInfo{Name: st.Name, MarginMM: st.MarginMM})
	}
	rep.Bays = bayGridOf(b.Bays)
	rep.Warnings = append(rep.Warnings, siteWarnings(rep)...)
	return rep
}

func points(p geom.Polygon) [][2]float64 {
	out := make([][2]float64, len(p))
	for i, v := range p {
		out[i] = [2]float64{r(v.X, lenDigits), r(v.Y, lenDigits)}
	}
	return out
}

// WriteJSON writes report.json, compact (it is for machines).
func WriteJSON(w io.Writer, rep *Report) error {
	return json.NewEncoder(w).Encode(rep)
}
