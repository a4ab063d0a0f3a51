package report

import (
	"fmt"
	"strings"

	"pqfab/quadnet"
)

// Output file names inside the build folder.
const (
	FileSchedule   = "schedule.xlsx"
	FileAssembly   = "assembly-plan.dxf"
	FileNet        = "net-flat.obj"
	FileReport     = "report.json"
	FileHTML       = "report.html"
	DirSheets      = "sheets"
	DirPanelTypes  = "panel-types"
	DirMemberTypes = "member-types"
)

// Output files for the site team.
const (
	DirSite     = "site"
	FilePlanPDF = "site/plan.pdf"
	FileTagsPDF = "site/tags.pdf"
	FileView    = "view.html"
)

// Size limits of the site files. Beyond them the file holds one page that
// says so (and the report carries a warning): the assembly plan DXF, the
// schedule and view.html still hold every part.
const (
	// MaxPlanPages: plan.pdf has a page per bay up to this many bays.
	MaxPlanPages = 600
	// MaxTags: tags.pdf has a tag per part (nodes, members and panels
	// together) up to this many parts (500 sheets of 24 labels).
	MaxTags = 12000
)

// BayGrid is the plan bay grid the labels use (see quadnet.Bays): columns
// lettered along x, rows numbered along y.
type BayGrid struct {
	OriginMM [2]float64 `json:"origin_mm"` // lower-left corner of bay A1
	SizeMM   [2]float64 `json:"size_mm"`   // bay width along x, depth along y
}

// BayGridOf rounds a plan bay grid for the report.
func BayGridOf(b quadnet.Bays) BayGrid {
	return BayGrid{OriginMM: [2]float64{r(b.Origin.X, LenDigits), r(b.Origin.Y, LenDigits)},
		SizeMM: [2]float64{r(b.SizeX, LenDigits), r(b.SizeY, LenDigits)}}
}

// SiteWarnings says which site files are cut short by the size limits.
func SiteWarnings(rep *Report) []string {
	var w []string
	if n := len(rep.Nodes) + len(rep.Members) + len(rep.Panels); n > MaxTags {
		w = append(w, fmt.Sprintf("%s holds no tags: the job has %d parts, more than the %d tags pqfab prints in one file", FileTagsPDF, n, MaxTags))
	}
	bays := map[string]bool{}
	for _, n := range rep.Nodes {
		bays[BayName(n.Label)] = true
	}
	for _, m := range rep.Members {
		bays[BayName(m.Label)] = true
	}
	for _, p := range rep.Panels {
		bays[BayName(p.Label)] = true
	}
	if len(bays) > MaxPlanPages {
		w = append(w, fmt.Sprintf("%s holds no bay pages: the job spans %d bays, more than the %d pages pqfab prints in one file", FilePlanPDF, len(bays), MaxPlanPages))
	}
	return w
}

// BayName returns the bay a part label names: "C2" of "C2-07".
func BayName(label string) string {
	name, _, _ := strings.Cut(label, "-")
	return name
}
