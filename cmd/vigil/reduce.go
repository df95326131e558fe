package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

var reduceCommand = command{
	name:    "reduce",
	summary: "differential photometry to calibrated magnitudes on HJD and BJD_TDB, with one comparison star or an ensemble",
	run:     runReduce,
}

// reduceResponse is the answer of vigil reduce. rows, check_mean,
// check_std, n and skipped are the contract (spec/cli.md, "vigil reduce"):
// do not rename or drop them.
type reduceResponse struct {
	Rows      []reduceRow `json:"rows"`
	CheckMean *float64    `json:"check_mean"` // null without --check
	CheckStd  *float64    `json:"check_std"`  // sample standard deviation (n − 1); null without --check or below 2
	N         int         `json:"n"`          // rows reduced
	Skipped   int         `json:"skipped"`    // rows skipped

	SkippedRows []reduceSkip      `json:"skipped_rows"` // which, and why
	Rejected    []reduceRejection `json:"rejected"`     // comparison stars left out of the ensemble
	Check       *reduceCheck      `json:"check"`        // null without --check
	Filter      string            `json:"filter"`       // the filter of the rows, "" when the file has none
	Geocentric  bool              `json:"geocentric"`   // times for the Earth's centre (no site given)
	Warnings    []string          `json:"warnings,omitempty"`
}

// reduceRow is one exposure reduced.
type reduceRow struct {
	JDUTC    float64  `json:"jd_utc"`    // mid-exposure
	HJD      float64  `json:"hjd"`       // heliocentric, UTC scale
	BJDTDB   float64  `json:"bjd_tdb"`   // barycentric, TDB scale
	Mag      float64  `json:"mag"`       // the target's standard magnitude
	Err      *float64 `json:"err"`       // sqrt(target_err² + σ_zp²)
	CheckMag *float64 `json:"check_mag"` // null without --check or its measurement

	CheckErr     *float64 `json:"check_err"`
	ZeroPoint    float64  `json:"zero_point"` // mag − target's instrumental magnitude
	ZeroPointErr *float64 `json:"zero_point_err"`
	NComps       int      `json:"n_comps"`  // comparison stars used
	Weighted     bool     `json:"weighted"` // zero point weighted by 1/err²
	Line         int      `json:"line"`     // the row's line in the input file
}

type reduceSkip struct {
	Line   int    `json:"line"`
	Reason string `json:"reason"`
}

type reduceRejection struct {
	ID         string   `json:"id"`
	Reason     string   `json:"reason"`
	OffsetMag  *float64 `json:"offset_mag"`
	ScatterMag *float64 `json:"scatter_mag"`
}

type reduceCheck struct {
	ID         string   `json:"id"`
	CatalogMag float64  `json:"catalog_mag"`
	N          int      `json:"n"` // exposures that measured it
	OffsetMag  *float64 `json:"offset_mag"`
}

func runReduce(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--input FILE --comp ID=MAG [--comp ID=MAG ...] [--check ID=MAG] --ra HOURS --dec DEG [--lat DEG --lon DEG [--elev METRES] | --site NAME [--logbook PATH]] [--filter NAME] [--json]",
		`Differential photometry to calibrated magnitudes. FILE columns: jd_utc
(mid-exposure, Julian date UTC), target, optional target_err, and for each
comparison or check star a column named by its ID (instrumental magnitude)
with an optional ID_err; optional filter. One comparison star gives
V = v - c + C. Several give an ensemble (Honeycutt 1992, PASP 104, 435): the
zero point is the mean of C_i - c_i weighted by 1/err_i^2 when every
comparison star has an error in that row, else with equal weights;
err = sqrt(target_err^2 + sigma_zp^2), missing errors counting 0. An empty
cell for a comparison star leaves it out of that row; a row without a target
value or any comparison star is skipped and counted. With three or more
comparison stars, one that disagrees with the others over the whole file is
left out and listed under rejected. Times: HJD on the UTC scale and BJD_TDB
for the target, topocentric with a site, geocentric without (at most 21 ms
apart). Magnitudes in mag, times in days.`)
	input := f.required("input", "FILE", inputFlagUsage+"; columns jd_utc, target, one per star ID")
	compTexts := f.repeated("comp", "ID=MAG", "a comparison star: its column ID and catalogue magnitude (mag) in the filter observed; repeat for an ensemble", "required")
	checkText := f.value("check", "ID=MAG", "", "a check star, reduced like the target: its column ID and catalogue magnitude (mag)", "")
	raText := f.required("ra", "HOURS", "the target's right ascension in hours, ICRS/J2000, decimal (22.486) or sexagesimal (22:29:10.265)")
	decText := f.required("dec", "DEG", "the target's declination in degrees, ICRS/J2000, decimal (58.415) or sexagesimal (+58:24:54.71)")
	site := addOptionalSiteFlags(e, f)
	filter := f.value("filter", "NAME", "", "reduce only the rows of this filter (column filter); without it every row must share one filter", "")
	outText := f.value("out", "FILE.csv", "", "also write the light curve as CSV (jd_utc, hjd_utc, bjd_tdb, mag, err, zero point, check star), whole or not at all", "")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	out := ""
	if f.given("out") {
		var err error
		if out, err = get(f, "out", *outText, csvOutPath); err != nil {
			return err
		}
	}
	path, err := get(f, "input", *input, nonEmpty("a file name"))
	if err != nil {
		return err
	}
	if len(*compTexts) == 0 {
		return f.missing("comp")
	}
	comps := make([]reduce.Comp, len(*compTexts))
	for i, text := range *compTexts {
		if comps[i], err = get(f, "comp", text, reduce.ParseComp); err != nil {
			return err
		}
	}
	var check *reduce.Comp
	if f.given("check") {
		c, err := get(f, "check", *checkText, reduce.ParseComp)
		if err != nil {
			return err
		}
		check = &c
	}
	ra, err := get(f, "ra", *raText, ephem.ParseRA)
	if err != nil {
		return err
	}
	dec, err := get(f, "dec", *decText, ephem.ParseDec)
	if err != nil {
		return err
	}
	obs, err := site.resolveOptional(f)
	if err != nil {
		return err
	}

	// Validate the set-up a flag at a time, so that the message names the
	// flag at fault: the comparison stars alone, then with the check star.
	p := reduce.Photometry{Comps: comps, Star: ephem.Star{RAHours: ra, DecDeg: dec}}
	if err := p.Validate(); err != nil {
		return &flagError{flag: "comp", err: err}
	}
	p.Check = check
	if err := p.Validate(); err != nil {
		return &flagError{flag: "check", err: err}
	}
	if obs != nil {
		p.Site = &obs.site
	}
	p.Filter = strings.TrimSpace(*filter)
	if err := p.Validate(); err != nil {
		return err
	}

	red, err := p.ReduceFile(path, reduce.Columns{})
	if err != nil {
		return fileError(path, inputError(path, err))
	}
	if len(red.Rows) == 0 {
		return fileError(path, reduceNothing(red))
	}
	resp := reduceAnswer(red, obs == nil)
	if out != "" {
		if err := red.WriteCSV(out); err != nil {
			return &flagError{flag: "out", err: err}
		}
	}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeReduceTable(e.stdout, path, p, obs, resp)
	return nil
}

// reduceNothing explains why no row could be reduced.
func reduceNothing(red *reduce.Reduction) error {
	switch {
	case len(red.Skipped) > 0:
		s := red.Skipped[0]
		return fmt.Errorf("none of the %d rows could be reduced (line %d: %s): want a target value and at least one comparison star in a row", len(red.Skipped), s.Line, s.Reason)
	case red.OtherFilter > 0:
		return fmt.Errorf("no row in filter %q (%d rows in other filters): check --filter", red.Filter, red.OtherFilter)
	}
	return fmt.Errorf("no data rows: want one row per exposure")
}

// reduceAnswer fills the answer of vigil reduce.
func reduceAnswer(red *reduce.Reduction, geocentric bool) reduceResponse {
	resp := reduceResponse{
		Rows:        make([]reduceRow, len(red.Rows)),
		N:           len(red.Rows),
		Skipped:     len(red.Skipped),
		SkippedRows: make([]reduceSkip, len(red.Skipped)),
		Rejected:    make([]reduceRejection, len(red.Rejected)),
		Filter:      red.Filter,
		Geocentric:  geocentric,
		Warnings:    red.Warnings,
	}
	for i, r := range red.Rows {
		resp.Rows[i] = reduceRow{
			JDUTC: r.JDUTC, HJD: r.HJD, BJDTDB: r.BJDTDB,
			Mag: r.Mag, Err: num(r.Err), CheckMag: num(r.CheckMag), CheckErr: num(r.CheckErr),
			ZeroPoint: r.ZeroPoint, ZeroPointErr: num(r.ZeroPointErr),
			NComps: r.NComps, Weighted: r.Weighted, Line: r.Line,
		}
	}
	for i, s := range red.Skipped {
		resp.SkippedRows[i] = reduceSkip{Line: s.Line, Reason: s.Reason}
	}
	for i, rj := range red.Rejected {
		resp.Rejected[i] = reduceRejection{ID: rj.ID, Reason: rj.Reason, OffsetMag: num(rj.OffsetMag), ScatterMag: num(rj.ScatterMag)}
	}
	if c := red.Check; c != nil {
		resp.CheckMean, resp.CheckStd = num(c.Mean), num(c.Std)
		resp.Check = &reduceCheck{ID: c.ID, CatalogMag: c.CatalogMag, N: c.N, OffsetMag: num(c.OffsetMag)}
	}
	return resp
}

// writeReduceTable prints the answer of vigil reduce for people.
func writeReduceTable(w io.Writer, path string, p reduce.Photometry, obs *observer, r reduceResponse) {
	fmt.Fprintf(w, "Differential photometry of the star at RA %s, Dec %s (ICRS/J2000), from %s\n",
		ephem.FormatRA(p.Star.RAHours), ephem.FormatDec(p.Star.DecDeg), path)
	comps := make([]string, len(p.Comps))
	for i, c := range p.Comps {
		comps[i] = fmt.Sprintf("%s = %.3f", c.ID, c.Mag)
	}
	word := "Comparison star"
	if len(comps) > 1 {
		word = "Comparison stars (ensemble)"
	}
	fmt.Fprintf(w, "%s: %s", word, strings.Join(comps, ", "))
	if p.Check != nil {
		fmt.Fprintf(w, "; check star %s = %.3f", p.Check.ID, p.Check.Mag)
	}
	fmt.Fprintln(w)
	if obs != nil {
		fmt.Fprintf(w, "Times for the observer at %s.\n\n", siteText(obs.site))
	} else {
		fmt.Fprint(w, "Times for the Earth's centre (no site given: at most 21 ms from topocentric).\n\n")
	}

	t := newTable(w)
	head := []string{"Line", "JD_UTC", "HJD_UTC", "BJD_TDB", "Mag", "Err", "Comps"}
	if p.Check != nil {
		head = append(head, "Check")
	}
	t.row(head...)
	for _, row := range r.Rows {
		cells := []string{fmt.Sprint(row.Line), fmt.Sprintf("%.6f", row.JDUTC), fmt.Sprintf("%.6f", row.HJD), fmt.Sprintf("%.6f", row.BJDTDB),
			fmt.Sprintf("%.4f", row.Mag), ptrText("%.4f", row.Err), comparisonWord(row)}
		if p.Check != nil {
			cells = append(cells, ptrText("%.4f", row.CheckMag))
		}
		t.row(cells...)
	}
	t.flush()

	fmt.Fprintf(w, "\n%d rows reduced, %d skipped.\n", r.N, r.Skipped)
	for _, s := range r.SkippedRows {
		fmt.Fprintf(w, "  skipped line %d: %s\n", s.Line, s.Reason)
	}
	for _, rj := range r.Rejected {
		fmt.Fprintf(w, "Comparison star %s left out: %s\n", rj.ID, rj.Reason)
	}
	if c := r.Check; c != nil {
		fmt.Fprintf(w, "Check star %s: mean %s, standard deviation %s mag over %d rows; catalogue %.3f, offset %s mag.\n",
			c.ID, ptrText("%.4f", r.CheckMean), ptrText("%.4f", r.CheckStd), c.N, c.CatalogMag, ptrText("%+.4f", c.OffsetMag))
	}
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "\nCaution: %s.\n", warn)
	}
}

// comparisonWord says how many comparison stars set a row's zero point and
// how they were weighted.
func comparisonWord(row reduceRow) string {
	switch {
	case row.NComps == 1:
		return "1"
	case row.Weighted:
		return fmt.Sprintf("%d weighted", row.NComps)
	}
	return fmt.Sprintf("%d equal", row.NComps)
}

// csvOutPath checks a --out path for a CSV file: it must end in .csv and its
// directory must exist, so that a run fails before any work is done.
func csvOutPath(s string) (string, error) {
	p := strings.TrimSpace(s)
	if !strings.EqualFold(filepath.Ext(p), ".csv") {
		return "", fmt.Errorf("%q: want a file name ending in .csv", s)
	}
	if st, err := os.Stat(filepath.Dir(p)); err != nil || !st.IsDir() {
		return "", fmt.Errorf("%q: the folder %q does not exist", s, filepath.Dir(p))
	}
	return p, nil
}
