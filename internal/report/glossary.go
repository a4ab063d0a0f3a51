package report

// GlossaryEntry explains one word of the outputs, the job file or the
// commands that is not plain trade language, or a sign rule.
type GlossaryEntry struct {
	Term    string
	Meaning string
}

// Glossary is the schedule's Glossary sheet; the README's glossary says
// the same. Job keys and command names keep their words, so they are
// explained here rather than renamed.
var Glossary = []GlossaryEntry{
	{"net", "The design team's grid of nodes and panels that pqfab reads (job table [net], the NET of the commands). " +
		"net-flat.obj is the same net after the panels were made flat."},
	{"planarize", "Make the panels flat: move the nodes a little until every panel is flat within the flatness tolerance. " +
		"The command planarize does this step alone; build does it first."},
	{"fairness", "Job key flatness.fairness (flag --fairness): how much smooth node moves are preferred over small ones " +
		"while the panels are made flat; 0 turns it off."},
	{"node axis", "The line through a node that its hub is built on; members are cut back to the hub around it."},
	{"normal", "Job value nodes.axis = \"normal\": each node axis is square to the panels around the node (their mean)."},
	{"least-twist", "Job value nodes.axis = \"least-twist\": node axes chosen so that members twist as little as possible " +
		"while staying close to square to the panels."},
	{"twist", "The turn of a member's section from end A to end B: the angle from the axis at A to the axis at B, " +
		"both seen along the member. Positive when, looking along the member from A to B, the axis at B is turned " +
		"clockwise from the axis at A (right-hand rule about the direction A to B)."},
	{"member frame", "x runs along the member from end A to end B; z is square to x towards the top face (midway between " +
		"the two end axes); y = z × x, to the left looking from A to B with the top face up."},
	{"mitre", "The end cut's angle in plan of the member (turned about z). 0 is a square cut; positive when the cut's " +
		"edge on the +y (left) side lies nearer end A than its right edge. The same rule at both ends."},
	{"bevel", "Of a member end: the end cut's tilt in elevation (turned about y). 0 is a square cut; positive when " +
		"the cut's top edge lies nearer end A than its bottom edge. The same rule at both ends; read from end B, " +
		"a member's bevels change sign."},
	{"setback", "How far a member's end cut stands back from the node point along the member: hub radius / cos(elevation)."},
	{"blank", "The length sawn from a bar for one member: the cut length plus, at each end, what the end cut reaches beyond it."},
	{"bar", "A length of stock that members are cut from (a member is never called a bar). Bars are named by length " +
		"and number, 12m-001: a name that starts with a digit and cannot be read as a bay (B1) or a part label (B1-01)."},
	{"set-out", "The panel outline through the node points (the member centre lines). The cut outline is the set-out " +
		"outline with every edge moved in by the edge inset."},
	{"fold", "The angle between two panels at a shared edge or member: the signed angle between the directions square " +
		"to their outside faces; positive on a ridge, negative in a valley, 0 where they are flush."},
	{"panel edge bevel", "Half the fold at that edge, with the fold's sign (positive on a ridge): each panel's edge face then " +
		"lies on the plane halfway between the two panels, so they butt. Edges on the boundary take the job's boundary bevel."},
	{"azimuth", "Of a member at a node, seen from above the hub looking down the node axis: the angle counter-clockwise " +
		"from the first member in label order, 0 to 360°."},
	{"elevation", "Of a member at a node: its angle above (+) or below (−) the plane square to the node axis."},
	{"type", "Parts that agree within every type tolerance. The values listed for a type are the middle of its parts' " +
		"values, which is what is cut; every part lies within half the tolerance of them. The largest difference from " +
		"type is the most any part of the type differs from these values."},
	{"fewest possible types", "A count no grouping under the same tolerances can go below, with its reason: parts that " +
		"differ pairwise by more than the tolerances, or one quantity whose spread alone needs that many types."},
	{"quarter", "Job value stock.rotation = \"quarter\": parts may be turned by 0, 90, 180 or 270° on the sheet. " +
		"\"free\" allows any turn, \"grain\" only 0 or 180°."},
	{"first-edge", "Job value panel.grain = \"first-edge\": on grain stock, each panel's edge 1 (corner 1 to corner 2) runs " +
		"along the grain. \"longest-edge\" takes the longest edge, \"plan\" a direction in plan."},
	{"material, making, setup", "The kinds of cost line. Material: the bars and sheets bought, at their prices. Making: " +
		"cutting, end cuts and edge work only, by cut length or area, and nodes supplied and made. Setup: setup and " +
		"drawing per distinct type. Nothing is charged twice."},
}
