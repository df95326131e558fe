package observe

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"testing"
	"time"

	"example.org/vigil/ephem"
)

// edgeTargets returns invented targets at the edges of what a forecast
// meets: stars a hair from either pole of the sky (their right ascension
// drifts fast), a star with a large proper motion, a quadratic ephemeris,
// a period of about an hour and one of most of a year, and secondary minima.
func edgeTargets() []Target {
	eph := func(p, q float64, ts ephem.TimeScale) ephem.Ephemeris {
		return ephem.Ephemeris{Epoch: 2461000.37, PeriodDays: p, Q: q, Scale: ts, EpochErr: 0.002, PeriodErr: 1e-6}
	}
	mk := func(name string, ra, dec, p, q float64, sec bool) Target {
		tg := NewTarget(name, ephem.Star{RAHours: ra, DecDeg: dec}, Eclipsing, eph(p, q, ephem.BJDTDB), Min)
		tg.Secondary = sec
		return tg
	}
	out := []Target{
		mk("Pole North", 3, 89.99, 0.31, 0, false),
		mk("Pole South", 15, -89.99, 0.52, 0, true),
		mk("Near Pole", 9, 89.5, 1.7, 0, false),
		mk("Quadratic", 20, 12, 0.4, 2e-10, true),
		mk("Hourly", 1, 35, 0.042, 0, false),
		mk("Slow", 6, -20, 290, 0, true),
	}
	fast := mk("Fast Mover", 11, 5, 0.77, 0, false)
	fast.Star.PMRA, fast.Star.PMDec = 8000, -10000
	out = append(out, fast)
	return append(out, benchCatalogue(300)...)
}

// everyExtremum returns, night by night, the events a forecast keeps as
// found the straightforward way: the light time solved for every extremum
// near a dark span, and each event kept when some part of its window is
// usable or it is observable at its instant. Events are in time order, then
// target order.
func everyExtremum(t *testing.T, p *Planner, targets []Target, date time.Time, nights int) [][]Event {
	t.Helper()
	starts := make([]float64, nights+1)
	for i := range starts {
		s, err := nightStart(&p.site, date.AddDate(0, 0, i))
		if err != nil {
			t.Fatal(err)
		}
		starts[i] = s.JDUTC()
	}
	lo, hi := starts[0], starts[nights]
	tb, err := p.table(lo, hi)
	if err != nil {
		t.Fatal(err)
	}
	type found struct {
		jd float64
		i  int
		e  Event
	}
	var all []found
	var tr track
	var ws winSpans
	for i := range targets {
		tg := &targets[i]
		eph := &tg.Ephemeris
		tb.reset(&tr, tg, i)
		err := cycles(tg, tg.Secondary, lo, hi, func(cyc float64, sec bool) error {
			T := eph.At(cyc)
			hw := p.c.HalfWidthDays(eph.PeriodAt(cyc))
			if !tb.dark.meets(T-hw-seenMarginDays, T+hw+seenMarginDays) {
				return nil
			}
			jd, err := tb.seen(&tr, T)
			if err != nil || jd < lo || jd >= hi || !tb.dark.meets(jd-hw, jd+hw) {
				return err
			}
			tb.windowSpans(&tr, jd, hw, &ws)
			if !(ws.usable.total() > 0) {
				return nil
			}
			var e Event
			tb.event(&e, &tr, &p.c, cyc, sec, jd, &ws)
			if e.Observable || e.Window.UsableFraction > 0 {
				all = append(all, found{jd, i, e})
			}
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
	}
	slices.SortFunc(all, func(a, b found) int { return cmp.Or(cmp.Compare(a.jd, b.jd), cmp.Compare(a.i, b.i)) })
	out := make([][]Event, nights)
	for _, f := range all {
		n := sort.SearchFloat64s(starts[1:nights], math.Nextafter(f.jd, math.Inf(1)))
		out[n] = append(out[n], f.e)
	}
	return out
}

// TestForecastSkipsOnlyUnusable: a forecast solves the light time only for
// the extrema whose window may meet the hours of darkness with the star
// high enough (skyTable.candidates). It must hold exactly the events found
// by solving every extremum near a dark span (everyExtremum), with the same
// numbers, at sites and seasons that stress the shortcut.
func TestForecastSkipsOnlyUnusable(t *testing.T) {
	steep := Horizon{{10, 5}, {11, 60}, {14, 60}, {15, 5}, {200, 25}, {201, 0}}
	day := func(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }
	fixed := DefaultConstraints()
	fixed.WindowDays, fixed.MoonMinSepDeg = MaxWindowDays, 40
	for _, tc := range []struct {
		name              string
		lat, lon, minAlt  float64
		h                 Horizon
		c                 Constraints
		date              time.Time
		nights, minEvents int
	}{
		{"mid north, flat, 30 nights", 52, 13, 15, nil, DefaultConstraints(), day(2026, 12, 1), 30, 1000},
		{"south, steep profile, fixed windows", -33, -70, 10, steep, fixed, day(2026, 6, 10), 8, 100},
		{"equator, 100 nights over several anchors", 0, 100, -5, Horizon{{0, 3}, {180, 12}}, DefaultConstraints(), day(2027, 1, 5), 100, 1000},
		{"polar night", 78, 15, 5, nil, DefaultConstraints(), day(2026, 12, 18), 4, 50},
		{"midnight sun: no darkness", 70, 20, 10, nil, DefaultConstraints(), day(2026, 6, 18), 4, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			site, err := NewSite("Edge "+tc.name, tc.lat, tc.lon, 200, "UTC", tc.minAlt, tc.h)
			if err != nil {
				t.Fatal(err)
			}
			targets := edgeTargets()
			p, err := NewPlanner(site, tc.c)
			if err != nil {
				t.Fatal(err)
			}
			kept, err := p.Forecast(targets, tc.date, tc.nights)
			if err != nil {
				t.Fatal(err)
			}
			every := everyExtremum(t, p, targets, tc.date, tc.nights)
			total := 0
			for n := range kept {
				got := make([]string, len(kept[n].Events))
				for i, e := range kept[n].Events {
					got[i] = fmt.Sprintf("%+v", e)
				}
				want := make([]string, len(every[n]))
				for i, e := range every[n] {
					want[i] = fmt.Sprintf("%+v", e)
				}
				total += len(got)
				if len(got) != len(want) {
					t.Errorf("night %d: %d events kept, solving every extremum keeps %d", n, len(got), len(want))
					continue
				}
				for i := range got {
					if got[i] != want[i] {
						t.Errorf("night %d, event %d:\n got %s\nwant %s (every extremum solved)", n, i, got[i], want[i])
					}
				}
			}
			if total < tc.minEvents {
				t.Errorf("only %d events kept, want at least %d: the case tests too little", total, tc.minEvents)
			}
		})
	}
}

// TestCyclesNear: the cycles visited near a list of spans are exactly those
// of cycles whose ephemeris time lies within pad of one of the spans, in
// the same order.
func TestCyclesNear(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	const from, to = 2461000.5, 2461040.5
	for k := range 301 {
		p := 0.05 * math.Pow(4000, r.Float64())
		q := 0.0
		if k%3 == 0 {
			q = (r.Float64() - 0.5) * 1e-9 * p
		}
		epoch := 2460000 + p*r.Float64()
		if k >= 300 {
			// The period P + 2QE falls through zero within the span (an
			// ephemeris Validate rejects): T(E) turns back.
			p, q, epoch = 1, -1/(2*25.0), from-3
		}
		tg := NewTarget("Cycler", ephem.Star{RAHours: 1, DecDeg: 2}, Eclipsing,
			ephem.Ephemeris{Epoch: epoch, PeriodDays: p, Q: q, Scale: ephem.HJD}, Min)
		sec := k%2 == 0
		var in spans
		for x := from - 1 + r.Float64(); x < to+1; x += 0.1 + 2*r.Float64() {
			in = in.add(x, x+0.05+0.6*r.Float64())
		}
		pad := 0.3 * r.Float64()
		type visit struct {
			cyc float64
			sec bool
		}
		var got, want []visit
		errGot := cyclesNear(&tg, sec, from, to, in, pad, func(c float64, s bool) error {
			got = append(got, visit{c, s})
			return nil
		})
		errWant := cycles(&tg, sec, from, to, func(c float64, s bool) error {
			T := tg.Ephemeris.At(c)
			for _, x := range in {
				if T >= x.a-pad && T < x.b+pad {
					want = append(want, visit{c, s})
					break
				}
			}
			return nil
		})
		if errGot != nil || errWant != nil {
			t.Fatalf("P = %v: errors %v, %v", p, errGot, errWant)
		}
		if !slices.Equal(got, want) {
			t.Errorf("P = %v d, Q = %v, secondary %v, pad %.3f d: %d cycles visited, want %d\n got %v\nwant %v",
				p, q, sec, pad, len(got), len(want), got, want)
		}
	}
	// Too many events: the same error as cycles.
	tg := NewTarget("Busy", ephem.Star{}, Pulsating, ephem.Ephemeris{Epoch: 2460000, PeriodDays: 1e-4, Scale: ephem.HJD}, Max)
	e1 := cyclesNear(&tg, false, from, to, spans{{from, to}}, 0, func(float64, bool) error { return nil })
	e2 := cycles(&tg, false, from, to, func(float64, bool) error { return nil })
	if e1 == nil || e2 == nil || e1.Error() != e2.Error() {
		t.Errorf("too many events: cyclesNear says %v, cycles says %v", e1, e2)
	}
}

// TestNightKeys: keys order events by instant, then by target, to the last
// bit of the Julian date, over ephem's whole range of dates.
func TestNightKeys(t *testing.T) {
	for _, tc := range []struct {
		name        string
		start       float64
		jdA, jdB    float64
		tgA, tgB    int
		wantAFirst  bool
		wantSameJDs bool
	}{
		{"same instant: lower target first", 2461000.25, 2461000.75, 2461000.75, 9, 3, false, true},
		{"same instant, in target order", 2461000.25, 2461000.75, 2461000.75, 3, 9, true, true},
		{"one bit apart: earlier first", 2461000.25, 2461000.75, math.Nextafter(2461000.75, 3e6), 9, 3, true, false},
		{"at the start of the night", 2461000.25, 2461000.25, math.Nextafter(2461000.25, 3e6), 1, 0, true, false},
		{"almost a day in", 2461000.25, math.Nextafter(2461001.25, 0), 2461000.30, 0, 1, false, false},
		{"1620", 2312752.5, 2312752.9, math.Nextafter(2312752.9, 3e6), 5, 4, true, false},
		{"2199", 2524592.0, 2524592.7, math.Nextafter(2524592.7, 0), 5, 4, false, false},
	} {
		a, b := nightKey(tc.jdA, tc.start, tc.tgA), nightKey(tc.jdB, tc.start, tc.tgB)
		if a>>32 == b>>32 != tc.wantSameJDs {
			t.Errorf("%s: instants %.10f and %.10f share a key: %v, want %v", tc.name, tc.jdA, tc.jdB, a>>32 == b>>32, tc.wantSameJDs)
		}
		if (a < b) != tc.wantAFirst {
			t.Errorf("%s: key %#x (JD %.10f, target %d) before %#x (JD %.10f, target %d): %v, want %v",
				tc.name, a, tc.jdA, tc.tgA, b, tc.jdB, tc.tgB, a < b, tc.wantAFirst)
		}
	}
}

// TestSortKeys: the radix sort gives the order of a comparison sort, each
// key with its own place.
func TestSortKeys(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	var tmp []forecastKey
	for _, n := range []int{0, 1, 2, 7, 300, 5000} {
		keys := make([]forecastKey, n)
		for i := range keys {
			jd := 2461000.25 + r.Float64()
			if i > 0 && r.IntN(4) == 0 {
				jd = 2461000.25 + float64(keys[i-1].k>>32)*0x1p-31 // an instant taken already
			}
			keys[i] = forecastKey{k: nightKey(jd, 2461000.25, r.IntN(20000)), w: int32(r.IntN(4)), i: int32(i)}
		}
		want := slices.Clone(keys)
		slices.SortStableFunc(want, func(a, b forecastKey) int { return cmp.Compare(a.k, b.k) })
		var got []forecastKey
		got, tmp = sortKeys(keys, tmp)
		for i := range want {
			if got[i].k != want[i].k || (got[i].k != got[max(i-1, 0)].k && got[i] != want[i]) {
				t.Errorf("%d keys: key %d got %+v want %+v", n, i, got[i], want[i])
				break
			}
		}
		for i := range got {
			if orig := want[slices.IndexFunc(want, func(k forecastKey) bool { return k.i == got[i].i })]; orig != got[i] {
				t.Errorf("%d keys: key %+v lost its place (was %+v)", n, got[i], orig)
				break
			}
		}
	}
}

// TestClearHSkipping: passing over the samples that cannot change sign
// gives the very intervals of comparing every sample, and the bound it
// rests on holds between samples 0.01 h apart.
func TestClearHSkipping(t *testing.T) {
	for _, tc := range []struct {
		name   string
		lat    float64
		minAlt float64
		h      Horizon
	}{
		{"trees and a roof", 50, 20, Horizon{{0, 15}, {90, 25}, {140, 35}, {200, 10}, {300, 30}}},
		{"south, steep wall", -33, 10, Horizon{{10, 5}, {11, 60}, {14, 60}, {15, 5}, {200, 25}, {201, 0}}},
		{"equator, low", 2, -5, Horizon{{0, 3}, {180, 12}}},
		{"far north, high ridge", 78, 5, Horizon{{0, 20}, {120, 40}, {240, 2}}},
		{"flat wall", 40, 10, Horizon{{0, 25}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			site, err := NewSite("Clear "+tc.name, tc.lat, 0, 0, "UTC", tc.minAlt, tc.h)
			if err != nil {
				t.Fatal(err)
			}
			tb, err := newTable(&site, 2461000.5, 2461001.5, -12)
			if err != nil {
				t.Fatal(err)
			}
			rate := tb.clearRate
			if rate <= 0 {
				t.Fatalf("no bound for the profile")
			}
			every := *tb
			every.clearRate = 0
			bad := 0
			for dec := -89.9; dec < 90; dec += 0.37 {
				c := ephem.NewDiurnalCircle(tc.lat, dec)
				hMin, _ := c.HourAngleAt(tc.minAlt)
				got := tb.clearH(c, hMin, nil)
				want := every.clearH(c, hMin, nil)
				if !slices.Equal(got, want) {
					t.Errorf("dec %.2f: intervals %v, comparing every sample %v", dec, got, want)
				}
				// The bound without its 10% for rounding.
				hMax, _ := c.HourAngleAt(tc.h.MaxAltDeg())
				g := func(H float64) float64 {
					alt, az := c.AltAz(H)
					return alt - tc.h.AltDeg(az)
				}
				const dH = 0.01
				for H := -hMin; H+dH <= hMin; H += dH {
					if math.Abs(H) < hMax || math.Abs(H+dH) < hMax {
						continue
					}
					if d := math.Abs(g(H+dH) - g(H)); d > rate/1.1*15*dH+1e-9 && bad < 5 {
						bad++
						t.Errorf("dec %.2f, H %.2f h: the difference of altitude and profile changes by %.4f° in %.2f h, bound %.4f°",
							dec, H, d, dH, rate/1.1*15*dH)
					}
				}
			}
		})
	}
}

// TestSpansFirstFrom: the guessed search agrees with the binary search for
// any guess.
func TestSpansFirstFrom(t *testing.T) {
	s := spans{{1, 2}, {3, 4}, {4.5, 6}, {8, 9}}
	for _, x := range []float64{0, 1, 1.5, 2, 2.5, 3, 4, 4.2, 4.5, 6, 7, 9, 10} {
		for guess := -1; guess <= len(s)+1; guess++ {
			if got, want := s.firstFrom(x, guess), s.first(x); got != want {
				t.Errorf("firstFrom(%v, guess %d) = %d, want %d (first)", x, guess, got, want)
			}
		}
	}
}

// sunEdgeTol bounds how far the usable part of a window may differ between
// sky tables over different spans when darkness bounds it: each table finds
// the Sun's crossings of the limit from its own samples, to 0.2 s
// (ephem.SkySpan), at both ends of the window.
const sunEdgeTol = 0.4 / secPerDay

// TestWindowsIndependentOfSpan: an event's coverage window depends only on
// the target and the event's own time, at a site with a horizon profile:
// the plan of one night (Night) and a forecast of 30 nights (with and
// without KeepAll) give the same verdict, reasons and edges, and the same
// usable fraction to the last bit where the window lies wholly in darkness
// (elsewhere to the Sun's crossings, sunEdgeTol). The span crosses a
// boundary of the anchors' grid (anchorStepDays) in 2027 January.
func TestWindowsIndependentOfSpan(t *testing.T) {
	site := benchSite(t)
	targets := benchCatalogue(2000)
	p, err := NewPlanner(site, DefaultConstraints())
	if err != nil {
		t.Fatal(err)
	}
	all := *p
	all.c.KeepAll = true
	date := time.Date(2026, 12, 20, 0, 0, 0, 0, time.UTC)
	const nights = 30
	kept, err := p.Forecast(targets, date, nights)
	if err != nil {
		t.Fatal(err)
	}
	every, err := all.Forecast(targets, date, nights)
	if err != nil {
		t.Fatal(err)
	}
	type id struct {
		target int
		cycle  float64
	}
	byID := func(evs []Event) map[id]Event {
		m := make(map[id]Event, len(evs))
		for _, e := range evs {
			m[id{e.TargetIndex, e.Cycle}] = e
		}
		return m
	}
	// KeepAll solves every extremum; the plans keep some: the same events
	// must come out bit for bit.
	for n := range kept {
		m := byID(every[n].Events)
		for _, e := range kept[n].Events {
			w, ok := m[id{e.TargetIndex, e.Cycle}]
			if got, want := fmt.Sprintf("%+v", e), fmt.Sprintf("%+v", w); !ok || got != want {
				t.Errorf("night %d, target %d cycle %v:\n got %s\nwant %s (KeepAll)", n, e.TargetIndex, e.Cycle, got, want)
			}
		}
	}
	exact, near := 0, 0
	for _, n := range []int{0, 12, 13, 14, 29} {
		one, err := p.Night(targets, date.AddDate(0, 0, n))
		if err != nil {
			t.Fatal(err)
		}
		m := byID(kept[n].Events)
		for _, w := range one.Events {
			g, ok := m[id{w.TargetIndex, w.Cycle}]
			if !ok {
				t.Errorf("night %d: target %d cycle %v (usable %.6f) planned for the night, missing from the forecast",
					n, w.TargetIndex, w.Cycle, w.Window.UsableFraction)
				continue
			}
			gw, ww := g.Window, w.Window
			gw.UsableFraction, ww.UsableFraction = 0, 0
			dark := w.Window.Reasons&(Twilight|Daylight) == 0
			d := (g.Window.UsableFraction - w.Window.UsableFraction) * 2 * w.Window.HalfWidthDays
			switch {
			case g.Observable != w.Observable || g.Reasons != w.Reasons || gw != ww:
				t.Errorf("night %d, target %d cycle %v: forecast %v %q window %+v, night plan %v %q window %+v",
					n, w.TargetIndex, w.Cycle, g.Observable, g.Reasons, g.Window, w.Observable, w.Reasons, w.Window)
			case dark && d != 0:
				t.Errorf("night %d, target %d cycle %v, window wholly dark: usable %v in the forecast, %v in the night plan: diff %.3g s, want 0",
					n, w.TargetIndex, w.Cycle, g.Window.UsableFraction, w.Window.UsableFraction, d*secPerDay)
			case math.Abs(d) > sunEdgeTol:
				t.Errorf("night %d, target %d cycle %v: usable %v in the forecast, %v in the night plan: diff %.3g s, tol %.3g s",
					n, w.TargetIndex, w.Cycle, g.Window.UsableFraction, w.Window.UsableFraction, d*secPerDay, sunEdgeTol*secPerDay)
			}
			if dark {
				exact++
			} else {
				near++
			}
		}
	}
	if exact < 500 || near < 100 {
		t.Errorf("compared %d wholly dark windows and %d others, want at least 500 and 100: the case tests too little", exact, near)
	}
}
