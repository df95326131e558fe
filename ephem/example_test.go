package ephem_test

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
)

// Meeus 1998, Ex. 7.a, p. 61: the launch of Sputnik 1, 1957 October 4.81,
// is JD 2436116.31; Ex. 7.b: 333 January 27.5 (Julian calendar) is
// JD 1842713.0.
func ExampleCalendarToJD() {
	fmt.Printf("%.2f\n", ephem.CalendarToJD(1957, 10, 4.81))
	fmt.Printf("%.1f\n", ephem.CalendarToJD(333, 1, 27.5))
	y, m, d := ephem.JDToCalendar(2436116.31) // Ex. 7.c, p. 64
	fmt.Printf("%d-%02d-%.2f\n", y, m, d)
	// Output:
	// 2436116.31
	// 1842713.0
	// 1957-10-4.81
}

// ParseInstant reads ISO 8601 (UTC or with an offset) and Julian dates on the
// UTC scale; 2026 December 1.125 is JD 2461375.625 (Meeus 1998, eq. 7.1).
func ExampleParseInstant() {
	for _, s := range []string{"2026-12-01T04:00:00+01:00", "JD2461375.625", "MJD61375.125", "2026-12-01 03:00"} {
		t, err := ephem.ParseInstant(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-26s %s  JD %.3f\n", s, t, t.JDUTC())
	}
	_, err := ephem.ParseInstant("2016-12-31T23:59:60Z")
	fmt.Println(err)
	// Output:
	// 2026-12-01T04:00:00+01:00  2026-12-01T03:00:00Z  JD 2461375.625
	// JD2461375.625              2026-12-01T03:00:00Z  JD 2461375.625
	// MJD61375.125               2026-12-01T03:00:00Z  JD 2461375.625
	// 2026-12-01 03:00           2026-12-01T03:00:00Z  JD 2461375.625
	// ephem: instant "2016-12-31T23:59:60Z": a leap second (:60) cannot be given; use the instant just before or after it
}

// The altitude and azimuth of δ Cephei from 50° N, 10° E at 2024-12-21
// 20:00 UTC. astropy 5.2.1 gives h = 53.502°, A = 308.359° (airless; methods.md §3).
func ExampleNewSky() {
	site, _ := ephem.NewSite("50N 10E", 50, 10, 0)
	ra, _ := ephem.ParseRA("22:29:10.26502")
	dec, _ := ephem.ParseDec("+58:24:54.7139")
	star := ephem.Star{RAHours: ra, DecDeg: dec}.Vec()
	t, _ := ephem.ParseInstant("2024-12-21T20:00:00Z")
	sky := ephem.NewSky(site, t)
	p := sky.Star(&star)
	fmt.Printf("altitude %.2f°, azimuth %.2f°\n", p.AltDeg, p.AzDeg)
	fmt.Printf("fast path: altitude %.2f°\n", sky.StarAltDeg(&star))
	x, _ := ephem.Airmass(ephem.RefractedAltDeg(p.AltDeg))
	fmt.Printf("airmass %.3f\n", x)
	// Output:
	// altitude 53.50°, azimuth 308.36°
	// fast path: altitude 53.50°
	// airmass 1.243
}

// The night of 2024 December 21 at 50° N, 10° E. astropy 5.2.1 gives sunset
// 15:20:27, civil dusk 15:58:59, nautical 16:40:35 and astronomical dusk
// 17:20:04 UTC (methods.md §5).
func ExampleNightOf() {
	site, _ := ephem.NewSite("50N 10E", 50, 10, 0)
	n, err := ephem.NightOf(site, time.Date(2024, 12, 21, 0, 0, 0, 0, time.UTC))
	if err != nil {
		fmt.Println(err)
		return
	}
	hm := func(e ephem.Event) string {
		if !e.OK {
			return "none"
		}
		return e.At.Time().Round(time.Minute).Format("Jan 2 15:04")
	}
	fmt.Println("sunset           ", hm(n.Sunset))
	fmt.Println("civil dusk       ", hm(n.CivilDusk))
	fmt.Println("nautical dusk    ", hm(n.NauticalDusk))
	fmt.Println("astronomical dusk", hm(n.AstroDusk))
	fmt.Println("astronomical dawn", hm(n.AstroDawn))
	fmt.Println("sunrise          ", hm(n.Sunrise))
	fmt.Printf("Moon %.0f%% lit\n", 100*n.MoonIllum)
	// Output:
	// sunset            Dec 21 15:20
	// civil dusk        Dec 21 15:59
	// nautical dusk     Dec 21 16:41
	// astronomical dusk Dec 21 17:20
	// astronomical dawn Dec 22 05:17
	// sunrise           Dec 22 07:17
	// Moon 59% lit
}

// The barycentric Julian date (TDB) of an observation of δ Cephei, and the
// heliocentric one (UTC) for comparison. astropy 5.2.1 (Time.light_travel_time,
// delta_ut1_utc = 0) gives HJD_UTC 2460666.3341993 and BJD_TDB 2460666.3349804.
func ExampleSky_BJDTDB() {
	site, _ := ephem.NewSite("50N 10E", 50, 10, 0)
	star := ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}.Vec()
	t, _ := ephem.ParseInstant("2024-12-21T20:00:00Z")
	sky := ephem.NewSky(site, t)
	fmt.Printf("JD_UTC  %.5f\n", t.JDUTC())
	fmt.Printf("HJD_UTC %.5f\n", sky.HJD(&star))
	fmt.Printf("BJD_TDB %.5f\n", sky.BJDTDB(&star))
	// Output:
	// JD_UTC  2460666.33333
	// HJD_UTC 2460666.33420
	// BJD_TDB 2460666.33498
}

// When is the maximum of δ Cephei predicted for HJD 2460669.3858 (cycle 4583
// of Max = 2436075.445 + 5.366341 E, methods.md §6) seen from 50° N, 10° E?
// astropy 5.2.1, inverting Time.light_travel_time, gives 21:14:31.55 UTC.
func ExampleSeenAt() {
	site, _ := ephem.NewSite("50N 10E", 50, 10, 0)
	star := ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}
	e := ephem.Ephemeris{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: ephem.HJD}
	hjd := e.At(4583)
	t, err := ephem.SeenAt(e.Scale, hjd, star, site)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s %.6f is seen at %s UTC\n", e.Scale.Label(), hjd, t.Time().Format("2006-01-02 15:04:05"))
	// Output:
	// HJD_UTC 2460669.385803 is seen at 2024-12-24 21:14:31 UTC
}

// Airmass by Pickering (2002), DIO 12, 3; methods.md §4 lists 1.9932 at 30°
// and 38.749 at the horizon.
func ExampleAirmass() {
	for _, h := range []float64{90, 30, 0, -2} {
		if x, ok := ephem.Airmass(h); ok {
			fmt.Printf("%3.0f°  %.4f\n", h, x)
		} else {
			fmt.Printf("%3.0f°  below the horizon\n", h)
		}
	}
	// Output:
	//  90°  1.0000
	//  30°  1.9932
	//   0°  38.7494
	//  -2°  below the horizon
}

// The maxima of δ Cephei, Max = HJD 2436075.445 + 5.366341 E: the first
// after HJD 2460666.0 is cycle 4583 at 2460669.3858 (methods.md §6).
func ExampleEphemeris_At() {
	e := ephem.Ephemeris{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: ephem.HJD}
	E := math.Ceil(e.Cycle(2460666.0))
	fmt.Printf("E = %.0f, %s %.4f\n", E, e.Scale.Label(), e.At(E))
	fmt.Printf("phase at HJD 2460666.0: %.3f\n", e.Phase(2460666.0))
	// Output:
	// E = 4583, HJD_UTC 2460669.3858
	// phase at HJD 2460666.0: 0.369
}

// The usual call chain: read the site and the star as a user types them,
// find the dark hours of a night, and follow the star through them with one
// Frame (reused for every instant within a day of it).
func Example() {
	lat, _ := ephem.ParseLatitude("50")
	lon, _ := ephem.ParseLongitude("10")
	site, _ := ephem.NewSite("50N 10E", lat, lon, 0)
	ra, _ := ephem.ParseRA("22 29 10.3")
	dec, _ := ephem.ParseDec("+58 24 55")
	star := ephem.Star{RAHours: ra, DecDeg: dec}.Vec()

	date, _ := ephem.ParseDate("2024-12-21")
	n, _ := ephem.NightOf(site, date)
	frame := ephem.NewFrame(n.AstroDusk.At)
	for t := n.AstroDusk.At; t.Before(n.AstroDawn.At); t = t.AddDays(3.0 / 24) {
		if t.Sub(frame.Time()) > 0.5 {
			frame = ephem.NewFrame(t)
		}
		alt := frame.Sky(site, t).StarAltDeg(&star)
		x, ok := ephem.Airmass(ephem.RefractedAltDeg(alt))
		if !ok {
			fmt.Printf("%s  %5.1f°  below the horizon\n", t.Time().Format("15:04"), alt)
			continue
		}
		fmt.Printf("%s  %5.1f°  airmass %.2f\n", t.Time().Format("15:04"), alt, x)
	}
	// Output:
	// 17:20   74.1°  airmass 1.04
	// 20:20   51.0°  airmass 1.29
	// 23:20   31.3°  airmass 1.92
	// 02:20   19.9°  airmass 2.90
}

// A planner's week at 50° N, 10° E from 2024 December 21, noon UTC: when
// the maximum of δ Cephei of cycle 4583 (HJD 2460669.3858, methods.md §6) is
// seen (astropy 5.2.1: 21:14:31.55 UTC, as in ExampleSeenAt), and when the
// first astronomical darkness of the span begins (astropy 5.2.1: 17:20:04
// UTC, as in ExampleNightOf).
func ExampleSkySpan() {
	site, _ := ephem.NewSite("50N 10E", 50, 10, 0)
	from, _ := ephem.ParseInstant("2024-12-21T12:00:00Z")
	span, err := ephem.NewSkySpan(site, from, from.AddDays(7))
	if err != nil {
		fmt.Println(err)
		return
	}
	star := ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}.Vec()
	t, err := span.SeenAt(ephem.HJD, 2436075.445+5.366341*4583, &star)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("maximum seen at %s UTC\n", t.Time().Format("Jan 2 15:04:05"))
	dark := span.SunBelow(ephem.AstronomicalAltDeg)
	fmt.Printf("%d dark intervals, the first from %s UTC\n", len(dark), dark[0].From.Time().Round(time.Minute).Format("Jan 2 15:04"))
	// Output:
	// maximum seen at Dec 24 21:14:31 UTC
	// 7 dark intervals, the first from Dec 21 17:20 UTC
}

// The path of Venus across the sky of Washington on 1987 April 10 (Meeus
// 1998, Ex. 13.b): at hour angle 64.352133° it stands at h = 15.1249° and
// A = 68.0337° from the south, 248.0337° from the north. A star of
// declination 80° seen from 50° N is lowest at φ + δ − 90° = 40°: it never
// sets below 20°.
func ExampleDiurnalCircle() {
	c := ephem.NewDiurnalCircle(38+55/60.0+17/3600.0, -(6 + 43/60.0 + 11.61/3600))
	alt, az := c.AltAz(64.352133 / 15)
	fmt.Printf("altitude %.4f°, azimuth %.4f°\n", alt, az)
	_, err := ephem.NewDiurnalCircle(50, 80).HourAngleAt(20)
	fmt.Println("δ = 80° from 50° N:", err)
	// Output:
	// altitude 15.1249°, azimuth 248.0337°
	// δ = 80° from 50° N: stays above that altitude all the time (circumpolar): no rise or set
}
