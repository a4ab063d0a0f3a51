package report

// Type rows: what the workshop makes and the estimator counts. A type is
// a promise: every two parts of a type agree within every tolerance, and
// every part lies within half the tolerance of the type's nominal part
// (the middle of each value's range over the parts), which is what is cut.

// TypeBoundRow is the fewest types any grouping can have, the quantity
// that gave it, and the reason in words.
type TypeBoundRow struct {
	Count    int    `json:"count"`
	Quantity string `json:"quantity"`
	Reason   string `json:"reason"`
}

// MemberTypeRow is one member type: the nominal member and its parts.
type MemberTypeRow struct {
	Name        string  `json:"name"`
	Count       int     `json:"count"`
	CutLengthMM float64 `json:"cut_length_mm"`
	BlankMM     float64 `json:"blank_length_mm"`
	// Ends A and B of the nominal member: mitre, bevel and setback at the
	// hub (the setback of a cut with these angles).
	Ends     [2]TypeEndRow `json:"ends"`
	TwistDeg float64       `json:"twist_deg"`
	// SetOutMM is the nominal system length, node to node: the cut length
	// and both setbacks, the length of the drawing's set-out line.
	SetOutMM float64 `json:"set_out_length_mm"`
	// Faces: the lengths of the nominal member's four long faces measured
	// on their centre lines between the end cuts: top, bottom (the
	// section's z = ±depth/2), and the sides at y = +width/2 and
	// y = −width/2 (y = z × x, x from end A to end B). The longer of top
	// and bottom is the long point of the elevation, the shorter the
	// short point.
	Faces     FaceLengthsRow `json:"face_lengths_mm"`
	MaxDevMM  float64        `json:"max_deviation_mm"`
	MaxDevDeg float64        `json:"max_deviation_deg"`
	TotalM    float64        `json:"total_cut_length_m"`
	WeightKg  float64        `json:"total_weight_kg"`
	Parts     []string       `json:"parts"`
	ReadFromB []string       `json:"read_from_end_b"` // parts whose end B is the type's end A
}

// FaceLengthsRow is the length of each long face of a member type.
type FaceLengthsRow struct {
	Top     float64 `json:"top"`
	Bottom  float64 `json:"bottom"`
	SidePos float64 `json:"side_y_pos"`
	SideNeg float64 `json:"side_y_neg"`
}

// TypeEndRow is one end of a member type.
type TypeEndRow struct {
	MitreDeg  float64 `json:"mitre_deg"`
	BevelDeg  float64 `json:"bevel_deg"`
	SetbackMM float64 `json:"setback_mm"`
}

// NodeTypeRow is one node type: its members at node and nominal arms.
type NodeTypeRow struct {
	Name          string       `json:"name"`
	Count         int          `json:"count"`
	MembersAtNode int          `json:"members_at_node"`
	Arms          []TypeArmRow `json:"arms"` // azimuth from the type's first arm, elevation
	MaxDevDeg     float64      `json:"max_deviation_deg"`
	Parts         []string     `json:"parts"`
}

// TypeArmRow is one arm of a node type.
type TypeArmRow struct {
	AzimuthDeg   float64 `json:"azimuth_deg"`
	ElevationDeg float64 `json:"elevation_deg"`
}

// PanelTypeRow is one panel type: the nominal cut outline's numbers, in
// the type's corner order (edge k from corner k to k+1), and the drawing.
type PanelTypeRow struct {
	Name        string        `json:"name"`
	Count       int           `json:"count"`
	EdgesMM     []float64     `json:"edges_mm"`
	AnglesDeg   []float64     `json:"corner_angles_deg"`
	Diagonals   []DiagonalRow `json:"diagonals"` // From and To are corner numbers
	AreaM2      float64       `json:"area_m2"`
	PerimeterMM float64       `json:"perimeter_mm"`
	// BevelsDeg: per edge, least and most over the parts; PartBevels:
	// every part's bevels by the type's edges. Both for the type's faces
	// as drawn: a part cut turned over has its own signs reversed (its
	// outside is the drawing's inside face). See BevelSignNote.
	BevelsDeg   [][2]float64    `json:"bevels_deg"`
	PartBevels  []PartBevelsRow `json:"part_bevels"`
	MaxDevMM    float64         `json:"max_deviation_mm"`
	MaxDevDeg   float64         `json:"max_deviation_deg"`
	TotalAreaM2 float64         `json:"total_area_m2"`
	WeightKg    float64         `json:"total_weight_kg"`
	Spec        PanelSpec       `json:"spec"`
	Parts       []string        `json:"parts"`
	Mirrored    []string        `json:"turned_over"` // parts cut from the shape turned over
	// The drawing (panel-types/PT-NNN.dxf): the nominal cut outline fitted
	// to the nominal edges and diagonals (corner 1 at the origin, edge 1
	// along x), the set-out outline around it, and the numbers written on
	// the drawing, measured on that outline.
	Drawing PanelDrawingRow `json:"drawing"`
}

// PartBevelsRow is one part's edge bevels by its type's edges (degrees).
type PartBevelsRow struct {
	Panel     string    `json:"panel"`
	BevelsDeg []float64 `json:"bevels_deg"`
}

// PanelDrawingRow is what a panel type drawing shows.
type PanelDrawingRow struct {
	CutMM     [][2]float64  `json:"cut_outline_mm"`
	SetOutMM  [][2]float64  `json:"set_out_outline_mm"`
	EdgesMM   []float64     `json:"edges_mm"`
	AnglesDeg []float64     `json:"corner_angles_deg"`
	Diagonals []DiagonalRow `json:"diagonals"`
}
