package report

import "pqfab/internal/job"

// Setting is one job setting shown in the summary: Value is a number
// (float64 or int, in the unit the name gives) or text.
type Setting struct {
	Name  string `json:"name"`
	Value any    `json:"value"`
}

// settings lists the job's settings for the summary sheet: numbers as
// numbers, units in the names. The stock sizes are in the report's stock
// rows.
func settingsOf(j *job.Job) []Setting {
	yes := func(b bool) string {
		if b {
			return "yes"
		}
		return "no"
	}
	return []Setting{
		{Name: "Geometry unit", Value: j.Net.Unit},
		{Name: "Supports", Value: j.Supports.Mode},
		{Name: "Flatness tolerance (mm)", Value: j.Flatness.TolMM},
		{Name: "Allowed node move (mm)", Value: j.Flatness.MaxMoveMM},
		{Name: "Smooth moves against small moves (fairness)", Value: j.Flatness.Fairness},
		{Name: "Node axes", Value: j.Nodes.Axis},
		{Name: "Hub radius (mm)", Value: j.Nodes.HubRadiusMM},
		{Name: "Member section", Value: j.Member.Section},
		{Name: "Member width (mm)", Value: j.Member.WidthMM},
		{Name: "Member depth (mm)", Value: j.Member.DepthMM},
		{Name: "Member wall (mm, hollow sections)", Value: j.Member.WallMM},
		{Name: "Member mass (kg/m)", Value: r(j.Member.KgPerM(), 3)},
		{Name: "Panel material", Value: j.Panel.Material},
		{Name: "Panel thickness (mm)", Value: j.Panel.ThicknessMM},
		{Name: "Panel edge inset (mm)", Value: j.Panel.EdgeInsetMM},
		{Name: "Mirrored panels allowed", Value: yes(j.Panel.Mirror)},
		{Name: "Panel edges bevelled (bevels part of each panel type)", Value: yes(j.Panel.BevelledEdges)},
		{Name: "Bay size (mm)", Value: j.Nodes.BayMM},
		{Name: "Type tolerance, member cut length (mm)", Value: j.Types.LengthTolMM},
		{Name: "Type tolerance, angles (°)", Value: j.Types.AngleTolDeg},
		{Name: "Type tolerance, panel edges and diagonals (mm)", Value: j.Types.PanelTolMM},
		{Name: "Nesting search steps", Value: j.NestOptions().Steps},
		{Name: "Nesting time limit (s, 0: none)", Value: j.Nesting.Seconds},
	}
}
