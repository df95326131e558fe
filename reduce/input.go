package reduce

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
)

// TimeFormat says how the time column of a photometry table is written.
type TimeFormat int

// The time formats accepted. Every one is on the UTC scale: convert
// heliocentric or barycentric dates back to UTC first (ephem.SeenAt).
const (
	// TimeJD is a Julian date, UTC: 2460666.3333333.
	TimeJD TimeFormat = iota
	// TimeMJD is a modified Julian date, UTC (JD − 2400000.5): 60665.8333333.
	TimeMJD
	// TimeISO is an ISO 8601 instant as ephem.ParseInstant reads it:
	// "2024-12-21T20:00:00Z", "2024-12-21T21:00:00+01:00",
	// "2024-12-21 20:00:00" (no zone means UTC), also "JD2460666.33" and
	// "MJD60665.83".
	TimeISO
)

// ParseTimeFormat reads "jd" (also "jd_utc"), "mjd" ("mjd_utc") or "iso".
func ParseTimeFormat(s string) (TimeFormat, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "jd", "jd_utc":
		return TimeJD, nil
	case "mjd", "mjd_utc":
		return TimeMJD, nil
	case "iso":
		return TimeISO, nil
	}
	return 0, fmt.Errorf("reduce: time format %q: expected jd, mjd or iso", s)
}

// Columns maps the columns of a photometry table (CSV with a header row) to
// what they hold, since photometry programs name their columns differently.
// The zero Columns is the layout of `vigil reduce`: jd_utc (mid-exposure,
// JD UTC), target, target_err, airmass, filter, and for each comparison or
// check star a column named by its ID with its instrumental magnitude, ID_err
// with its error and ID_airmass with its airmass.
//
// A column named here must exist; a column left to its default may be
// absent when optional (errors, airmasses, filter). Names ignore case and
// surrounding blanks; other columns are ignored; empty cells are missing
// values.
type Columns struct {
	Time       string     // the instant; default "jd_utc"
	TimeFormat TimeFormat // how Time is written; default Julian date UTC
	// ExposureSec optionally names a column of exposure lengths in seconds:
	// Time is then the start of the exposure and the mid-exposure instant
	// is Time + ExposureSec/2.
	ExposureSec   string
	Target        string // default "target"
	TargetErr     string // default "target_err"
	TargetAirmass string // default "airmass"
	Filter        string // default "filter"
	// Stars maps a comparison or check star's ID to its columns.
	Stars map[string]StarColumns
}

// StarColumns names the columns of one star: its instrumental magnitude,
// error and airmass. Empty names take the defaults ID, ID_err, ID_airmass.
type StarColumns struct {
	Mag, Err, Airmass string
}

// photoColumn is one column the reader looks for: its name, whether it
// must exist, and the key cells are looked up by (the name in lower case:
// internal/table lower-cases every name it is asked for, which costs an
// allocation unless the name already is).
type photoColumn struct {
	name     string
	required bool
	key      string
}

func pickColumn(given, def string, required bool) photoColumn {
	if given != "" {
		def, required = given, true
	}
	return photoColumn{def, required, strings.ToLower(strings.TrimSpace(def))}
}

// starColumns returns the mag, err and airmass columns of star id.
func (c *Columns) starColumns(id string) (mag, err, airmass photoColumn) {
	sc := c.Stars[id]
	return pickColumn(sc.Mag, id, true), pickColumn(sc.Err, id+"_err", false), pickColumn(sc.Airmass, id+"_airmass", false)
}

// ReadFile reads the exposures of a photometry table (see Read).
func (p *Photometry) ReadFile(path string, cols Columns) ([]Exposure, error) {
	t, err := table.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return p.fromTable(t, cols)
}

// Read reads the exposures of a photometry table from r, laid out as cols
// says, for the stars of the set-up; name is used in errors. Every error
// about the data is a *table.Error naming the file, line and column: a
// missing column, a cell that is not a number or not an instant, a time
// outside ephem's range, a negative error or exposure length, an airmass
// below 1, a missing airmass the extinction correction needs. Empty
// magnitude cells are missing measurements, left for Reduce to skip.
func (p *Photometry) Read(r io.Reader, name string, cols Columns) ([]Exposure, error) {
	t, err := table.Read(r, name)
	if err != nil {
		return nil, err
	}
	return p.fromTable(t, cols)
}

// ReduceFile reads the photometry table at path and reduces it (Read, then
// Reduce): the one call behind `vigil reduce`. Every error about the data
// names the file, line and column (*table.Error); nothing is written.
func (p *Photometry) ReduceFile(path string, cols Columns) (*Reduction, error) {
	t, err := table.ReadFile(path)
	if err != nil {
		return nil, err
	}
	exps, err := p.fromTable(t, cols)
	if err != nil {
		return nil, err
	}
	red, err := p.Reduce(exps)
	var ee *ExposureError
	if errors.As(err, &ee) && ee.Index < t.Len() {
		// One exposure per data row: place the fault at its cell.
		return nil, t.Row(ee.Index).Wrap(p.columnOf(ee.Field, cols), ee.Err)
	}
	return red, err
}

// columnOf returns the column that holds an ExposureError's field.
func (p *Photometry) columnOf(field string, cols Columns) string {
	switch field {
	case "jd_utc":
		return pickColumn(cols.Time, "jd_utc", true).name
	case "target":
		return pickColumn(cols.Target, "target", true).name
	case "filter":
		return pickColumn(cols.Filter, "filter", false).name
	}
	mag, _, _ := cols.starColumns(field)
	return mag.name
}

// photoStarCols is the columns of one star with their indices checked.
type photoStarCols struct {
	mag, err, airmass photoColumn
}

func (p *Photometry) fromTable(t *table.Table, cols Columns) ([]Exposure, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	headerErr := func(err error) error {
		return &table.Error{File: t.File, Line: t.HeaderLine(), Err: err}
	}
	if cols.TimeFormat < TimeJD || cols.TimeFormat > TimeISO {
		return nil, fmt.Errorf("reduce: unknown time format %d: expected TimeJD, TimeMJD or TimeISO", cols.TimeFormat)
	}
	for id := range cols.Stars {
		if !p.hasStar(id) {
			return nil, fmt.Errorf("reduce: column mapping names star %q, which is neither a comparison nor the check star", id)
		}
	}
	timeCol := pickColumn(cols.Time, "jd_utc", true)
	expCol := pickColumn(cols.ExposureSec, "", false)
	tgt := photoStarCols{pickColumn(cols.Target, "target", true), pickColumn(cols.TargetErr, "target_err", false), pickColumn(cols.TargetAirmass, "airmass", false)}
	filterCol := pickColumn(cols.Filter, "filter", false)
	comps := make([]photoStarCols, len(p.Comps))
	for j, c := range p.Comps {
		comps[j].mag, comps[j].err, comps[j].airmass = cols.starColumns(c.ID)
	}
	var check photoStarCols
	if p.Check != nil {
		check.mag, check.err, check.airmass = cols.starColumns(p.Check.ID)
	}
	all := []photoColumn{timeCol, expCol, tgt.mag, tgt.err, tgt.airmass, filterCol, check.mag, check.err, check.airmass}
	for _, c := range comps {
		all = append(all, c.mag, c.err, c.airmass)
	}
	for _, c := range all {
		if c.required {
			if err := t.Require(c.name); err != nil {
				return nil, err
			}
		}
	}
	// The extinction correction needs airmasses: from the table, or from
	// the star's position and the site.
	if p.Transform.ExtinctionK != 0 {
		need := func(c photoColumn, id string, hasPos bool) error {
			if t.Has(c.name) || (hasPos && p.Site != nil) {
				return nil
			}
			return headerErr(fmt.Errorf("%w column %q: the extinction correction needs the airmass of %s (or its position and a site)", table.ErrMissing, c.name, id))
		}
		if err := need(tgt.airmass, "the target", true); err != nil {
			return nil, err
		}
		for j, c := range p.Comps {
			if err := need(comps[j].airmass, fmt.Sprintf("comparison star %q", c.ID), p.hasPosition(c.ID)); err != nil {
				return nil, err
			}
		}
		if p.Check != nil {
			if err := need(check.airmass, fmt.Sprintf("check star %q", p.Check.ID), p.hasPosition(p.Check.ID)); err != nil {
				return nil, err
			}
		}
	}
	exps := make([]Exposure, t.Len())
	for i := range exps {
		row := t.Row(i)
		e, err := p.readRow(row, cols.TimeFormat, timeCol, expCol, filterCol, tgt, comps, check)
		if err != nil {
			return nil, err
		}
		exps[i] = e
	}
	return exps, nil
}

func (p *Photometry) hasStar(id string) bool {
	if p.Check != nil && p.Check.ID == id {
		return true
	}
	for _, c := range p.Comps {
		if c.ID == id {
			return true
		}
	}
	return false
}

func (p *Photometry) hasPosition(id string) bool {
	_, ok := p.Transform.Positions[id]
	return ok
}

// Longest exposure accepted (s): a day.
const maxExposureSec = 86400

// readRow reads one exposure.
func (p *Photometry) readRow(row table.Row, tf TimeFormat, timeCol, expCol, filterCol photoColumn, tgt photoStarCols, comps []photoStarCols, check photoStarCols) (Exposure, error) {
	e := NewExposure(math.NaN(), len(p.Comps))
	e.Line = row.Line()
	jd, err := readInstant(row, timeCol.key, tf)
	if err != nil {
		return e, err
	}
	if expCol.key != "" {
		sec, err := row.MustFloat(expCol.key)
		if err != nil {
			return e, err
		}
		if sec < 0 || sec > maxExposureSec {
			return e, row.Errorf(expCol.key, "exposure length %v s: expected 0 to %d seconds", sec, maxExposureSec)
		}
		jd += sec / 2 / 86400
	}
	if _, err := ephem.FromJDUTC(jd); err != nil {
		return e, row.Wrap(timeCol.key, err)
	}
	e.JDUTC = jd
	e.Filter = row.String(filterCol.key)
	airmassNeeded := p.Transform.ExtinctionK != 0 && p.Site == nil
	if e.Target, err = readInst(row, tgt, airmassNeeded); err != nil {
		return e, err
	}
	for j, c := range comps {
		need := p.Transform.ExtinctionK != 0 && (p.Site == nil || !p.hasPosition(p.Comps[j].ID))
		if e.Comps[j], err = readInst(row, c, need); err != nil {
			return e, err
		}
	}
	if p.Check != nil {
		need := p.Transform.ExtinctionK != 0 && (p.Site == nil || !p.hasPosition(p.Check.ID))
		if e.Check, err = readInst(row, check, need); err != nil {
			return e, err
		}
	}
	return e, nil
}

// readInstant reads the time cell as a Julian date UTC.
func readInstant(row table.Row, col string, tf TimeFormat) (float64, error) {
	switch tf {
	case TimeJD:
		return row.MustFloat(col)
	case TimeMJD:
		v, err := row.MustFloat(col)
		return v + 2400000.5, err
	case TimeISO:
		s := row.String(col)
		if s == "" {
			return 0, row.Wrap(col, fmt.Errorf("%w value: the cell is empty", table.ErrMissing))
		}
		t, err := ephem.ParseInstant(s)
		if err != nil {
			return 0, row.Wrap(col, err)
		}
		return t.JDUTC(), nil
	}
	return 0, fmt.Errorf("reduce: unknown time format %d", tf)
}

// readInst reads one star's cells. An empty magnitude is a missing
// measurement; then its error and airmass are not needed.
func readInst(row table.Row, c photoStarCols, airmassNeeded bool) (Inst, error) {
	in := Unmeasured()
	var err error
	if in.Mag, _, err = row.Float(c.mag.key); err != nil {
		return in, err
	}
	if math.Abs(in.Mag) > maxInstMag {
		return in, row.Errorf(c.mag.key, "instrumental magnitude %v: expected a number within ±%d", in.Mag, maxInstMag)
	}
	if in.Err, _, err = row.Float(c.err.key); err != nil {
		return in, err
	}
	if in.Err < 0 || in.Err > maxInstErrM {
		return in, row.Errorf(c.err.key, "error %v: expected a one-sigma error from 0 to %d mag", in.Err, maxInstErrM)
	}
	var ok bool
	if in.Airmass, ok, err = row.Float(c.airmass.key); err != nil {
		return in, err
	}
	if ok && !(in.Airmass >= 1 && in.Airmass <= maxAirmass) {
		return in, row.Errorf(c.airmass.key, "airmass %v: expected a value from 1 (zenith) to %d", in.Airmass, maxAirmass)
	}
	if !ok && airmassNeeded && !math.IsNaN(in.Mag) {
		return in, row.Wrap(c.airmass.key, fmt.Errorf("%w airmass: the extinction correction needs it", table.ErrMissing))
	}
	return in, nil
}
