package main

import (
	"errors"
	"fmt"
	"io/fs"
	"math"
	"strconv"
	"strings"

	csvtable "example.org/vigil/internal/table"
	"example.org/vigil/reduce"
)

// This file holds what vigil reduce, extremum, oc and distance share: the
// --input file, Julian dates and day counts typed on the command line, the
// translation of the engine's errors about one input point into the file,
// line and column that hold it, and the optional site of vigil reduce.

// inputFlagUsage is the start of every --input flag's description.
const inputFlagUsage = "CSV file with a header row; '#' starts a comment line, empty cells are missing values"

// readInput reads the table at path (the value of --input). A file that
// cannot be opened or read is a fault of the flag; a table without data rows
// is a fault of the file, at its header line.
func readInput(path string) (*csvtable.Table, error) {
	t, err := csvtable.ReadFile(path)
	if err != nil {
		return nil, inputError(path, err)
	}
	if t.Len() == 0 {
		return nil, &csvtable.Error{File: path, Line: t.HeaderLine(), Err: errors.New("no data rows under the header: want one row per measurement")}
	}
	return t, nil
}

// inputError names --input when the file itself could not be opened or
// read (missing, a directory, no permission); other errors, which name the
// file, line and column already, pass unchanged.
func inputError(path string, err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return &flagError{flag: "input", err: fmt.Errorf("cannot read %q: %v: want a readable CSV file", path, pe.Err)}
	}
	return err
}

// pointError places an error of the engine about one input point (a
// *reduce.PointError, whose Index counts the points given, one per data
// row of t) at the file's line and column; column maps the error's field to
// the column that holds it. Other errors are returned unchanged.
func pointError(t *csvtable.Table, err error, column map[string]string) error {
	var pe *reduce.PointError
	if !errors.As(err, &pe) || pe.Index < 0 || pe.Index >= t.Len() {
		return err
	}
	col := column[pe.Field]
	if col == "" {
		col = pe.Field
	}
	return t.Row(pe.Index).Errorf(col, "%s %s: want %s", pe.Field, strconv.FormatFloat(pe.Value, 'f', -1, 64), pe.Want)
}

// fileError prefixes an error about the data of a file as a whole (not one
// cell) with the file's name, so that the one stderr line names it.
func fileError(path string, err error) error {
	var te *csvtable.Error
	var fe *flagError
	if errors.As(err, &te) || errors.As(err, &fe) {
		return err
	}
	return fmt.Errorf("%s: %w", path, err)
}

// parseJulianDate reads a Julian date typed on the command line: a decimal
// number, optionally after "JD" (2450000.1234 or JD2450000.1234). The time
// scale is the one the command states (HJD, BJD_TDB, or that of the input).
func parseJulianDate(s string) (float64, error) {
	text := strings.TrimSpace(s)
	if rest, ok := strings.CutPrefix(strings.ToUpper(text), "JD"); ok {
		text = strings.TrimSpace(rest)
	}
	v, err := strconv.ParseFloat(text, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a Julian date: want a number of days such as 2450000.1234", s)
	}
	return v, nil
}

// parseFullJulianDate is parseJulianDate for an epoch: a full Julian date
// between 2000000 (1764) and 2600000 (2406), as ephem.Ephemeris takes it.
func parseFullJulianDate(s string) (float64, error) {
	v, err := parseJulianDate(s)
	if err != nil {
		return 0, err
	}
	if v < 2e6 || v > 2.6e6 {
		return 0, fmt.Errorf("%q: want a full Julian date between 2000000 and 2600000, such as 2450000.1234 (not a reduced or modified one)", s)
	}
	return v, nil
}

// parsePeriodDays reads a period in days: a positive finite number.
func parsePeriodDays(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a number: want a period in days such as 5.366341", s)
	}
	if !(v > 0) || v > 1e5 {
		return 0, fmt.Errorf("period %q: want a positive number of days (below 100000)", s)
	}
	return v, nil
}

// parseDaysNonNegative reads a duration or uncertainty in days, 0 or more.
func parseDaysNonNegative(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
		return 0, fmt.Errorf("%q: want a number of days, 0 or more", s)
	}
	return v, nil
}

// parseMagnitude reads a magnitude: a finite number within ±40.
func parseMagnitude(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a number: want a magnitude such as 3.94", s)
	}
	if math.Abs(v) > 40 {
		return 0, fmt.Errorf("magnitude %q: want a number within ±40", s)
	}
	return v, nil
}

// parseIntIn returns a parser of a whole number from lo to hi.
func parseIntIn(lo, hi int) func(string) (int, error) {
	return func(s string) (int, error) {
		v, err := strconv.Atoi(strings.TrimSpace(s))
		if err != nil || v < lo || v > hi {
			return 0, fmt.Errorf("%q: want a whole number from %d to %d", s, lo, hi)
		}
		return v, nil
	}
}

// parseSeed reads a random seed: a whole number, 0 or more.
func parseSeed(s string) (uint64, error) {
	v, err := strconv.ParseUint(strings.TrimSpace(s), 10, 64)
	if err != nil {
		return 0, fmt.Errorf("%q: want a whole number, 0 or more", s)
	}
	return v, nil
}

// num is a JSON number that may not exist: NaN and infinities become null.
func num(x float64) *float64 { return optional(x, true) }

// ptrText writes a number that may be null for people.
func ptrText(format string, x *float64) string {
	if x == nil {
		return "—"
	}
	return fmt.Sprintf(format, *x)
}

// nonEmpty returns a parser that refuses a blank value.
func nonEmpty(what string) func(string) (string, error) {
	return func(s string) (string, error) {
		if strings.TrimSpace(s) == "" {
			return "", fmt.Errorf("empty value: want %s", what)
		}
		return s, nil
	}
}

// addOptionalSiteFlags declares --lat, --lon, --elev and --site for a
// command that works without a site (geocentric times then). It shares
// siteFlags.resolve with the commands that need one.
func addOptionalSiteFlags(e *env, f *flags) *siteFlags {
	const optionalNote = "optional: without a site, times are geocentric"
	s := &siteFlags{
		lat:  f.value("lat", "DEG", "", "site latitude in degrees, north positive, decimal (52.1172) or sexagesimal (+52:07:02); give with --lon", optionalNote),
		lon:  f.value("lon", "DEG", "", "site longitude in degrees, EAST positive (west of Greenwich is negative: -1.4538), decimal or sexagesimal; give with --lat", optionalNote),
		elev: f.value("elev", "METRES", "0", "site elevation in metres above sea level", ""),
		name: f.value("site", "NAME", "", siteNameUsage, ""),
	}
	s.book = addLogbookFlag(e, f)
	return s
}

// resolveOptional returns the observer the site flags describe, or nil when
// none of them was given.
func (s *siteFlags) resolveOptional(f *flags) (*observer, error) {
	if !f.given("lat") && !f.given("lon") && !f.given("elev") && !f.given("site") {
		return nil, nil
	}
	if !f.given("site") {
		for _, pair := range [][2]string{{"lat", "lon"}, {"lon", "lat"}} {
			if !f.given(pair[0]) {
				return nil, &flagError{flag: pair[0], err: fmt.Errorf("missing: give --lat and --lon together (or --site, or no site at all for geocentric times; --%s was given)", givenSiteFlag(f, pair[1]))}
			}
		}
	}
	obs, err := s.resolve(f)
	if err != nil {
		return nil, err
	}
	return &obs, nil
}

// givenSiteFlag names a site flag that was given, preferring want.
func givenSiteFlag(f *flags, want string) string {
	if f.given(want) {
		return want
	}
	return "elev"
}
