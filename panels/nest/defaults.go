package nest

// Stock defaults: what a stock sheet gets for the settings a job or a
// command leaves out. The sheet size is a common float glass "jumbo" size
// (6000 × 3210 mm, common practice); the edge margin and the spacing
// between parts (kerf plus clearance) are common practice for glass and
// board cutting, to be checked against the cutting machine.
const (
	DefaultSheetWidthMM  = 6000.0
	DefaultSheetHeightMM = 3210.0
	DefaultMarginMM      = 20.0
	DefaultSpacingMM     = 6.0
	DefaultRotation      = Free
	DefaultCuts          = AnyCut
)

// DefaultStock returns a stock sheet named name with every default: the
// default size, margin, spacing, rotation and cuts, no mirroring, no count
// limit and no price.
func DefaultStock(name string) Stock {
	return Stock{Name: name, WidthMM: DefaultSheetWidthMM, HeightMM: DefaultSheetHeightMM, MarginMM: DefaultMarginMM,
		SpacingMM: DefaultSpacingMM, Rotation: DefaultRotation, Cuts: DefaultCuts}
}
