package dxf

// DXF layer names: our own, one concept each. Colours come from the layer.
const (
	LayerPlanMember  = "PQ-PLAN-MEMBER" // members seen from above
	LayerPlanPanel   = "PQ-PLAN-PANEL"  // panel outlines seen from above
	LayerNodeLabel   = "PQ-NODE-LABEL"
	LayerMemberLabel = "PQ-MEMBER-LABEL"
	LayerPanelLabel  = "PQ-PANEL-LABEL"
	Layer3DMember    = "PQ-3D-MEMBER"       // member lines in space
	LayerPlanTop     = "PQ-PLAN-MEMBER-TOP" // top face of each member between its hub cuts, seen from above
	LayerTitle       = "PQ-TITLE"           // title and caution
)
