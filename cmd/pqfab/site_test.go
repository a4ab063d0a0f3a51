package main

import (
	"bytes"
	"cmp"
	"fmt"
	"html"
	"image"
	"image/png"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"pqfab/export/pdf"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// Outside readers of the site files, all Debian packages that .ci/run
// installs: poppler-utils (pdftotext, pdftoppm), zbar-tools (zbarimg) and
// chromium. A missing reader is a failure, not a skip.
const (
	pdftotext = "/usr/bin/pdftotext"
	pdftoppm  = "/usr/bin/pdftoppm"
	zbarimg   = "/usr/bin/zbarimg"
)

// siteTitle has what a title can break: quotes, markup, a newline, a DXF
// control code, a backslash and characters outside code page 1252.
const siteTitle = `Café "Nord" <b>&amp; 50%% \ 日本 — hall`

// buildSiteJob builds a small wave (120 panels, 3 m bays so it spans
// several) and returns the output folder and its report.
func buildSiteJob(t *testing.T, dir string) (string, *report.Report) {
	t.Helper()
	if _, _, err := runCmd(t, "sample", "wave", "--panels", "120", "-o", filepath.Join(dir, "wave.obj")); err != nil {
		t.Fatal(err)
	}
	job := `title = "` + strings.ReplaceAll(strings.ReplaceAll(siteTitle, `\`, `\\`), `"`, `\"`) + `"
[net]
file = "wave.obj"
[nodes]
bay_mm = 3000
hub_radius_mm = 50
[[stock]]
name = "jumbo"
width_mm = 6000
height_mm = 3210
margin_mm = 20
spacing_mm = 6
`
	if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	return out, loadReport(t, out)
}

func runTool(t *testing.T, name string, args ...string) string {
	t.Helper()
	out, err := exec.Command(name, args...).Output()
	if err != nil {
		msg := ""
		if ee, ok := err.(*exec.ExitError); ok {
			msg = string(ee.Stderr)
		}
		t.Fatalf("%s %v: %v\n%s", name, args, err, tail(msg, 2000))
	}
	return string(out)
}

// pdfPages returns the text of every page (pdftotext ends each page with
// a form feed).
func pdfPages(t *testing.T, path string) []string {
	t.Helper()
	pages := strings.Split(runTool(t, pdftotext, "-enc", "UTF-8", path, "-"), "\f")
	return pages[:len(pages)-1]
}

func tokens(s string) map[string]bool {
	out := map[string]bool{}
	for _, f := range strings.Fields(s) {
		out[f] = true
	}
	return out
}

// partsByBay lists each bay's node, member and panel labels.
func partsByBay(rep *report.Report) map[string][]string {
	out := map[string][]string{}
	add := func(l string) {
		bay, _, _ := strings.Cut(l, "-")
		out[bay] = append(out[bay], l)
	}
	for _, n := range rep.Nodes {
		add(n.Label)
	}
	for _, m := range rep.Members {
		add(m.Label)
	}
	for _, p := range rep.Panels {
		add(p.Label)
	}
	return out
}

// TestSitePlanPDF reads site/plan.pdf back with pdftotext (poppler-utils):
// an index page listing every bay with its page, then one page per bay
// that holds parts, each page names its bay and scale, carries the
// caution and the title (in code page 1252: characters outside it print
// as '?'), and every label of the bay's nodes, members and panels appears
// on its page as a word of its own, at least 2.5 mm high (pdftotext
// -bbox); pdftohtml -xml (poppler-utils) finds a bookmark for the index
// and for every bay, each pointing to the bay's page.
func TestSitePlanPDF(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	out, rep := buildSiteJob(t, dir)
	path := filepath.Join(out, report.FilePlanPDF)
	pages := pdfPages(t, path)
	bays := partsByBay(rep)
	if len(pages) != len(bays)+1 {
		t.Fatalf("%d pages for %d bays and the index", len(pages), len(bays))
	}
	index := strings.Join(strings.Fields(pages[0]), " ")
	if !strings.Contains(index, "Bays and pages") {
		t.Fatalf("page 1 is not the index: %q", tail(index, 300))
	}
	pageOf := map[string]int{}
	for i, pg := range pages[1:] {
		if k := strings.Index(pg, "Bay "); k >= 0 {
			pageOf[strings.Fields(pg[k+4:])[0]] = i + 2
		}
	}
	words := pdfWords(t, path)
	// The index's list, read line by line (words on one baseline, by x):
	// "Bay C3 … page 12".
	lines := map[float64][]pdfWord{}
	for _, w := range words[0] {
		lines[math.Round(w.yMax*10)] = append(lines[math.Round(w.yMax*10)], w)
	}
	listed := map[string]string{}
	for _, ws := range lines {
		slices.SortFunc(ws, func(a, b pdfWord) int { return cmp.Compare(a.xMin, b.xMin) })
		for i := 0; i+3 < len(ws); i++ {
			if ws[i].text == "Bay" && ws[i+2].text == "page" {
				listed[ws[i+1].text] = ws[i+3].text
			}
		}
	}
	for bay := range bays {
		if got := listed[bay]; got != strconv.Itoa(pageOf[bay]) {
			t.Errorf("index lists bay %s on page %q, it is on page %d", bay, got, pageOf[bay])
		}
	}
	outline := runTool(t, "/usr/bin/pdftohtml", "-xml", "-stdout", "-i", "-f", "1", "-l", "1", path)
	marks := regexp.MustCompile(`<item page="(\d+)">([^<]*)</item>`).FindAllStringSubmatch(outline, -1)
	if len(marks) != len(bays)+1 || marks[0][1] != "1" {
		t.Fatalf("%d bookmarks for %d bays and the index: %v", len(marks), len(bays), marks)
	}
	for _, mk := range marks[1:] {
		bay := strings.Fields(strings.TrimPrefix(mk[2], "Bay "))[0]
		if strconv.Itoa(pageOf[bay]) != mk[1] {
			t.Errorf("bookmark %q points to page %s, the bay is on page %d", mk[2], mk[1], pageOf[bay])
		}
	}
	const tol = 0.01 // mm
	smallest := math.Inf(1)
	seen := map[string]bool{}
	for i, pg := range pages[1:] {
		for _, w := range words[i+1] {
			if _, _, ok := quadnet.ParseBay(w.text); ok && strings.Contains(w.text, "-") {
				smallest = min(smallest, w.capMM())
				if w.capMM() < 2.5-tol {
					t.Errorf("page %d: label %s is %.2f mm high, less than 2.5 mm", i+2, w.text, w.capMM())
				}
			}
		}
		words := tokens(pg)
		bay := ""
		if k := strings.Index(pg, "Bay "); k >= 0 {
			bay = strings.Fields(pg[k+4:])[0]
		}
		labels, ok := bays[bay]
		if !ok || seen[bay] {
			t.Fatalf("page %d: bay %q is not a bay with parts, or is on two pages", i+2, bay)
		}
		seen[bay] = true
		for _, l := range labels {
			if !words[l] {
				t.Errorf("page %d (bay %s): label %s missing", i+2, bay, l)
			}
		}
		flat := strings.Join(strings.Fields(pg), " ")
		for _, want := range []string{"scale 1:", "CAUTION: pqfab computes geometry only", "azimuth 0", "row by row",
			`Café "Nord" <b>&amp; 50%% \ ?? — hall`} {
			if !strings.Contains(flat, want) {
				t.Errorf("page %d: no %q in %q", i+2, want, tail(flat, 300))
			}
		}
	}
	t.Logf("%d bay pages; smallest part label %.2f mm high", len(pages)-1, smallest)
}

// TestSiteTagsPDF reads site/tags.pdf back: pdftotext (poppler-utils) finds
// every node, member and panel label, node tags carry the azimuth
// definition and member tags their end nodes; pdftoppm renders sample
// sheets and zbarimg (zbar-tools) decodes each sampled tag's QR code to
// exactly the label of the part in that slot.
func TestSiteTagsPDF(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	out, rep := buildSiteJob(t, dir)
	path := filepath.Join(out, report.FileTagsPDF)
	pages := pdfPages(t, path)
	// The order of the tags: nodes, members, panels, each by label.
	var order []string
	for _, kind := range [][]string{labelsOf(rep.Nodes, func(n report.NodeRow) string { return n.Label }),
		labelsOf(rep.Members, func(m report.MemberRow) string { return m.Label }),
		labelsOf(rep.Panels, func(p report.PanelRow) string { return p.Label })} {
		slices.Sort(kind)
		order = append(order, kind...)
	}
	lay := pdf.TagOffice
	perSheet := lay.Cols * lay.Rows
	if want := (len(order) + perSheet - 1) / perSheet; len(pages) != want {
		t.Fatalf("%d sheets for %d tags, want %d", len(pages), len(order), want)
	}
	for k, l := range order {
		pg := pages[k/perSheet]
		if !tokens(pg)[l] {
			t.Errorf("tag %s missing from sheet %d", l, k/perSheet+1)
		}
	}
	flat := strings.Join(strings.Fields(pages[0]), " ")
	if !strings.Contains(flat, "az 0 = grid north (+y) on the plane square to the axis") || !strings.Contains(flat, "NODE") {
		t.Errorf("first sheet (node tags) lacks the azimuth definition: %q", tail(flat, 400))
	}
	// Every member's tag names the end it is fixed at: its type's end A,
	// the same end for every member of a type. Read from there (ends
	// swapped and bevels turned for a tag at end B), every member's end
	// cuts lie within the type's largest deviation of the type's.
	types := map[string]report.MemberTypeRow{}
	for _, mt := range rep.MemberTypes {
		types[mt.Name] = mt
	}
	for _, m := range rep.Members {
		tagNode, other := m.NodeA, m.NodeB
		ends := m.Ends
		if m.TagEnd == "B" {
			tagNode, other = other, tagNode
			ends = [2]report.EndRow{m.Ends[1], m.Ends[0]}
			ends[0].BevelDeg, ends[1].BevelDeg = -ends[0].BevelDeg, -ends[1].BevelDeg
		}
		mt := types[m.Type]
		const rounding = 0.002 // degrees: both values are rounded to 0.001°
		for k := range 2 {
			if d := max(math.Abs(ends[k].MitreDeg-mt.Ends[k].MitreDeg), math.Abs(ends[k].BevelDeg-mt.Ends[k].BevelDeg)); d > mt.MaxDevDeg+rounding {
				t.Errorf("member %s read from its tag end: end %d differs from type %s by %.3f°, more than its %.3f°", m.Label, k+1, mt.Name, d, mt.MaxDevDeg)
			}
		}
		mpage := strings.Join(strings.Fields(pages[slices.Index(order, m.Label)/perSheet]), " ")
		if !strings.Contains(mpage, "TAG END (type end A) to node "+tagNode) || !strings.Contains(mpage, "other end (type end B) to node "+other) {
			t.Errorf("member %s's tag lacks its tag end (node %s)", m.Label, tagNode)
		}
	}
	checkTagTextSizes(t, path, order, 1)

	decoded := checkTagQRs(t, dir, path, lay, order, len(pages))
	t.Logf("%d tags on %d sheets; %d QR codes decoded", len(order), len(pages), decoded)

	// Outdoor tags: the same tags twice the size, two to a sheet, every
	// text twice as high, the QR codes still read.
	rep.TagSize = pdf.TagOutdoor.Name
	var buf bytes.Buffer
	if err := pdf.WriteTagsPDF(&buf, rep); err != nil {
		t.Fatal(err)
	}
	big := filepath.Join(dir, "tags-outdoor.pdf")
	if err := os.WriteFile(big, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	if n, want := len(pdfPages(t, big)), (len(order)+1)/2; n != want {
		t.Errorf("outdoor tags: %d sheets for %d tags, want %d", n, len(order), want)
	}
	checkTagTextSizes(t, big, order, 2)
	checkTagQRs(t, dir, big, pdf.TagOutdoor, order, (len(order)+1)/2)
}

// checkTagQRs decodes the QR code of every tag on the first sheet, a
// middle one and the last (pdftoppm renders the sheet, zbarimg reads the
// code): each holds exactly the label of the part in its slot.
func checkTagQRs(t *testing.T, dir, path string, lay pdf.TagLayout, order []string, sheets int) int {
	t.Helper()
	const dpi = 150
	perSheet := lay.Cols * lay.Rows
	decoded := 0
	for _, s := range slices.Compact([]int{0, sheets / 2, sheets - 1}) {
		prefix := filepath.Join(dir, fmt.Sprintf("%s-sheet-%d", lay.Name, s+1))
		runTool(t, pdftoppm, "-r", fmt.Sprint(dpi), "-gray", "-png", "-singlefile", "-f", fmt.Sprint(s+1), "-l", fmt.Sprint(s+1), path, prefix)
		img := readPNG(t, prefix+".png")
		for slot := 0; slot < perSheet && s*perSheet+slot < len(order); slot++ {
			want := order[s*perSheet+slot]
			x := (lay.SheetW-float64(lay.Cols)*lay.W)/2 + float64(slot%lay.Cols)*lay.W
			y := (lay.SheetH-float64(lay.Rows)*lay.H)/2 + float64(slot/lay.Cols)*lay.H
			px := func(mm float64) int { return int(mm / 25.4 * dpi) }
			k := lay.Scale // the QR code sits 3 k mm in, 13.6 k mm down, 25 k mm wide
			crop := image.Rect(px(x+k), px(y+12*k), px(x+31*k), px(y+42*k))
			file := filepath.Join(dir, fmt.Sprintf("qr-%s-%d-%d.png", lay.Name, s, slot))
			writePNG(t, file, img.(interface {
				SubImage(image.Rectangle) image.Image
			}).SubImage(crop))
			got := strings.TrimSpace(runTool(t, zbarimg, "-q", "--raw", file))
			if got != want {
				t.Errorf("%s tags, sheet %d slot %d: QR code reads %q, want %q", lay.Name, s+1, slot+1, got, want)
			}
			decoded++
		}
	}
	return decoded
}

// pdfWord is a word on a PDF page as pdftotext -bbox (poppler-utils)
// gives it: its box in points from the page's top-left corner.
type pdfWord struct {
	text                   string
	xMin, yMin, xMax, yMax float64
}

var bboxWord = regexp.MustCompile(`<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</word>`)

// pdfWords returns the words of every page of a PDF (pdftotext -bbox).
func pdfWords(t *testing.T, path string) [][]pdfWord {
	t.Helper()
	var pages [][]pdfWord
	for _, pg := range strings.Split(runTool(t, pdftotext, "-bbox", "-enc", "UTF-8", path, "-"), "<page ")[1:] {
		var words []pdfWord
		for _, m := range bboxWord.FindAllStringSubmatch(pg, -1) {
			w := pdfWord{text: html.UnescapeString(m[5])}
			for i, p := range []*float64{&w.xMin, &w.yMin, &w.xMax, &w.yMax} {
				v, err := strconv.ParseFloat(m[i+1], 64)
				if err != nil {
					t.Fatal(err)
				}
				*p = v
			}
			words = append(words, w)
		}
		pages = append(pages, words)
	}
	return pages
}

// capMM is a word's capital-letter height in mm (the nominal size of
// lettering, ISO 3098-1). poppler's word box spans the font's ascender to
// its descender; for Helvetica, the font of every site file, those are
// 718 and −207 and the capital height 718 units of 1000 (Adobe's font
// metrics for Helvetica, from memory).
func (w pdfWord) capMM() float64 { return (w.yMax - w.yMin) * 718 / 925 * 25.4 / 72 }

// checkTagTextSizes measures the tags' text in the PDF: every word at
// least pdf.TagDataCapMM high and every part's label, on its own tag,
// at least pdf.TagLabelCapMM (times the tag size's scale).
func checkTagTextSizes(t *testing.T, path string, order []string, scale float64) {
	t.Helper()
	const tol = 0.01 // mm: the PDF's coordinates are rounded
	big := map[string]bool{}
	smallest, n := math.Inf(1), 0
	for p, words := range pdfWords(t, path) {
		for _, w := range words {
			if w.capMM() < scale*pdf.TagDataCapMM-tol {
				t.Errorf("page %d: %q is %.2f mm high, less than %g mm", p+1, w.text, w.capMM(), scale*pdf.TagDataCapMM)
			}
			smallest = min(smallest, w.capMM())
			n++
			if w.capMM() >= scale*pdf.TagLabelCapMM-tol {
				big[w.text] = true
			}
		}
	}
	for _, l := range order {
		if !big[l] {
			t.Errorf("label %s is never %g mm high", l, scale*pdf.TagLabelCapMM)
		}
	}
	t.Logf("tags: %d words, smallest capital height %.2f mm", n, smallest)
}

func labelsOf[T any](rows []T, label func(T) string) []string {
	out := make([]string, len(rows))
	for i, r := range rows {
		out[i] = label(r)
	}
	return out
}

func readPNG(t *testing.T, path string) image.Image {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	return img
}

func writePNG(t *testing.T, path string, img image.Image) {
	t.Helper()
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := png.Encode(f, img); err != nil {
		t.Fatal(err)
	}
	if err := f.Close(); err != nil {
		t.Fatal(err)
	}
}

// TestSitePlanDXF checks the assembly plan with ezdxf and shapely (Debian's
// python3-ezdxf and python3-shapely; check_plan_dxf.py says what): no two
// text boxes overlap, no label on a member line, grid lines and bay texts
// present, every label near its part; with one label moved onto another
// the same script must fail.
func TestSitePlanDXF(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	out, _ := buildSiteJob(t, dir)
	readBack(t, "check_plan_dxf.py", out)
	readBack(t, "readback_dxf.py", out)
	got, err := exec.Command(debianPython, filepath.Join("testdata", "check_plan_dxf.py"), out, "--perturb").CombinedOutput()
	if err == nil || !strings.Contains(string(got), "text boxes overlap") {
		t.Errorf("a label moved onto another was not caught: %v\n%s", err, tail(string(got), 500))
	}
}

// chromiumFlags are the flags of every headless run: no network services,
// a fresh profile, software WebGL (SwiftShader, which chromium no longer
// falls back to by itself).
func chromiumFlags(profile string) []string {
	return []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
		"--disable-component-update", "--disable-sync", "--no-first-run", "--user-data-dir=" + profile,
		"--enable-unsafe-swiftshader", "--enable-logging=stderr", "--v=0", "--virtual-time-budget=15000", "--hide-scrollbars"}
}

// consoleErrors returns the page's console messages and uncaught errors
// from chromium's log, leaving out the GL driver's performance notes
// (reading pixels back for the screenshot stalls SwiftShader).
func consoleErrors(log string) []string {
	var out []string
	for _, line := range strings.Split(log, "\n") {
		if (strings.Contains(line, "CONSOLE") || strings.Contains(line, "Uncaught")) && !strings.Contains(line, "GL Driver Message") {
			out = append(out, line)
		}
	}
	return out
}

// TestSiteViewInChromium loads view.html in headless chromium (Debian's
// chromium): with a member's label after # the DOM shows it selected and
// its data (read with --dump-dom); with a node's label the screenshot is
// not blank; no console errors either time. The page loads nothing from
// the network: every script is inline and a content security policy
// forbids other sources.
func TestSiteViewInChromium(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	out, rep := buildSiteJob(t, dir)
	page := filepath.Join(out, report.FileView)
	body, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	html := string(body)
	for _, bad := range []string{"<script src", "<link rel=\"stylesheet\"", "@import", "<img src=\"http"} {
		if strings.Contains(html, bad) {
			t.Errorf("view.html loads a file: %q", bad)
		}
	}
	if !strings.Contains(html, `content="default-src 'none'`) {
		t.Error("view.html has no content security policy")
	}
	if strings.Contains(html, "<b>&amp;") || !strings.Contains(html, "&lt;b&gt;&amp;amp;") {
		t.Error("the title is not escaped in view.html")
	}

	m := rep.Members[len(rep.Members)/2]
	cmd := exec.Command(chromium, append(chromiumFlags(filepath.Join(dir, "p1")), "--dump-dom", "file://"+page+"#"+m.Label)...)
	var logs strings.Builder
	cmd.Stderr = &logs
	dom, err := cmd.Output()
	if err != nil {
		t.Fatalf("chromium: %v\n%s", err, tail(logs.String(), 3000))
	}
	for _, l := range consoleErrors(logs.String()) {
		t.Errorf("console message: %s", l)
	}
	d := string(dom)
	if !strings.Contains(d, `data-selected="`+m.Label+`"`) || !strings.Contains(d, `data-kind="member"`) {
		t.Errorf("member %s not selected in the DOM: %s", m.Label, tail(d, 600))
	}
	info := d[strings.Index(d, `id="info"`):]
	for _, want := range []string{m.Label, m.NodeA, m.NodeB, m.Type} {
		if !strings.Contains(info[:min(len(info), 2000)], want) {
			t.Errorf("data panel lacks %s", want)
		}
	}

	if !strings.Contains(d, `data-view="3d"`) {
		t.Error("view.html did not start its 3D view in chromium with software WebGL")
	}

	// Without WebGL (--disable-3d-apis): a message where the view would
	// be, and the search and the part data work as before.
	cmd = exec.Command(chromium, append(chromiumFlags(filepath.Join(dir, "p3")), "--disable-3d-apis", "--dump-dom", "file://"+page+"#"+m.Label)...)
	logs.Reset()
	cmd.Stderr = &logs
	dom, err = cmd.Output()
	if err != nil {
		t.Fatalf("chromium without WebGL: %v\n%s", err, tail(logs.String(), 3000))
	}
	for _, l := range consoleErrors(logs.String()) {
		t.Errorf("console message without WebGL: %s", l)
	}
	d = string(dom)
	if !strings.Contains(d, `data-view="none"`) || !strings.Contains(d, `id="no3d"`) || !strings.Contains(d, "No 3D view:") {
		t.Errorf("without WebGL the page does not say there is no 3D view: %s", tail(d, 600))
	}
	if !strings.Contains(d, `data-selected="`+m.Label+`"`) {
		t.Errorf("without WebGL member %s is not selected", m.Label)
	}
	tagNode := m.NodeA
	if m.TagEnd == "B" {
		tagNode = m.NodeB
	}
	info = d[strings.Index(d, `id="info"`):]
	for _, want := range []string{m.Label, m.NodeA, m.NodeB, m.Type, "tag end (type end A) to node</td><td>" + tagNode} {
		if !strings.Contains(info[:min(len(info), 2000)], want) {
			t.Errorf("without WebGL the data panel lacks %s", want)
		}
	}

	n := rep.Nodes[0]
	shot := filepath.Join(dir, "view.png")
	cmd = exec.Command(chromium, append(chromiumFlags(filepath.Join(dir, "p2")), "--window-size=1200,800", "--screenshot="+shot, "file://"+page+"#"+n.Label)...)
	combined, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("chromium: %v\n%s", err, tail(string(combined), 3000))
	}
	for _, l := range consoleErrors(string(combined)) {
		t.Errorf("console message: %s", l)
	}
	colours, nonWhite, total := pixelStats(readPNG(t, shot))
	t.Logf("screenshot: %d colours, %.1f %% non-white", colours, 100*float64(nonWhite)/float64(total))
	if colours < 64 || float64(nonWhite) < 0.1*float64(total) {
		t.Errorf("screenshot looks blank: %d colours, %d of %d pixels non-white", colours, nonWhite, total)
	}
}

// TestSiteDeterministic: the site files of two builds are byte for byte
// the same.
func TestSiteDeterministic(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	a, _ := buildSiteJob(t, t.TempDir())
	b, _ := buildSiteJob(t, t.TempDir())
	for _, name := range []string{report.FilePlanPDF, report.FileTagsPDF, report.FileView, report.FileAssembly} {
		x, err := os.ReadFile(filepath.Join(a, name))
		if err != nil {
			t.Fatal(err)
		}
		y, err := os.ReadFile(filepath.Join(b, name))
		if err != nil {
			t.Fatal(err)
		}
		if string(x) != string(y) {
			t.Errorf("%s differs between builds", name)
		}
	}
}
