package observe

import (
	"cmp"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
	"time"

	"example.org/vigil/ephem"
)

// Planner predicts and plans for one site under one set of constraints.
// It is safe for concurrent use; each call computes its own sky table.
type Planner struct {
	site Site
	c    Constraints
}

// NewPlanner checks the site and the constraints and returns a planner.
func NewPlanner(site Site, c Constraints) (*Planner, error) {
	if err := site.Validate(); err != nil {
		return nil, err
	}
	if err := c.Validate(); err != nil {
		return nil, err
	}
	return &Planner{site: site, c: c}, nil
}

// Site returns the planner's site.
func (p *Planner) Site() Site { return p.site }

// Constraints returns the planner's constraints.
func (p *Planner) Constraints() Constraints { return p.c }

// table builds the sky table for [from, to) with room for the windows.
func (p *Planner) table(from, to float64) (*skyTable, error) {
	pad := p.c.maxHalfWidth() + 0.05
	if _, err := ephem.FromJDUTC(from - pad); err != nil {
		return nil, fmt.Errorf("observe: span start: %w", err)
	}
	if _, err := ephem.FromJDUTC(to + pad); err != nil {
		return nil, fmt.Errorf("observe: span end: %w", err)
	}
	return newTable(&p.site, from-pad, to+pad, p.c.SunAltDeg)
}

// Predict returns every extremum of target t whose UTC instant lies in
// [from, to) (an event exactly at from is included, one exactly at to is
// not), in time order: primary extrema at whole cycles E and, when
// t.Secondary is set, secondary minima at E + 0.5. Each event carries its
// ephemeris time, the instant it is seen at the site, where the star, the
// Sun and the Moon stand then, the verdict at that instant and over the
// coverage window, and its score. The span may be up to MaxSpanDays long.
//
// Accuracy (engine_test.go, predict_test.go): the UTC instant agrees with
// ephem.SeenAt to 1 ms and with astropy to 0.04 s (testdata/predict); the
// star's, the Sun's and the Moon's places with ephem's full computation to
// 0.3″, 0.3″ and 0.5″; the usable fraction of a window with ephem sampled
// every 30 s to within the sampling.
func (p *Planner) Predict(t Target, from, to ephem.Time) ([]Event, error) {
	if err := t.Validate(); err != nil {
		return nil, err
	}
	if err := validSpan(from, to); err != nil {
		return nil, err
	}
	tb, err := p.table(from.JDUTC(), to.JDUTC())
	if err != nil {
		return nil, err
	}
	var tr track
	tb.reset(&tr, &t, 0)
	var out []Event
	var ws winSpans
	lo, hi := from.JDUTC(), to.JDUTC()
	err = cycles(&t, t.Secondary, lo, hi, func(cyc float64, sec bool) error {
		jd, err := tb.seen(&tr, t.Ephemeris.At(cyc))
		if err != nil || jd < lo || jd >= hi {
			return err
		}
		tb.windowSpans(&tr, jd, p.c.HalfWidthDays(t.Ephemeris.PeriodAt(cyc)), &ws)
		out = append(out, Event{})
		tb.event(&out[len(out)-1], &tr, &p.c, cyc, sec, jd, &ws)
		return nil
	})
	if err != nil {
		return nil, err
	}
	return out, nil
}

// NightPlan is one night at the site: its twilights and the events in it.
type NightPlan struct {
	Date       time.Time  // the civil date the night begins on (0h UTC of it)
	Start, End ephem.Time // local mean noon to local mean noon, as ephem.NightOf
	Twilights  Twilights
	// Events are the extrema seen between Start and End, in time order:
	// those with some usable part of their window (all of them with
	// Constraints.KeepAll).
	Events []Event
}

// Twilights holds the Sun's crossings of the standard altitudes in a night
// (first downward, last upward; not OK when it does not happen), and the
// dark span in which the Sun is below the planner's limit.
type Twilights struct {
	Sunset, Sunrise            ephem.Event // −0.8333°
	CivilDusk, CivilDawn       ephem.Event // −6°
	NauticalDusk, NauticalDawn ephem.Event // −12°
	AstroDusk, AstroDawn       ephem.Event // −18°
	DarkFrom, DarkTo           ephem.Event // Constraints.SunAltDeg
}

// Ranked returns the night's events best first (highest Score; ties in time
// order). The plan itself stays in time order.
func (n NightPlan) Ranked() []Event {
	out := slices.Clone(n.Events)
	slices.SortStableFunc(out, func(a, b Event) int { return cmp.Compare(b.Score, a.Score) })
	return out
}

// nightStart returns the start of the night of date: local mean noon
// (UTC + longitude/15 h), as ephem.NightOf counts it.
func nightStart(site *Site, date time.Time) (ephem.Time, error) {
	d := time.Date(date.Year(), date.Month(), date.Day(), 0, 0, 0, 0, time.UTC)
	noon := d.Add(12*time.Hour - time.Duration(site.LonDeg/15*float64(time.Hour)))
	t, err := ephem.FromTime(noon)
	if err != nil {
		return ephem.Time{}, fmt.Errorf("observe: night of %s: %w", d.Format("2006-01-02"), err)
	}
	return t, nil
}

// Night returns the plan of the night of date (year, month and day are
// used): every event of the targets seen in it, in time order.
func (p *Planner) Night(targets []Target, date time.Time) (NightPlan, error) {
	ns, err := p.Forecast(targets, date, 1)
	if err != nil {
		return NightPlan{}, err
	}
	return ns[0], nil
}

// Forecast returns the plans of nights consecutive nights starting with the
// night of date (1 ≤ nights ≤ MaxSpanDays). The targets are spread over
// goroutines; the sky (Sun, Moon, sidereal time, light-time geometry and the
// dark spans) is computed once for all of them. Unless Constraints.KeepAll
// is set, only the extrema whose window may meet the hours in which the Sun
// is below the limit and the star above the site's lowest altitude are
// solved (see skyTable.candidates); the others have no usable part.
func (p *Planner) Forecast(targets []Target, date time.Time, nights int) ([]NightPlan, error) {
	if nights < 1 || nights > MaxSpanDays {
		return nil, fmt.Errorf("observe: forecast of %d nights: want 1 to %d", nights, MaxSpanDays)
	}
	for i := range targets {
		if err := targets[i].Validate(); err != nil {
			return nil, fmt.Errorf("target %d: %w", i+1, err)
		}
	}
	starts := make([]float64, nights+1)
	plans := make([]NightPlan, nights)
	for i := range starts {
		s, err := nightStart(&p.site, date.AddDate(0, 0, i))
		if err != nil {
			return nil, err
		}
		starts[i] = s.JDUTC()
	}
	lo, hi := starts[0], starts[nights]
	tb, err := p.table(lo, hi)
	if err != nil {
		return nil, err
	}
	for i := range plans {
		d := date.AddDate(0, 0, i)
		plans[i] = NightPlan{Date: time.Date(d.Year(), d.Month(), d.Day(), 0, 0, 0, 0, time.UTC),
			Start: mustTime(starts[i]), End: mustTime(starts[i+1])}
	}

	// Each worker takes the targets a chunk at a time and keeps its events
	// night by night, in fixed blocks (no copying on growth; reused between
	// calls), with a key for each. Each night's keys are then sorted and its
	// events copied once, in time order, into the night's slice.
	workers := runtime.GOMAXPROCS(0)
	outs := make([]*forecastOut, workers)
	for w := range outs {
		outs[w] = getOut(starts)
	}
	defer func() {
		for _, o := range outs {
			o.release()
		}
	}()
	var next atomic.Int64
	var wg sync.WaitGroup
	const chunk = 16
	for w := range outs {
		wg.Add(1)
		go func(fc *forecaster) {
			defer wg.Done()
			for {
				i0 := int(next.Add(chunk)) - chunk
				if i0 >= len(targets) {
					return
				}
				for i := i0; i < min(i0+chunk, len(targets)); i++ {
					if err := fc.target(&targets[i], i); err != nil && fc.o.err == nil {
						fc.o.err, fc.o.errAt = fmt.Errorf("target %d: %w", i+1, err), i
					}
				}
			}
		}(&forecaster{p: p, tb: tb, starts: starts, o: outs[w], w: int32(w)})
	}
	wg.Wait()
	var first *forecastOut // the error of the first target that has one
	for _, o := range outs {
		if o.err != nil && (first == nil || o.errAt < first.errAt) {
			first = o
		}
	}
	if first != nil {
		return nil, first.err
	}

	// The nights' events, sorted and copied night by night in parallel,
	// with the twilights.
	var nextNight atomic.Int64
	for range min(workers, nights) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var keys, tmp []forecastKey
			for {
				n := int(nextNight.Add(1)) - 1
				if n >= nights {
					return
				}
				plans[n].Twilights = tb.twilight(starts[n], starts[n+1])
				keys = keys[:0]
				for _, o := range outs {
					keys = append(keys, o.nights[n].keys...)
				}
				keys, tmp = sortKeys(keys, tmp)
				dst := make([]Event, len(keys))
				for j, k := range keys {
					dst[j] = *outs[k.w].nights[n].at(k.i)
				}
				plans[n].Events = dst
			}
		}()
	}
	wg.Wait()
	return plans, nil
}

// twilight finds the Sun's crossings in [from, to).
func (tb *skyTable) twilight(from, to float64) Twilights {
	var tw Twilights
	f, t := mustTime(from), mustTime(to)
	set := func(level float64, dusk, dawn *ephem.Event) {
		for _, c := range tb.span.SunCrossings(level, f, t) {
			if !c.Rising && !dusk.OK {
				*dusk = ephem.Event{At: c.At, OK: true}
			}
			if c.Rising {
				*dawn = ephem.Event{At: c.At, OK: true}
			}
		}
	}
	set(ephem.SunriseAltDeg, &tw.Sunset, &tw.Sunrise)
	set(ephem.CivilAltDeg, &tw.CivilDusk, &tw.CivilDawn)
	set(ephem.NauticalAltDeg, &tw.NauticalDusk, &tw.NauticalDawn)
	set(ephem.AstronomicalAltDeg, &tw.AstroDusk, &tw.AstroDawn)
	if i := tb.dark.first(from); i < len(tb.dark) && tb.dark[i].a < to {
		tw.DarkFrom = ephem.Event{At: mustTime(max(tb.dark[i].a, from)), OK: true}
		j := i
		for j+1 < len(tb.dark) && tb.dark[j+1].a < to {
			j++
		}
		tw.DarkTo = ephem.Event{At: mustTime(min(tb.dark[j].b, to)), OK: true}
	}
	return tw
}

// AgeScaleDays is the age of a star's last timing at which the ranking's
// age term saturates (one observing season, common practice).
const AgeScaleDays = 365.0

// score ranks an event (see the package documentation):
//
//	S = C · (1 + B) · (1 + A + U) / 6,  in [0, 1]
//
// C the usable fraction of the window, B = 1 when the whole window (and the
// extremum) is usable, A = min(age/AgeScaleDays, 1) for the age of the last
// timing (1 when there is none), U = min(σ/w, 1) for the prediction's
// uncertainty σ against the window's half-width w.
func score(e *Event, tg *Target) float64 {
	cov := e.Window.UsableFraction
	if cov <= 0 {
		return 0
	}
	b := 0.0
	if e.Window.Whole {
		b = 1
	}
	a := 1.0
	if tg.LastTimingJD != 0 {
		a = math.Max(0, math.Min((e.EphemerisJD-tg.LastTimingJD)/AgeScaleDays, 1))
	}
	u := math.Min(e.SigmaDays/e.Window.HalfWidthDays, 1)
	return cov * (1 + b) * (1 + a + u) / 6
}
