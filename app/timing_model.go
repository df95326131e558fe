package app

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// TimingData is what the Timings page reads from the logbook about one
// star, in one go off the UI thread (LoadTimingData): the star, the nights
// with its reduced measurements, and its timings, own and published.
type TimingData struct {
	Target  observe.Target
	Nights  []TimingNight    // nights with reduced measurements, newest first
	Timings []logbook.Timing // in time order
	// Points are all the star's reduced measurements on its ephemeris's
	// time scale, in time order (the period search's data).
	Points []reduce.Point
	// Adopted is the current ephemeris's entry of the star's history (when
	// and from what it was adopted).
	Adopted logbook.AdoptedEphemeris
	sites   map[string]observe.Site
}

// TimingNight is one night's light curve of the star.
type TimingNight struct {
	Night  logbook.Night
	Site   *observe.Site  // nil when the logbook lost it
	Points []reduce.Point // on the ephemeris's scale, in time order
	// FirstUTC, LastUTC are the first and last mid-exposure instants.
	FirstUTC, LastUTC time.Time
	Filter            string // the filter every point shares; "" when mixed
}

// LoadTimingData reads the star named target: its measurements grouped by
// night, the nights and their sites, and its timings.
func LoadTimingData(lb *logbook.Logbook, target string) (*TimingData, error) {
	tg, err := lb.Target(target)
	if err != nil {
		return nil, err
	}
	d := &TimingData{Target: tg, sites: map[string]observe.Site{}}
	sites, err := lb.Sites()
	if err != nil {
		return nil, err
	}
	for _, s := range sites {
		d.sites[strings.ToLower(s.Name)] = s
	}
	ms, err := lb.MeasurementsOf(target, 0)
	if err != nil {
		return nil, err
	}
	byNight := map[int64]*TimingNight{}
	for _, m := range ms {
		p := reduce.Point{T: timingMeasurementTime(m, tg.Ephemeris.Scale), Mag: m.Mag, Err: m.MagErr}
		if math.IsNaN(p.T) || math.IsNaN(p.Mag) {
			continue // not reduced: no point on the light curve
		}
		d.Points = append(d.Points, p)
		n := byNight[m.NightID]
		utc := timingJDTime(m.JDUTC)
		if n == nil {
			night, err := lb.NightByID(m.NightID)
			if err != nil {
				return nil, err
			}
			n = &TimingNight{Night: night, FirstUTC: utc, Filter: m.Filter}
			if s, ok := d.sites[strings.ToLower(night.Site)]; ok {
				n.Site = &s
			}
			byNight[m.NightID] = n
		}
		n.Points = append(n.Points, p)
		n.LastUTC = utc
		if !strings.EqualFold(n.Filter, m.Filter) {
			n.Filter = ""
		}
	}
	for _, n := range byNight {
		slices.SortFunc(n.Points, func(a, b reduce.Point) int { return timingCmp(a.T, b.T) })
		d.Nights = append(d.Nights, *n)
	}
	slices.SortFunc(d.Nights, func(a, b TimingNight) int { return b.Night.Date.Compare(a.Night.Date) })
	slices.SortFunc(d.Points, func(a, b reduce.Point) int { return timingCmp(a.T, b.T) })
	if d.Timings, err = lb.TimingsOf(target); err != nil {
		return nil, err
	}
	hist, err := lb.EphemerisHistory(target)
	if err != nil {
		return nil, err
	}
	if len(hist) > 0 {
		d.Adopted = hist[len(hist)-1]
	}
	return d, nil
}

// Site returns the logbook's site named name (any case).
func (d *TimingData) Site(name string) (observe.Site, bool) {
	s, ok := d.sites[strings.ToLower(name)]
	return s, ok
}

func timingCmp(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// timingMeasurementTime returns a measurement's time on scale ts.
func timingMeasurementTime(m logbook.Measurement, ts ephem.TimeScale) float64 {
	if ts == ephem.HJD {
		return m.HJD
	}
	return m.BJDTDB
}

// timingJDTime returns the instant of a Julian date UTC (the zero time when it
// is out of range).
func timingJDTime(jd float64) time.Time {
	t, err := ephem.FromJDUTC(jd)
	if err != nil {
		return time.Time{}
	}
	return t.Time()
}

// DefaultNight returns the index of the night the page opens on: the
// session's night at its site when the star has data in it, else the most
// recent night with data (0); -1 when there is none.
func (d *TimingData) DefaultNight(site string, date time.Time) int {
	if len(d.Nights) == 0 {
		return -1
	}
	for i, n := range d.Nights {
		if strings.EqualFold(n.Night.Site, site) && n.Night.Date.Equal(date) {
			return i
		}
	}
	return 0
}

// Label names a night in the night chooser: "Thu 5 Nov 2026 ·
// Ashgrove Hill Observatory (demo) · 116 points".
func (n TimingNight) Label() string {
	return fmt.Sprintf("%s · %s · %s", n.Night.Date.Format("Mon 2 Jan 2006"), n.Night.Site,
		plural(len(n.Points), "point", "points"))
}

// Loc returns the time zone of the night's site (UTC when it is unknown).
func (n TimingNight) Loc() *time.Location {
	if n.Site == nil {
		return time.UTC
	}
	return n.Site.Location()
}

// TimingSeed seeds the bootstrap of every fit the page makes, so that the
// same points and options always give the same σ.
const TimingSeed = 7

// TimingFitRequest is what the page asks reduce.Extremum to time.
type TimingFitRequest struct {
	Points []reduce.Point
	Kind   reduce.ExtremumKind
	Method reduce.ExtremumMethod
	Degree int     // 0: chosen from the data
	From   float64 // the picked range on the ephemeris's scale; both 0: none
	To     float64
}

// Options returns the options of reduce.Extremum for the request: the
// default number of bootstrap resamples with the page's fixed seed.
func (r TimingFitRequest) Options() reduce.ExtremumOptions {
	opt := reduce.ExtremumOptions{Kind: r.Kind, Method: r.Method, From: r.From, To: r.To, Seed: TimingSeed}
	if r.Method == reduce.MethodPoly {
		opt.Degree = r.Degree
	}
	return opt
}

// TimingFit times the extremum the request covers (reduce.Extremum).
func TimingFit(r TimingFitRequest) (reduce.Timing, error) {
	if len(r.Points) == 0 {
		return reduce.Timing{}, errors.New("this night has no reduced points to fit")
	}
	return reduce.Extremum(r.Points, r.Options())
}

// TimingRefusal says in plain words why a fit was refused, with reduce's
// reason after it.
func TimingRefusal(err error, kind reduce.ExtremumKind) string {
	what := timingExtremumWord(kind)
	switch {
	case errors.Is(err, reduce.ErrOneSided):
		return fmt.Sprintf("The points do not cover both sides of the %s: widen the range, or pick the part of the night where the light turns (%v).", what, err)
	case errors.Is(err, reduce.ErrNoExtremum):
		return fmt.Sprintf("No %s found in these points: %v. Pick a range where the light turns, or check the kind of extremum.", what, err)
	}
	return "The fit failed: " + err.Error()
}

// timingExtremumWord names an extremum kind: "maximum" or "minimum".
func timingExtremumWord(k reduce.ExtremumKind) string {
	if k == reduce.Minimum {
		return "minimum"
	}
	return "maximum"
}

// TimingDefaultKind is the extremum the star's ephemeris marks.
func TimingDefaultKind(tg observe.Target) reduce.ExtremumKind {
	if tg.Kind == observe.Min {
		return reduce.Minimum
	}
	return reduce.Maximum
}

// TimingDefaultMethod is Kwee & van Woerden (1956) for the minima of an
// eclipsing star, whose eclipses are symmetric, and a polynomial otherwise
// (common practice).
func TimingDefaultMethod(tg observe.Target, kind reduce.ExtremumKind) reduce.ExtremumMethod {
	if tg.Class == observe.Eclipsing && kind == reduce.Minimum {
		return reduce.MethodKvW
	}
	return reduce.MethodPoly
}

// TimingIsSecondary reports whether a minimum timed at jd falls at a secondary
// minimum (a half-integer cycle) of a star whose secondary minima are
// followed.
func TimingIsSecondary(tg observe.Target, kind reduce.ExtremumKind, jd float64) bool {
	if !tg.Secondary || kind != reduce.Minimum {
		return false
	}
	e, _ := reduce.CycleOf(tg.Ephemeris, jd, true)
	return e != math.Floor(e)
}

// TimingFitReport is a fitted extremum in words.
type TimingFitReport struct {
	Headline string // "Minimum at BJD_TDB 2461350.58481 ± 0.00004 d (±3.6 s)"
	When     string // local time and UTC at the site
	How      string // method, points, where σ comes from
	OC       string // cycle and O−C against the current ephemeris
}

// TimingDescribeFit writes a fitted extremum of the star, observed on night n.
func TimingDescribeFit(tm reduce.Timing, tg observe.Target, n TimingNight) TimingFitReport {
	eph := tg.Ephemeris
	secondary := TimingIsSecondary(tg, tm.Kind, tm.Time)
	what := timingExtremumWord(tm.Kind)
	if secondary {
		what = "secondary minimum"
	}
	var r TimingFitReport
	r.Headline = fmt.Sprintf("%s at %s %.5f %s", timingCapitalise(what), eph.Scale.Label(), tm.Time, timingSigmaText(tm.Sigma))
	r.When = timingSeenText(tm.Time, eph.Scale, tg.Star, n.Site)
	switch tm.Method {
	case reduce.MethodKvW:
		r.How = fmt.Sprintf("Kwee–van Woerden with %d folds, %s; σ from the method", tm.Folds, plural(tm.N, "point", "points"))
	default:
		r.How = fmt.Sprintf("Polynomial of degree %d, %s", tm.Degree, plural(tm.N, "point", "points"))
		if !math.IsNaN(tm.SigmaBootstrap) && tm.Bootstrap > 0 {
			r.How += fmt.Sprintf("; σ from %d bootstrap resamples (the fit's own: %s)", tm.Bootstrap, timingSigmaText(tm.SigmaMethod))
		} else {
			r.How += "; σ from the fit"
		}
	}
	r.How += fmt.Sprintf("; points from %s %.4f to %.4f", eph.Scale.Label(), tm.WindowFrom, tm.WindowTo)
	if tm.Weighted {
		r.How += ", weighted by their errors"
	}
	r.How += "."
	if TimingDefaultKind(tg) == tm.Kind {
		e, oc := reduce.CycleOf(eph, tm.Time, secondary)
		r.OC = fmt.Sprintf("Cycle %g, O−C %s against the current ephemeris.", e, timingOCText(oc))
	} else {
		r.OC = fmt.Sprintf("The star's ephemeris marks %s, so this %s has no O−C.", timingExtremumWord(TimingDefaultKind(tg))+"s", what)
	}
	return r
}

// TimingRecord is the logbook record of an extremum fitted on night n.
func TimingRecord(tm reduce.Timing, tg observe.Target, n TimingNight) logbook.Timing {
	method := string(tm.Method)
	if tm.Method == reduce.MethodPoly {
		method = "poly" + strconv.Itoa(tm.Degree)
	}
	kind := observe.Max
	if tm.Kind == reduce.Minimum {
		kind = observe.Min
	}
	return logbook.Timing{
		Target: tg.Name, JD: tm.Time, Scale: tg.Ephemeris.Scale, SigmaDays: tm.Sigma, Kind: kind,
		Secondary: TimingIsSecondary(tg, tm.Kind, tm.Time), Origin: logbook.Own, Method: method,
		NightID: n.Night.ID, Filter: n.Filter, Observer: n.Night.Observer,
		Notes: fmt.Sprintf("timed in the window from %d points", tm.N),
	}
}
