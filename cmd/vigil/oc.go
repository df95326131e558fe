package main

import (
	"fmt"
	"io"

	"example.org/vigil/ephem"
	csvtable "example.org/vigil/internal/table"
	"example.org/vigil/reduce"
)

var ocCommand = command{
	name:    "oc",
	summary: "O−C of timed extrema against an ephemeris, with linear and quadratic ephemeris fits (period change)",
	run:     runOC,
}

// ocResponse is the answer of vigil oc. rows, linear, quadratic, preferred
// and preferred_by are the contract (spec/cli.md, "vigil oc"): do not
// rename or drop them.
type ocResponse struct {
	Rows        []ocRow      `json:"rows"`
	Linear      ocLinear     `json:"linear"`
	Quadratic   *ocQuadratic `json:"quadratic"` // null with fewer than 4 timings or 3 distinct cycles
	Preferred   string       `json:"preferred"` // "linear" or "quadratic"
	PreferredBy string       `json:"preferred_by"`

	FTestF    *float64    `json:"f_test_f"` // F of the quadratic term; null without a quadratic fit
	FTestP    *float64    `json:"f_test_p"`
	Weighted  bool        `json:"weighted"` // fits weighted by 1/sigma² (every timing had one)
	Ephemeris ocEphemeris `json:"ephemeris"`
	Secondary bool        `json:"secondary"`
	Warnings  []string    `json:"warnings,omitempty"`
}

// ocRow is one timing on the O−C diagram.
type ocRow struct {
	Time      float64  `json:"time"`    // observed extremum, on the ephemeris' scale
	Cycle     float64  `json:"cycle"`   // E (half-integer for a secondary minimum)
	OCDays    float64  `json:"oc_days"` // O − C, days
	Sigma     *float64 `json:"sigma"`   // days; null when not given
	Line      int      `json:"line"`    // the timing's line in the input file
	Ambiguous bool     `json:"ambiguous"`
	Warning   string   `json:"warning,omitempty"`
}

// ocLinear is T(E) = epoch + period·E fitted to the timings.
type ocLinear struct {
	Epoch          float64  `json:"epoch"`  // Julian date at cycle 0
	Period         float64  `json:"period"` // days
	EpochErr       *float64 `json:"epoch_err"`
	PeriodErr      *float64 `json:"period_err"`
	Chi2           *float64 `json:"chi2"` // Σ r²/σ² (weighted) or Σ r² in days² (unweighted)
	Dof            int      `json:"dof"`
	CovEpochPeriod *float64 `json:"cov_epoch_period"` // days²
}

// ocQuadratic is T(E) = epoch + period·E + q·E² fitted to the timings.
type ocQuadratic struct {
	Epoch             float64  `json:"epoch"`
	Period            float64  `json:"period"`
	Q                 float64  `json:"q"` // days
	QErr              *float64 `json:"q_err"`
	DPdt              float64  `json:"dpdt"` // 2Q/P, days per day
	DPdtErr           *float64 `json:"dpdt_err"`
	EpochErr          *float64 `json:"epoch_err"`
	PeriodErr         *float64 `json:"period_err"`
	DPdtSecPerYear    float64  `json:"dpdt_s_per_yr"`
	DPdtErrSecPerYear *float64 `json:"dpdt_err_s_per_yr"`
	Chi2              *float64 `json:"chi2"`
	Dof               int      `json:"dof"`
}

// ocEphemeris is the ephemeris the O−C are computed with.
type ocEphemeris struct {
	Epoch     float64 `json:"epoch"`
	Period    float64 `json:"period"`
	EpochErr  float64 `json:"epoch_err"`
	PeriodErr float64 `json:"period_err"`
	Timescale string  `json:"timescale"` // "hjd" or "bjd"
}

func runOC(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--input FILE --epoch T0 --period P [--timescale hjd|bjd] [--secondary] [--epoch-err DAYS] [--period-err DAYS] [--json]",
		`O-C of observed extrema against the ephemeris T(E) = T0 + P*E, and what the
timings say about the period (Sterken 2005, ASP Conf. Ser. 335, 3). FILE
columns: time (the observed extremum, a full Julian date on the same scale
as T0), optional sigma (days). cycle E is the nearest integer to
(time - T0)/P (nearest half-integer with --secondary); O-C = time - T(E).
A linear and a quadratic ephemeris T(E) = T0 + P*E + Q*E^2 are fitted by
least squares, with dpdt = 2Q/P (days per day); an F-test on the quadratic
term at the 1% level picks the preferred one. With a sigma on every row the
fits are weighted by 1/sigma^2 and the errors are the formal ones; without,
chi2 is the sum of squared residuals (days^2) and the errors are scaled by
sqrt(chi2/dof). Timings whose cycle count may be wrong are flagged. Never
mix HJD and BJD, maxima and minima.`)
	input := f.required("input", "FILE", inputFlagUsage+"; columns time, optional sigma")
	epochText := f.required("epoch", "T0", "the ephemeris' epoch: a full Julian date on the --timescale scale (2450000.1234 or JD2450000.1234)")
	periodText := f.required("period", "DAYS", "the ephemeris' period in days")
	scaleText := f.value("timescale", "hjd|bjd", "bjd", "the time scale of T0 and of the timings: hjd (heliocentric, UTC) or bjd (barycentric, TDB); only labels the answer", "")
	secondary := f.toggle("secondary", "allow half-integer cycles, for lists that mix primary and secondary minima")
	epochErrText := f.value("epoch-err", "DAYS", "0", "uncertainty of T0 in days, for flagging doubtful cycle counts", "")
	periodErrText := f.value("period-err", "DAYS", "0", "uncertainty of P in days, for flagging doubtful cycle counts", "")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	path, err := get(f, "input", *input, nonEmpty("a file name"))
	if err != nil {
		return err
	}
	var eph ephem.Ephemeris
	if eph.Epoch, err = get(f, "epoch", *epochText, parseFullJulianDate); err != nil {
		return err
	}
	if eph.PeriodDays, err = get(f, "period", *periodText, parsePeriodDays); err != nil {
		return err
	}
	if eph.Scale, err = get(f, "timescale", *scaleText, ephem.ParseTimeScale); err != nil {
		return err
	}
	if eph.EpochErr, err = get(f, "epoch-err", *epochErrText, parseDaysNonNegative); err != nil {
		return err
	}
	if eph.PeriodErr, err = get(f, "period-err", *periodErrText, parseDaysNonNegative); err != nil {
		return err
	}
	if err := eph.Validate(); err != nil {
		return &flagError{flag: "epoch", err: err}
	}

	t, err := readInput(path)
	if err != nil {
		return err
	}
	timings, err := readTimings(t)
	if err != nil {
		return err
	}
	a, err := reduce.OC(eph, timings, reduce.OCOptions{Secondary: *secondary})
	if err != nil {
		return fileError(path, pointError(t, err, nil))
	}
	resp := ocAnswer(a, t, *secondary)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeOCTable(e.stdout, path, resp)
	return nil
}

// readTimings reads the timings of vigil oc's input, one per data row: time
// (every row needs one) and an optional sigma (empty: unknown).
func readTimings(t *csvtable.Table) ([]reduce.Timing, error) {
	if err := t.Require("time"); err != nil {
		return nil, err
	}
	out := make([]reduce.Timing, t.Len())
	for i := range out {
		row := t.Row(i)
		var err error
		if out[i].Time, err = row.MustFloat("time"); err != nil {
			return nil, err
		}
		if out[i].Sigma, _, err = row.Float("sigma"); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// ocAnswer fills the answer of vigil oc; t gives each row's line.
func ocAnswer(a reduce.OCAnalysis, t *csvtable.Table, secondary bool) ocResponse {
	r := ocResponse{
		Rows:        make([]ocRow, len(a.Rows)),
		Preferred:   a.Preferred,
		PreferredBy: a.PreferredBy,
		FTestF:      num(a.FTestF),
		FTestP:      num(a.FTestP),
		Weighted:    a.Weighted,
		Ephemeris: ocEphemeris{Epoch: a.Ephemeris.Epoch, Period: a.Ephemeris.PeriodDays,
			EpochErr: a.Ephemeris.EpochErr, PeriodErr: a.Ephemeris.PeriodErr, Timescale: a.Ephemeris.Scale.String()},
		Secondary: secondary,
		Warnings:  a.Warnings,
	}
	for i, row := range a.Rows {
		sigma := num(row.SigmaDays)
		if sigma != nil && *sigma == 0 {
			sigma = nil
		}
		r.Rows[i] = ocRow{Time: row.Time, Cycle: row.Cycle, OCDays: row.OCDays, Sigma: sigma,
			Line: t.Row(i).Line(), Ambiguous: row.Ambiguous, Warning: row.Warning}
	}
	l := a.Linear
	r.Linear = ocLinear{Epoch: l.Epoch, Period: l.Period, EpochErr: num(l.EpochErr), PeriodErr: num(l.PeriodErr),
		Chi2: num(l.Chi2), Dof: l.Dof, CovEpochPeriod: num(l.CovEpochPeriod)}
	if q := a.Quadratic; q != nil {
		r.Quadratic = &ocQuadratic{Epoch: q.Epoch, Period: q.Period, Q: q.Q, QErr: num(q.QErr),
			DPdt: q.DPdt, DPdtErr: num(q.DPdtErr), EpochErr: num(q.EpochErr), PeriodErr: num(q.PeriodErr),
			DPdtSecPerYear: q.DPdtSecPerYear, DPdtErrSecPerYear: num(q.DPdtErrSecPerYear),
			Chi2: num(q.Chi2), Dof: q.Dof}
	}
	return r
}

// writeOCTable prints the answer of vigil oc for people.
func writeOCTable(w io.Writer, path string, r ocResponse) {
	scale := ephem.BJDTDB
	if r.Ephemeris.Timescale == ephem.HJD.String() {
		scale = ephem.HJD
	}
	label := scale.Label()
	fmt.Fprintf(w, "O−C of the timings in %s against %s %.6f + %.8f·E", path, label, r.Ephemeris.Epoch, r.Ephemeris.Period)
	if r.Secondary {
		fmt.Fprint(w, " (half-integer cycles allowed)")
	}
	fmt.Fprint(w, "\n\n")
	t := newTable(w)
	t.row("Line", "Time ("+label+")", "E", "O−C (d)", "Sigma (d)", "")
	for _, row := range r.Rows {
		flag := ""
		if row.Ambiguous {
			flag = "cycle count doubtful"
		}
		t.row(fmt.Sprint(row.Line), fmt.Sprintf("%.5f", row.Time), fmt.Sprintf("%g", row.Cycle), fmt.Sprintf("%+.5f", row.OCDays), ptrText("%.5f", row.Sigma), flag)
	}
	t.flush()

	weights := "unweighted: errors scaled by sqrt(chi2/dof)"
	if r.Weighted {
		weights = "weighted by 1/sigma²"
	}
	fmt.Fprintf(w, "\nLinear fit (%s):\n", weights)
	t = newTable(w)
	t.row("  T0", fmt.Sprintf("%.6f ± %s", r.Linear.Epoch, ptrText("%.6f", r.Linear.EpochErr)))
	t.row("  P", fmt.Sprintf("%.9f ± %s d", r.Linear.Period, ptrText("%.9f", r.Linear.PeriodErr)))
	t.row("  chi2 / dof", fmt.Sprintf("%s / %d", ptrText("%.6g", r.Linear.Chi2), r.Linear.Dof))
	t.flush()
	if q := r.Quadratic; q != nil {
		fmt.Fprintln(w, "Quadratic fit T0 + P·E + Q·E²:")
		t = newTable(w)
		t.row("  T0", fmt.Sprintf("%.6f ± %s", q.Epoch, ptrText("%.6f", q.EpochErr)))
		t.row("  P", fmt.Sprintf("%.9f ± %s d", q.Period, ptrText("%.9f", q.PeriodErr)))
		t.row("  Q", fmt.Sprintf("%.4e ± %s d", q.Q, ptrText("%.4e", q.QErr)))
		t.row("  dP/dt", fmt.Sprintf("%.4e ± %s d/d = %.4g ± %s s/yr", q.DPdt, ptrText("%.4e", q.DPdtErr), q.DPdtSecPerYear, ptrText("%.4g", q.DPdtErrSecPerYear)))
		t.row("  chi2 / dof", fmt.Sprintf("%s / %d", ptrText("%.6g", q.Chi2), q.Dof))
		t.flush()
	}
	fmt.Fprintf(w, "Preferred: %s (%s).\n", r.Preferred, r.PreferredBy)
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "\nCaution: %s.\n", warn)
	}
}
