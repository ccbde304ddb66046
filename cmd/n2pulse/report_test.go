package main

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

// chromiumFlags start a headless Chromium that reaches no network and keeps no profile.
var chromiumFlags = []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
	"--disable-background-networking", "--disable-component-update", "--disable-sync", "--enable-logging=stderr", "--v=0"}

// chromium returns the path of a Chromium browser, or skips the test saying why.
func chromium(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	t.Skip("no chromium on PATH: the rendering of report.html is not checked (.ci/run installs Debian's chromium)")
	return ""
}

// TestRunReport writes a run's report.html and checks it: self-contained (no reference to
// another file or host), every figure inline, the design, summary, verdict, warnings, energy
// account and validation status present; then renders it in headless Chromium and checks that
// the page loads with no error, that the DOM holds every figure's SVG and that the screenshot
// is not blank.
func TestRunReport(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	var out, errb bytes.Buffer
	if code := run([]string{"run", "--set", "numerics.cells=60", "--out", dir}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	page := filepath.Join(dir, "report.html")
	b, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	html := string(b)
	for _, want := range []string{"<h2>Summary and verdict</h2>", "Verdict: lases", "<h2>Warnings</h2>", "<h2>Energy account</h2>",
		"<h2>Design</h2>", "channel.gap", "<h2>Validation status of the model</h2>", "checks against outside values",
		"atmospheric Blumlein", "charge-transfer laser", `<figure id="pulse-report">`, `<figure id="gain-map">`, "Caution"} {
		if !strings.Contains(html, want) {
			t.Errorf("report.html has no %q", want)
		}
	}
	// Self-contained: no src attributes, no links out, nothing loaded from a host.
	for _, re := range []string{`\ssrc=`, `<link`, `<script`, `href="http`, `url\(http`, `@import`} {
		if regexp.MustCompile(re).MatchString(html) {
			t.Errorf("report.html matches %s: it must not load anything", re)
		}
	}
	if n := strings.Count(html, "<svg"); n != 2 {
		t.Errorf("%d inline SVG figures, want 2", n)
	}

	browser := chromium(t)
	profile := t.TempDir()
	shot := filepath.Join(t.TempDir(), "shot.png")
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	args := append(append([]string{}, chromiumFlags...), "--user-data-dir="+profile, "--dump-dom", "file://"+page)
	cmd := exec.CommandContext(ctx, browser, args...)
	var dom, logs bytes.Buffer
	cmd.Stdout, cmd.Stderr = &dom, &logs
	if err := cmd.Run(); err != nil || dom.Len() == 0 {
		t.Skipf("chromium cannot start here (%v): the rendering is not checked; its log:\n%s", err, tail(logs.Bytes(), 30))
	}
	for _, bad := range []string{"Uncaught", "Refused to", "net::ERR_", "Failed to load resource"} {
		if strings.Contains(logs.String(), bad) {
			t.Errorf("chromium reports %q loading report.html:\n%s", bad, tail(logs.Bytes(), 60))
		}
	}
	d := dom.String()
	for _, id := range []string{"pulse-report", "gain-map"} {
		i := strings.Index(d, `<figure id="`+id+`">`)
		if i < 0 || !strings.Contains(d[i:min(len(d), i+400)], "<svg") {
			t.Errorf("the rendered page has no SVG in figure %s", id)
		}
	}
	args = append(append([]string{}, chromiumFlags...), "--user-data-dir="+t.TempDir(), "--window-size=1000,3000", "--screenshot="+shot, "file://"+page)
	if err := exec.CommandContext(ctx, browser, args...).Run(); err != nil {
		t.Fatalf("chromium screenshot: %v", err)
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
	// Not blank: a good share of the page below the text is drawn (figures, not white).
	dark, total := 0, 0
	bnd := img.Bounds()
	for y := bnd.Min.Y; y < bnd.Max.Y; y += 4 {
		for x := bnd.Min.X; x < bnd.Max.X; x += 4 {
			r, g, b, _ := img.At(x, y).RGBA()
			total++
			if r+g+b < 3*0xc000 {
				dark++
			}
		}
	}
	if frac := float64(dark) / float64(total); frac < 0.01 {
		t.Errorf("the screenshot is nearly blank: %.3g of its pixels are drawn", frac)
	}
}
