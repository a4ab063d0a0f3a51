package main

import (
	"image"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"pqfab/internal/report"
	"strings"
	"testing"
)

// chromium is Debian's browser; .ci/run installs it. A missing browser is
// a failure, not a skip.
const chromium = "/usr/bin/chromium"

// TestReportRendersInChromium renders the demo's report.html headless to a
// PNG: no console errors, and the picture is not blank (many colours, much
// non-white).
func TestReportRendersInChromium(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "demo", "-q", "-o", out); err != nil {
		t.Fatal(err)
	}
	shot := filepath.Join(dir, "report.png")
	cmd := exec.Command(chromium, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync", "--hide-scrollbars",
		"--user-data-dir="+filepath.Join(dir, "profile"), "--enable-logging=stderr", "--v=0",
		"--virtual-time-budget=5000", "--window-size=1400,3000", "--screenshot="+shot,
		"file://"+filepath.Join(out, report.FileHTML))
	logs, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("chromium: %v\n%s", err, tail(string(logs), 3000))
	}
	for _, line := range strings.Split(string(logs), "\n") {
		if strings.Contains(line, "CONSOLE") || strings.Contains(line, "Uncaught") {
			t.Errorf("console message: %s", line)
		}
	}
	f, err := os.Open(shot)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	colours, nonWhite, total := pixelStats(img)
	t.Logf("screenshot %v: %d colours, %.1f %% non-white", img.Bounds().Size(), colours, 100*float64(nonWhite)/float64(total))
	if colours < 64 || float64(nonWhite) < 0.05*float64(total) {
		t.Errorf("screenshot looks blank: %d colours, %d of %d pixels non-white", colours, nonWhite, total)
	}
}

func pixelStats(img image.Image) (colours, nonWhite, total int) {
	seen := map[uint32]bool{}
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			key := (r>>8)<<16 | (g>>8)<<8 | bl>>8
			seen[key] = true
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				nonWhite++
			}
			total++
		}
	}
	return len(seen), nonWhite, total
}
