package export

import (
	"fmt"
)

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

// maxWarningLines is the most warnings a drawing's title block lists;
// report.json and the schedule list them all.
const maxWarningLines = 5

// warningLines returns the lines a title block shows for the warnings.
func warningLines(ws []string) []string {
	var out []string
	for i, w := range ws {
		if i == maxWarningLines {
			out = append(out, fmt.Sprintf("WARNING: … and %d more (see report.json)", len(ws)-i))
			break
		}
		out = append(out, "WARNING: "+w)
	}
	return out
}
