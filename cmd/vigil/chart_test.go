package main

import (
	"bytes"
	"fmt"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// chartArgs is a good vigil chart command line without --out.
var chartArgs = []string{"chart", "--targets", planTargets, "--site", "demo", "--date", "2026-12-01"}

// pngPixels is the size in pixels of a length in centimetres in a PNG
// drawn at 96 dpi (gonum/plot vgimg.DefaultDPI): whole pixels.
func pngPixels(cm float64) int { return int(math.Round(cm / 2.54 * 96)) }

// TestChartFormats writes the chart in each format and checks the file:
// a PNG of the asked size in pixels, an SVG, a PDF; the printed path.
func TestChartFormats(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		name, file string
		extra      []string
		magic      string
		wcm, hcm   float64
	}{
		{"png, default size", "night.png", nil, "\x89PNG\r\n\x1a\n", chartWidthCM, chartHeightCM},
		{"png, 10 × 7.5 cm", "small.PNG", []string{"--width", "10", "--height", "7.5"}, "\x89PNG\r\n\x1a\n", 10, 7.5},
		{"svg", "night.svg", nil, "<?xml", chartWidthCM, chartHeightCM},
		{"pdf, night red", "night.pdf", []string{"--night-red"}, "%PDF-", chartWidthCM, chartHeightCM},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out := filepath.Join(dir, tc.file)
			r := vigil(append(append(append([]string{}, chartArgs...), "--out", out), tc.extra...)...)
			if r.code != exitOK || r.stderr != "" || r.stdout != out+"\n" {
				t.Fatalf("exit %d, stdout %q, stderr %q; want 0 and the path", r.code, r.stdout, r.stderr)
			}
			data, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.HasPrefix(data, []byte(tc.magic)) {
				t.Errorf("%s starts %q, want %q", tc.file, data[:min(len(data), 8)], tc.magic)
			}
			if tc.magic[1:4] == "PNG" {
				cfg, err := png.DecodeConfig(bytes.NewReader(data))
				if err != nil {
					t.Fatal(err)
				}
				if cfg.Width != pngPixels(tc.wcm) || cfg.Height != pngPixels(tc.hcm) {
					t.Errorf("%s is %d × %d px, want %d × %d (%g × %g cm at 96 dpi)", tc.file, cfg.Width, cfg.Height, pngPixels(tc.wcm), pngPixels(tc.hcm), tc.wcm, tc.hcm)
				}
			}
			if tc.magic == "<?xml" && !bytes.Contains(data, []byte("<svg")) {
				t.Errorf("%s has no <svg> element", tc.file)
			}
		})
	}
}

// TestChartNightRed checks that --night-red keeps to red: no pixel of the
// PNG has any green or blue (app/chart.NightRedPalette: no channel but red,
// red at most 200), and that the default palette is not red only.
func TestChartNightRed(t *testing.T) {
	dir := t.TempDir()
	for _, red := range []bool{true, false} {
		out := filepath.Join(dir, fmt.Sprintf("red_%v.png", red))
		args := append(append([]string{}, chartArgs...), "--out", out)
		if red {
			args = append(args, "--night-red")
		}
		if r := vigil(args...); r.code != exitOK {
			t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
		}
		f, err := os.Open(out)
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(f)
		f.Close()
		if err != nil {
			t.Fatal(err)
		}
		b := img.Bounds()
		var maxGB, maxR uint32
		for y := b.Min.Y; y < b.Max.Y; y++ {
			for x := b.Min.X; x < b.Max.X; x++ {
				r, g, bl, _ := img.At(x, y).RGBA()
				maxGB, maxR = max(maxGB, g>>8, bl>>8), max(maxR, r>>8)
			}
		}
		if red && (maxGB != 0 || maxR > 200) {
			t.Errorf("--night-red: largest green or blue %d (want 0), largest red %d (want at most 200)", maxGB, maxR)
		}
		if !red && maxGB == 0 {
			t.Errorf("default palette: no green or blue anywhere, want the daytime colours")
		}
	}
}

// TestChartJSON checks the answer with --json and the choice of targets by
// --only: in the order given, by exact name or by name ignoring case.
func TestChartJSON(t *testing.T) {
	out := filepath.Join(t.TempDir(), "two.svg")
	m := mustJSON(t, append(append([]string{}, chartArgs...), "--out", out, "--only", "willow ecl, Rowan Var", "--json")...)
	if m["out"] != out || m["format"] != "svg" || m["date"] != "2026-12-01" || m["palette"] != "default" ||
		number(t, m, "width_cm") != chartWidthCM || number(t, m, "height_cm") != chartHeightCM {
		t.Errorf("answer %v", m)
	}
	if got := fmt.Sprint(m["targets"]); got != "[Willow Ecl Rowan Var]" {
		t.Errorf("targets %s, want [Willow Ecl Rowan Var]", got)
	}
	// The extrema marked are those of the two stars whose windows meet the
	// night's span: vigil plan --all lists each of them (the span runs
	// from an hour before sunset to an hour after sunrise, inside the night).
	plan := mustJSON(t, "plan", "--targets", planTargets, "--site", "demo", "--date", "2026-12-01", "--all", "--json")
	inNight := 0
	for _, ev := range list(t, list(t, plan, "nights")[0], "events") {
		if ev["target"] == "Willow Ecl" || ev["target"] == "Rowan Var" {
			inNight++
		}
	}
	if n := number(t, m, "events"); n < 1 || n > float64(inNight) {
		t.Errorf("events %v, want 1 to %d (the night's events of the two stars)", n, inNight)
	}
	if _, err := os.Stat(out); err != nil {
		t.Errorf("the chart was not written: %v", err)
	}
}

// TestChartBadInput checks the contract for bad input: exit 2, one stderr
// line naming the flag or file, nothing on stdout, and no file written (an
// old file at --out is left as it was).
func TestChartBadInput(t *testing.T) {
	dir := t.TempDir()
	old := filepath.Join(dir, "old.png")
	if err := os.WriteFile(old, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	var many strings.Builder
	many.WriteString("name,ra,dec,epoch,period\n")
	for i := 0; i < 21; i++ {
		fmt.Fprintf(&many, "Star %02d,%.2f,20,2459000.1,0.5\n", i, float64(i))
	}
	manyFile := writeTemp(t, "many.csv", many.String())
	chart := func(extra ...string) []string { return append(append([]string{}, chartArgs...), extra...) }
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"bad --out extension", chart("--out", filepath.Join(dir, "night.jpg")), []string{"vigil chart: ", "--out", "night.jpg", `".jpg"`, ".png, .svg or .pdf"}},
		{"--out without extension", chart("--out", filepath.Join(dir, "night")), []string{"--out", ".png, .svg or .pdf"}},
		{"--out in no directory", chart("--out", filepath.Join(dir, "nowhere", "night.png")), []string{"--out", "does not exist"}},
		{"missing --out", chart(), []string{"--out", "missing", "required"}},
		{"unknown --only name", chart("--out", old, "--only", "Rowan Var,Foo Var"), []string{"--only", `"Foo Var"`, planTargets, `"Rowan Var"`}},
		{"empty --only name", chart("--out", old, "--only", "Rowan Var,,Larch Ecl"), []string{"--only", "empty name"}},
		{"too many targets", []string{"chart", "--targets", manyFile, "--lat", "50", "--lon", "10", "--date", "2026-12-01", "--out", old}, []string{"--only", "21 targets", "at most 20"}},
		{"--width 0", chart("--out", old, "--width", "0"), []string{"--width", `"0"`, "centimetres"}},
		{"--height 500", chart("--out", old, "--height", "500"), []string{"--height", `"500"`}},
		{"bad targets file", []string{"chart", "--targets", filepath.Join(dir, "none.csv"), "--site", "demo", "--date", "2026-12-01", "--out", old}, []string{"--targets", "none.csv"}},
		{"bad date", chart("--out", old, "--date", "2026-13-01"), []string{"--date", `"2026-13-01"`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := vigil(tc.args...)
			wantFailure(t, tc.args, r, tc.want...)
			entries, _ := os.ReadDir(dir)
			if len(entries) != 1 {
				t.Errorf("%d files in the output directory, want only the old one: %v", len(entries), entries)
			}
			if data, _ := os.ReadFile(old); string(data) != "old" {
				t.Errorf("the old file now holds %d bytes, want it untouched", len(data))
			}
		})
	}
}

// TestChartHelp checks that --help lists every flag with its unit and
// default.
func TestChartHelp(t *testing.T) {
	r := vigil("chart", "--help")
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"Usage:\n  vigil chart", "--targets FILE", "--lat DEG", "--lon DEG", "--site NAME", "--tz ZONE",
		"--date YYYY-MM-DD", "--only NAME,...", "--out FILE", ".png, .svg or .pdf", "--night-red", "--width CM", "(default 24)",
		"--height CM", "(default 15)", "--min-alt DEG", "(default 20)", "--sun-alt DEG", "--moon-sep DEG", "--json", "whole or not at all"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("help lacks %q:\n%s", want, r.stdout)
		}
	}
}
