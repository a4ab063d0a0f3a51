package pipeline_test

import (
	"math"
	"testing"

	"pqfab/internal/report"
)

// TestMemberSectionWeights: the same net built with a solid steel bar, a
// rectangular hollow section and a given mass per metre; every member's
// weight in the report is its cut length times the section's mass per
// metre, the members' total is their sum, and the hollow 60 x 120 x 4 mm
// section (wall area 2·4·(60 + 120) − 4·4² = 1376 mm², 10.80 kg/m at
// 7850 kg/m³; EN 10219-2 lists about 10.7 kg/m for it, from memory)
// weighs about a fifth of the solid bar (7200 mm², 56.52 kg/m).
func TestMemberSectionWeights(t *testing.T) {
	build := func(member string) *report.Report {
		t.Helper()
		text := "[net]\nfile = \"net.obj\"\n[member]\nwidth_mm = 60\ndepth_mm = 120\ndensity_kg_m3 = 7850\n" + member +
			"[[stock]]\nwidth_mm = 6000\nheight_mm = 3210\n"
		return report.New(runSample(t, "wave", 60, text))
	}
	weights := map[string]float64{}
	for _, tc := range []struct {
		name, keys string
		kgm        float64
	}{
		{"solid", "", 56.52},
		{"hollow", "section = \"hollow\"\nwall_mm = 4\n", 10.8016},
		{"mass", "section = \"mass\"\nmass_kg_m = 10.7\n", 10.7},
	} {
		rep := build(tc.keys)
		if rep.MemberMaterial.Section != tc.name || math.Abs(rep.MemberMaterial.KgPerM-tc.kgm) > 0.001 {
			t.Errorf("%s: section %q, %.4f kg/m; want %.4f", tc.name, rep.MemberMaterial.Section, rep.MemberMaterial.KgPerM, tc.kgm)
		}
		sum := 0.0
		for _, m := range rep.Members {
			if want := tc.kgm * m.CutLengthMM / 1000; math.Abs(m.WeightKg-want) > 0.006 {
				t.Errorf("%s: member %s weighs %.2f kg, want %.2f", tc.name, m.Label, m.WeightKg, want)
			}
			sum += tc.kgm * m.CutLengthMM / 1000
		}
		if math.Abs(rep.Weights.MembersKg-sum) > 0.01 {
			t.Errorf("%s: members %.2f kg, their sum %.2f", tc.name, rep.Weights.MembersKg, sum)
		}
		weights[tc.name] = rep.Weights.MembersKg
	}
	if f := weights["hollow"] / weights["solid"]; math.Abs(f-0.2) > 0.015 {
		t.Errorf("the hollow section weighs %.3f of the solid bar, want about a fifth", f)
	}
	t.Logf("members: solid %.1f kg, hollow %.1f kg, given mass %.1f kg", weights["solid"], weights["hollow"], weights["mass"])
}
