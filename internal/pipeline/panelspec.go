package pipeline

import (
	"fmt"
	"strings"

	"pqfab/internal/job"
	"pqfab/panels"
)

// pickPanels returns, for every panel, the [[panel_type]] table that picks
// it by label or by bay (an index into j.PanelType), or -1. A label that is
// not a panel of the net, a bay without panels and a panel picked twice
// are errors naming the table's key and line.
func pickPanels(j *job.Job, flats []panels.Flat) ([]int, error) {
	pick := make([]int, len(flats))
	byLabel := make(map[string]int, len(flats))
	byBay := map[string][]int{}
	for f, fl := range flats {
		pick[f] = -1
		byLabel[fl.Label] = f
		bay, _, _ := strings.Cut(fl.Label, "-")
		byBay[bay] = append(byBay[bay], f)
	}
	take := func(i int, key string, f int) error {
		if m := pick[f]; m >= 0 && m != i {
			return j.Errorf(key, "panel %s is picked by panel_type %d too: a panel takes one specification", flats[f].Label, m+1)
		}
		pick[f] = i
		return nil
	}
	for i, t := range j.PanelType {
		prefix := fmt.Sprintf("panel_type[%d].", i+1)
		for _, l := range t.Panels {
			f, ok := byLabel[l]
			if !ok {
				return nil, j.Errorf(prefix+"panels", "%q is not a panel of this net (panel labels are bay and number, such as %s)", l, flats[0].Label)
			}
			if err := take(i, prefix+"panels", f); err != nil {
				return nil, err
			}
		}
		for _, b := range t.Bays {
			fs, ok := byBay[b]
			if !ok {
				return nil, j.Errorf(prefix+"bays", "bay %s holds no panel of this net", b)
			}
			for _, f := range fs {
				if err := take(i, prefix+"bays", f); err != nil {
					return nil, err
				}
			}
		}
	}
	return pick, nil
}

// panelMaterial returns the material of a panel picked by table pick (-1:
// none): [panel]'s, with the thickness and density the table gives.
func panelMaterial(j *job.Job, pick int) panels.Material {
	if pick < 0 {
		return j.Material()
	}
	return j.PanelType[pick].OverMaterial(j.Material())
}

// typeSpecs returns every panel type's specification, field by field:
// [panel]'s, then the table that picked its panels by label or bay, then
// the table that names the type. It sets the weights of the panels of a
// named type with another thickness or density, and the type's totals.
func typeSpecs(j *job.Job, types []panels.Type, flats []panels.Flat, pick []int) (map[string]PanelSpec, error) {
	named := map[string]job.PanelTypeSpec{}
	have := map[string]bool{}
	for _, t := range types {
		have[t.Name] = true
	}
	for i, t := range j.PanelType {
		if t.Picks() {
			continue
		}
		if !have[t.Type] {
			return nil, j.Errorf(fmt.Sprintf("panel_type[%d].type", i+1), "%q is not a panel type of this net (it has PT-001 to %s)", t.Type, types[len(types)-1].Name)
		}
		named[t.Type] = t
	}
	out := make(map[string]PanelSpec, len(types))
	for ti := range types {
		t := &types[ti]
		s, m := j.Panel.PanelSpec, j.Material()
		if p := pick[t.Panels[0]]; p >= 0 {
			s, m = j.PanelType[p].Over(s), j.PanelType[p].OverMaterial(m)
		}
		if tb, ok := named[t.Name]; ok {
			s, m = tb.Over(s), tb.OverMaterial(m)
			for _, f := range t.Panels {
				flats[f].WeightKg = m.WeightKg(flats[f].AreaM2)
			}
			t.Retotal(flats)
		}
		es := Spec(s)
		es.ThicknessMM, es.DensityKgM3 = m.ThicknessMM, m.DensityKgM3
		out[t.Name] = es
	}
	return out, nil
}

// PanelSpec is a panel's plain-text specification, as the job gives it,
// with the panel's thickness and density.
type PanelSpec struct {
	BuildUp       string `json:"build_up,omitempty"`
	EdgeWork      string `json:"edge_work,omitempty"`
	Coating       string `json:"coating,omitempty"`
	HeatTreatment string `json:"heat_treatment,omitempty"`
	Grade         string `json:"grade,omitempty"`
	// Thickness and density of a panel type's panels (0: the job's).
	ThicknessMM float64 `json:"thickness_mm,omitempty"`
	DensityKgM3 float64 `json:"density_kg_m3,omitempty"`
}

// Spec turns a job's panel specification into a PanelSpec (without
// thickness and density).
func Spec(s job.PanelSpec) PanelSpec {
	return PanelSpec{BuildUp: s.BuildUp, EdgeWork: s.EdgeWork, Coating: s.Coating, HeatTreatment: s.HeatTreatment, Grade: s.Grade}
}
