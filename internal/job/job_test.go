package job

import (
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
		{"negative type rate", base + "[rates]\nmember_type_each = -1\n", "job.toml:7: key rates.member_type_each: -1 must be between 0"},
		{"unpriced sheets twice", base + "[rates]\nsheet_each = 100\nsheet_per_m2 = 5\n", "job.toml:8: key rates.sheet_per_m2: 5: give the material of unpriced sheet stock once"},
		{"unknown rate", base + "[rates]\npanel_per_m = 5\n", "job.toml:7: key rates.panel_per_m: unknown key; did you mean rates.panel_per_m2?"},
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
	for _, c := range []struct{ key, want string }{{"", ""}, {"cuts = \"any\"\n", ""}, {"cuts = \"edge-to-edge\"\n", "edge-to-edge"}} {
		j, err := Parse([]byte(base+c.key), "job.toml")
		if err != nil {
			t.Errorf("%q: %v", c.key, err)
		} else if got := string(j.Stocks()[0].Cuts); got != c.want {
			t.Errorf("%q: cut rule %q, want %q", c.key, got, c.want)
		}
	}
}
