package nodes

import (
	"math"

	"pqfab/geom"
	"pqfab/parttype"
	"pqfab/quadnet"
)

// Options sets up the whole node and member computation. A zero field
// means its default, so Options{HubRadiusMM: 60} is the defaults with a
// hub; where zero is a setting of its own, a negative constant asks for
// it (NoTypeTol).
type Options struct {
	Axis          AxisMethod // "": DefaultAxis
	AxisStiffness float64    // least-twist only; 0: DefaultAxisStiffness
	HubRadiusMM   float64    // 0: DefaultHubRadiusMM (no hub)
	// Section: a zero WidthMM or DepthMM is DefaultSectionWidthMM or
	// DefaultSectionDepthMM; WallMM 0 is solid.
	Section Section
	Bays    quadnet.Bays // zero: no bays
	Types   TypeOptions  // zero tolerances: their defaults
}

// Member section defaults (mm): a common timber gridshell lath size,
// for drawings only.
const (
	DefaultSectionWidthMM = 60.0
	DefaultSectionDepthMM = 120.0
)

// DefaultAxis is the node axis method, and DefaultHubRadiusMM the hub
// radius (no hub: members run to the node point), when none is given.
const (
	DefaultAxis        = AxisLeastTwist
	DefaultHubRadiusMM = 0.0
)

// DefaultOptions returns the default axes and hub, the default section,
// no bays and the default type tolerances, every field set: the zero
// Options does the same work.
func DefaultOptions() Options {
	return Options{Axis: DefaultAxis, HubRadiusMM: DefaultHubRadiusMM, Section: Section{WidthMM: DefaultSectionWidthMM, DepthMM: DefaultSectionDepthMM},
		Types: TypeOptions{LengthTolMM: DefaultTypeLengthTolMM, AngleTolDeg: DefaultTypeAngleTolDeg}}
}

// Structure is the result: nodes, members and their types.
type Structure struct {
	Nodes       []Node
	Members     []Member
	MemberTypes []MemberType
	NodeTypes   []NodeType
	// Lower bounds on the numbers of types (see parttype.Bound).
	MemberTypeBound parttype.Bound
	NodeTypeBound   parttype.Bound
	// TwistNormalDeg is the largest |twist| with normal axes, for the
	// report; equal to the members' largest twist for AxisNormal.
	TwistNormalDeg float64
	Section        Section
}

// MaxHubRadiusMM and MaxSectionMM bound the sizes an option may take
// (10 m): larger values are a unit mistake.
const (
	MaxHubRadiusMM = 1e4
	MaxSectionMM   = 1e4
)

// withDefaults returns the options with every zero field but Types set
// to its default (GroupMembers and GroupNodes set the tolerances').
func (o Options) withDefaults() Options {
	if o.Axis == "" {
		o.Axis = DefaultAxis
	}
	if o.AxisStiffness == 0 {
		o.AxisStiffness = DefaultAxisStiffness
	}
	o.HubRadiusMM = MemberOptions{HubRadiusMM: o.HubRadiusMM}.withDefaults().HubRadiusMM
	if o.Section.WidthMM == 0 {
		o.Section.WidthMM = DefaultSectionWidthMM
	}
	if o.Section.DepthMM == 0 {
		o.Section.DepthMM = DefaultSectionDepthMM
	}
	return o
}

// Validate checks every option's range, a zero field standing for its
// default, and returns a *geom.FieldError naming the first bad field.
func (o Options) Validate() error {
	o = o.withDefaults()
	if err := o.check(); err != nil {
		return err
	}
	return o.Types.Validate()
}

// ValidateExact checks the options as given: a zero field means zero (an
// error where the option has no zero setting) and the negative constants
// are refused, as a job file or a flag means them. The errors are
// Validate's.
func (o Options) ValidateExact() error {
	if err := o.check(); err != nil {
		return err
	}
	return o.Types.check()
}

// check checks the ranges of every field but Types as they stand.
func (o Options) check() error {
	switch o.Axis {
	case AxisNormal, AxisLeastTwist:
	default:
		return geom.FieldErrorf("Axis", "%q: want normal or least-twist", quote(string(o.Axis)))
	}
	if !(o.AxisStiffness >= 0) || math.IsInf(o.AxisStiffness, 0) {
		return geom.FieldErrorf("AxisStiffness", "%g must be zero or more", o.AxisStiffness)
	}
	if err := (MemberOptions{HubRadiusMM: o.HubRadiusMM}).Validate(); err != nil {
		return err
	}
	if !(o.Section.WidthMM > 0) || o.Section.WidthMM > MaxSectionMM {
		return geom.FieldErrorf("Section.WidthMM", "%g must be more than 0 and at most %g mm", o.Section.WidthMM, MaxSectionMM)
	}
	if !(o.Section.DepthMM > 0) || o.Section.DepthMM > MaxSectionMM {
		return geom.FieldErrorf("Section.DepthMM", "%g must be more than 0 and at most %g mm", o.Section.DepthMM, MaxSectionMM)
	}
	if w := o.Section.WallMM; !(w >= 0) || (w > 0 && 2*w >= min(o.Section.WidthMM, o.Section.DepthMM)) {
		return geom.FieldErrorf("Section.WallMM", "%g must be more than 0 and less than half the section's width and depth (%g x %g mm)",
			w, o.Section.WidthMM, o.Section.DepthMM)
	}
	return nil
}

// Validate checks the type tolerances, a zero tolerance standing for its
// default.
func (t TypeOptions) Validate() error { return t.withDefaults().check() }

// check checks the tolerances' ranges as they stand.
func (t TypeOptions) check() error {
	if !(t.LengthTolMM >= 0) || t.LengthTolMM > MaxTypeLengthTolMM {
		return geom.FieldErrorf("Types.LengthTolMM", "%g must be between 0 and %g mm", t.LengthTolMM, MaxTypeLengthTolMM)
	}
	if !(t.AngleTolDeg >= 0) || t.AngleTolDeg > MaxTypeAngleTolDeg {
		return geom.FieldErrorf("Types.AngleTolDeg", "%g must be between 0 and %g°", t.AngleTolDeg, MaxTypeAngleTolDeg)
	}
	return nil
}

// quote shortens a value for a message: at most 32 characters.
func quote(s string) string {
	if r := []rune(s); len(r) > 32 {
		return string(r[:32]) + "…"
	}
	return s
}

// Build computes axes, members, hubs, labels and types for a net. It
// checks opt first (Options.Validate); a zero field of opt means its
// default.
func Build(n *quadnet.Net, topo *quadnet.Topology, opt Options) (*Structure, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	opt = opt.withDefaults()
	normals, err := NormalAxes(n)
	if err != nil {
		return nil, err
	}
	axes := normals
	if opt.Axis == AxisLeastTwist {
		if axes, err = LeastTwistAxes(n, topo, normals, opt.AxisStiffness); err != nil {
			return nil, err
		}
	}
	mopt := MemberOptions{HubRadiusMM: opt.HubRadiusMM}
	ms, err := Members(n, topo, axes, mopt)
	if err != nil {
		return nil, err
	}
	s := &Structure{Members: ms, Section: opt.Section}
	if opt.Axis == AxisLeastTwist {
		before, err := Members(n, topo, normals, mopt)
		if err != nil {
			return nil, err
		}
		s.TwistNormalDeg = MaxAbsTwist(before)
	} else {
		s.TwistNormalDeg = MaxAbsTwist(ms)
	}
	nodeLabels, memberLabels := Labels(n, topo, opt.Bays)
	for k := range ms {
		ms[k].Label = memberLabels[k]
	}
	if s.Nodes, err = Hubs(n, topo, axes, ms, nodeLabels); err != nil {
		return nil, err
	}
	if s.MemberTypes, s.MemberTypeBound, err = GroupMembers(ms, opt.Types); err != nil {
		return nil, err
	}
	if s.NodeTypes, s.NodeTypeBound, err = GroupNodes(s.Nodes, opt.Types); err != nil {
		return nil, err
	}
	return s, nil
}

// MaxAbsTwist returns the largest |twist| of the members (degrees).
func MaxAbsTwist(ms []Member) float64 {
	var m float64
	for _, x := range ms {
		m = math.Max(m, math.Abs(x.TwistDeg))
	}
	return m
}
