package layout

// The sign of an edge bevel, in words, on every output that gives one.
// A bevel is fold / 2 with the fold positive at a ridge (see
// geom.FoldAngle): at a ridge the bisector plane runs from the outside
// face's edge in under the pane, so the outside face is the larger; at a
// valley the inside face is. The angle is measured from square to the
// faces.
const (
	// BevelSignNote is the full definition, for drawings.
	BevelSignNote = "Bevel sign: + = the edge face leans in under the pane, the outside face is the larger (as at a ridge); " +
		"- = the inside face is the larger (as at a valley); degrees from square to the faces"
	// BevelSignShort is the definition as it fits on a tag.
	BevelSignShort = "Bevel +: outside face larger; -: inside face larger."
	// BevelSignHead is the definition in a schedule column header.
	BevelSignHead = "°, + outside face larger"
)

// SignedFixed formats x with d decimals and its sign: "+2.1", "-5.7",
// "0.0" (never "-0.0" nor "+0.0").
func SignedFixed(x float64, d int) string {
	s := Fixed(x, d)
	if s[0] != '-' && Fixed(-x, d)[0] == '-' {
		return "+" + s
	}
	return s
}
