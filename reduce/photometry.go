package reduce

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
)

// Comp is a comparison or check star: the ID that names its column in the
// input and its catalogue magnitude in the filter observed.
type Comp struct {
	ID  string
	Mag float64
}

// ParseComp reads a comparison or check star written "ID=MAG", as the
// command line's --comp and --check take it: "A=11.20".
func ParseComp(s string) (Comp, error) {
	id, mag, ok := strings.Cut(s, "=")
	id, mag = strings.TrimSpace(id), strings.TrimSpace(mag)
	if !ok || mag == "" {
		return Comp{}, fmt.Errorf("reduce: star %q has no catalogue magnitude: expected ID=MAG, e.g. \"A=11.20\"", s)
	}
	if id == "" {
		return Comp{}, fmt.Errorf("reduce: star %q has no ID: expected ID=MAG, e.g. \"A=11.20\"", s)
	}
	v, err := strconv.ParseFloat(mag, 64)
	if err != nil || !finite(v) {
		return Comp{}, fmt.Errorf("reduce: star %q: catalogue magnitude %q is not a number", s, mag)
	}
	c := Comp{ID: id, Mag: v}
	return c, c.validate("star")
}

// Catalogue magnitudes outside this range are typing errors.
const (
	minCatalogMag = -30
	maxCatalogMag = 40
)

func (c Comp) validate(role string) error {
	switch {
	case c.ID == "":
		return fmt.Errorf("reduce: %s with no ID", role)
	case strings.ContainsAny(c.ID, " \t\",="):
		return fmt.Errorf("reduce: %s ID %q: expected a name without blanks, commas, quotes or '='", role, c.ID)
	case !finite(c.Mag) || c.Mag < minCatalogMag || c.Mag > maxCatalogMag:
		return fmt.Errorf("reduce: %s %q: catalogue magnitude %v: expected a number in [%d, %d]", role, c.ID, c.Mag, minCatalogMag, maxCatalogMag)
	}
	return nil
}

// Inst is one star's instrumental magnitude in one exposure, with its
// one-sigma error and the star's airmass. Mag is NaN when the star was not
// measured; Err is 0 or NaN when unknown; Airmass is 0 or NaN when unknown
// (only the extinction correction uses it).
type Inst struct {
	Mag     float64
	Err     float64
	Airmass float64
}

// Unmeasured returns an Inst with nothing measured (all NaN): the value of
// an empty cell.
func Unmeasured() Inst { return Inst{Mag: math.NaN(), Err: math.NaN(), Airmass: math.NaN()} }

// Limits of an instrumental measurement: beyond them a value is a typing
// or unit error.
const (
	maxInstMag  = 100
	maxAirmass  = 40 // Pickering (2002) gives 38.7 at the horizon
	maxInstErrM = 10
)

// checkInst reports the first unusable value of a measurement.
func checkInst(in Inst) error {
	switch {
	case math.IsInf(in.Mag, 0) || math.Abs(in.Mag) > maxInstMag:
		return fmt.Errorf("instrumental magnitude %v: expected a number within ±%d", in.Mag, maxInstMag)
	case in.Err < 0:
		return fmt.Errorf("error %v is negative: expected a one-sigma error of 0 or more", in.Err)
	case math.IsInf(in.Err, 0) || in.Err > maxInstErrM:
		return fmt.Errorf("error %v: expected a one-sigma error below %d mag", in.Err, maxInstErrM)
	case in.Airmass != 0 && !math.IsNaN(in.Airmass) && !(in.Airmass >= 1 && in.Airmass <= maxAirmass):
		return fmt.Errorf("airmass %v: expected a value from 1 (zenith) to %d", in.Airmass, maxAirmass)
	}
	return nil
}

// Exposure is one frame of instrumental photometry: its mid-exposure instant
// (Julian date, UTC), its filter, and the instrumental magnitudes of the
// target, of each comparison star (in the order of Photometry.Comps) and of
// the check star.
type Exposure struct {
	JDUTC  float64
	Filter string
	Target Inst
	Comps  []Inst
	Check  Inst
	Line   int // the exposure's line in the input file; 0 when typed in
}

// NewExposure returns an exposure at jdUTC with room for nComps comparison
// stars and nothing measured yet.
func NewExposure(jdUTC float64, nComps int) Exposure {
	e := Exposure{JDUTC: jdUTC, Target: Unmeasured(), Check: Unmeasured(), Comps: make([]Inst, nComps)}
	for i := range e.Comps {
		e.Comps[i] = Unmeasured()
	}
	return e
}

// Photometry is the set-up of a differential reduction: the comparison
// stars with their catalogue magnitudes, an optional check star, the
// target's position (for HJD and BJD_TDB) and the observer's site.
type Photometry struct {
	Comps []Comp     // one or more comparison stars
	Check *Comp      // optional check star, reduced like the target
	Star  ephem.Star // the target's J2000 position
	// Site is the observer's place; nil gives times for the Earth's centre
	// (at most 21 ms off).
	Site *ephem.Site
	// Filter selects the exposures taken in this filter (case ignored);
	// "" takes every exposure, which must then share one filter.
	Filter string
	// Transform holds the optional extinction and colour corrections.
	Transform Transform
	// Reject says when a comparison star that disagrees with the others is
	// left out; nil means DefaultRejectRule. KeepAllComps switches the
	// rejection off.
	Reject       *RejectRule
	KeepAllComps bool
	// Frames is an optional cache of ephem frames to share between calls.
	Frames *ephem.Frames
}

// reservedColumns are the column names of the input that a star ID must not
// take (see Columns).
var reservedColumns = []string{"jd_utc", "target", "target_err", "airmass", "filter"}

// Validate reports the first fault of the set-up: no comparison star, a
// star without a usable ID or catalogue magnitude, a star given twice, a
// bad position, site, coefficient or rule.
func (p *Photometry) Validate() error {
	if len(p.Comps) == 0 {
		return errors.New("reduce: no comparison star: give at least one as ID=MAG")
	}
	stars := map[string]string{} // lower-case ID → the star's role and ID
	cols := map[string]string{}  // lower-case column name → what uses it
	for _, r := range reservedColumns {
		cols[r] = "a column of the input"
	}
	use := func(c Comp, role string) error {
		if err := c.validate(role); err != nil {
			return err
		}
		if other, dup := stars[strings.ToLower(c.ID)]; dup {
			return fmt.Errorf("reduce: %s %q is given twice (also as %s; column names ignore case)", role, c.ID, other)
		}
		for _, col := range []string{c.ID, c.ID + "_err", c.ID + "_airmass"} {
			if other, clash := cols[strings.ToLower(col)]; clash {
				return fmt.Errorf("reduce: %s ID %q clashes with the column name %q (%s)", role, c.ID, col, other)
			}
		}
		name := fmt.Sprintf("%s %q", role, c.ID)
		stars[strings.ToLower(c.ID)] = name
		cols[strings.ToLower(c.ID)] = name
		cols[strings.ToLower(c.ID+"_err")] = "the error column of " + name
		cols[strings.ToLower(c.ID+"_airmass")] = "the airmass column of " + name
		return nil
	}
	for _, c := range p.Comps {
		if err := use(c, "comparison star"); err != nil {
			return err
		}
	}
	if p.Check != nil {
		if err := use(*p.Check, "check star"); err != nil {
			return err
		}
	}
	if err := p.Star.Validate(); err != nil {
		return fmt.Errorf("reduce: target position: %w", err)
	}
	if p.Site != nil {
		if err := p.Site.Validate(); err != nil {
			return fmt.Errorf("reduce: site: %w", err)
		}
	}
	if err := p.Transform.validate(p.Comps, p.Check); err != nil {
		return err
	}
	return p.rule().validate()
}

func (p *Photometry) rule() RejectRule {
	if p.Reject != nil {
		return *p.Reject
	}
	return DefaultRejectRule()
}

// Reduced is one exposure reduced: its times, the target's standard
// magnitude and error, the zero point it came from, and the check star.
type Reduced struct {
	Index  int     // the exposure's index in the input
	Line   int     // its line in the input file; 0 when typed in
	JDUTC  float64 // mid-exposure, Julian date UTC
	HJD    float64 // heliocentric Julian date, UTC scale
	BJDTDB float64 // barycentric Julian date, TDB scale
	Mag    float64 // the target's standard magnitude
	// Err = sqrt(target_err² + ZeroPointErr²), missing errors counting 0.
	Err float64
	// ZeroPoint is Mag minus the target's instrumental magnitude; its
	// error σ_zp is described at Photometry.Reduce.
	ZeroPoint, ZeroPointErr float64
	NComps                  int  // comparison stars used
	Weighted                bool // zero point weighted by 1/err² (see Photometry.Reduce)
	// CheckMag and CheckErr are the check star reduced like the target:
	// NaN without a check star or its measurement.
	CheckMag, CheckErr float64
}

// Skip is an exposure left out of the light curve, and why.
type Skip struct {
	Index  int
	Line   int
	Reason string
}

// Reduction is the outcome of Photometry.Reduce.
type Reduction struct {
	Rows        []Reduced   // the exposures reduced, in input order
	Skipped     []Skip      // exposures without a target or comparison measurement
	OtherFilter int         // exposures in another filter than Photometry.Filter
	Filter      string      // the filter of the exposures reduced
	Rejected    []Rejection // comparison stars left out, and why
	Check       *CheckSummary
	Warnings    []string
}

// Points returns the light curve: the reduced magnitudes and errors against
// HJD_UTC (ts = ephem.HJD) or BJD_TDB (ts = ephem.BJDTDB); any other value
// of ts gives the Julian date UTC of mid-exposure.
func (r *Reduction) Points(ts ephem.TimeScale) []Point {
	pts := make([]Point, len(r.Rows))
	for i, row := range r.Rows {
		t := row.JDUTC
		switch ts {
		case ephem.HJD:
			t = row.HJD
		case ephem.BJDTDB:
			t = row.BJDTDB
		}
		pts[i] = Point{T: t, Mag: row.Mag, Err: row.Err}
	}
	return pts
}

// ExposureError is a fault of one exposure given to Photometry.Reduce.
type ExposureError struct {
	Index int    // the exposure's index
	Line  int    // its line in the input file; 0 when typed in
	Field string // what was wrong: "jd_utc", "target", a star ID ...
	Err   error
}

func (e *ExposureError) Error() string {
	where := fmt.Sprintf("exposure %d", e.Index+1)
	if e.Line > 0 {
		where += fmt.Sprintf(" (line %d)", e.Line)
	}
	if e.Field != "" {
		where += " " + e.Field
	}
	return "reduce: " + where + ": " + e.Err.Error()
}

func (e *ExposureError) Unwrap() error { return e.Err }
