package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	csvtable "example.org/vigil/internal/table"
	"example.org/vigil/reduce"
)

var periodCommand = command{
	name:    "period",
	summary: "period search: generalised Lomb–Scargle (Zechmeister & Kürster 2009) or PDM (Stellingwerf 1978)",
	run:     runPeriod,
}

// periodResponse is the answer of vigil period. best_period, peaks, method
// and fap are the contract (spec/cli.md, "vigil period"): do not rename or
// drop them.
type periodResponse struct {
	BestPeriod float64      `json:"best_period"` // days
	Peaks      []periodPeak `json:"peaks"`       // distinct local optima, best first
	Method     string       `json:"method"`      // ls or pdm
	FAP        *float64     `json:"fap"`         // Baluev (2008) for ls; null for pdm

	BestFrequency float64      `json:"best_frequency"` // cycles per day
	BestPower     float64      `json:"best_power"`
	PowerBetter   string       `json:"power_better"` // "higher" (ls) or "lower" (pdm)
	FAPMethod     *string      `json:"fap_method"`   // the published approximation; null for pdm
	N             int          `json:"n"`            // points used
	Rows          int          `json:"rows"`         // data rows in the file
	MissingMag    int          `json:"missing_mag"`  // rows without a magnitude, left out
	Weighted      bool         `json:"weighted"`     // weights 1/err² (every point had an error); pdm weighs equally
	SpanDays      float64      `json:"span_days"`    // time span T of the points
	MinPeriod     float64      `json:"min_period"`   // days, as asked
	MaxPeriod     float64      `json:"max_period"`
	FreqMin       float64      `json:"freq_min"` // trial grid, cycles per day
	FreqMax       float64      `json:"freq_max"`
	FreqStep      float64      `json:"freq_step"`
	GridSize      int          `json:"grid_size"`
	Oversample    float64      `json:"oversample"`   // grid points per peak width 1/T, 1/(step·T)
	Bins          *int         `json:"bins"`         // PDM phase bins; null for ls
	Covers        *int         `json:"covers"`       // PDM covers; null for ls
	WindowPeaks   []periodPeak `json:"window_peaks"` // strongest peaks of the spectral window; null without --window
}

// periodPeak is one peak of the periodogram (or of the spectral window).
type periodPeak struct {
	Period    float64 `json:"period"`    // days
	Power     float64 `json:"power"`     // GLS power, PDM θ, or window power
	Frequency float64 `json:"frequency"` // cycles per day
	// Hint names a known relation to the best peak (periodogram peaks only).
	Hint *string `json:"hint,omitempty"`
}

func runPeriod(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--input FILE --min-period DAYS --max-period DAYS [--method ls|pdm] [--oversample N | --nfreq N] [--peaks N] [--bins N] [--covers N] [--window] [--json]",
		`Search the light curve in FILE for a period between --min-period and
--max-period, on an even grid of trial frequencies. FILE columns: time (a
Julian date on any one scale), mag, optional err (mag; used as weights
1/err^2 when every point has one). An empty mag cell is a missing point.
ls is the generalised Lomb–Scargle periodogram (Zechmeister & Kürster 2009,
A&A 496, 577): power 0..1, higher is better, peaks refined off the grid,
with the false-alarm probability of the best peak by Baluev (2008, MNRAS
385, 1279). pdm is phase dispersion minimisation (Stellingwerf 1978, ApJ
224, 953): power is theta, lower is better, equal weights. Periods in days,
frequencies in cycles per day. Ground-based data show aliases 1 c/d from
the true frequency: --window lists the peaks of the sampling's spectral
window, and each peak's hint names such relations to the best one.`)
	input := f.required("input", "FILE", inputFlagUsage+"; columns time, mag, optional err")
	minText := f.required("min-period", "DAYS", "shortest trial period in days")
	maxText := f.required("max-period", "DAYS", "longest trial period in days")
	methodText := f.value("method", "ls|pdm", reduce.MethodLS, "ls: generalised Lomb–Scargle power (higher is better); pdm: Stellingwerf's theta (lower is better)", "")
	overText := f.value("oversample", "N", strconv.Itoa(reduce.DefaultOversample), "trial frequencies per peak width 1/T (T the time span in days), 1 or more", "")
	nfreqText := f.value("nfreq", "N", periodAuto, fmt.Sprintf("number of trial frequencies instead of --oversample, 2 to %d, or auto", reduce.MaxFreqs), "")
	peaksText := f.value("peaks", "N", strconv.Itoa(reduce.DefaultPeaks), "how many distinct peaks to list, 1 to 1000", "")
	binsText := f.value("bins", "N", strconv.Itoa(reduce.DefaultPDMBins), "phase bins for pdm, 2 to fewer than the points", "")
	coversText := f.value("covers", "N", "1", fmt.Sprintf("covers (sets of bins shifted by 1/(bins·covers) in phase) for pdm, 1 to %d", reduce.MaxPDMCovers), "")
	window := f.toggle("window", "also list the strongest peaks of the spectral window of the sampling on the same grid (aliases lie that far from the true frequency)")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	path, err := get(f, "input", *input, nonEmpty("a file name"))
	if err != nil {
		return err
	}
	s, err := periodOptions(f, periodFlagTexts{
		min: *minText, max: *maxText, method: *methodText, over: *overText,
		nfreq: *nfreqText, peaks: *peaksText, bins: *binsText, covers: *coversText,
	})
	if err != nil {
		return err
	}
	t, err := readInput(path)
	if err != nil {
		return err
	}
	pts, missing, err := readPeriodCurve(t)
	if err != nil {
		return err
	}
	if err := checkPeriodData(f, path, pts, s); err != nil {
		return err
	}
	res, err := reduce.Periodogram(context.Background(), pts, s)
	if err != nil {
		return fileError(path, err)
	}
	resp := periodAnswer(res, s, pts, t.Len(), missing, *window)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writePeriodTable(e.stdout, path, resp)
	return nil
}

// periodAuto is the value of --nfreq that lets --oversample set the grid.
const periodAuto = "auto"

// periodFlagTexts are the flags of vigil period as typed.
type periodFlagTexts struct {
	min, max, method, over, nfreq, peaks, bins, covers string
}

// periodOptions converts the flags into the engine's search, each fault
// named by its flag.
func periodOptions(f *flags, in periodFlagTexts) (reduce.PeriodSearch, error) {
	var s reduce.PeriodSearch
	var err error
	if s.MinPeriod, err = get(f, "min-period", in.min, parsePeriodDays); err != nil {
		return s, err
	}
	if s.MaxPeriod, err = get(f, "max-period", in.max, parsePeriodDays); err != nil {
		return s, err
	}
	if !(s.MinPeriod < s.MaxPeriod) {
		return s, &flagError{flag: "min-period", err: fmt.Errorf("%q is not below --max-period %q: want the shortest trial period first", in.min, in.max)}
	}
	if s.Method, err = get(f, "method", in.method, trimmed(parsePeriodMethod)); err != nil {
		return s, err
	}
	if f.given("oversample") && f.given("nfreq") {
		return s, &flagError{flag: "nfreq", err: fmt.Errorf("give either --nfreq or --oversample, not both")}
	}
	if s.Oversample, err = get(f, "oversample", in.over, parseOversample); err != nil {
		return s, err
	}
	if strings.TrimSpace(in.nfreq) != periodAuto {
		if s.NFreq, err = get(f, "nfreq", in.nfreq, parseIntIn(2, reduce.MaxFreqs)); err != nil {
			return s, err
		}
	}
	if s.NPeaks, err = get(f, "peaks", in.peaks, parseIntIn(1, 1000)); err != nil {
		return s, err
	}
	for _, name := range []string{"bins", "covers"} {
		if f.given(name) && s.Method != reduce.MethodPDM {
			return s, &flagError{flag: name, err: fmt.Errorf("applies to --method pdm only (the method is %s)", s.Method)}
		}
	}
	if s.Bins, err = get(f, "bins", in.bins, parseIntIn(2, 1000)); err != nil {
		return s, err
	}
	if s.Covers, err = get(f, "covers", in.covers, parseIntIn(1, reduce.MaxPDMCovers)); err != nil {
		return s, err
	}
	return s, nil
}

// parsePeriodMethod reads --method: ls or pdm.
func parsePeriodMethod(s string) (string, error) {
	switch strings.ToLower(s) {
	case reduce.MethodLS:
		return reduce.MethodLS, nil
	case reduce.MethodPDM:
		return reduce.MethodPDM, nil
	}
	return "", fmt.Errorf("%q: want ls (generalised Lomb–Scargle) or pdm (phase dispersion minimisation)", s)
}

// parseOversample reads the trial frequencies per peak width: 1 or more.
func parseOversample(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || !(v >= 1) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q: want a number of trial frequencies per peak width, 1 or more", s)
	}
	return v, nil
}

// readPeriodCurve reads the points of vigil period's input: time (every row
// needs one), mag (empty: a missing point, left out and counted) and an
// optional err (empty: unknown). A negative err is refused at its cell.
func readPeriodCurve(t *csvtable.Table) (pts []reduce.Point, missing int, err error) {
	if err := t.Require("time", "mag"); err != nil {
		return nil, 0, err
	}
	pts = make([]reduce.Point, 0, t.Len())
	for i := range t.Len() {
		row := t.Row(i)
		var p reduce.Point
		if p.T, err = row.MustFloat("time"); err != nil {
			return nil, 0, err
		}
		var ok bool
		if p.Mag, ok, err = row.Float("mag"); err != nil {
			return nil, 0, err
		}
		if p.Err, _, err = row.Float("err"); err != nil {
			return nil, 0, err
		}
		if p.Err < 0 {
			return nil, 0, pointError(t, &reduce.PointError{Index: i, Field: "err", Value: p.Err, Want: "a positive error in magnitudes (or empty for unknown)"}, nil)
		}
		if !ok {
			missing++
			continue
		}
		pts = append(pts, p)
	}
	return pts, missing, nil
}

// checkPeriodData names the flag at fault when the search cannot run on
// these points: faults of the data themselves (too few points, one time,
// one magnitude) name the file; a grid too large for the time span names
// --min-period (or --nfreq); more PDM bins than points name --bins.
func checkPeriodData(f *flags, path string, pts []reduce.Point, s reduce.PeriodSearch) error {
	// A grid of two frequencies is never too large: what fails here is the data.
	if _, err := (reduce.PeriodSearch{MinPeriod: s.MinPeriod, MaxPeriod: s.MaxPeriod, NFreq: 2}).Grid(pts); err != nil {
		return fileError(path, err)
	}
	if _, err := s.Grid(pts); err != nil {
		flag := "min-period"
		if f.given("nfreq") {
			flag = "nfreq"
		}
		return &flagError{flag: flag, err: err}
	}
	if s.Method == reduce.MethodPDM && s.Bins >= len(pts) {
		return &flagError{flag: "bins", err: fmt.Errorf("%d bins for %d points with a magnitude in %s: want fewer bins than points", s.Bins, len(pts), path)}
	}
	return nil
}

// periodAnswer fills the answer of vigil period.
func periodAnswer(res reduce.PeriodResult, s reduce.PeriodSearch, pts []reduce.Point, rows, missing int, window bool) periodResponse {
	lo, hi := pts[0].T, pts[0].T
	weighted := true
	for _, p := range pts {
		lo, hi = min(lo, p.T), max(hi, p.T)
		weighted = weighted && p.Err > 0
	}
	span := hi - lo
	g := res.Grid
	r := periodResponse{
		BestPeriod: res.Best.PeriodDays, Method: res.Method, FAP: num(res.FAP),
		BestFrequency: res.Best.FreqPerDay, BestPower: res.Best.Power, PowerBetter: "higher",
		N: len(pts), Rows: rows, MissingMag: missing, Weighted: weighted && res.Method == reduce.MethodLS,
		SpanDays: span, MinPeriod: s.MinPeriod, MaxPeriod: s.MaxPeriod,
		FreqMin: g.Start, FreqMax: g.Freq(g.N - 1), FreqStep: g.Step, GridSize: g.N,
		Oversample: 1 / (g.Step * span),
	}
	if res.Method == reduce.MethodLS {
		m := "Baluev (2008, MNRAS 385, 1279), up to freq_max"
		r.FAPMethod = &m
	} else {
		r.PowerBetter = "lower"
		r.Bins, r.Covers = &s.Bins, &s.Covers
	}
	for i, pk := range res.Peaks {
		p := periodPeak{Period: pk.PeriodDays, Power: pk.Power, Frequency: pk.FreqPerDay}
		if i > 0 {
			if note := reduce.AliasNote(pk.FreqPerDay, res.Best.FreqPerDay, res.SpanDays); note != "" {
				p.Hint = &note
			}
		}
		r.Peaks = append(r.Peaks, p)
	}
	if window {
		r.WindowPeaks = []periodPeak{}
		for _, pk := range res.WindowPeaks(s.NPeaks) {
			r.WindowPeaks = append(r.WindowPeaks, periodPeak{Period: pk.PeriodDays, Power: pk.Power, Frequency: pk.FreqPerDay})
		}
	}
	return r
}

// writePeriodTable prints the answer of vigil period for people.
func writePeriodTable(w io.Writer, path string, r periodResponse) {
	name := "generalised Lomb–Scargle (Zechmeister & Kürster 2009), power 0..1, higher is better"
	if r.Method == reduce.MethodPDM {
		name = fmt.Sprintf("phase dispersion minimisation (Stellingwerf 1978), %d bins × %d covers, theta: lower is better", *r.Bins, *r.Covers)
	}
	fmt.Fprintf(w, "Period search of %s\n\n", path)
	t := newTable(w)
	t.row("Method", name)
	t.row("Best period", fmt.Sprintf("%.6f d (%.6f c/d), power %.6f", r.BestPeriod, r.BestFrequency, r.BestPower))
	if r.FAP != nil {
		t.row("False-alarm probability", fmt.Sprintf("%.3g (Baluev 2008)", *r.FAP))
	}
	weighted := "equal weights"
	if r.Weighted {
		weighted = "weighted by 1/err²"
	}
	t.row("Points used", fmt.Sprintf("%d of %d rows (%d without a magnitude) over %.4f d, %s", r.N, r.Rows, r.MissingMag, r.SpanDays, weighted))
	t.row("Trial grid", fmt.Sprintf("%d frequencies, %.6g to %.6g c/d in steps of %.3g (%.3g per peak width)", r.GridSize, r.FreqMin, r.FreqMax, r.FreqStep, r.Oversample))
	t.flush()
	fmt.Fprintf(w, "\nPeaks, best first:\n")
	t = newTable(w)
	t.row("  #", "period (d)", "frequency (c/d)", "power", "note")
	for i, p := range r.Peaks {
		note := ""
		if p.Hint != nil {
			note = *p.Hint
		}
		t.row(fmt.Sprintf("  %d", i+1), fmt.Sprintf("%.6f", p.Period), fmt.Sprintf("%.6f", p.Frequency), fmt.Sprintf("%.6f", p.Power), note)
	}
	t.flush()
	if r.WindowPeaks != nil {
		fmt.Fprintf(w, "\nSpectral window of the sampling (aliases lie these frequencies away from the true one):\n")
		t = newTable(w)
		t.row("  #", "frequency (c/d)", "window power")
		for i, p := range r.WindowPeaks {
			t.row(fmt.Sprintf("  %d", i+1), fmt.Sprintf("%.6f", p.Frequency), fmt.Sprintf("%.4f", p.Power))
		}
		t.flush()
	}
}
