package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/app/chart"
	"example.org/vigil/observe"
)

var chartCommand = command{
	name:    "chart",
	summary: "the altitude chart of one night for chosen targets, written as PNG, SVG or PDF",
	run:     runChart,
}

// chartResponse is the answer of vigil chart with --json.
type chartResponse struct {
	Out      string   `json:"out"`    // the file written
	Format   string   `json:"format"` // png, svg or pdf
	WidthCM  float64  `json:"width_cm"`
	HeightCM float64  `json:"height_cm"`
	Date     string   `json:"date"`    // the date the night begins on
	Targets  []string `json:"targets"` // drawn, in the order given
	Events   int      `json:"events"`  // extrema marked
	Palette  string   `json:"palette"` // default or night-red
}

// Chart sizes, centimetres.
const (
	chartWidthCM  = 24.0
	chartHeightCM = 15.0
	chartMaxCM    = 200.0
	// chartMaxTargets is observe.Planner.Chart's limit.
	chartMaxTargets = 20
)

func runChart(e *env, args []string) error {
	f := newFlags(e.cmd,
		"[--targets FILE] (--lat DEG --lon DEG [--elev METRES] [--tz ZONE] | --site NAME) [--logbook PATH] --date YYYY-MM-DD|tonight [--only NAME,...] --out FILE.png|.svg|.pdf [--night-red] [--width CM] [--height CM] [--json]",
		`The altitude chart of one night: the airless altitude of the chosen targets
and of the Moon against time, from an hour before sunset to an hour after
sunrise, over the sky shaded from day through civil, nautical and
astronomical twilight to night; the site's lowest useful altitude (--min-alt)
dotted; each predicted extremum marked (▲ maximum, ▼ minimum; filled when
observable) and its coverage window drawn as a bar. The time axis is in local
time (--tz, or the zone of the --site), with a UTC row when they differ.
The file is written whole or not at all, in the format its extension names;
the path written is printed (with --json: {out, format, width_cm, height_cm,
date, targets, events, palette}). FILE is a target catalogue as for vigil
plan (CSV, or a VOTable .vot/.xml); without --targets the targets are the
logbook's. A --site brings its lowest altitude and horizon profile, as for
vigil plan.`)
	pf := addPlannerFlags(e, f)
	dateText := f.required("date", "YYYY-MM-DD", "the date the night begins on, or tonight: the site's local date, the day before until local noon")
	onlyText := f.value("only", "NAME,...", "", fmt.Sprintf("the targets to draw, by name, separated by commas (default: all of FILE, at most %d)", chartMaxTargets), "optional")
	outText := f.required("out", "FILE", "the file to write: .png, .svg or .pdf")
	nightRed := f.toggle("night-red", "deep red on black, to keep dark adaptation at the telescope")
	widthText := f.value("width", "CM", strconv.FormatFloat(chartWidthCM, 'f', -1, 64), fmt.Sprintf("width of the chart in centimetres, above 0 and at most %g", chartMaxCM), "")
	heightText := f.value("height", "CM", strconv.FormatFloat(chartHeightCM, 'f', -1, 64), fmt.Sprintf("height of the chart in centimetres, above 0 and at most %g", chartMaxCM), "")
	asJSON := f.toggle("json", "print one JSON object instead of the path")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	// The output first: a bad name fails before any work.
	out, err := get(f, "out", *outText, parseChartOut)
	if err != nil {
		return err
	}
	width, err := get(f, "width", *widthText, parseChartCM)
	if err != nil {
		return err
	}
	height, err := get(f, "height", *heightText, parseChartCM)
	if err != nil {
		return err
	}
	p, obs, err := pf.planner(f, false)
	if err != nil {
		return err
	}
	date, err := get(f, "date", *dateText, parseDateFlag(e.now, obs))
	if err != nil {
		return err
	}
	targets, path, err := pf.readTargets(f)
	if err != nil {
		return err
	}
	chosen, err := chooseTargets(f, path, targets, *onlyText)
	if err != nil {
		return err
	}
	ch, err := p.Chart(chosen, date)
	if err != nil {
		return &flagError{flag: "date", err: fmt.Errorf("%q: %w", *dateText, err)}
	}
	pal, palName := chart.DefaultPalette(), "default"
	if *nightRed {
		pal, palName = chart.NightRedPalette(), "night-red"
	}
	pl, err := chart.Altitude(ch, pal)
	if err != nil {
		return fmt.Errorf("drawing the chart: %w", err)
	}
	if err := chart.Save(pl, out, chartLength(width), chartLength(height)); err != nil {
		return &flagError{flag: "out", err: err}
	}

	if !*asJSON {
		fmt.Fprintln(e.stdout, out)
		return nil
	}
	resp := chartResponse{Out: out, Format: chartFormat(out), WidthCM: width, HeightCM: height,
		Date: ch.Date.Format(time.DateOnly), Events: len(ch.Events), Palette: palName}
	for _, t := range chosen {
		resp.Targets = append(resp.Targets, t.Name)
	}
	return writeJSON(e.stdout, resp)
}

// chartLength returns a length in centimetres rounded to whole pixels of a
// PNG (at vgimg.DefaultDPI, the resolution chart.Save draws PNGs at), so that
// the chart's background covers the image to its last row of pixels; a
// fraction of a pixel would leave a grey seam. SVG and PDF change by under
// 1/96 inch.
func chartLength(cm float64) vg.Length {
	px := math.Max(1, math.Round(cm/2.54*vgimg.DefaultDPI))
	return vg.Length(px/vgimg.DefaultDPI) * vg.Inch
}

// chartFormat is the format a file name asks for: png, svg or pdf, or "".
func chartFormat(path string) string {
	switch ext := strings.ToLower(filepath.Ext(path)); ext {
	case ".png", ".svg", ".pdf":
		return ext[1:]
	}
	return ""
}

// parseChartOut checks the name of the chart file: its extension says the
// format.
func parseChartOut(s string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want a file name ending in .png, .svg or .pdf")
	}
	if chartFormat(s) == "" {
		return "", fmt.Errorf("%q: the extension %q names no format: want .png, .svg or .pdf", s, filepath.Ext(s))
	}
	if base := filepath.Base(s); strings.HasPrefix(base, ".") && strings.Count(base, ".") == 1 {
		return "", fmt.Errorf("%q: want a file name before the extension, such as chart%s", s, filepath.Ext(s))
	}
	if fi, err := os.Stat(filepath.Dir(s)); err != nil || !fi.IsDir() {
		return "", fmt.Errorf("%q: the directory %q does not exist: want a file in an existing directory", s, filepath.Dir(s))
	}
	return s, nil
}

// parseChartCM reads a length of the chart in centimetres.
func parseChartCM(s string) (float64, error) {
	v, err := parseDegIn(0, chartMaxCM, true)(s)
	if err != nil || v == 0 {
		return 0, fmt.Errorf("%q: want a length in centimetres above 0 and at most %g", s, chartMaxCM)
	}
	return v, nil
}

// chooseTargets returns the targets --only names, in the order given (all
// of them without --only). A name matches exactly, or else ignoring case
// when that finds only one target.
func chooseTargets(f *flags, path string, targets []observe.Target, only string) ([]observe.Target, error) {
	if !f.given("only") {
		if len(targets) > chartMaxTargets {
			return nil, &flagError{flag: "only", err: fmt.Errorf("missing: %s holds %d targets and a chart shows at most %d: choose them with --only NAME,...", path, len(targets), chartMaxTargets)}
		}
		return targets, nil
	}
	var out []observe.Target
	seen := map[int]bool{}
	for _, raw := range strings.Split(only, ",") {
		name := strings.TrimSpace(raw)
		if name == "" {
			return nil, &flagError{flag: "only", err: fmt.Errorf("%q: an empty name: want target names separated by commas", only)}
		}
		i := observe.FindTarget(targets, name)
		if i < 0 {
			return nil, &flagError{flag: "only", err: fmt.Errorf("no target named %q in %s: want one of %s", name, path, targetNames(targets, 10))}
		}
		if !seen[i] {
			seen[i] = true
			out = append(out, targets[i])
		}
	}
	if len(out) > chartMaxTargets {
		return nil, &flagError{flag: "only", err: fmt.Errorf("%d targets: a chart shows at most %d", len(out), chartMaxTargets)}
	}
	return out, nil
}

// targetNames lists up to n target names, quoted, for a message.
func targetNames(targets []observe.Target, n int) string {
	var names []string
	for i, t := range targets {
		if i == n {
			names = append(names, fmt.Sprintf("... (%d in all)", len(targets)))
			break
		}
		names = append(names, strconv.Quote(t.Name))
	}
	return strings.Join(names, ", ")
}
