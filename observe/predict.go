package observe

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
)

// Event is one predicted extremum of a target and how well it can be
// observed from the site.
type Event struct {
	Target      string // the target's name
	TargetIndex int    // its index in the list the caller gave
	Kind        Kind   // what the extremum is (a secondary minimum is Min)
	Secondary   bool   // a secondary minimum at a half-integer cycle
	Cycle       float64
	// EphemerisJD is T0 + P·E (+ Q·E²), the Julian date on Scale at which
	// the extremum happens; SigmaDays its uncertainty from σT0 and σP
	// (ephem.Ephemeris.Sigma), growing with |E|.
	EphemerisJD float64
	Scale       ephem.TimeScale
	SigmaDays   float64
	// UTC is the instant at which the extremum is seen at the telescope
	// (light time to the Sun's centre or the barycentre removed); Local is
	// the same instant in the site's time zone.
	UTC   ephem.Time
	Local time.Time
	// Where the star stands then: airless altitude, azimuth from north
	// through east, air mass (Pickering 2002; NaN below the horizon).
	AltDeg, AzDeg, Airmass float64
	SunAltDeg, SunSepDeg   float64
	MoonAltDeg, MoonSepDeg float64 // topocentric Moon
	MoonIllum              float64 // illuminated fraction 0..1
	// Observable is the verdict at the instant of the extremum; Reasons says
	// why not.
	Observable bool
	Reasons    Reasons
	Window     Coverage
	// SolarWarning is set when the Sun is up and the star is within
	// SolarWarningSepDeg of it: show SolarWarningText.
	SolarWarning bool
	// Score ranks the event in a plan (see the package documentation).
	Score float64
}

// Coverage is the verdict over the window around an extremum.
type Coverage struct {
	Start, End    ephem.Time
	HalfWidthDays float64
	// UsableFraction is the part of the window in which the star is
	// observable; Whole is set when all of it is (and the extremum itself).
	UsableFraction float64
	Whole          bool
	Reasons        Reasons // why parts of the window are not usable
}

// eventTol is the tolerance (days, about 0.09 s) below which a window
// counts as wholly usable, and a usable part of it as none.
const eventTol = 1e-6

// event evaluates, into e, the extremum at cycle of track tr, seen at jd
// (UTC), whose coverage window ws holds (see windowSpans).
func (tb *skyTable) event(e *Event, tr *track, c *Constraints, cycle float64, secondary bool, jd float64, ws *winSpans) {
	tg := tr.tg
	eph := &tg.Ephemeris
	T := eph.At(cycle)
	*e = Event{
		Target: tg.Name, TargetIndex: tr.idx, Kind: tg.eventKind(secondary), Secondary: secondary,
		Cycle: cycle, EphemerisJD: T, Scale: eph.Scale, SigmaDays: eph.Sigma(cycle),
		UTC: mustTime(jd),
	}
	e.Local = e.UTC.Time().In(tb.site.Location())
	cs := tb.span.Circumstances(&tr.v, e.UTC)
	e.AltDeg, e.AzDeg = cs.StarAltDeg, cs.StarAzDeg
	e.Airmass = math.NaN()
	if e.AltDeg > -1 {
		if x, ok := ephem.Airmass(ephem.RefractedAltDeg(e.AltDeg)); ok {
			e.Airmass = x
		}
	}
	e.SunAltDeg, e.SunSepDeg = cs.SunAltDeg, cs.SunSepDeg
	e.MoonAltDeg, e.MoonSepDeg, e.MoonIllum = cs.MoonAltDeg, cs.MoonSepDeg, cs.MoonIllum
	e.SolarWarning = e.SunAltDeg > ephem.SunriseAltDeg && e.SunSepDeg < SolarWarningSepDeg

	// The verdict at the instant.
	site := tb.site
	if !(e.SunAltDeg < c.SunAltDeg) {
		if e.SunAltDeg > ephem.SunriseAltDeg {
			e.Reasons |= Daylight
		} else {
			e.Reasons |= Twilight
		}
	}
	if !(e.AltDeg > site.MinAltDeg) {
		e.Reasons |= TooLow
	} else if len(site.Horizon) > 0 && !(e.AltDeg > site.Horizon.AltDeg(e.AzDeg)) {
		e.Reasons |= BehindHorizon
	}
	if c.MoonMinSepDeg > 0 && e.MoonAltDeg > 0 && e.MoonSepDeg < c.MoonMinSepDeg {
		e.Reasons |= MoonTooClose
	}
	e.Observable = e.Reasons == 0

	// The verdict over the window.
	lo, hi := ws.lo, ws.hi
	w := (hi - lo) / 2
	cv := &e.Window
	cv.Start, cv.End, cv.HalfWidthDays = mustTime(lo), mustTime(hi), w
	good := ws.usable.total()
	moonBad := tb.moonBad(tr, c, ws, jd, e.MoonSepDeg)
	if free := good - moonBad; free >= eventTol { // shorter is rounding: none
		cv.UsableFraction = free / (2 * w)
	}
	if moonBad > 0 {
		cv.Reasons |= MoonTooClose
	}
	if good < 2*w-eventTol {
		hiM := ws.high.total()
		if hiM < 2*w-eventTol {
			cv.Reasons |= TooLow
		}
		if ws.hc.total() < hiM-eventTol {
			cv.Reasons |= BehindHorizon
		}
		if tb.dark.measure(lo, hi) < 2*w-eventTol {
			if tb.night.measure(lo, hi) < 2*w-eventTol {
				cv.Reasons |= Daylight
			} else {
				cv.Reasons |= Twilight
			}
		}
	}
	cv.Whole = e.Observable && cv.Reasons == 0 && cv.UsableFraction >= 1-eventTol
	e.Score = score(e, tg)
}

// moonStepCheck is the step (days, 5 minutes) at which the Moon's distance
// is checked across a window. moonRate bounds how fast the topocentric Moon
// moves against the stars (degrees per day: its orbital motion, at most
// about 15.4° per day, plus the change of its diurnal parallax, under 6.3°),
// and moonAltRate how fast its altitude changes (the Earth's rotation,
// 361° per day, plus its own motion).
const (
	moonStepCheck = 5.0 / 1440
	moonRate      = 24.0
	moonAltRate   = 375.0
)

// moonBad returns the length (days) of the usable part of the window around
// jd in which the Moon is up and closer than the limit, checked every
// moonStepCheck (ephem.SkySpan.Circumstances). A check whose Moon is far
// from changing state (by moonRate and moonAltRate) stands for the checks
// that follow it within that margin.
func (tb *skyTable) moonBad(tr *track, c *Constraints, ws *winSpans, jd, sepAtJD float64) float64 {
	w := math.Max(jd-ws.lo, ws.hi-jd)
	lim := c.MoonMinSepDeg
	if lim <= 0 || sepAtJD-moonRate*w > lim {
		return 0
	}
	bad := 0.0
	ws.usable.each(ws.lo, ws.hi, func(a, b float64) {
		n := int(math.Ceil((b - a) / moonStepCheck))
		dt := (b - a) / float64(n)
		for i := 0; i < n; {
			cs := tb.span.Circumstances(&tr.v, mustTime(a+(float64(i)+0.5)*dt))
			up, near := cs.MoonAltDeg/moonAltRate, (lim-cs.MoonSepDeg)/moonRate // days
			isBad := up > 0 && near > 0
			margin := math.Max(-up, -near) // days until it can turn bad
			if isBad {
				margin = math.Min(up, near) // days until it can turn good
			}
			k := min(n-i, 1+int(margin/dt*(1-1e-9)))
			if isBad {
				bad += float64(k) * dt
			}
			i += k
		}
	})
	return bad
}

// seenMarginDays bounds |UTC instant − ephemeris time| of any event: the
// light time across the Earth's orbit (under 0.006 d) plus TT − UTC or ΔT
// (under 0.002 d from 1620 on, Meeus 1998 table 10.A).
const seenMarginDays = 0.02

// cycles calls fn, in time order, for every cycle (and, with secondary,
// half cycle) whose event could be seen in [from, to): those whose
// ephemeris time lies within seenMarginDays of the span. It stops at the
// first error fn returns.
func cycles(tg *Target, secondary bool, from, to float64, fn func(cycle float64, sec bool) error) error {
	eph := &tg.Ephemeris
	e0, e1, err := cycleRange(tg, secondary, from, to)
	if err != nil {
		return err
	}
	call := func(cyc float64, sec bool) error {
		if T := eph.At(cyc); T < from-seenMarginDays || T >= to+seenMarginDays {
			return nil
		}
		return fn(cyc, sec)
	}
	for e := e0; e <= e1; e++ {
		if secondary && e > e0 {
			if err := call(e-0.5, true); err != nil {
				return err
			}
		}
		if err := call(e, false); err != nil {
			return err
		}
	}
	return nil
}

// cycleRange returns the first and last whole cycles cycles visits, or an
// error when the span holds more than maxEventsPerRun events of tg.
func cycleRange(tg *Target, secondary bool, from, to float64) (e0, e1 float64, err error) {
	eph := &tg.Ephemeris
	e0 = math.Floor(eph.Cycle(from-seenMarginDays)) - 1
	e1 = math.Ceil(eph.Cycle(to+seenMarginDays)) + 1
	n := e1 - e0
	if secondary {
		n *= 2
	}
	if n > maxEventsPerRun {
		return 0, 0, fmt.Errorf("observe: target %q: %.0f events from %s to %s: at most %d; shorten the span",
			tg.Name, n, mustTime(from), mustTime(to), maxEventsPerRun)
	}
	return e0, e1, nil
}

// cyclesNear calls fn, as cycles does, for those of its cycles whose
// ephemeris time T lies within pad of the spans in (that is, in one of the
// spans widened by pad on each side), in time order. It gives the same
// error as cycles when the span holds too many events.
func cyclesNear(tg *Target, secondary bool, from, to float64, in spans, pad float64, fn func(cycle float64, sec bool) error) error {
	eph := &tg.Ephemeris
	e0, e1, err := cycleRange(tg, secondary, from, to)
	if err != nil {
		return err
	}
	if !(eph.PeriodAt(e0) > 0 && eph.PeriodAt(e1) > 0) {
		// T(E) is not monotonic over the span (Ephemeris.Validate rules
		// this out within the supported range): test every cycle.
		return cycles(tg, secondary, from, to, func(cyc float64, sec bool) error {
			if T := eph.At(cyc); !in.meets(T-pad, math.Nextafter(T+pad, math.Inf(1))) {
				return nil
			}
			return fn(cyc, sec)
		})
	}
	lo, hi := from-seenMarginDays, to+seenMarginDays
	step := 1.0
	if secondary {
		step = 0.5
	}
	done := math.Inf(-1)     // ephemeris times below it have been visited
	c, started := 0.0, false // the next cycle to try
	for _, s := range in {
		a, b := max(s.a-pad, lo, done), min(s.b+pad, hi)
		if !(b > a) {
			continue
		}
		done = b
		if !started || eph.At(c) < a {
			c0 := math.Floor(eph.Cycle(a)/step)*step - step // at or before the first at a
			if !started || c0 > c {
				c, started = c0, true
			}
		}
		for ; ; c += step {
			T := eph.At(c)
			if T >= b {
				break
			}
			if T >= a {
				if err := fn(c, c != math.Floor(c)); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// seen returns the Julian date (UTC) at which the extremum at ephemeris time
// T is seen at the site (ephem.SkySpan.SeenAt, within a millisecond of
// ephem.SeenAt).
func (tb *skyTable) seen(tr *track, T float64) (float64, error) {
	t, err := tb.span.SeenAt(tr.tg.Ephemeris.Scale, T, &tr.v)
	if err != nil {
		return 0, fmt.Errorf("observe: target %q: %w", tr.tg.Name, err)
	}
	return t.JDUTC(), nil
}

// Predict returns every extremum of target t whose UTC instant lies in
// [from, to), in time order, each with its verdict at the site under the
// constraints c (see Planner.Predict).
func Predict(site Site, t Target, from, to ephem.Time, c Constraints) ([]Event, error) {
	p, err := NewPlanner(site, c)
	if err != nil {
		return nil, err
	}
	return p.Predict(t, from, to)
}
