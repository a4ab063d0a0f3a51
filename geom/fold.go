package geom

// FoldAngle returns the signed angle (radians) between the unit normals n1
// and n2 of two panels meeting along an edge, measured about the edge
// direction e, where panel 1 runs along e (from the edge's first node to
// its second) and panel 2 against it. Zero for coplanar panels, positive
// for a ridge (the panels fall away from each other), negative for a
// valley.
func FoldAngle(n1, n2, e Vec) float64 {
	return SignedAngle(n1, n2, e)
}
