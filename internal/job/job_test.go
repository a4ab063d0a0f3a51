package job

import (
	"math"
	"strings"
	"testing"
)

func TestJobErrors(t *testing.T) {
	base := `[net]
file = "wave.obj"
[[stock]]
width_mm = 6000
height_mm = 3210
`
	tests := []struct {
		name, text, want string
	}{
		{"unknown key", base + "colour = \"red\"\n", "job.toml:6: key stock.colour: unknown key"},
		{"near key", base + "hieght_mm = 3\n", "key stock.hieght_mm: unknown key; did you mean stock.height_mm?"},
		{"duplicate stock name", base + "name = \"a\"\n[[stock]]\nname = \"a\"\nwidth_mm = 10\nheight_mm = 10\n", "job.toml:8: key stock[2].name: \"a\" is the name of stock 1 too"},
		{"huge price", base + "price = 1e308\n", "key stock[1].price: 1e+308 must be zero (unknown) or a positive number of at most 1e+12"},
		{"newline in title", "title = \"a\\nb\"\n" + base, "job.toml:1: key title: \"a\\nb\" holds a control character"},
		{"unknown table", "[nett]\nfile = \"x\"\n" + base, "job.toml:1: key nett: unknown key"},
		{"negative tolerance", base + "[flatness]\ntolerance_mm = -1\n", "job.toml:7: key flatness.tolerance_mm: -1 must be more than 0"},
		{"zero tolerance", base + "[flatness]\ntolerance_mm = 0\n", "job.toml:7: key flatness.tolerance_mm: 0 must be more than 0 and at most 1000 mm"},
		{"zero move", base + "[flatness]\nmax_move_mm = 0\n", "job.toml:7: key flatness.max_move_mm: 0 must be more than 0 and at most 100000 mm"},
		{"zero budget", base + "[flatness]\nmax_iterations = 0\n", "job.toml:7: key flatness.max_iterations: 0 must be between 1 and 100000"},
		{"negative fairness", base + "[flatness]\nfairness = -1\n", "job.toml:7: key flatness.fairness: -1 must be between 0 and 1e+06"},
		{"zero width", base + "[member]\nwidth_mm = 0\n", "job.toml:7: key member.width_mm: 0 must be more than 0 and at most 10000 mm"},
		{"zero depth", base + "[member]\ndepth_mm = 0\n", "job.toml:7: key member.depth_mm: 0 must be more than 0 and at most 10000 mm"},
		{"negative type tolerance", base + "[types]\nlength_tol_mm = -1\n", "job.toml:7: key types.length_tol_mm: -1 must be between 0 and 1000 mm"},
		{"negative panel tolerance", base + "[types]\npanel_tol_mm = -1\n", "job.toml:7: key types.panel_tol_mm: -1 must be between 0 and 1000 mm"},
		{"negative merge tolerance", strings.Replace(base, "file = \"wave.obj\"", "file = \"wave.obj\"\nmerge_tol_mm = -1", 1), "job.toml:3: key net.merge_tol_mm: -1 must be a finite number, zero or more"},
		{"bad unit", strings.Replace(base, "file = \"wave.obj\"", "file = \"wave.obj\"\nunit = \"ft\"", 1), "job.toml:3: key net.unit: \"ft\": want mm, cm or m"},
		{"bad axis", base + "[nodes]\naxis = \"diagonal\"\n", "job.toml:7: key nodes.axis"},
		{"no stock", "[net]\nfile = \"wave.obj\"\n", "job.toml: no [[stock]] sheet"},
		{"zero stock", strings.Replace(base, "width_mm = 6000", "width_mm = 0", 1), "job.toml:4: key stock[1].width_mm: 0 mm must be a positive number"},
		{"margin too big", base + "margin_mm = 2000\n", "job.toml:6: key stock[1].margin_mm"},
		{"bad rotation", base + "rotation = \"sideways\"\n", "key stock[1].rotation"},
		{"bad cuts", base + "cuts = \"guillotine\"\n", "job.toml:6: key stock[1].cuts: \"guillotine\" must be \"any\""},
		{"long nesting", base + "[nesting]\nseconds = 1e6\n", "job.toml:7: key nesting.seconds"},
		{"negative steps", base + "[nesting]\nsteps = -1\n", "job.toml:7: key nesting.steps"},
		{"wrong type", base + "[flatness]\ntolerance_mm = \"small\"\n", "job.toml:7: key flatness.tolerance_mm: want a number, got text"},
		{"syntax", "[net\nfile = 1\n", "job.toml:2: TOML syntax: expected '.' or ']'"},
		{"empty", "", "job.toml: empty job file"},
		{"no net", "[[stock]]\nwidth_mm = 1\nheight_mm = 1\n", "key net.file: missing"},
		{"list without ids", base + "[supports]\nmode = \"list\"\n", "key supports.nodes"},
		{"negative rate", base + "[rates]\nnode_each = -5\n", "key rates.node_each"},
		{"bad section", base + "[member]\nsection = \"tube\"\n", "job.toml:7: key member.section: \"tube\": want \"solid\""},
		{"hollow without wall", base + "[member]\nsection = \"hollow\"\n", "job.toml:7: key member.section: \"hollow\" needs wall_mm"},
		{"wall on solid", base + "[member]\nwall_mm = 4\n", "job.toml:7: key member.wall_mm: is read only with section = \"hollow\""},
		{"wall too thick", base + "[member]\nsection = \"hollow\"\nwidth_mm = 60\nwall_mm = 30\n", "job.toml:9: key member.wall_mm: 30 must be more than 0 and less than half"},
		{"mass without mass", base + "[member]\nsection = \"mass\"\n", "job.toml:7: key member.section: \"mass\" needs mass_kg_m"},
		{"negative mass", base + "[member]\nsection = \"mass\"\nmass_kg_m = -3\n", "job.toml:8: key member.mass_kg_m: -3 must be more than 0"},
		{"mass on hollow", base + "[member]\nsection = \"hollow\"\nwall_mm = 4\nmass_kg_m = 3\n", "job.toml:9: key member.mass_kg_m: is read only with section = \"mass\""},
		{"bad tag size", base + "[site]\ntag_size = \"huge\"\n", "job.toml:7: key site.tag_size: \"huge\": want \"office\""},
		{"negative type rate", base + "[rates]\nmember_type_each = -1\n", "job.toml:7: key rates.member_type_each: -1 must be between 0"},
		{"unpriced sheets twice", base + "[rates]\nsheet_each = 100\nsheet_per_m2 = 5\n", "job.toml:8: key rates.sheet_per_m2: 5: give the material of unpriced sheet stock once"},
		{"unknown rate", base + "[rates]\npanel_per_m = 5\n", "job.toml:7: key rates.panel_per_m: unknown key; did you mean rates.panel_per_m2?"},
		{"panel type picks nothing", base + "[[panel_type]]\nbuild_up = \"x\"\n", "job.toml:6: key panel_type[1]: name its panels one way"},
		{"panel type picks twice", base + "[[panel_type]]\ntype = \"PT-001\"\nbays = [\"C3\"]\n", "job.toml:6: key panel_type[1]: name its panels one way"},
		{"panel type bad bay", base + "[[panel_type]]\nbays = [\"c3\"]\n", "job.toml:7: key panel_type[1].bays: \"c3\" is not a bay"},
		{"panel type thin", base + "[[panel_type]]\nbays = [\"C3\"]\nthickness_mm = 0\n", "job.toml:8: key panel_type[1].thickness_mm: 0 must be more than 0"},
		{"panel type dense", base + "[[panel_type]]\nbays = [\"C3\"]\n[[panel_type]]\ntype = \"PT-002\"\ndensity_kg_m3 = -1\n", "job.toml:10: key panel_type[2].density_kg_m3: -1 must be between 0"},
		{"panel type twice", base + "[[panel_type]]\ntype = \"PT-002\"\n[[panel_type]]\ntype = \"PT-002\"\n", "job.toml:9: key panel_type[2].type: \"PT-002\" is given in panel_type 1 too"},
	}
	for _, tc := range tests {
		_, err := Parse([]byte(tc.text), "job.toml")
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: got %v, want %q", tc.name, err, tc.want)
		}
	}
	if _, err := Parse([]byte(base), "job.toml"); err != nil {
		t.Errorf("minimal job: %v", err)
	}
	// Member mass per metre. A 120 x 60 x 4 mm steel rectangular hollow
	// section weighs about 10.7 kg/m in the EN 10219-2 tables (from
	// memory; its rounded corners take off about 1 %): a fifth of the
	// solid bar of the same outside, 0.120 x 0.060 m x 7850 kg/m³ =
	// 56.52 kg/m. The square-cornered wall area is 2·4·(60 + 120) − 4·4²
	// = 1376 mm², 10.80 kg/m.
	for _, c := range []struct {
		keys string
		want float64
	}{
		{"density_kg_m3 = 7850\n", 56.52},
		{"section = \"hollow\"\nwall_mm = 4\ndensity_kg_m3 = 7850\n", 10.8016},
		{"section = \"mass\"\nmass_kg_m = 10.7\n", 10.7},
	} {
		j, err := Parse([]byte(base+"[member]\nwidth_mm = 60\ndepth_mm = 120\n"+c.keys), "job.toml")
		if err != nil {
			t.Fatalf("%q: %v", c.keys, err)
		}
		if got := j.Member.KgPerM(); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%q: %.4f kg/m, want %.4f", c.keys, got, c.want)
		}
		if hs, solid := 10.7, 56.52; c.want < 20 && math.Abs(c.want/solid-hs/solid) > 0.01 {
			t.Errorf("%q: %.3f of the solid bar, the handbook section is %.3f", c.keys, c.want/solid, hs/solid)
		}
	}
	for _, c := range []struct{ key, want string }{{"", ""}, {"cuts = \"any\"\n", ""}, {"cuts = \"edge-to-edge\"\n", "edge-to-edge"}} {
		j, err := Parse([]byte(base+c.key), "job.toml")
		if err != nil {
			t.Errorf("%q: %v", c.key, err)
		} else if got := string(j.Stocks()[0].Cuts); got != c.want {
			t.Errorf("%q: cut rule %q, want %q", c.key, got, c.want)
		}
	}
}

// TestPanelTypeMerge: a [[panel_type]] table replaces only the keys it
// gives; the others keep [panel]'s values.
func TestPanelTypeMerge(t *testing.T) {
	text := `[net]
file = "wave.obj"
[panel]
thickness_mm = 16.76
density_kg_m3 = 2500
build_up = "8 + 8 laminated"
edge_work = "flat ground"
coating = "low-e face 3"
[[panel_type]]
bays = ["C3"]
build_up = "10 + 10 laminated"
thickness_mm = 20.76
[[stock]]
width_mm = 6000
height_mm = 3210
`
	j, err := Parse([]byte(text), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	tb := j.PanelType[0]
	got := tb.Over(j.Panel.PanelSpec)
	want := PanelSpec{BuildUp: "10 + 10 laminated", EdgeWork: "flat ground", Coating: "low-e face 3"}
	if got != want {
		t.Errorf("merged spec %+v, want %+v", got, want)
	}
	m := tb.OverMaterial(j.Material())
	if m.ThicknessMM != 20.76 || m.DensityKgM3 != 2500 {
		t.Errorf("merged material %g mm %g kg/m³, want 20.76 and 2500", m.ThicknessMM, m.DensityKgM3)
	}
	if !tb.Picks() {
		t.Error("a table with bays picks panels")
	}
}
