package main

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
)

// Job is a build job file (TOML). Every key is optional except net.file
// and at least one stock sheet; defaults are the library defaults.
type Job struct {
	Title    string      `toml:"title"`
	Net      jobNet      `toml:"net"`
	Supports jobSupports `toml:"supports"`
	Flatness jobFlatness `toml:"flatness"`
	Nodes    jobNodes    `toml:"nodes"`
	Member   jobMember   `toml:"member"`
	Panel    jobPanel    `toml:"panel"`
	Types    jobTypes    `toml:"types"`
	Stock    []jobStock  `toml:"stock"`
	Rates    *jobRates   `toml:"rates"`

	file  string // the job file's name, for messages
	lines *keyLines
}

type jobNet struct {
	File       string  `toml:"file"`
	Unit       string  `toml:"unit"`
	Reorient   bool    `toml:"reorient"`
	MergeTolMM float64 `toml:"merge_tol_mm"`
}

type jobSupports struct {
	Mode  string   `toml:"mode"`  // boundary, none, file, list
	Nodes []string `toml:"nodes"` // node ids for mode = "list"
}

type jobFlatness struct {
	TolMM        float64 `toml:"tolerance_mm"`
	MaxMoveMM    float64 `toml:"max_move_mm"`
	Fairness     float64 `toml:"fairness"`
	VerticalOnly bool    `toml:"vertical_only"`
	MaxIter      int     `toml:"max_iterations"`
}

type jobNodes struct {
	Axis        string  `toml:"axis"`
	HubRadiusMM float64 `toml:"hub_radius_mm"`
	BayMM       float64 `toml:"bay_mm"`
}

type jobMember struct {
	WidthMM float64 `toml:"width_mm"`
	DepthMM float64 `toml:"depth_mm"`
}

type jobPanel struct {
	Material         string  `toml:"material"`
	ThicknessMM      float64 `toml:"thickness_mm"`
	DensityKgM3      float64 `toml:"density_kg_m3"`
	EdgeInsetMM      float64 `toml:"edge_inset_mm"`
	BoundaryBevelDeg float64 `toml:"boundary_bevel_deg"`
	Mirror           bool    `toml:"mirror"`
}

type jobTypes struct {
	LengthTolMM float64 `toml:"length_tol_mm"`
	AngleTolDeg float64 `toml:"angle_tol_deg"`
	PanelTolMM  float64 `toml:"panel_tol_mm"`
}

type jobStock struct {
	Name      string  `toml:"name"`
	WidthMM   float64 `toml:"width_mm"`
	HeightMM  float64 `toml:"height_mm"`
	MarginMM  float64 `toml:"margin_mm"`
	SpacingMM float64 `toml:"spacing_mm"`
	Rotation  string  `toml:"rotation"`
	Mirror    bool    `toml:"mirror"`
	Count     int     `toml:"count"`
	Price     float64 `toml:"price"`
}

type jobRates struct {
	Currency   string  `toml:"currency"`
	MemberPerM float64 `toml:"member_per_m"`
	NodeEach   float64 `toml:"node_each"`
	PanelPerM2 float64 `toml:"panel_per_m2"`
	SheetEach  float64 `toml:"sheet_each"` // for stock without a price
}

// jobError names the job file, the line and the key.
func (j *Job) errorf(key string, format string, args ...any) error {
	line := j.lines.line(key)
	return &geom.InputError{File: j.file, Line: line, Elem: "key " + key, Msg: fmt.Sprintf(format, args...)}
}

// ParseJob reads and checks a job file's text.
func ParseJob(data []byte, file string) (*Job, error) {
	j := &Job{file: file, lines: indexKeys(data)}
	// Defaults.
	j.Net.Unit = "mm"
	j.Net.MergeTolMM = geom.DefaultCoincidentTolMM
	j.Supports.Mode = "boundary"
	j.Flatness = jobFlatness{TolMM: panels.DefaultFlatTolMM, MaxMoveMM: panels.DefaultMaxMoveMM, Fairness: panels.DefaultFairness, MaxIter: panels.DefaultMaxIter}
	j.Nodes = jobNodes{Axis: string(nodes.AxisLeastTwist), BayMM: geom.DefaultBaySizeMM}
	j.Member = jobMember{WidthMM: 60, DepthMM: 120}
	j.Panel = jobPanel{Material: "float glass", ThicknessMM: panels.DefaultThicknessMM, DensityKgM3: panels.DefaultDensityKgM3}
	j.Types = jobTypes{LengthTolMM: nodes.DefaultTypeLengthTolMM, AngleTolDeg: nodes.DefaultTypeAngleTolDeg, PanelTolMM: panels.DefaultTypeTolMM}
	if len(bytes.TrimSpace(data)) == 0 {
		return nil, &geom.InputError{File: file, Msg: "empty job file"}
	}
	md, err := toml.Decode(string(data), j)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			msg := pe.Message
			if pe.LastKey != "" {
				return nil, &geom.InputError{File: file, Line: pe.Position.Line, Elem: "key " + pe.LastKey, Msg: msg}
			}
			return nil, &geom.InputError{File: file, Line: pe.Position.Line, Msg: msg}
		}
		// Type mismatches come as "toml: line N (last key "k"): message".
		if m := tomlTypeErr.FindStringSubmatch(err.Error()); m != nil {
			line, _ := strconv.Atoi(m[1])
			return nil, &geom.InputError{File: file, Line: line, Elem: "key " + m[2], Msg: m[3]}
		}
		return nil, &geom.InputError{File: file, Msg: strings.TrimPrefix(err.Error(), "toml: ")}
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0].String()
		return nil, j.errorf(k, "unknown key (see the README for the job file's keys)")
	}
	if j.Stock == nil {
		return nil, &geom.InputError{File: file, Msg: "no [[stock]] sheet given: nesting needs at least one"}
	}
	for i := range j.Stock {
		if j.Stock[i].Rotation == "" {
			j.Stock[i].Rotation = string(nest.Free)
		}
		if j.Stock[i].Name == "" {
			j.Stock[i].Name = fmt.Sprintf("stock %d", i+1)
		}
	}
	return j, j.check()
}

var tomlTypeErr = regexp.MustCompile(`^toml: line (\d+) \(last key "([^"]*)"\): (.*)$`)

// check rejects bad values, naming the key and its line.
func (j *Job) check() error {
	var first error // only the first problem is reported (and computed)
	fail := func(key, format string, args ...any) {
		if first == nil {
			first = j.errorf(key, format, args...)
		}
	}
	positive := func(key string, v float64) {
		if !(v > 0) || math.IsInf(v, 0) {
			fail(key, "%g must be a positive number", v)
		}
	}
	nonNeg := func(key string, v float64) {
		if !(v >= 0) || math.IsInf(v, 0) {
			fail(key, "%g must be zero or more", v)
		}
	}
	if j.Net.File == "" {
		return j.errorf("net.file", "missing: name the net file (OBJ, OFF or nodes CSV), relative to the job file")
	}
	if _, err := geom.ParseUnit(j.Net.Unit); err != nil {
		return j.errorf("net.unit", "%q: want mm, cm or m", j.Net.Unit)
	}
	switch j.Supports.Mode {
	case "boundary", "none", "file":
		if len(j.Supports.Nodes) > 0 {
			return j.errorf("supports.nodes", "node ids need mode = \"list\"")
		}
	case "list":
		if len(j.Supports.Nodes) == 0 {
			return j.errorf("supports.nodes", "mode = \"list\" needs node ids")
		}
	default:
		return j.errorf("supports.mode", "%q: want boundary, none, file or list", j.Supports.Mode)
	}
	switch nodes.AxisMethod(j.Nodes.Axis) {
	case nodes.AxisNormal, nodes.AxisLeastTwist:
	default:
		return j.errorf("nodes.axis", "%q: want normal or least-twist", j.Nodes.Axis)
	}
	nonNeg("net.merge_tol_mm", j.Net.MergeTolMM)
	positive("flatness.tolerance_mm", j.Flatness.TolMM)
	positive("flatness.max_move_mm", j.Flatness.MaxMoveMM)
	nonNeg("flatness.fairness", j.Flatness.Fairness)
	positive("flatness.max_iterations", float64(j.Flatness.MaxIter))
	nonNeg("nodes.hub_radius_mm", j.Nodes.HubRadiusMM)
	positive("nodes.bay_mm", j.Nodes.BayMM)
	positive("member.width_mm", j.Member.WidthMM)
	positive("member.depth_mm", j.Member.DepthMM)
	positive("panel.thickness_mm", j.Panel.ThicknessMM)
	nonNeg("panel.density_kg_m3", j.Panel.DensityKgM3)
	nonNeg("panel.edge_inset_mm", j.Panel.EdgeInsetMM)
	nonNeg("types.length_tol_mm", j.Types.LengthTolMM)
	nonNeg("types.angle_tol_deg", j.Types.AngleTolDeg)
	nonNeg("types.panel_tol_mm", j.Types.PanelTolMM)
	if math.Abs(j.Panel.BoundaryBevelDeg) >= 90 || math.IsNaN(j.Panel.BoundaryBevelDeg) {
		fail("panel.boundary_bevel_deg", "%g must lie between -90 and 90", j.Panel.BoundaryBevelDeg)
	}
	for i, s := range j.Stock {
		if first != nil {
			break
		}
		k := func(name string) string { return fmt.Sprintf("stock[%d].%s", i+1, name) }
		positive(k("width_mm"), s.WidthMM)
		positive(k("height_mm"), s.HeightMM)
		nonNeg(k("margin_mm"), s.MarginMM)
		nonNeg(k("spacing_mm"), s.SpacingMM)
		nonNeg(k("count"), float64(s.Count))
		nonNeg(k("price"), s.Price)
		switch nest.Rotation(s.Rotation) {
		case nest.Free, nest.Quarter, nest.Grain:
		default:
			fail(k("rotation"), "%q: want free, quarter or grain", s.Rotation)
		}
		if s.WidthMM > 0 && s.HeightMM > 0 && 2*s.MarginMM >= math.Min(s.WidthMM, s.HeightMM) {
			fail(k("margin_mm"), "%g mm leaves no room on a %g × %g mm sheet", s.MarginMM, s.WidthMM, s.HeightMM)
		}
	}
	if r := j.Rates; r != nil {
		nonNeg("rates.member_per_m", r.MemberPerM)
		nonNeg("rates.node_each", r.NodeEach)
		nonNeg("rates.panel_per_m2", r.PanelPerM2)
		nonNeg("rates.sheet_each", r.SheetEach)
	}
	return first
}

// keyLines finds the line of each key in a TOML text: "table.key" for
// plain tables and "stock[2].key" for the second [[stock]] table.
type keyLines struct{ lines map[string]int }

func indexKeys(data []byte) *keyLines {
	kl := &keyLines{lines: map[string]int{}}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 64*1024), 4*1024*1024)
	table := ""
	arrays := map[string]int{}
	for n := 1; sc.Scan(); n++ {
		s := strings.TrimSpace(sc.Text())
		switch {
		case strings.HasPrefix(s, "[["):
			name := strings.TrimSpace(strings.Trim(strings.SplitN(s, "]]", 2)[0], "[ "))
			arrays[name]++
			table = fmt.Sprintf("%s[%d]", name, arrays[name])
			kl.set(table, n)
		case strings.HasPrefix(s, "["):
			table = strings.TrimSpace(strings.Trim(strings.SplitN(s, "]", 2)[0], "[ "))
			kl.set(table, n)
		default:
			if k, _, ok := strings.Cut(s, "="); ok && !strings.HasPrefix(s, "#") {
				key := strings.Trim(strings.TrimSpace(k), `"`)
				if table != "" {
					kl.set(table+"."+key, n)
					// Undecoded keys of array tables come without the index:
					// remember the first line under the plain name too.
					if i := strings.IndexByte(table, '['); i >= 0 {
						kl.set(table[:i]+"."+key, n)
					}
				} else {
					kl.set(key, n)
				}
			}
		}
	}
	return kl
}

func (kl *keyLines) set(key string, n int) {
	if _, ok := kl.lines[key]; !ok {
		kl.lines[key] = n
	}
}

// line returns the line of a key such as "net.unit", "stock[1].width_mm",
// "stock" (the first [[stock]]) or, for an undecoded key in an array
// table, "stock.colour" (the first such key); 0 if not found.
func (kl *keyLines) line(key string) int {
	if n, ok := kl.lines[key]; ok {
		return n
	}
	if n, ok := kl.lines[key+"[1]"]; ok {
		return n // an array table: its first table
	}
	return 0
}

// stocks returns the job's stock sheets for nesting.
func (j *Job) stocks() []nest.Stock {
	out := make([]nest.Stock, len(j.Stock))
	for i, s := range j.Stock {
		out[i] = nest.Stock{Name: s.Name, WidthMM: s.WidthMM, HeightMM: s.HeightMM, MarginMM: s.MarginMM, SpacingMM: s.SpacingMM,
			Rotation: nest.Rotation(s.Rotation), Mirror: s.Mirror, Count: s.Count, Price: s.Price}
	}
	return out
}
