package job

import (
	"fmt"
	"path/filepath"
	"pqfab/nodes/bars"
	"pqfab/quadnet"
	"regexp"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
)

// Job is a build job file (TOML). Every key is optional except net.file
// and at least one stock sheet; defaults are the library defaults.
type Job struct {
	Title    string   `toml:"title"`
	Net      Net      `toml:"net"`
	Supports Supports `toml:"supports"`
	Flatness Flatness `toml:"flatness"`
	Nodes    Nodes    `toml:"nodes"`
	Member   Member   `toml:"member"`
	Panel    Panel    `toml:"panel"`
	Types    Types    `toml:"types"`
	Stock    []Stock  `toml:"stock"`
	Nesting  Nesting  `toml:"nesting"`
	Bar      []Bar    `toml:"bar"`
	Rates    *Rates   `toml:"rates"`
	Site     Site     `toml:"site"`
	// PanelType changes the panel settings for some panels: a type, or
	// panels picked by label or by bay.
	PanelType []PanelTypeSpec `toml:"panel_type"`
	File      string          `toml:"-"` // the job file's name, for messages
	lines     *keyLines       // where each key is, for messages
}

// Net is the [net] table.
type Net struct {
	File       string  `toml:"file"`
	Unit       string  `toml:"unit"`
	Reorient   bool    `toml:"reorient"`
	MergeTolMM float64 `toml:"merge_tol_mm"`
}

// Supports is the [supports] table.
type Supports struct {
	Mode  string   `toml:"mode"`  // boundary, none, file, list
	Nodes []string `toml:"nodes"` // node ids for mode = "list"
}

// Flatness is the [flatness] table.
type Flatness struct {
	TolMM        float64 `toml:"tolerance_mm"`
	MaxMoveMM    float64 `toml:"max_move_mm"`
	Fairness     float64 `toml:"fairness"`
	VerticalOnly bool    `toml:"vertical_only"`
	MaxIter      int     `toml:"max_iterations"`
}

// Nodes is the [nodes] table.
type Nodes struct {
	Axis        string  `toml:"axis"`
	HubRadiusMM float64 `toml:"hub_radius_mm"`
	BayMM       float64 `toml:"bay_mm"`
}

// Member is the [member] table: the member section and its material.
// The section is solid (weight from width, depth and density), hollow
// (a rectangular hollow section with walls wall_mm thick) or mass (its
// weight is mass_kg_m, such as a catalogue section's).
type Member struct {
	Material    string  `toml:"material"`
	Section     string  `toml:"section"` // solid, hollow or mass
	WidthMM     float64 `toml:"width_mm"`
	DepthMM     float64 `toml:"depth_mm"`
	WallMM      float64 `toml:"wall_mm"`   // section = "hollow"
	MassKgM     float64 `toml:"mass_kg_m"` // section = "mass"
	DensityKgM3 float64 `toml:"density_kg_m3"`
}

// Member section kinds (member.section).
const (
	SectionSolid  = "solid"
	SectionHollow = "hollow"
	SectionMass   = "mass"
)

// MaxMassKgM bounds member.mass_kg_m: a heavier member is a unit mistake.
const MaxMassKgM = 10000.0

// SectionOf returns the section for drawings (the wall only when hollow).
func (m Member) SectionOf() nodes.Section {
	s := nodes.Section{WidthMM: m.WidthMM, DepthMM: m.DepthMM}
	if m.Section == SectionHollow {
		s.WallMM = m.WallMM
	}
	return s
}

// KgPerM returns the members' mass per metre: the section's area times
// the density, or mass_kg_m.
func (m Member) KgPerM() float64 {
	if m.Section == SectionMass {
		return m.MassKgM
	}
	return m.SectionOf().AreaMM2() / 1e6 * m.DensityKgM3
}

// checkSection checks the member section's kind and the keys that go
// with it.
func (j *Job) checkSection() error {
	m := j.Member
	switch m.Section {
	case SectionSolid, SectionHollow, SectionMass:
	default:
		return j.Errorf("member.section", "%q: want %q, %q (with wall_mm) or %q (with mass_kg_m)", short(m.Section), SectionSolid, SectionHollow, SectionMass)
	}
	given := func(key string) bool { return j.lines.line(key) > 0 }
	if m.Section != SectionHollow && given("member.wall_mm") {
		return j.Errorf("member.wall_mm", "is read only with section = %q (this member's section is %q)", SectionHollow, m.Section)
	}
	if m.Section != SectionMass && given("member.mass_kg_m") {
		return j.Errorf("member.mass_kg_m", "is read only with section = %q (this member's section is %q)", SectionMass, m.Section)
	}
	if m.Section == SectionHollow && !given("member.wall_mm") {
		return j.Errorf("member.section", "%q needs wall_mm, the wall thickness", SectionHollow)
	}
	if m.Section == SectionMass {
		if !given("member.mass_kg_m") {
			return j.Errorf("member.section", "%q needs mass_kg_m, the mass per metre", SectionMass)
		}
		if !(m.MassKgM > 0) || m.MassKgM > MaxMassKgM {
			return j.Errorf("member.mass_kg_m", "%g must be more than 0 and at most %g kg/m", m.MassKgM, MaxMassKgM)
		}
	}
	return nil
}

// Site is the [site] table: the files for the site team.
type Site struct {
	TagSize string `toml:"tag_size"` // office or outdoor
}

// Tag sizes (site.tag_size): the names of pdf.TagSizes (export/pdf).
const (
	TagOffice  = "office"
	TagOutdoor = "outdoor"
)

// Panel is the [panel] table.
type Panel struct {
	Material         string  `toml:"material"`
	ThicknessMM      float64 `toml:"thickness_mm"`
	DensityKgM3      float64 `toml:"density_kg_m3"`
	EdgeInsetMM      float64 `toml:"edge_inset_mm"`
	BoundaryBevelDeg float64 `toml:"boundary_bevel_deg"`
	Mirror           bool    `toml:"mirror"`
	BevelledEdges    bool    `toml:"bevelled_edges"` // edges ground to their bevels: the bevels are part of each panel type
	Grain            string  `toml:"grain"`          // first-edge, longest-edge or plan
	GrainPlanDeg     float64 `toml:"grain_plan_deg"` // with grain = "plan"
	PanelSpec
}

// PanelSpec is the plain-text specification of a panel: job-wide in
// [panel], and per panel type in [[panel_type]] tables naming the type.
type PanelSpec struct {
	Type          string `toml:"type"` // [[panel_type]] only: the type it applies to, such as "PT-003"
	BuildUp       string `toml:"build_up"`
	EdgeWork      string `toml:"edge_work"`
	Coating       string `toml:"coating"` // which face, such as "low-e on face 2 (inside)"
	HeatTreatment string `toml:"heat_treatment"`
	Grade         string `toml:"grade"`
}

// PanelTypeSpec is one [[panel_type]] table: the panels it picks, by type
// name (such as "PT-003", known once a build has named the types), by
// label (such as "C3-P05") or by bay (such as "C3"), and the settings it
// changes for them. A key it does not give keeps its value from [panel]
// (or from the table that picked the panels by label or bay, for a table
// naming a type). Panels picked by label or bay never share a type with
// panels outside the table.
type PanelTypeSpec struct {
	Type          string   `toml:"type"`
	Panels        []string `toml:"panels"`
	Bays          []string `toml:"bays"`
	BuildUp       *string  `toml:"build_up"`
	EdgeWork      *string  `toml:"edge_work"`
	Coating       *string  `toml:"coating"`
	HeatTreatment *string  `toml:"heat_treatment"`
	Grade         *string  `toml:"grade"`
	ThicknessMM   *float64 `toml:"thickness_mm"`
	DensityKgM3   *float64 `toml:"density_kg_m3"`
}

// Picks says whether the table picks panels by label or bay (else it
// names a type).
func (t PanelTypeSpec) Picks() bool { return t.Type == "" }

// Over returns s with the fields t gives.
func (t PanelTypeSpec) Over(s PanelSpec) PanelSpec {
	for _, f := range []struct {
		from *string
		to   *string
	}{{t.BuildUp, &s.BuildUp}, {t.EdgeWork, &s.EdgeWork}, {t.Coating, &s.Coating}, {t.HeatTreatment, &s.HeatTreatment}, {t.Grade, &s.Grade}} {
		if f.from != nil {
			*f.to = *f.from
		}
	}
	s.Type = t.Type
	return s
}

// OverMaterial returns m with the thickness and density t gives.
func (t PanelTypeSpec) OverMaterial(m panels.Material) panels.Material {
	if t.ThicknessMM != nil {
		m.ThicknessMM = *t.ThicknessMM
	}
	if t.DensityKgM3 != nil {
		m.DensityKgM3 = *t.DensityKgM3
	}
	return m
}

// Bar is one [[bar]] table: bar stock the members are cut from.
type Bar struct {
	Name     string  `toml:"name"`
	LengthMM float64 `toml:"length_mm"`
	KerfMM   float64 `toml:"kerf_mm"`
	TrimMM   float64 `toml:"trim_mm"` // cut off at each end of a bar
	Price    float64 `toml:"price"`
	Count    int     `toml:"count"` // 0: no limit
}

// Types is the [types] table.
type Types struct {
	LengthTolMM float64 `toml:"length_tol_mm"`
	AngleTolDeg float64 `toml:"angle_tol_deg"`
	PanelTolMM  float64 `toml:"panel_tol_mm"`
}

// Stock is one [[stock]] table.
type Stock struct {
	Name      string  `toml:"name"`
	WidthMM   float64 `toml:"width_mm"`
	HeightMM  float64 `toml:"height_mm"`
	MarginMM  float64 `toml:"margin_mm"`
	SpacingMM float64 `toml:"spacing_mm"`
	Rotation  string  `toml:"rotation"`
	Mirror    bool    `toml:"mirror"`
	Count     int     `toml:"count"`
	Price     float64 `toml:"price"`
	Cuts      string  `toml:"cuts"` // "any" (default) or "edge-to-edge" (glass: every cut across the whole piece)
}

// Nesting is the [nesting] table: how hard the nesting searches.
type Nesting struct {
	Steps   int     `toml:"steps"`   // search effort; the layout depends on it, never on the clock
	Seconds float64 `toml:"seconds"` // 0: no time limit; else the search stops after this long
}

// NestOptions returns the nesting's search options.
func (j *Job) NestOptions() nest.Options { return nest.Options{Steps: j.Nesting.Steps} }

// Rates is the optional [rates] table. Making rates (member_per_m,
// panel_per_m2) cover processing only; material is charged once, from the
// bar and sheet prices, or from bar_per_m, sheet_each or sheet_per_m2
// where a stock has no price; node_each is the whole node (supplied and
// made); the type rates are a setup and drawing charge per distinct type.
type Rates struct {
	Currency string `toml:"currency"`
	// Making, per quantity made.
	MemberPerM float64 `toml:"member_per_m"` // per metre of cut member length
	NodeEach   float64 `toml:"node_each"`    // per node, supplied and made
	PanelPerM2 float64 `toml:"panel_per_m2"` // per m² of cut panel
	// Setup and drawing, per distinct type.
	MemberTypeEach float64 `toml:"member_type_each"`
	NodeTypeEach   float64 `toml:"node_type_each"`
	PanelTypeEach  float64 `toml:"panel_type_each"`
	// Material where a stock has no price.
	BarPerM    float64 `toml:"bar_per_m"`    // per metre of bar stock without a price; per metre of blank for members on no bar
	SheetEach  float64 `toml:"sheet_each"`   // per sheet of stock without a price
	SheetPerM2 float64 `toml:"sheet_per_m2"` // per m² of sheet of stock without a price
}

// Support modes of the [supports] table.
const (
	SupportsBoundary = "boundary"
	SupportsNone     = "none"
	SupportsFile     = "file"
	SupportsList     = "list"
)

// Defaults of the job's own settings (the others are the libraries':
// see defaults).
const (
	DefaultSupportsMode   = SupportsBoundary
	DefaultMemberMaterial = "glulam"
	DefaultNestSeconds    = 0.0 // no time limit
)

// Member densities (kg/m³): the default is glulam of strength class
// GL24h, whose mean density EN 14080 gives as 420 kg/m³ (from memory;
// check the supplier's figure); steel is 7850 kg/m³ (handbook value,
// EN 1991-1-1 Table A.4 gives 77–78.5 kN/m³).
const (
	DefaultMemberDensityKgM3 = 420.0
	SteelDensityKgM3         = 7850.0
	MaxDensityKgM3           = 25000.0
)

// Limits on what a job may ask for: beyond them a value is a mistake and
// the outputs would overflow.
const (
	MaxStocks      = 100     // [[stock]] tables, and [[bar]] tables
	MaxRate        = 1e9     // any rate or price
	MaxTextLen     = 1000    // title, names, material (characters)
	MaxSupports    = 1e6     // node ids in supports.nodes
	MaxTypeSpecs   = 10000   // [[panel_type]] tables
	MaxNestSeconds = 86400.0 // nesting.seconds: a day
)

// defaults returns a job with every default set: the libraries' defaults
// (the same the single-stage commands' flags take) and the job's own.
// Tables that a job may repeat ([[stock]], [[bar]]) get theirs from
// stockDefaults and barDefaults, key by key, once they are read.
func defaults(file string) *Job {
	po, no, mat := panels.DefaultPlanarizeOptions(), nodes.DefaultOptions(), panels.DefaultMaterial()
	return &Job{
		File:     file,
		Net:      Net{Unit: quadnet.DefaultUnit.String(), MergeTolMM: quadnet.DefaultCoincidentTolMM},
		Supports: Supports{Mode: DefaultSupportsMode},
		Flatness: Flatness{TolMM: po.TolMM, MaxMoveMM: po.MaxMoveMM, Fairness: po.Fairness, VerticalOnly: po.Vertical, MaxIter: po.MaxIter},
		Nodes:    Nodes{Axis: string(no.Axis), HubRadiusMM: no.HubRadiusMM, BayMM: quadnet.DefaultBaySizeMM},
		Site:     Site{TagSize: TagOffice},
		Member: Member{Material: DefaultMemberMaterial, Section: SectionSolid, WidthMM: no.Section.WidthMM, DepthMM: no.Section.DepthMM,
			DensityKgM3: DefaultMemberDensityKgM3},
		Panel: Panel{Material: mat.Name, ThicknessMM: mat.ThicknessMM, DensityKgM3: mat.DensityKgM3, EdgeInsetMM: mat.EdgeInsetMM,
			BoundaryBevelDeg: mat.BoundaryBevelDeg, Grain: mat.Grain.Rule, GrainPlanDeg: mat.Grain.PlanDeg},
		Nesting: Nesting{Steps: nest.DefaultSteps, Seconds: DefaultNestSeconds},
		Types:   Types{LengthTolMM: no.Types.LengthTolMM, AngleTolDeg: no.Types.AngleTolDeg, PanelTolMM: panels.DefaultTypeTolMM},
	}
}

// stockDefaults is a [[stock]] table's defaults (its name, "stock N", is
// set by Parse); width_mm and height_mm are required.
func stockDefaults() Stock {
	s := nest.DefaultStock("")
	return Stock{MarginMM: s.MarginMM, SpacingMM: s.SpacingMM, Rotation: string(s.Rotation), Mirror: s.Mirror,
		Count: s.Count, Price: s.Price, Cuts: CutsAny}
}

// barDefaults is a [[bar]] table's defaults (its name, "bar N", is set by
// Parse); length_mm is required.
func barDefaults() Bar { return Bar{KerfMM: bars.DefaultKerfMM, TrimMM: bars.DefaultTrimMM} }

// Errorf returns an error naming the job file, the line of key and the key.
func (j *Job) Errorf(key string, format string, args ...any) error {
	return &quadnet.InputError{File: j.File, Line: j.lines.line(key), Elem: "key " + key, Msg: fmt.Sprintf(format, args...)}
}

// KeyError wraps err (a problem found while running the job) as an error
// naming key and its line.
func (j *Job) KeyError(key string, err error) error {
	return &quadnet.InputError{File: j.File, Line: j.lines.line(key), Elem: "key " + key, Msg: err.Error(), Err: err}
}

// NetPath returns the net file's path: net.file relative to the job file.
func (j *Job) NetPath() string {
	if filepath.IsAbs(j.Net.File) {
		return j.Net.File
	}
	return filepath.Join(filepath.Dir(j.File), j.Net.File)
}

// Unit returns the net file's unit.
func (j *Job) Unit() quadnet.Unit {
	u, _ := quadnet.ParseUnit(j.Net.Unit) // checked by Parse
	return u
}

// ValidateOptions returns the net checks of the job, as quadnet.Validate
// reads them (see ExplicitValidate).
func (j *Job) ValidateOptions() quadnet.ValidateOptions {
	o, _ := j.validateOptions() // checked by Parse
	return o
}

func (j *Job) validateOptions() (quadnet.ValidateOptions, error) {
	o := quadnet.DefaultValidateOptions()
	o.CoincidentTolMM = j.Net.MergeTolMM
	return ExplicitValidate(o)
}

// PlanarizeOptions returns the [flatness] settings, as panels.Planarize
// reads them (see ExplicitPlanarize; supports are set by the build, once
// the net is read).
func (j *Job) PlanarizeOptions() panels.PlanarizeOptions {
	o, _ := j.planarizeOptions() // checked by Parse
	return o
}

func (j *Job) planarizeOptions() (panels.PlanarizeOptions, error) {
	f := j.Flatness
	return ExplicitPlanarize(panels.PlanarizeOptions{TolMM: f.TolMM, MaxMoveMM: f.MaxMoveMM, Fairness: f.Fairness, Vertical: f.VerticalOnly, MaxIter: f.MaxIter})
}

// NodeOptions returns the [nodes], [member] and [types] settings, as
// nodes.Build reads them (see ExplicitNodes; bays are set by the build
// from the net).
func (j *Job) NodeOptions() nodes.Options {
	o, _ := j.nodeOptions() // checked by Parse
	return o
}

func (j *Job) nodeOptions() (nodes.Options, error) {
	return ExplicitNodes(nodes.Options{Axis: nodes.AxisMethod(j.Nodes.Axis), HubRadiusMM: j.Nodes.HubRadiusMM,
		Section: j.Member.SectionOf(),
		Types:   nodes.TypeOptions{LengthTolMM: j.Types.LengthTolMM, AngleTolDeg: j.Types.AngleTolDeg}})
}

// Material returns the [panel] material.
func (j *Job) Material() panels.Material {
	p := j.Panel
	return panels.Material{Name: p.Material, ThicknessMM: p.ThicknessMM, DensityKgM3: p.DensityKgM3,
		EdgeInsetMM: p.EdgeInsetMM, BoundaryBevelDeg: p.BoundaryBevelDeg,
		Grain: panels.Grain{Rule: p.Grain, PlanDeg: p.GrainPlanDeg}, BevelledEdges: p.BevelledEdges}
}

// PanelTypeOptions returns when two panels are one type, as panels.Group
// reads it (see ExplicitPanelTypes).
func (j *Job) PanelTypeOptions() panels.TypeOptions {
	o, _ := j.panelTypeOptions() // checked by Parse
	return o
}

func (j *Job) panelTypeOptions() (panels.TypeOptions, error) {
	return ExplicitPanelTypes(panels.TypeOptions{TolMM: j.Types.PanelTolMM, AngleTolDeg: j.Types.AngleTolDeg, Mirror: j.Panel.Mirror, Bevels: j.Panel.BevelledEdges})
}

// BarStocks returns the job's bar stock for the members' cutting plan.
func (j *Job) BarStocks() []bars.Stock {
	out := make([]bars.Stock, len(j.Bar))
	for i, b := range j.Bar {
		out[i] = bars.Stock{Name: b.Name, LengthMM: b.LengthMM, KerfMM: b.KerfMM, TrimMM: b.TrimMM, Price: b.Price, Count: b.Count}
	}
	return out
}

// CutsAny is the stock key cuts for parts cut out in any way (the default).
const CutsAny = "any"

// Stocks returns the job's stock sheets for nesting.
func (j *Job) Stocks() []nest.Stock {
	out := make([]nest.Stock, len(j.Stock))
	for i, s := range j.Stock {
		out[i] = nest.Stock{Name: s.Name, WidthMM: s.WidthMM, HeightMM: s.HeightMM, MarginMM: s.MarginMM, SpacingMM: s.SpacingMM,
			Rotation: nest.Rotation(s.Rotation), Mirror: s.Mirror, Count: s.Count, Price: s.Price}
		if s.Cuts != CutsAny {
			out[i].Cuts = nest.CutRule(s.Cuts)
		}
	}
	return out
}

// Keys of the job for each options field: a *geom.FieldError from a
// library's Validate names a field; these name the key the user wrote.
var (
	planarizeKeys = map[string]string{"TolMM": "flatness.tolerance_mm", "MaxMoveMM": "flatness.max_move_mm",
		"Fairness": "flatness.fairness", "MaxIter": "flatness.max_iterations"}
	nodeKeys = map[string]string{"Axis": "nodes.axis", "HubRadiusMM": "nodes.hub_radius_mm",
		"Section.WidthMM": "member.width_mm", "Section.DepthMM": "member.depth_mm", "Section.WallMM": "member.wall_mm",
		"Types.LengthTolMM": "types.length_tol_mm", "Types.AngleTolDeg": "types.angle_tol_deg"}
	materialKeys = map[string]string{"ThicknessMM": "panel.thickness_mm", "DensityKgM3": "panel.density_kg_m3",
		"EdgeInsetMM": "panel.edge_inset_mm", "BoundaryBevelDeg": "panel.boundary_bevel_deg",
		"Grain.Rule": "panel.grain", "Grain.PlanDeg": "panel.grain_plan_deg"}
	typeMaterialKeys = map[string]string{"ThicknessMM": "thickness_mm", "DensityKgM3": "density_kg_m3"}
	barKeys          = map[string]string{"LengthMM": "length_mm", "KerfMM": "kerf_mm", "TrimMM": "trim_mm", "Price": "price", "Count": "count"}
	panelTypeKeys    = map[string]string{"TolMM": "types.panel_tol_mm", "AngleTolDeg": "types.angle_tol_deg"}
	validateKeys     = map[string]string{"CoincidentTolMM": "net.merge_tol_mm"}
	stockKeys        = map[string]string{"Name": "name", "WidthMM": "width_mm", "HeightMM": "height_mm", "MarginMM": "margin_mm",
		"SpacingMM": "spacing_mm", "Rotation": "rotation", "Mirror": "mirror", "Count": "count", "Price": "price", "Cuts": "cuts"}
	nestKeys = map[string]string{"Steps": "nesting.steps"}
)

// fieldErr turns a *geom.FieldError into an error naming the job key
// (prefix + keys[field]); other errors pass through.
func (j *Job) fieldErr(err error, keys map[string]string, prefix string) error {
	if err == nil {
		return nil
	}
	fe, ok := err.(*geom.FieldError)
	if !ok {
		return err
	}
	key, ok := keys[fe.Field]
	if !ok {
		return err
	}
	return j.Errorf(prefix+key, "%s", fe.Msg)
}

// check rejects bad values, naming the key and its line. Ranges of the
// library options are checked by the libraries' Validate methods; only the
// job's own settings are checked here.
func (j *Job) check() error {
	if j.Net.File == "" {
		return j.Errorf("net.file", "missing: name the net file (OBJ, OFF or nodes CSV), relative to the job file")
	}
	if _, err := quadnet.ParseUnit(j.Net.Unit); err != nil {
		return j.Errorf("net.unit", "%q: want mm, cm or m", short(j.Net.Unit))
	}
	if _, err := j.validateOptions(); err != nil {
		return j.fieldErr(err, validateKeys, "")
	}
	if err := j.checkSupports(); err != nil {
		return err
	}
	if _, err := quadnet.NewBays(nil, j.Nodes.BayMM, j.Nodes.BayMM); err != nil {
		return j.Errorf("nodes.bay_mm", "%g must be a positive number of millimetres", j.Nodes.BayMM)
	}
	texts := []struct{ key, text string }{{"title", j.Title}, {"panel.material", j.Panel.Material}, {"member.material", j.Member.Material}}
	texts = append(texts, specTexts("panel.", j.Panel.PanelSpec)...)
	if len(j.PanelType) > MaxTypeSpecs {
		return j.Errorf("panel_type", "%d [[panel_type]] tables: at most %d", len(j.PanelType), MaxTypeSpecs)
	}
	seen := map[string]int{}
	for i, t := range j.PanelType {
		prefix := fmt.Sprintf("panel_type[%d].", i+1)
		given := 0
		for _, g := range []bool{t.Type != "", len(t.Panels) > 0, len(t.Bays) > 0} {
			if g {
				given++
			}
		}
		if given != 1 {
			return j.Errorf(fmt.Sprintf("panel_type[%d]", i+1), "name its panels one way: type = \"PT-003\", panels = [\"C3-P05\", …] or bays = [\"C3\", …]")
		}
		if t.Type != "" {
			if k, dup := seen[t.Type]; dup {
				return j.Errorf(prefix+"type", "%q is given in panel_type %d too", short(t.Type), k+1)
			}
			seen[t.Type] = i
		}
		if len(t.Panels)+len(t.Bays) > MaxSupports {
			return j.Errorf(prefix+"panels", "%d labels: at most %d", len(t.Panels)+len(t.Bays), int(MaxSupports))
		}
		for _, b := range t.Bays {
			if !bayName.MatchString(b) {
				return j.Errorf(prefix+"bays", "%q is not a bay: a bay is letters then a number, such as \"C3\"", short(b))
			}
		}
		texts = append(texts, specTexts(prefix, t.Over(PanelSpec{}))...)
		for _, l := range t.Panels {
			texts = append(texts, struct{ key, text string }{prefix + "panels", l})
		}
	}
	for _, t := range texts {
		if err := j.checkText(t.key, t.text); err != nil {
			return err
		}
	}
	if d := j.Member.DensityKgM3; !(d >= 0) || d > MaxDensityKgM3 {
		return j.Errorf("member.density_kg_m3", "%g must be between 0 and %g kg/m³", d, MaxDensityKgM3)
	}
	if _, err := j.planarizeOptions(); err != nil {
		return j.fieldErr(err, planarizeKeys, "")
	}
	if err := j.checkSection(); err != nil {
		return err
	}
	if _, err := j.nodeOptions(); err != nil {
		return j.fieldErr(err, nodeKeys, "")
	}
	if t := j.Site.TagSize; t != TagOffice && t != TagOutdoor {
		return j.Errorf("site.tag_size", "%q: want %q (A4 sheets of 8 labels 105 x 74 mm) or %q (two A5 tags to an A4 sheet, text twice as large)", short(t), TagOffice, TagOutdoor)
	}
	if err := j.fieldErr(j.Material().Validate(), materialKeys, ""); err != nil {
		return err
	}
	for i, t := range j.PanelType {
		if err := j.fieldErr(t.OverMaterial(j.Material()).Validate(), typeMaterialKeys, fmt.Sprintf("panel_type[%d].", i+1)); err != nil {
			return err
		}
	}
	if _, err := j.panelTypeOptions(); err != nil {
		return j.fieldErr(err, panelTypeKeys, "")
	}
	if err := j.checkStocks(); err != nil {
		return err
	}
	if err := j.fieldErr(j.NestOptions().Validate(), nestKeys, ""); err != nil {
		return err
	}
	if sec := j.Nesting.Seconds; !(sec >= 0) || sec > MaxNestSeconds {
		return j.Errorf("nesting.seconds", "%g must be between 0 (no time limit) and %g", sec, MaxNestSeconds)
	}
	if err := j.checkBars(); err != nil {
		return err
	}
	return j.checkRates()
}

// bayName is a bay of the plan grid as labels carry it: column letters,
// row number.
var bayName = regexp.MustCompile(`^[A-Z]+[1-9][0-9]*$`)

// specTexts lists a panel specification's text keys with their values.
func specTexts(prefix string, s PanelSpec) []struct{ key, text string } {
	return []struct{ key, text string }{{prefix + "type", s.Type}, {prefix + "build_up", s.BuildUp}, {prefix + "edge_work", s.EdgeWork},
		{prefix + "coating", s.Coating}, {prefix + "heat_treatment", s.HeatTreatment}, {prefix + "grade", s.Grade}}
}

func (j *Job) checkBars() error {
	if len(j.Bar) > MaxStocks {
		return j.Errorf("bar", "%d [[bar]] tables: at most %d", len(j.Bar), MaxStocks)
	}
	names := map[string]int{}
	for i := range j.Bar {
		prefix := fmt.Sprintf("bar[%d].", i+1)
		if j.Bar[i].Name == "" {
			j.Bar[i].Name = fmt.Sprintf("bar %d", i+1)
		}
		if err := j.checkText(prefix+"name", j.Bar[i].Name); err != nil {
			return err
		}
		if k, dup := names[j.Bar[i].Name]; dup {
			return j.Errorf(prefix+"name", "%q is the name of bar stock %d too: give each its own name", short(j.Bar[i].Name), k+1)
		}
		names[j.Bar[i].Name] = i
		if err := j.fieldErr(j.BarStocks()[i].Validate(), barKeys, prefix); err != nil {
			return err
		}
	}
	return nil
}

func (j *Job) checkSupports() error {
	switch j.Supports.Mode {
	case SupportsBoundary, SupportsNone, SupportsFile:
		if len(j.Supports.Nodes) > 0 {
			return j.Errorf("supports.nodes", "node ids need mode = \"list\"")
		}
	case SupportsList:
		if len(j.Supports.Nodes) == 0 {
			return j.Errorf("supports.nodes", "mode = \"list\" needs node ids")
		}
		if len(j.Supports.Nodes) > MaxSupports {
			return j.Errorf("supports.nodes", "%d ids: at most %d", len(j.Supports.Nodes), int(MaxSupports))
		}
	default:
		return j.Errorf("supports.mode", "%q: want boundary, none, file or list", short(j.Supports.Mode))
	}
	return nil
}

func (j *Job) checkStocks() error {
	if len(j.Stock) > MaxStocks {
		return j.Errorf("stock", "%d [[stock]] tables: at most %d", len(j.Stock), MaxStocks)
	}
	names := map[string]int{}
	for i, s := range j.Stock {
		prefix := fmt.Sprintf("stock[%d].", i+1)
		if err := j.checkText(prefix+"name", s.Name); err != nil {
			return err
		}
		if k, dup := names[s.Name]; dup {
			return j.Errorf(prefix+"name", "%q is the name of stock %d too: give each stock its own name", short(s.Name), k+1)
		}
		names[s.Name] = i
		if s.Cuts != CutsAny && s.Cuts != string(nest.EdgeToEdge) {
			return j.Errorf(prefix+"cuts", "%q must be %q (parts cut out in any way) or %q (every cut runs across the whole piece, as glass is scored and broken)", short(s.Cuts), CutsAny, nest.EdgeToEdge)
		}
		if err := j.fieldErr(j.Stocks()[i].Validate(), stockKeys, prefix); err != nil {
			return err
		}
	}
	return nil
}

func (j *Job) checkRates() error {
	r := j.Rates
	if r == nil {
		return nil
	}
	if err := j.checkText("rates.currency", r.Currency); err != nil {
		return err
	}
	for _, v := range []struct {
		key string
		v   float64
	}{{"rates.member_per_m", r.MemberPerM}, {"rates.node_each", r.NodeEach}, {"rates.panel_per_m2", r.PanelPerM2},
		{"rates.member_type_each", r.MemberTypeEach}, {"rates.node_type_each", r.NodeTypeEach}, {"rates.panel_type_each", r.PanelTypeEach},
		{"rates.bar_per_m", r.BarPerM}, {"rates.sheet_each", r.SheetEach}, {"rates.sheet_per_m2", r.SheetPerM2}} {
		if !(v.v >= 0) || v.v > MaxRate {
			return j.Errorf(v.key, "%g must be between 0 and %g", v.v, MaxRate)
		}
	}
	if r.SheetEach > 0 && r.SheetPerM2 > 0 {
		return j.Errorf("rates.sheet_per_m2", "%g: give the material of unpriced sheet stock once, per sheet (rates.sheet_each = %g) or per m² of sheet, not both", r.SheetPerM2, r.SheetEach)
	}
	return nil
}

// checkText refuses text that no output can carry: control characters
// (a newline in a title would break a DXF or an OBJ) and very long text.
func (j *Job) checkText(key, s string) error {
	if n := len([]rune(s)); n > MaxTextLen {
		return j.Errorf(key, "%d characters: at most %d", n, MaxTextLen)
	}
	for _, r := range s {
		if r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || r == 0xfffd {
			return j.Errorf(key, "%q holds a control character (%U): write it on one line without tabs", short(s), r)
		}
	}
	return nil
}

// short cuts a value for a message to at most 32 characters.
func short(s string) string {
	if r := []rune(s); len(r) > 32 {
		return string(r[:32]) + "…"
	}
	return s
}
