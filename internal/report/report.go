package report

import (
	"pqfab/internal/num"
	"pqfab/internal/pipeline"
	"pqfab/panels"
)

// Digits of the numbers in every output: lengths to 0.01 mm, angles to
// 0.001°, areas to 0.0001 m², weights to 0.01 kg.
const (
	LenDigits    = 2
	AngleDigits  = 3
	AreaDigits   = 4
	WeightDigits = 2
)

// r is the short name of the rounding used throughout this package.
var r = num.Round

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
	MemberTypes []MemberTypeRow   `json:"member_types"`
	NodeTypes   []NodeTypeRow     `json:"node_types"`
	PanelTypes  []PanelTypeRow    `json:"panel_types"`
	Section     Section           `json:"member_section_mm"`
	Sheets      []SheetRow        `json:"sheets"`
	Unplaced    []UnplacedRow     `json:"unplaced"`
	Stocks      []StockRow        `json:"stocks"`
	// Member material, bar stock and the members' cutting plan (empty
	// without bar stock), panel specification, and the weights.
	MemberMaterial MemberMaterial `json:"member_material"`
	PanelMaterial  PanelMaterial  `json:"panel_material"`
	BarStocks      []BarStockRow  `json:"bar_stocks"`
	Bars           []BarRow       `json:"bars"`
	PanelSpec      PanelSpec      `json:"panel_spec"`
	Weights        Weights        `json:"weights_kg"`
	Cost           *Cost          `json:"cost,omitempty"`
	Bays           BayGrid        `json:"bays"`
	// TagSize is the size of the tags in site/tags.pdf (a name in
	// pdf.TagSizes of export/pdf).
	TagSize string `json:"tag_size"`

	panelOf map[string]*PanelRow // panel rows by label, into Panels
}

// Section is the members' cross-section (mm): WallMM is the wall of a
// rectangular hollow section, 0 for a solid one.
type Section struct {
	WidthMM float64 `json:"width"`
	DepthMM float64 `json:"depth"`
	WallMM  float64 `json:"wall"`
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
	// Lower bounds on the type counts: no grouping that keeps the
	// tolerances can have fewer types.
	MemberTypesBound TypeBoundRow `json:"member_types_lower_bound"`
	NodeTypesBound   TypeBoundRow `json:"node_types_lower_bound"`
	PanelTypesBound  TypeBoundRow `json:"panel_types_lower_bound"`
}

// Planarity sums up the planarization.
type Planarity struct {
	ToleranceMM       float64       `json:"tolerance_mm"`
	Converged         bool          `json:"converged"`
	Iterations        int           `json:"iterations"`
	MaxMoveMM         float64       `json:"max_move_mm"`
	RMSMoveMM         float64       `json:"rms_move_mm"`
	FlatBeforeMM      panels.Spread `json:"flatness_before_mm"`
	FlatAfterMM       panels.Spread `json:"flatness_after_mm"`
	MaxTwistDeg       float64       `json:"max_abs_twist_deg"`
	MaxTwistNormalDeg float64       `json:"max_abs_twist_normal_axes_deg"`
}

// NodeRow is one node.
type NodeRow struct {
	Label         string     `json:"label"`
	ID            string     `json:"id"`
	Pos           [3]float64 `json:"position_mm"`
	Axis          [3]float64 `json:"axis"`
	MembersAtNode int        `json:"members_at_node"`
	Type          string     `json:"type"`
	Support       bool       `json:"support"`
	MoveMM        float64    `json:"move_mm"`
	Move          [3]float64 `json:"move_vector_mm"`
	// Hub: azimuth 0 ("north": grid north, +y of the plan, projected on
	// the hub plane; "up" where the axis lies along the north-south
	// line), the arms going round the hub from it, and the axis tilt: its
	// angle from vertical and the plan direction it leans toward
	// (counter-clockwise from grid north, seen from above).
	AzimuthZero       string   `json:"azimuth_zero"`
	Arms              []ArmRow `json:"arms"`
	AxisTiltDeg       float64  `json:"axis_tilt_deg"`
	AxisTiltTowardDeg float64  `json:"axis_tilt_toward_deg"`
}

// ArmRow is one member at a node's hub.
type ArmRow struct {
	Member       string  `json:"member"`
	AzimuthDeg   float64 `json:"azimuth_deg"`
	ElevationDeg float64 `json:"elevation_deg"`
}

// MemberRow is one member.
type MemberRow struct {
	Label       string  `json:"label"`
	NodeA       string  `json:"node_a"`
	NodeB       string  `json:"node_b"`
	LengthMM    float64 `json:"system_length_mm"`
	CutLengthMM float64 `json:"cut_length_mm"`
	TwistDeg    float64 `json:"twist_deg"`
	// FoldDeg is the fold between the two panels at the member: the signed
	// angle between their normals, ridge positive (as for panel edges);
	// 0 on the boundary.
	FoldDeg float64   `json:"fold_deg"`
	Type    string    `json:"type"`
	Ends    [2]EndRow `json:"ends"`
	// TagEnd is the member's own end, "A" or "B", that is its type's end
	// A: the end that carries the member's tag. Read from there, every
	// member of a type agrees with the type's values.
	TagEnd string `json:"tag_end"`
	// BlankMM is the length of bar the member is cut from: the cut length
	// plus an allowance for each end cut. Bar names the bar of the cutting
	// plan ("" without bar stock).
	BlankMM  float64 `json:"blank_length_mm"`
	Bar      string  `json:"bar"`
	WeightKg float64 `json:"weight_kg"`
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
	Label            string   `json:"label"`
	ID               string   `json:"id"`
	Corners          []string `json:"corners"`
	Cut              CutRow   `json:"cut"` // the cut outline's numbers: what is ordered
	GrainDeg         float64  `json:"grain_deg"`
	AreaM2           float64  `json:"area_m2"`
	PerimeterMM      float64  `json:"perimeter_mm"`
	WeightKg         float64  `json:"weight_kg"`
	FlatnessBeforeMM float64  `json:"flatness_before_mm"`
	FlatnessMM       float64  `json:"flatness_mm"`
	// Set-out (centre-line) numbers: edges (with their folds, bevels and
	// neighbours), corner angles and diagonals of the set-out outline.
	Edges     []EdgeRow     `json:"edges"`
	AnglesDeg []float64     `json:"corner_angles_deg"`
	Diagonals []DiagonalRow `json:"diagonals"`
	Type      string        `json:"type"`
	Sheet     string        `json:"sheet"`
	Outline   [][2]float64  `json:"cut_outline_mm"`
}

// CutRow holds a panel's cut-outline numbers: edge k runs from corner k
// to k+1 (corner 1 first), angles are the inner corner angles, and the
// box is the smallest enclosing rectangle, long side first.
type CutRow struct {
	EdgesMM   []float64     `json:"edges_mm"`
	AnglesDeg []float64     `json:"corner_angles_deg"`
	Diagonals []DiagonalRow `json:"diagonals"`
	BoxMM     [2]float64    `json:"box_mm"`
}

// PanelMaterial is what the panels are cut from.
type PanelMaterial struct {
	Name        string  `json:"name"`
	ThicknessMM float64 `json:"thickness_mm"`
	DensityKgM3 float64 `json:"density_kg_m3"`
	EdgeInsetMM float64 `json:"edge_inset_mm"`
	// BevelledEdges: edges are ground to their bevels, and each edge's
	// bevel is part of a panel type's promise.
	BevelledEdges bool `json:"bevelled_edges"`
}

// MemberMaterial is the members' material, density, section kind (solid,
// hollow or mass: a mass per metre given) and mass per metre, which every
// member weight comes from.
type MemberMaterial struct {
	Name        string  `json:"name"`
	DensityKgM3 float64 `json:"density_kg_m3"`
	Section     string  `json:"section"`
	KgPerM      float64 `json:"mass_kg_m"`
}

// Weights are the totals an estimator carries: panels (glass or board)
// and members (cut lengths, section and density).
type Weights struct {
	PanelsKg  float64 `json:"panels"`
	MembersKg float64 `json:"members"`
	TotalKg   float64 `json:"total"`
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

// SheetRow is one stock sheet.
type SheetRow struct {
	Name        string         `json:"name"`
	Stock       string         `json:"stock"`
	WidthMM     float64        `json:"width_mm"`
	HeightMM    float64        `json:"height_mm"`
	MarginMM    float64        `json:"margin_mm"`
	Rotation    string         `json:"rotation"` // free, quarter or grain (the grain runs along x)
	Utilization float64        `json:"utilization"`
	Placements  []PlacementRow `json:"placements"`
	// Cuts are the straight cuts that release every part (stock with
	// edge-to-edge cuts only), in cutting order: cut i splits piece
	// Piece (0 the whole sheet) into pieces 2i+1, left of From→To, and
	// 2i+2, right of it; each runs from edge to edge of its piece.
	Cuts        []SheetCutRow `json:"cuts,omitempty"`
	CutLengthMM float64       `json:"cut_length_mm,omitempty"`
}

// SheetCutRow is one cut of a sheet's cutting sequence (mm).
type SheetCutRow struct {
	Piece int        `json:"piece"`
	From  [2]float64 `json:"from_mm"`
	To    [2]float64 `json:"to_mm"`
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
	WidthMM   float64 `json:"width_mm"`
	HeightMM  float64 `json:"height_mm"`
	MarginMM  float64 `json:"margin_mm"`
	SpacingMM float64 `json:"spacing_mm"`
	Rotation  string  `json:"rotation"`
	Mirror    bool    `json:"mirror"`
	Cuts      string  `json:"cuts"`
	Count     int     `json:"count"` // sheets in stock; 0 for no limit
	Sheets    int     `json:"sheets"`
	AreaBound int     `json:"area_bound"`
	Price     float64 `json:"price"` // per sheet; 0 when the job gives none
	Cost      float64 `json:"cost"`  // sheets × price
}

// Panel returns the row of the panel with this label (indexed by New), or
// an empty row for a label the report does not hold.
func (rep *Report) Panel(label string) *PanelRow {
	if p := rep.panelOf[label]; p != nil {
		return p
	}
	return &PanelRow{Label: label}
}

// Caution is printed in every report, schedule, drawing and plan.
const Caution = pipeline.Caution
