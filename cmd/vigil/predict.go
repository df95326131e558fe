package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

var predictCommand = command{
	name:    "predict",
	summary: "the coming maxima or minima of one star from its ephemeris, and whether each can be observed",
	run:     runPredict,
}

// predictResponse is the answer of vigil predict. events and, in each event,
// cycle, ephemeris_time, utc, alt_deg, sun_alt_deg and observable are the
// contract (spec/cli.md, "vigil predict"): do not rename or drop them.
type predictResponse struct {
	Events []predictEvent `json:"events"`

	From           ephem.Time `json:"from"`
	To             ephem.Time `json:"to"`
	Timescale      string     `json:"timescale"` // of epoch and ephemeris_time: hjd or bjd
	Kind           string     `json:"kind"`      // what the epoch marks: max or min
	Secondary      bool       `json:"secondary"`
	MinAltDeg      float64    `json:"min_alt_deg"`       // --min-alt
	SunAltLimitDeg float64    `json:"sun_alt_limit_deg"` // --sun-alt
	N              int        `json:"n"`                 // events listed
	NObservable    int        `json:"n_observable"`
	Warnings       []string   `json:"warnings,omitempty"`
}

// predictEvent is one extremum of vigil predict.
type predictEvent struct {
	Cycle         float64    `json:"cycle"`          // E, or E + 0.5 for a secondary minimum
	EphemerisTime float64    `json:"ephemeris_time"` // T0 + P·E (+ Q·E²), Julian date on the ephemeris's scale
	UTC           ephem.Time `json:"utc"`            // the instant it is seen at the telescope
	AltDeg        float64    `json:"alt_deg"`        // airless
	SunAltDeg     float64    `json:"sun_alt_deg"`    // airless
	Observable    bool       `json:"observable"`     // alt_deg > --min-alt and sun_alt_deg < --sun-alt

	Kind       string         `json:"kind"` // max or min (a secondary minimum is min)
	Secondary  bool           `json:"secondary"`
	JDUTC      float64        `json:"jd_utc"`     // utc as a Julian date, in full
	Local      string         `json:"local"`      // utc in the site's zone (UTC without one)
	SigmaDays  *float64       `json:"sigma_days"` // sqrt(σT0² + (E·σP)²); null when neither is given
	AzDeg      float64        `json:"az_deg"`     // from north through east
	Airmass    *float64       `json:"airmass"`    // Pickering (2002); null below the horizon
	SunSepDeg  float64        `json:"sun_sep_deg"`
	MoonAltDeg float64        `json:"moon_alt_deg"` // topocentric, airless
	MoonSepDeg float64        `json:"moon_sep_deg"` // star–Moon, topocentric Moon
	MoonIllum  float64        `json:"moon_illum"`   // illuminated fraction 0..1
	Reasons    []string       `json:"reasons"`      // why not observable; empty when it is
	Window     predictWindow  `json:"window"`
	Warnings   []string       `json:"warnings,omitempty"`
	event      *observe.Event // for the table
}

// predictWindow is the verdict over the coverage window around an extremum.
type predictWindow struct {
	Start          ephem.Time `json:"start"`
	End            ephem.Time `json:"end"`
	HalfWidthDays  float64    `json:"half_width_days"`
	UsableFraction float64    `json:"usable_fraction"` // the part of the window that is observable
	Whole          bool       `json:"whole"`           // all of it (and the extremum) is
	Reasons        []string   `json:"reasons"`         // why parts of it are not
}

// Defaults and limits of vigil predict.
const (
	predictMinAltDeg = 20  // --min-alt, degrees
	predictSunAltDeg = -12 // --sun-alt, degrees: nautical twilight (USNO definitions)
	// predictMaxEvents bounds the events one run may list: a short period
	// over a long span would print megabytes that no one reads.
	predictMaxEvents = 100000
)

func runPredict(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--ra HOURS --dec DEG (--lat DEG --lon DEG [--elev METRES] | --site NAME [--logbook PATH]) --epoch JD --period DAYS [--timescale hjd|bjd] [--kind max|min] [--secondary] --from INSTANT --to INSTANT [--min-alt DEG] [--sun-alt DEG] [--json]",
		`The maxima or minima of one star that are seen at a site from --from to
--to: every extremum T(E) = T0 + P·E + Q·E² (Sterken 2005, ASP Conf. Ser.
335, 3) whose instant at the telescope lies in [from, to) (an event exactly at
--from is listed, one exactly at --to is not), in time order. The ephemeris is
on HJD (heliocentric, UTC scale) or BJD_TDB (barycentric, TDB scale); the
instant at the telescope has the light time to the Sun or the barycentre
removed (Eastman, Siverd & Gaudi 2010, PASP 122, 935).
An event is observable when, at that instant, the star stands above --min-alt
(airless altitude) and the Sun below --sun-alt; nothing else counts (no
horizon profile, no Moon). Extra fields say where the Moon is, and how much of
a coverage window of ±0.1 P (at most ±3 h) around the extremum is observable.
Fields: events [{cycle, ephemeris_time, utc, alt_deg, sun_alt_deg, observable,
kind, secondary, jd_utc, local, sigma_days, az_deg, airmass, sun_sep_deg,
moon_alt_deg, moon_sep_deg, moon_illum, reasons, window {start, end,
half_width_days, usable_fraction, whole, reasons}, warnings}], from, to,
timescale, kind, secondary, min_alt_deg, sun_alt_limit_deg, n, n_observable.`)
	raText := f.required("ra", "HOURS", "right ascension in hours, ICRS/J2000, decimal (22.486) or sexagesimal (22:29:10.265)")
	decText := f.required("dec", "DEG", "declination in degrees, ICRS/J2000, decimal (58.415) or sexagesimal (+58:24:54.71)")
	pmRAText := f.value("pm-ra", "MAS/YR", "0", "proper motion in right ascension, μα cos δ, milliarcseconds per year", "")
	pmDecText := f.value("pm-dec", "MAS/YR", "0", "proper motion in declination, milliarcseconds per year", "")
	site := addSiteFlags(e, f)
	epochText := f.required("epoch", "JD", "T0, the epoch of one extremum: a full Julian date on --timescale (2436075.445)")
	periodText := f.required("period", "DAYS", "P, the period in days (5.366341)")
	qText := f.value("q", "DAYS", "0", "Q, the quadratic term of T(E) = T0 + P·E + Q·E², days", "")
	epochErrText := f.value("epoch-err", "DAYS", "", "σ(T0), days: with --period-err gives sigma_days", "optional")
	periodErrText := f.value("period-err", "DAYS", "", "σ(P), days", "optional")
	scaleText := f.value("timescale", "hjd|bjd", "bjd", "time scale of --epoch and ephemeris_time: hjd (heliocentric JD, UTC scale) or bjd (barycentric JD, TDB scale)", "")
	kindText := f.value("kind", "max|min", "max", "what T0 marks, and so each event: max (maximum light) or min (minimum light)", "")
	secondary := f.toggle("secondary", "also list the secondary minima of an eclipsing binary, at half-integer cycles (cycle = E + 0.5)")
	fromText := f.required("from", "INSTANT", "start of the span: ISO 8601 UTC (2026-12-01T03:00:00Z), a Julian date on the UTC scale (JD2461375.625), or now")
	toText := f.required("to", "INSTANT", fmt.Sprintf("end of the span (excluded), same forms; at most %d days after --from", observe.MaxSpanDays))
	minAltText := f.value("min-alt", "DEG", strconv.Itoa(predictMinAltDeg), "lowest airless altitude of the star, degrees, from -5 to 90", "")
	sunAltText := f.value("sun-alt", "DEG", strconv.Itoa(predictSunAltDeg), "the Sun must be below this airless altitude, degrees, from -30 to 10 (-12 is nautical twilight)", "")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	star, err := starFlags(f, *raText, *decText, *pmRAText, *pmDecText)
	if err != nil {
		return err
	}
	obs, err := site.resolve(f)
	if err != nil {
		return err
	}
	eph, err := ephemerisFlags(f, ephemerisTexts{epoch: *epochText, period: *periodText, q: *qText,
		epochErr: *epochErrText, periodErr: *periodErrText, scale: *scaleText})
	if err != nil {
		return err
	}
	kind, err := get(f, "kind", *kindText, observe.ParseKind)
	if err != nil {
		return err
	}
	from, to, err := spanFlags(f, e.now, *fromText, *toText)
	if err != nil {
		return err
	}
	minAlt, err := get(f, "min-alt", *minAltText, parseDegIn(-5, 90, false))
	if err != nil {
		return err
	}
	sunAlt, err := get(f, "sun-alt", *sunAltText, parseDegIn(-30, 10, true))
	if err != nil {
		return err
	}
	if n := predictEventCount(eph, from, to, *secondary); n > predictMaxEvents {
		return &flagError{flag: "to", err: fmt.Errorf("%q: the span from --from holds about %.0f extrema of period %g d: at most %d in one run; shorten the span",
			*toText, n, eph.PeriodDays, predictMaxEvents)}
	}

	oSite, err := observe.NewSite(obs.site.Name, obs.site.LatDeg, obs.site.LonDeg, obs.site.ElevM, zoneName(obs.zone), minAlt, nil)
	if err != nil {
		return &flagError{flag: "min-alt", err: err}
	}
	c := observe.DefaultConstraints()
	c.SunAltDeg = sunAlt
	c.MoonMinSepDeg = 0 // the contract's rule: no Moon
	tg := observe.NewTarget("star", star, observe.Other, eph, kind)
	tg.Secondary = *secondary
	evs, err := observe.Predict(oSite, tg, from, to, c)
	if err != nil {
		return fmt.Errorf("predicting the extrema from --from %s to --to %s: %w", from, to, err)
	}

	resp := predictAnswer(evs, from, to, eph, kind, *secondary, minAlt, sunAlt, oSite.Location())
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writePredictTable(e.stdout, obs, star, resp)
	return nil
}

// starFlags reads --ra, --dec and the proper motion.
func starFlags(f *flags, ra, dec, pmRA, pmDec string) (ephem.Star, error) {
	var s ephem.Star
	var err error
	if s.RAHours, err = get(f, "ra", ra, ephem.ParseRA); err != nil {
		return s, err
	}
	if s.DecDeg, err = get(f, "dec", dec, ephem.ParseDec); err != nil {
		return s, err
	}
	if s.PMRA, err = get(f, "pm-ra", pmRA, parseProperMotion); err != nil {
		return s, err
	}
	if s.PMDec, err = get(f, "pm-dec", pmDec, parseProperMotion); err != nil {
		return s, err
	}
	if err := s.Validate(); err != nil {
		return s, &flagError{flag: "pm-ra", err: err}
	}
	return s, nil
}

// parseProperMotion reads a proper motion in mas/yr: a finite number within
// ±20000 (the fastest star known moves about 10.4″ a year).
func parseProperMotion(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v) > 20000 {
		return 0, fmt.Errorf("%q: want a proper motion in milliarcseconds per year, within ±20000", s)
	}
	return v, nil
}

// ephemerisTexts are the ephemeris flags as typed.
type ephemerisTexts struct {
	epoch, period, q, epochErr, periodErr, scale string
}

// ephemerisFlags reads T0, P, Q, their errors and the time scale, and checks
// the ephemeris as a whole (a quadratic term that would stop the period).
func ephemerisFlags(f *flags, in ephemerisTexts) (ephem.Ephemeris, error) {
	var eph ephem.Ephemeris
	var err error
	if eph.Epoch, err = get(f, "epoch", in.epoch, parseFullJulianDate); err != nil {
		return eph, err
	}
	if eph.PeriodDays, err = get(f, "period", in.period, parsePeriodDays); err != nil {
		return eph, err
	}
	if eph.Q, err = get(f, "q", in.q, parseQuadraticTerm); err != nil {
		return eph, err
	}
	if f.given("epoch-err") {
		if eph.EpochErr, err = get(f, "epoch-err", in.epochErr, parseDaysNonNegative); err != nil {
			return eph, err
		}
	}
	if f.given("period-err") {
		if eph.PeriodErr, err = get(f, "period-err", in.periodErr, parseDaysNonNegative); err != nil {
			return eph, err
		}
	}
	if eph.Scale, err = get(f, "timescale", in.scale, ephem.ParseTimeScale); err != nil {
		return eph, err
	}
	if err := eph.Validate(); err != nil {
		return eph, &flagError{flag: "q", err: err}
	}
	return eph, nil
}

// parseQuadraticTerm reads Q in days: a finite number.
func parseQuadraticTerm(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q: want the quadratic term Q in days, such as 2e-9 (0 for a linear ephemeris)", s)
	}
	return v, nil
}

// spanFlags reads --from and --to and checks the span: from before to, at
// most observe.MaxSpanDays long.
func spanFlags(f *flags, now func() time.Time, fromText, toText string) (from, to ephem.Time, err error) {
	if from, err = get(f, "from", fromText, parseInstantFlag(now)); err != nil {
		return
	}
	if to, err = get(f, "to", toText, parseInstantFlag(now)); err != nil {
		return
	}
	switch d := to.Sub(from); {
	case !(d > 0):
		err = &flagError{flag: "to", err: fmt.Errorf("%q is not after --from %q: want the end of the span after its start", toText, fromText)}
	case d > observe.MaxSpanDays:
		err = &flagError{flag: "to", err: fmt.Errorf("%q is %.1f days after --from %q: want a span of at most %d days", toText, d, fromText, observe.MaxSpanDays)}
	}
	return
}

// parseDegIn returns a parser of an angle in decimal degrees from lo to
// hi; closedHi says whether hi itself is allowed.
func parseDegIn(lo, hi float64, closedHi bool) func(string) (float64, error) {
	return func(s string) (float64, error) {
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		bad := err != nil || math.IsNaN(v) || v < lo || v > hi || (!closedHi && v == hi)
		if bad {
			end := "]"
			if !closedHi {
				end = ")"
			}
			return 0, fmt.Errorf("%q: want decimal degrees in [%g, %g%s", s, lo, hi, end)
		}
		return v, nil
	}
}

// predictEventCount bounds the number of events of the ephemeris in the span.
func predictEventCount(eph ephem.Ephemeris, from, to ephem.Time, secondary bool) float64 {
	n := math.Abs(eph.Cycle(to.JDUTC())-eph.Cycle(from.JDUTC())) + 2
	if secondary {
		n *= 2
	}
	return n
}

// zoneName is the IANA name of a time zone, "UTC" when there is none.
func zoneName(z *time.Location) string {
	if z == nil {
		return "UTC"
	}
	return z.String()
}

// predictAnswer fills the answer of vigil predict.
func predictAnswer(evs []observe.Event, from, to ephem.Time, eph ephem.Ephemeris, kind observe.Kind, secondary bool, minAlt, sunAlt float64, zone *time.Location) predictResponse {
	r := predictResponse{
		Events: make([]predictEvent, len(evs)),
		From:   from, To: to, Timescale: eph.Scale.String(), Kind: kind.String(), Secondary: secondary,
		MinAltDeg: minAlt, SunAltLimitDeg: sunAlt, N: len(evs),
	}
	known := eph.EpochErr > 0 || eph.PeriodErr > 0
	for i := range evs {
		ev := &evs[i]
		p := predictEvent{
			Cycle: ev.Cycle, EphemerisTime: ev.EphemerisJD, UTC: ev.UTC, AltDeg: ev.AltDeg, SunAltDeg: ev.SunAltDeg,
			Observable: ev.Observable,
			Kind:       ev.Kind.String(), Secondary: ev.Secondary, JDUTC: ev.UTC.JDUTC(), Local: localISO(ev.UTC, zone),
			SigmaDays: optional(ev.SigmaDays, known), AzDeg: ev.AzDeg, Airmass: num(ev.Airmass),
			SunSepDeg: ev.SunSepDeg, MoonAltDeg: ev.MoonAltDeg, MoonSepDeg: ev.MoonSepDeg, MoonIllum: ev.MoonIllum,
			Reasons: reasonList(ev.Reasons),
			Window: predictWindow{Start: ev.Window.Start, End: ev.Window.End, HalfWidthDays: ev.Window.HalfWidthDays,
				UsableFraction: ev.Window.UsableFraction, Whole: ev.Window.Whole, Reasons: reasonList(ev.Window.Reasons)},
			event: ev,
		}
		if ev.SolarWarning {
			p.Warnings = append(p.Warnings, observe.SolarWarningText)
		}
		if ev.Observable {
			r.NObservable++
		}
		r.Events[i] = p
	}
	r.Warnings = spanWarnings(from, to)
	return r
}

// reasonList returns the reasons as a list, empty (not null) for none.
func reasonList(r observe.Reasons) []string {
	if l := r.List(); l != nil {
		return l
	}
	return []string{}
}

// localISO writes an instant as ISO 8601 in the zone, with its offset
// ("2026-12-01T18:03:21.5+01:00"; "Z" for UTC), to the millisecond.
func localISO(t ephem.Time, zone *time.Location) string {
	if zone == nil {
		zone = time.UTC
	}
	return t.Time().Round(time.Millisecond).In(zone).Format("2006-01-02T15:04:05.999Z07:00")
}

// spanWarnings are the time-scale cautions of sky's timeWarnings for a span,
// each given once.
func spanWarnings(from, to ephem.Time) []string {
	var out []string
	for _, w := range append(timeWarnings(from), timeWarnings(to)...) {
		dup := false
		for _, o := range out {
			dup = dup || o == w
		}
		if !dup {
			out = append(out, w)
		}
	}
	return out
}

// writePredictTable prints the answer of vigil predict for people.
func writePredictTable(w io.Writer, obs observer, star ephem.Star, r predictResponse) {
	fmt.Fprintf(w, "Extrema of the star at RA %s, Dec %s (ICRS/J2000)\n", ephem.FormatRA(star.RAHours), ephem.FormatDec(star.DecDeg))
	fmt.Fprintf(w, "seen from %s\n", siteText(obs.site))
	fmt.Fprintf(w, "from %s to %s. %s\n", utcText(r.From), utcText(r.To), zoneNote(obs.zone))
	fmt.Fprintf(w, "Observable: the star above %g° (airless) and the Sun below %g° at the instant.\n\n", r.MinAltDeg, r.SunAltLimitDeg)
	if len(r.Events) == 0 {
		fmt.Fprintln(w, "No extremum is seen in this span.")
	} else {
		scale := ephem.HJD
		if r.Timescale == ephem.BJDTDB.String() {
			scale = ephem.BJDTDB
		}
		t := newTable(w)
		head := []string{"Cycle", "Kind", scale.Label(), "UTC"}
		if obs.zone != nil {
			head = append(head, "Local")
		}
		head = append(head, "Alt", "Az", "Sun", "Moon", "Window", "Observable")
		t.row(head...)
		for _, p := range r.Events {
			ev := p.event
			cells := []string{fmt.Sprintf("%g", p.Cycle), p.Kind, fmt.Sprintf("%.5f", p.EphemerisTime), utcText(p.UTC)}
			if obs.zone != nil {
				cells = append(cells, localText(p.UTC, obs.zone))
			}
			verdict := "yes"
			if !p.Observable {
				verdict = "no: " + strings.Join(p.Reasons, ", ")
			}
			cells = append(cells, fmt.Sprintf("%.1f°", p.AltDeg), fmt.Sprintf("%.0f°", p.AzDeg), fmt.Sprintf("%.1f°", p.SunAltDeg),
				fmt.Sprintf("%.0f° away, %.0f%% lit", ev.MoonSepDeg, 100*ev.MoonIllum),
				fmt.Sprintf("%.0f%% usable", 100*p.Window.UsableFraction), verdict)
			t.row(cells...)
		}
		t.flush()
		fmt.Fprintf(w, "\n%d of %d observable.\n", r.NObservable, r.N)
	}
	warned := false
	for _, p := range r.Events {
		if len(p.Warnings) > 0 && !warned {
			fmt.Fprintf(w, "\nCaution: %s\n", observe.SolarWarningText)
			warned = true
		}
	}
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "\nCaution: %s.\n", warn)
	}
}
