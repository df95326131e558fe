package ephem

import (
	"math"
	"strings"
	"testing"
	"time"
)

// tolNightEventSec is the tolerance on the Sun's rise, set and twilight times
// against astropy: ephem's Sun is good to about 0.01° (Meeus 1998, ch. 25),
// which moves these events by up to 5 s at the sites below (the Sun's
// altitude changes by 7–10° an hour there); astropy's times are rounded to
// 1 s.
const tolNightEventSec = 6.0

// tolEventAltDeg is the tolerance on the Sun's (or Moon's) altitude at the
// instant of an event: the instants are refined to 0.05 s, in which the
// altitude moves by under 0.3″.
const tolEventAltDeg = 1 * arcsecDeg

func date(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }

// TestNightOfAstropy compares dusk and dawn with astropy 5.2.1 (methods.md §5,
// [A]; Sun's centre at −0.8333°, −6°, −12°, −18°, airless). astropy's values
// are for one UT date: its evening events are the dusks of that date's
// night, its morning events the dawns of the night before.
func TestNightOfAstropy(t *testing.T) {
	const source = "astropy 5.2.1, methods.md §5"
	mid := Site{Name: "50N 10E", LatDeg: 50, LonDeg: 10}
	greenwich := Site{Name: "Greenwich", LatDeg: 51.4779, LonDeg: -0.0015}
	type ev struct {
		name string
		get  func(*Night) Event
		iso  string
	}
	cases := []struct {
		name   string
		site   Site
		night  time.Time
		events []ev
	}{
		{"50N 10E evening of 2024-12-21", mid, date(2024, 12, 21), []ev{
			{"sunset", func(n *Night) Event { return n.Sunset }, "2024-12-21T15:20:27Z"},
			{"civil dusk", func(n *Night) Event { return n.CivilDusk }, "2024-12-21T15:58:59Z"},
			{"nautical dusk", func(n *Night) Event { return n.NauticalDusk }, "2024-12-21T16:40:35Z"},
			{"astronomical dusk", func(n *Night) Event { return n.AstroDusk }, "2024-12-21T17:20:04Z"},
		}},
		{"50N 10E morning of 2024-12-21", mid, date(2024, 12, 20), []ev{
			{"astronomical dawn", func(n *Night) Event { return n.AstroDawn }, "2024-12-21T05:16:29Z"},
			{"nautical dawn", func(n *Night) Event { return n.NauticalDawn }, "2024-12-21T05:55:58Z"},
			{"civil dawn", func(n *Night) Event { return n.CivilDawn }, "2024-12-21T06:37:34Z"},
			{"sunrise", func(n *Night) Event { return n.Sunrise }, "2024-12-21T07:16:06Z"},
		}},
		{"Greenwich evening of 2024-03-20", greenwich, date(2024, 3, 20), []ev{
			{"sunset", func(n *Night) Event { return n.Sunset }, "2024-03-20T18:13:50Z"},
			{"civil dusk", func(n *Night) Event { return n.CivilDusk }, "2024-03-20T18:47:11Z"},
			{"nautical dusk", func(n *Night) Event { return n.NauticalDusk }, "2024-03-20T19:26:39Z"},
			{"astronomical dusk", func(n *Night) Event { return n.AstroDusk }, "2024-03-20T20:07:49Z"},
		}},
		{"Greenwich morning of 2024-03-20", greenwich, date(2024, 3, 19), []ev{
			{"astronomical dawn", func(n *Night) Event { return n.AstroDawn }, "2024-03-20T04:08:21Z"},
			{"nautical dawn", func(n *Night) Event { return n.NauticalDawn }, "2024-03-20T04:49:16Z"},
			{"civil dawn", func(n *Night) Event { return n.CivilDawn }, "2024-03-20T05:28:34Z"},
			{"sunrise", func(n *Night) Event { return n.Sunrise }, "2024-03-20T06:01:49Z"},
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			n, err := NightOf(c.site, c.night)
			if err != nil {
				t.Fatal(err)
			}
			for _, e := range c.events {
				want, _ := ParseInstant(e.iso)
				got := e.get(&n)
				if !got.OK {
					t.Errorf("%s: none, want %s (%s)", e.name, e.iso, source)
					continue
				}
				if d := got.At.Sub(want) * secPerDay; math.Abs(d) > tolNightEventSec {
					t.Errorf("%s = %s, want %s (%s), diff %.1f s, tol %.0f s", e.name, got.At, e.iso, source, d, tolNightEventSec)
				}
			}
		})
	}
}

// sunEvents lists a night's Sun events with their altitudes, in the order
// they happen when all happen.
func sunEvents(n *Night) []struct {
	name string
	e    Event
	alt  float64
} {
	return []struct {
		name string
		e    Event
		alt  float64
	}{
		{"sunset", n.Sunset, SunriseAltDeg},
		{"civil dusk", n.CivilDusk, CivilAltDeg},
		{"nautical dusk", n.NauticalDusk, NauticalAltDeg},
		{"astronomical dusk", n.AstroDusk, AstronomicalAltDeg},
		{"astronomical dawn", n.AstroDawn, AstronomicalAltDeg},
		{"nautical dawn", n.NauticalDawn, NauticalAltDeg},
		{"civil dawn", n.CivilDawn, CivilAltDeg},
		{"sunrise", n.Sunrise, SunriseAltDeg},
	}
}

// checkNightInvariants checks what must hold for any night: the span is
// local mean noon to local mean noon, every event lies in it, the Sun (or
// Moon) stands at the event's altitude, the events that happen are in order,
// and the Moon's events lie in the dark span.
func checkNightInvariants(t *testing.T, site Site, n *Night) {
	t.Helper()
	noon := n.Date.Add(12*time.Hour - time.Duration(site.LonDeg/15*float64(time.Hour)))
	if d := n.Start.Time().Sub(noon); d.Abs() > time.Millisecond {
		t.Errorf("Start = %s, want local mean noon %s (UTC + lon/15 h)", n.Start, FormatISO(noon))
	}
	if d := n.End.Sub(n.Start); math.Abs(d-1) > 1e-9 {
		t.Errorf("End − Start = %v d, want 1 d", d)
	}
	var prev Time
	for _, ev := range sunEvents(n) {
		if !ev.e.OK {
			continue
		}
		at := ev.e.At
		if at.Before(n.Start) || !at.Before(n.End) {
			t.Errorf("%s %s outside the night %s – %s", ev.name, at, n.Start, n.End)
		}
		if alt := NewSky(site, at).Sun().AltDeg; math.Abs(alt-ev.alt) > tolEventAltDeg {
			t.Errorf("Sun altitude at %s (%s) = %.5f°, want %.4f°", ev.name, at, alt, ev.alt)
		}
		if prev.Valid() && at.Before(prev) {
			t.Errorf("%s %s comes before the event listed ahead of it (%s)", ev.name, at, prev)
		}
		prev = at
	}
	for _, ev := range []struct {
		name string
		e    Event
	}{{"moonrise", n.Moonrise}, {"moonset", n.Moonset}} {
		if !ev.e.OK {
			continue
		}
		if alt := MoonCentre.Position(NewSky(site, ev.e.At)).AltDeg; math.Abs(alt-MoonriseAltDeg) > tolEventAltDeg {
			t.Errorf("Moon altitude at %s (%s) = %.5f°, want %.3f°", ev.name, ev.e.At, alt, MoonriseAltDeg)
		}
		if (n.Sunset.OK && ev.e.At.Before(n.Sunset.At)) || (n.Sunrise.OK && ev.e.At.After(n.Sunrise.At)) {
			t.Errorf("%s %s outside the dark span %v – %v", ev.name, ev.e.At, n.Sunset, n.Sunrise)
		}
	}
	if !(n.MoonIllum >= 0 && n.MoonIllum <= 1) {
		t.Errorf("MoonIllum = %v, want in [0, 1]", n.MoonIllum)
	}
	if n.MoonIllumAt.Before(n.Start) || n.MoonIllumAt.After(n.End) {
		t.Errorf("MoonIllumAt %s outside the night", n.MoonIllumAt)
	}
	if k := NewSky(site, n.MoonIllumAt).MoonIllumination(); math.Abs(k-n.MoonIllum) > 1e-9 {
		t.Errorf("MoonIllum = %.6f, but the Moon at MoonIllumAt has %.6f", n.MoonIllum, k)
	}
	if n.SunAlwaysUp && n.SunAlwaysDown {
		t.Error("SunAlwaysUp and SunAlwaysDown both set")
	}
}

func TestNightPolarAndSummer(t *testing.T) {
	arctic := Site{Name: "78N 15E", LatDeg: 78, LonDeg: 15}
	north55 := Site{Name: "55N 3W", LatDeg: 55, LonDeg: -3}
	// The Sun's lowest altitude is −(90° − φ − δ) at lower culmination: at
	// 78° N in June (δ = +23.44°) +11.4°, at 55° N −11.6° (above −12°, so no
	// nautical or astronomical night); at 78° N in December its highest is
	// 90° − 78° − 23.44° = −11.4° (polar night: no civil twilight either).
	// Obliquity 23.44° (Meeus 1998, eq. 22.2 at 2024).
	type want struct {
		alwaysUp, alwaysDown                   bool
		set, civil, nautical, astro, sunriseOK bool
	}
	cases := []struct {
		name string
		site Site
		day  time.Time
		want want
	}{
		{"midnight sun, 78° N in June", arctic, date(2024, 6, 21), want{alwaysUp: true}},
		{"polar night, 78° N in December", arctic, date(2024, 12, 21), want{alwaysDown: true, nautical: true, astro: true}},
		{"white night, 55° N at the June solstice", north55, date(2024, 6, 21), want{set: true, civil: true, sunriseOK: true}},
		{"midnight sun, 78° S in December", Site{Name: "78S 166E", LatDeg: -78, LonDeg: 166.7}, date(2024, 12, 21), want{alwaysUp: true}},
		{"ordinary night, 55° N in December", north55, date(2024, 12, 21), want{set: true, civil: true, nautical: true, astro: true, sunriseOK: true}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			n, err := NightOf(c.site, c.day)
			if err != nil {
				t.Fatal(err)
			}
			got := want{
				alwaysUp: n.SunAlwaysUp, alwaysDown: n.SunAlwaysDown,
				set: n.Sunset.OK, civil: n.CivilDusk.OK && n.CivilDawn.OK,
				nautical: n.NauticalDusk.OK && n.NauticalDawn.OK, astro: n.AstroDusk.OK && n.AstroDawn.OK,
				sunriseOK: n.Sunrise.OK,
			}
			if got != c.want {
				t.Errorf("night of %s at %s: got %+v, want %+v", c.day.Format("2006-01-02"), c.site.Name, got, c.want)
			}
			// A dusk without its dawn (or the reverse) would be a half-found twilight.
			for _, p := range [][2]Event{{n.CivilDusk, n.CivilDawn}, {n.NauticalDusk, n.NauticalDawn}, {n.AstroDusk, n.AstroDawn}} {
				if p[0].OK != p[1].OK {
					t.Errorf("dusk %v and dawn %v: want both or neither", p[0], p[1])
				}
			}
			if c.want.alwaysUp && (n.Moonrise.OK || n.Moonset.OK) {
				t.Errorf("midnight sun: moonrise %v, moonset %v; want none (no dark span)", n.Moonrise, n.Moonset)
			}
			checkNightInvariants(t, c.site, &n)
			// The JSON form of a missing event is null.
			if c.want.alwaysUp {
				if b, _ := n.AstroDusk.MarshalJSON(); string(b) != "null" {
					t.Errorf("AstroDusk JSON = %s, want null", b)
				}
			}
		})
	}
}

// TestNightLongitudes runs nights at sites west of Greenwich, east and west
// of the date line and on it. The middle of the night (halfway from sunset
// to sunrise) is solar midnight, which lies within 16.5 min (the equation of
// time, Meeus 1998, ch. 28) plus the change of declination over the night
// (a minute or two) of local mean midnight = 0h UTC − lon/15 h.
func TestNightLongitudes(t *testing.T) {
	const tolMidnightMin = 20.0
	sites := append([]Site{
		{Name: "west, 40N 105W", LatDeg: 40, LonDeg: -105},
		{Name: "Americas, 30S 70.7W", LatDeg: -30.2, LonDeg: -70.7},
	}, testSites[1:5]...)
	for _, site := range sites {
		for _, day := range []time.Time{date(2024, 3, 20), date(2024, 6, 21), date(2024, 11, 3), date(2025, 1, 1)} {
			n, err := NightOf(site, day)
			if err != nil {
				t.Fatalf("%s %s: %v", site.Name, day.Format("2006-01-02"), err)
			}
			name := site.Name + " " + day.Format("2006-01-02")
			if !n.Sunset.OK || !n.Sunrise.OK || n.SunAlwaysUp || n.SunAlwaysDown {
				t.Errorf("%s: sunset %v, sunrise %v; want both", name, n.Sunset, n.Sunrise)
				continue
			}
			midnight := n.Date.Add(24*time.Hour - time.Duration(site.LonDeg/15*float64(time.Hour)))
			solar := n.Sunset.At.AddDays(n.Sunrise.At.Sub(n.Sunset.At) / 2)
			if d := solar.Time().Sub(midnight).Minutes(); math.Abs(d) > tolMidnightMin {
				t.Errorf("%s: middle of the night %s is %.1f min from local mean midnight %s, tol %.0f min",
					name, solar, d, FormatISO(midnight), tolMidnightMin)
			}
			checkNightInvariants(t, site, &n)
		}
	}
}

// TestNewMoonIllumination: at the new Moon of Meeus 1998, Ex. 49.a (p. 353),
// JDE 2443192.65118 (1977 Feb 18 3h37m42s TD), the Moon and Sun have the
// same ecliptic longitude, so the phase angle is at least 180° − |β| − a
// little, and k ≤ (1 − cos 5.3°)/2 = 0.0021 with |β| ≤ 5.3°.
func TestNewMoonIllumination(t *testing.T) {
	tm, err := FromJDTT(2443192.65118)
	if err != nil {
		t.Fatal(err)
	}
	if k := NewSky(Site{Name: "any"}, tm).MoonIllumination(); k < 0 || k > 0.0021 {
		t.Errorf("Moon illuminated fraction at the new Moon of Meeus Ex. 49.a = %.5f, want in [0, 0.0021]", k)
	}
	// Half a synodic month (29.53 d, Meeus ch. 49) later the Moon is full.
	full := tm.AddDays(29.530589 / 2)
	if k := NewSky(Site{Name: "any"}, full).MoonIllumination(); k < 0.98 {
		t.Errorf("Moon illuminated fraction half a lunation after new = %.4f, want near 1 (≥ 0.98)", k)
	}
}

func TestNightOfRejects(t *testing.T) {
	for _, c := range []struct {
		name, want string
		site       Site
		day        time.Time
	}{
		{"latitude 91", "latitude", Site{Name: "x", LatDeg: 91}, date(2026, 12, 1)},
		{"longitude NaN", "longitude", Site{Name: "x", LonDeg: math.NaN()}, date(2026, 12, 1)},
		{"year 1500", "1500-06-01", Site{Name: "x"}, date(1500, 6, 1)},
	} {
		_, err := NightOf(c.site, c.day)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: NightOf error = %v, want one containing %q", c.name, err, c.want)
		}
	}
	// The hour and zone of the date are ignored: only its calendar day counts.
	a, err1 := NightOf(testSites[0], time.Date(2026, 12, 1, 23, 30, 0, 0, time.FixedZone("x", -5*3600)))
	b, err2 := NightOf(testSites[0], date(2026, 12, 1))
	if err1 != nil || err2 != nil || a.Sunset != b.Sunset {
		t.Errorf("NightOf with a late hour in a zone = %v, %v; want the night of its calendar date %v, %v", a.Sunset, err1, b.Sunset, err2)
	}
}
