package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	csvtable "example.org/vigil/internal/table"
	"example.org/vigil/reduce"
)

var extremumCommand = command{
	name:    "extremum",
	summary: "the time of one maximum or minimum of a light curve, by a polynomial fit or Kwee & van Woerden (1956)",
	run:     runExtremum,
}

// extremumResponse is the answer of vigil extremum. time, sigma, method and
// n are the contract (spec/cli.md, "vigil extremum"): do not rename or drop
// them.
type extremumResponse struct {
	Time   float64  `json:"time"`   // Julian date of the extremum, on the scale of the input
	Sigma  *float64 `json:"sigma"`  // days: the bootstrap for poly, the method's own for kvw (see sigma_from)
	Method string   `json:"method"` // poly or kvw
	N      int      `json:"n"`      // points used

	Kind           string   `json:"kind"`            // max (smallest magnitude) or min
	SigmaFrom      string   `json:"sigma_from"`      // "bootstrap" or "method"
	SigmaMethod    *float64 `json:"sigma_method"`    // days, the method's own uncertainty
	SigmaBootstrap *float64 `json:"sigma_bootstrap"` // days, SD of the bootstrap times; null when not run
	SigmaKvW1956   *float64 `json:"sigma_kvw1956"`   // days, Kwee & van Woerden's own formula; null for poly or where it fails
	Mag            *float64 `json:"mag"`             // magnitude at the extremum
	WindowFrom     float64  `json:"window_from"`     // time range of the points used
	WindowTo       float64  `json:"window_to"`
	Degree         *int     `json:"degree"` // polynomial degree (poly); null for kvw
	Folds          *int     `json:"folds"`  // trial times (kvw); null for poly
	Pairs          *int     `json:"pairs"`  // reflected pairs (kvw); null for poly
	Bootstrap      int      `json:"bootstrap"`
	BootstrapFail  int      `json:"bootstrap_failed"`
	Seed           uint64   `json:"seed"`
	Weighted       bool     `json:"weighted"` // fit weighted by 1/err²
	Rows           int      `json:"rows"`     // data rows in the file
	MissingMag     int      `json:"missing_mag"`
}

// extremumAuto is the value of --window and --degree that lets the data
// choose.
const extremumAuto = "auto"

func runExtremum(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--input FILE [--kind max|min] [--method poly|kvw] [--window DAYS | --window-from JD --window-to JD] [--degree N] [--folds N] [--bootstrap N] [--seed N] [--json]",
		`The time of one maximum or minimum that the light curve in FILE covers.
FILE columns: time (a Julian date on any one scale: the answer is on the
same scale), mag, optional err (mag; used as weights 1/err^2 when every
row has one). An empty mag cell is a missing point. max is maximum light,
the smallest magnitude. poly fits a polynomial around the extremum and
solves dm/dt = 0, with a bootstrap uncertainty (Efron 1979, Ann. Stat. 7, 1);
kvw is Kwee & van Woerden (1956), BAN 12, 327, for symmetric minima, with
the error after Deeg (2021), Galaxies 9, 1. Data that do not cover both sides
of the extremum are refused. Times and uncertainties in days.`)
	input := f.required("input", "FILE", inputFlagUsage+"; columns time, mag, optional err")
	kindText := f.value("kind", "max|min", "max", "which extremum: max is maximum light (the smallest magnitude), min the largest magnitude", "")
	methodText := f.value("method", "poly|kvw", "poly", "poly: polynomial fit with bootstrap sigma; kvw: Kwee & van Woerden (1956)", "")
	windowText := f.value("window", "DAYS", extremumAuto, "full width in days of the window centred on the extremum, or auto to choose it from the data", "")
	fromText := f.value("window-from", "JD", "", "fix the window's start instead (a time on the scale of the input; with --window-to)", "")
	toText := f.value("window-to", "JD", "", "fix the window's end instead (with --window-from)", "")
	degreeText := f.value("degree", "N", extremumAuto, "polynomial degree for poly: 2, 3 or 4, or auto (3, or 4 when the data ask for it)", "")
	foldsText := f.value("folds", "N", "5", "trial times of the Kwee–van Woerden sum for kvw: odd, 3 to 9 (Deeg 2021 advises 5 or more)", "")
	bootText := f.value("bootstrap", "N", fmt.Sprint(reduce.DefaultBootstrap), "bootstrap resamples for sigma_bootstrap (0 turns the bootstrap off)", "")
	seedText := f.value("seed", "N", "0", "seed of the bootstrap: the same data, options and seed give the same answer", "")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	path, err := get(f, "input", *input, nonEmpty("a file name"))
	if err != nil {
		return err
	}
	opt, err := extremumOptions(f, extremumFlagTexts{
		kind: *kindText, method: *methodText, window: *windowText, from: *fromText, to: *toText,
		degree: *degreeText, folds: *foldsText, boot: *bootText, seed: *seedText,
	})
	if err != nil {
		return err
	}

	t, err := readInput(path)
	if err != nil {
		return err
	}
	pts, missing, err := readLightCurve(t)
	if err != nil {
		return err
	}
	tm, err := reduce.Extremum(pts, opt)
	if err != nil {
		if errors.Is(err, reduce.ErrOneSided) || errors.Is(err, reduce.ErrNoExtremum) {
			err = fmt.Errorf("%w (with --kind %s; max is maximum light, the smallest magnitude, and min the largest)", err, opt.Kind)
		}
		return fileError(path, pointError(t, err, nil))
	}
	resp := extremumAnswer(tm, opt, t.Len(), missing)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeExtremumTable(e.stdout, path, resp)
	return nil
}

// extremumFlagTexts are the flags of vigil extremum as typed.
type extremumFlagTexts struct {
	kind, method, window, from, to, degree, folds, boot, seed string
}

// extremumOptions converts the flags into the engine's options, each fault
// named by its flag.
func extremumOptions(f *flags, in extremumFlagTexts) (reduce.ExtremumOptions, error) {
	var opt reduce.ExtremumOptions
	var err error
	if opt.Kind, err = get(f, "kind", in.kind, trimmed(reduce.ParseExtremumKind)); err != nil {
		return opt, err
	}
	if opt.Method, err = get(f, "method", in.method, trimmed(reduce.ParseExtremumMethod)); err != nil {
		return opt, err
	}
	if strings.TrimSpace(in.window) != extremumAuto {
		if opt.WindowDays, err = get(f, "window", in.window, parsePositiveDays); err != nil {
			return opt, err
		}
	}
	if f.given("window-from") || f.given("window-to") {
		for _, pair := range [][2]string{{"window-from", "window-to"}, {"window-to", "window-from"}} {
			if !f.given(pair[0]) {
				return opt, &flagError{flag: pair[0], err: fmt.Errorf("missing: --window-from and --window-to fix the window together (--%s was given)", pair[1])}
			}
		}
		if f.given("window") {
			return opt, &flagError{flag: "window", err: errors.New("give either --window or --window-from/--window-to, not both")}
		}
		if opt.From, err = get(f, "window-from", in.from, parseJulianDate); err != nil {
			return opt, err
		}
		if opt.To, err = get(f, "window-to", in.to, parseJulianDate); err != nil {
			return opt, err
		}
		if !(opt.To > opt.From) {
			return opt, &flagError{flag: "window-to", err: fmt.Errorf("%q is not after --window-from %q: want the window's end after its start", in.to, in.from)}
		}
	}
	if strings.TrimSpace(in.degree) != extremumAuto {
		if opt.Method != reduce.MethodPoly {
			return opt, &flagError{flag: "degree", err: fmt.Errorf("applies to --method poly only (the method is %s)", opt.Method)}
		}
		if opt.Degree, err = get(f, "degree", in.degree, parseIntIn(2, 4)); err != nil {
			return opt, err
		}
	}
	if f.given("folds") && opt.Method != reduce.MethodKvW {
		return opt, &flagError{flag: "folds", err: fmt.Errorf("applies to --method kvw only (the method is %s)", opt.Method)}
	}
	if opt.Folds, err = get(f, "folds", in.folds, parseFolds); err != nil {
		return opt, err
	}
	if opt.Bootstrap, err = get(f, "bootstrap", in.boot, parseIntIn(0, 100000)); err != nil {
		return opt, err
	}
	if opt.Bootstrap == 0 {
		opt.Bootstrap = -1 // the engine's "off"; its 0 means the default
	}
	if opt.Seed, err = get(f, "seed", in.seed, parseSeed); err != nil {
		return opt, err
	}
	return opt, nil
}

// trimmed applies parse to s without surrounding blanks.
func trimmed[T any](parse func(string) (T, error)) func(string) (T, error) {
	return func(s string) (T, error) { return parse(strings.TrimSpace(s)) }
}

// parsePositiveDays reads a width in days, more than 0.
func parsePositiveDays(s string) (float64, error) {
	v, err := parseDaysNonNegative(s)
	if err != nil || v == 0 {
		return 0, fmt.Errorf("%q: want a width in days above 0, or %s", s, extremumAuto)
	}
	return v, nil
}

// parseFolds reads the number of Kwee–van Woerden trial times.
func parseFolds(s string) (int, error) {
	v, err := parseIntIn(3, 9)(s)
	if err != nil || v%2 == 0 {
		return 0, fmt.Errorf("%q: want an odd number from 3 to 9", s)
	}
	return v, nil
}

// readLightCurve reads the points of vigil extremum's input, one per data
// row: time (every row needs one), mag (empty: a missing point) and an
// optional err (empty: unknown; the engine refuses negative ones). It also
// counts the rows without a magnitude.
func readLightCurve(t *csvtable.Table) (pts []reduce.Point, missing int, err error) {
	if err := t.Require("time", "mag"); err != nil {
		return nil, 0, err
	}
	pts = make([]reduce.Point, t.Len())
	for i := range pts {
		row := t.Row(i)
		p := &pts[i]
		if p.T, err = row.MustFloat("time"); err != nil {
			return nil, 0, err
		}
		var ok bool
		if p.Mag, ok, err = row.Float("mag"); err != nil {
			return nil, 0, err
		} else if !ok {
			missing++
		}
		if p.Err, _, err = row.Float("err"); err != nil {
			return nil, 0, err
		}
	}
	return pts, missing, nil
}

// extremumWord names an extremum kind for people.
func extremumWord(k reduce.ExtremumKind) string {
	if k == reduce.Minimum {
		return "minimum (largest magnitude)"
	}
	return "maximum (smallest magnitude)"
}

// extremumAnswer fills the answer of vigil extremum.
func extremumAnswer(tm reduce.Timing, opt reduce.ExtremumOptions, rows, missing int) extremumResponse {
	r := extremumResponse{
		Time: tm.Time, Sigma: num(tm.Sigma), Method: string(tm.Method), N: tm.N,
		Kind:           string(tm.Kind),
		SigmaFrom:      "method",
		SigmaMethod:    num(tm.SigmaMethod),
		SigmaBootstrap: num(tm.SigmaBootstrap),
		SigmaKvW1956:   num(tm.SigmaKvW1956),
		Mag:            num(tm.Mag),
		WindowFrom:     tm.WindowFrom, WindowTo: tm.WindowTo,
		Bootstrap: tm.Bootstrap, BootstrapFail: tm.BootstrapFailed, Seed: opt.Seed,
		Weighted: tm.Weighted, Rows: rows, MissingMag: missing,
	}
	if tm.Method == reduce.MethodPoly && !math.IsNaN(tm.SigmaBootstrap) && tm.Sigma == tm.SigmaBootstrap {
		r.SigmaFrom = "bootstrap"
	}
	if tm.Method == reduce.MethodPoly {
		r.Degree = &tm.Degree
	} else {
		r.Folds, r.Pairs = &tm.Folds, &tm.Pairs
	}
	return r
}

// writeExtremumTable prints the answer of vigil extremum for people.
func writeExtremumTable(w io.Writer, path string, r extremumResponse) {
	fmt.Fprintf(w, "Time of %s from %s\n\n", extremumWord(reduce.ExtremumKind(r.Kind)), path)
	t := newTable(w)
	method := "Kwee & van Woerden (1956)"
	if r.Method == string(reduce.MethodPoly) {
		method = fmt.Sprintf("polynomial of degree %d, dm/dt = 0", *r.Degree)
	} else {
		method += fmt.Sprintf(", %d trial times, %d reflected pairs", *r.Folds, *r.Pairs)
	}
	t.row("Method", method)
	t.row("Time", fmt.Sprintf("%.6f (Julian date, on the scale of the input)", r.Time))
	t.row("Uncertainty", daysText(r.Sigma)+" ("+r.SigmaFrom+")")
	t.row("Method's own", daysText(r.SigmaMethod))
	if r.SigmaBootstrap != nil {
		t.row("Bootstrap", fmt.Sprintf("%s (%d resamples, %d failed, seed %d)", daysText(r.SigmaBootstrap), r.Bootstrap, r.BootstrapFail, r.Seed))
	}
	if r.SigmaKvW1956 != nil {
		t.row("KvW 1956 formula", daysText(r.SigmaKvW1956))
	}
	t.row("Magnitude there", ptrText("%.4f", r.Mag))
	weighted := "equal weights"
	if r.Weighted {
		weighted = "weighted by 1/err²"
	}
	t.row("Points used", fmt.Sprintf("%d of %d rows (%d without a magnitude), from %.6f to %.6f, %s", r.N, r.Rows, r.MissingMag, r.WindowFrom, r.WindowTo, weighted))
	t.flush()
}

// daysText writes an uncertainty in days and seconds.
func daysText(d *float64) string {
	if d == nil {
		return "—"
	}
	return fmt.Sprintf("%.6f d = %.1f s", *d, *d*86400)
}
