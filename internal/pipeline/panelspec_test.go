package pipeline_test

import (
	"math"
	"strings"
	"testing"

	"pqfab/internal/pipeline"
	"pqfab/internal/report"
)

// runDome runs a job on a sample dome of 120 panels; extra is appended to
// a job with [panel] settings and one stock.
func runDome(t *testing.T, extra string) (*pipeline.Result, error) {
	t.Helper()
	text := `[net]
file = "net.obj"
[nodes]
bay_mm = 4000
[nesting]
steps = 500
[panel]
thickness_mm = 10
density_kg_m3 = 2500
build_up = "10 mm toughened"
edge_work = "flat ground"
coating = "none"
[[stock]]
name = "float"
width_mm = 6000
height_mm = 3210
` + extra
	return runJob(t, text, sampleOpener(t, "dome", 120))
}

// TestPanelTypeOverrides: a [[panel_type]] table picking a bay gives its
// panels another build-up and thickness, key by key (edge work and
// coating stay [panel]'s); their weights follow the thickness (area ×
// thickness × density, recomputed here), and they share no type with
// panels outside the bay. A table naming a type then changes only its
// coating.
func TestPanelTypeOverrides(t *testing.T) {
	base, err := runDome(t, "")
	if err != nil {
		t.Fatal(err)
	}
	bay := ""
	for _, fl := range base.Flats {
		if b, _, _ := strings.Cut(fl.Label, "-"); bay == "" || b < bay {
			bay = b
		}
	}
	res, err := runDome(t, "[[panel_type]]\nbays = [\""+bay+"\"]\nbuild_up = \"laminated 10 + 10\"\nthickness_mm = 20.76\n")
	if err != nil {
		t.Fatal(err)
	}
	inBay := func(label string) bool { return strings.HasPrefix(label, bay+"-") }
	typeInBay := map[int]bool{}
	picked := 0
	for _, fl := range res.Flats {
		want := fl.AreaM2 * 10 / 1000 * 2500
		if inBay(fl.Label) {
			want = fl.AreaM2 * 20.76 / 1000 * 2500
			picked++
		}
		if math.Abs(fl.WeightKg-want) > 1e-9 {
			t.Errorf("%s: %g kg, want %g", fl.Label, fl.WeightKg, want)
		}
		if seen, ok := typeInBay[fl.Type]; ok && seen != inBay(fl.Label) {
			t.Errorf("%s: type %s holds panels in and out of bay %s", fl.Label, res.PanelTypes[fl.Type].Name, bay)
		}
		typeInBay[fl.Type] = inBay(fl.Label)
	}
	if picked == 0 {
		t.Fatalf("bay %s picked no panel", bay)
	}
	var named string
	for _, ty := range res.PanelTypes {
		s := res.TypeSpecs[ty.Name]
		want := report.PanelSpec{BuildUp: "10 mm toughened", EdgeWork: "flat ground", Coating: "none", ThicknessMM: 10, DensityKgM3: 2500}
		if typeInBay[res.Flats[ty.Panels[0]].Type] {
			want.BuildUp, want.ThicknessMM = "laminated 10 + 10", 20.76
			named = ty.Name
		}
		if s != want {
			t.Errorf("%s: spec %+v, want %+v", ty.Name, s, want)
		}
		var sum float64
		for _, f := range ty.Panels {
			sum += res.Flats[f].WeightKg
		}
		if math.Abs(sum-ty.TotalWeightKg) > 1e-9 {
			t.Errorf("%s: total %g kg, panels sum to %g", ty.Name, ty.TotalWeightKg, sum)
		}
	}
	res2, err := runDome(t, "[[panel_type]]\nbays = [\""+bay+"\"]\nbuild_up = \"laminated 10 + 10\"\nthickness_mm = 20.76\n[[panel_type]]\ntype = \""+named+"\"\ncoating = \"low-e face 2\"\n")
	if err != nil {
		t.Fatal(err)
	}
	want := report.PanelSpec{BuildUp: "laminated 10 + 10", EdgeWork: "flat ground", Coating: "low-e face 2", ThicknessMM: 20.76, DensityKgM3: 2500}
	if got := res2.TypeSpecs[named]; got != want {
		t.Errorf("%s named: spec %+v, want %+v", named, got, want)
	}
}

// TestPanelTypeErrors: picks that name no panel, or a panel twice, are
// errors naming the key and its line.
func TestPanelTypeErrors(t *testing.T) {
	for _, tc := range []struct{ extra, want string }{
		{"[[panel_type]]\npanels = [\"Z9-P01\"]\n", "job.toml:18: key panel_type[1].panels: \"Z9-P01\" is not a panel of this net"},
		{"[[panel_type]]\nbays = [\"Z9\"]\n", "job.toml:18: key panel_type[1].bays: bay Z9 holds no panel"},
		{"[[panel_type]]\ntype = \"PT-999\"\n", "job.toml:18: key panel_type[1].type: \"PT-999\" is not a panel type of this net"},
	} {
		_, err := runDome(t, tc.extra)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("got %v, want %q", err, tc.want)
		}
	}
}
