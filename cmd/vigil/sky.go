package main

import (
	"fmt"
	"io"

	"example.org/vigil/ephem"
)

var skyCommand = command{
	name:    "sky",
	summary: "where a star stands at one instant: altitude, azimuth, airmass, hour angle, HJD, BJD_TDB, Sun and Moon",
	run:     runSky,
}

// sunCautionSepDeg is the star–Sun separation within which vigil sky warns
// when the Sun is up (methods.md §14: warn within about 15° of the Sun).
const sunCautionSepDeg = 15

// skyResponse is the answer of vigil sky. Its JSON tags are the contract
// (spec/cli.md, "vigil sky"): do not rename or drop them.
type skyResponse struct {
	UTC             ephem.Time `json:"utc"`               // the instant, ISO 8601 UTC
	JDUTC           float64    `json:"jd_utc"`            // Julian date, UTC scale
	AltDeg          float64    `json:"alt_deg"`           // airless topocentric altitude
	AltRefractedDeg float64    `json:"alt_refracted_deg"` // Sæmundsson (1986), 10 °C, 1010 hPa
	AzDeg           float64    `json:"az_deg"`            // from north through east
	Airmass         *float64   `json:"airmass"`           // Pickering (2002); null below the apparent horizon
	HourAngleH      float64    `json:"hour_angle_h"`      // local apparent sidereal time − apparent RA, [-12, 12)
	HJD             float64    `json:"hjd"`               // heliocentric JD, UTC scale
	BJDTDB          float64    `json:"bjd_tdb"`           // barycentric JD, TDB scale
	SunAltDeg       float64    `json:"sun_alt_deg"`       // airless, topocentric
	MoonAltDeg      float64    `json:"moon_alt_deg"`      // airless, topocentric
	MoonSepDeg      float64    `json:"moon_sep_deg"`      // star–Moon, topocentric Moon
	MoonIllum       float64    `json:"moon_illum"`        // illuminated fraction 0..1
	SunSepDeg       float64    `json:"sun_sep_deg"`       // star–Sun
	RAAppH          float64    `json:"ra_app_h"`          // apparent RA, true equator and equinox of date
	DecAppDeg       float64    `json:"dec_app_deg"`       // apparent Dec, true equator of date
	LSTH            float64    `json:"lst_h"`             // local apparent sidereal time
	Warnings        []string   `json:"warnings,omitempty"`
}

func runSky(e *env, args []string) error {
	f := newFlags(e.cmd,
		"(--lat DEG --lon DEG [--elev METRES] | --site NAME [--logbook PATH]) --ra HOURS --dec DEG --at INSTANT [--json]",
		`Where a star stands at one instant, seen from a site: airless and refracted
altitude, azimuth from north through east, airmass (Pickering 2002; null when
the star is below the apparent horizon), hour angle, HJD (UTC scale), BJD_TDB,
the Sun's and Moon's altitudes, the Moon's separation and illuminated fraction.
Refraction is Saemundsson's (1986) for 10 °C and 1010 hPa.`)
	site := addSiteFlags(e, f)
	raText := f.required("ra", "HOURS", "right ascension in hours, ICRS/J2000, decimal (22.486) or sexagesimal (22:29:10.265)")
	decText := f.required("dec", "DEG", "declination in degrees, ICRS/J2000, decimal (58.415) or sexagesimal (+58:24:54.71)")
	atText := f.required("at", "INSTANT", "the instant: ISO 8601 UTC (2026-12-01T03:00:00Z), a Julian date on the UTC scale (JD2461375.625), or now")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	obs, err := site.resolve(f)
	if err != nil {
		return err
	}
	ra, err := get(f, "ra", *raText, ephem.ParseRA)
	if err != nil {
		return err
	}
	dec, err := get(f, "dec", *decText, ephem.ParseDec)
	if err != nil {
		return err
	}
	at, err := get(f, "at", *atText, parseInstantFlag(e.now))
	if err != nil {
		return err
	}

	star := ephem.Star{RAHours: ra, DecDeg: dec}
	resp := skyAt(obs.site, star, at)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeSkyTable(e.stdout, obs, star, resp)
	return nil
}

// skyAt computes the answer of vigil sky for a checked site, star and instant.
func skyAt(site ephem.Site, star ephem.Star, at ephem.Time) skyResponse {
	v := star.Vec()
	sky := ephem.NewSky(site, at)
	p := sky.Star(&v)
	refracted := ephem.RefractedAltDeg(p.AltDeg)
	r := skyResponse{
		UTC:             at,
		JDUTC:           at.JDUTC(),
		AltDeg:          p.AltDeg,
		AltRefractedDeg: refracted,
		AzDeg:           p.AzDeg,
		Airmass:         optional(ephem.Airmass(refracted)),
		HourAngleH:      p.HourAngleH,
		HJD:             sky.HJD(&v),
		BJDTDB:          sky.BJDTDB(&v),
		SunAltDeg:       sky.Sun().AltDeg,
		MoonAltDeg:      sky.Moon().AltDeg,
		MoonSepDeg:      sky.MoonSeparationDeg(&v),
		MoonIllum:       sky.MoonIllumination(),
		SunSepDeg:       sky.SunSeparationDeg(&v),
		RAAppH:          p.RAHours,
		DecAppDeg:       p.DecDeg,
		LSTH:            sky.LocalSiderealHours(),
	}
	r.Warnings = timeWarnings(at)
	if r.SunAltDeg > ephem.SunriseAltDeg && r.SunSepDeg < sunCautionSepDeg {
		r.Warnings = append(r.Warnings, fmt.Sprintf(
			"the Sun is up and only %.1f° from the star: never point an optical instrument at or near the Sun without a proper solar filter",
			r.SunSepDeg))
	}
	return r
}

// timeWarnings says when the time scales of an instant are less certain than
// usual: after the leap-second table's validity date, or before 1972.
func timeWarnings(at ephem.Time) []string {
	var w []string
	if ephem.LeapSecondsStale(at) {
		w = append(w, fmt.Sprintf(
			"the leap-second table is complete only to %s: TT, TDB and bjd_tdb may be off by a whole second if a leap second was inserted since",
			ephem.LeapSecondsValidUntil().Format("2006-01-02")))
	}
	if _, ok := ephem.TAIMinusUTC(at); !ok {
		w = append(w, "before 1972 UTC is taken as UT and TT = UT + ΔT from Meeus (1998) table 10.A: times on TT and TDB are uncertain by a second or more")
	}
	return w
}

// writeSkyTable prints the answer of vigil sky for people.
func writeSkyTable(w io.Writer, obs observer, star ephem.Star, r skyResponse) {
	fmt.Fprintf(w, "Star at RA %s, Dec %s (ICRS/J2000)\n", ephem.FormatRA(star.RAHours), ephem.FormatDec(star.DecDeg))
	fmt.Fprintf(w, "seen from %s\n", siteText(obs.site))
	when := utcText(r.UTC)
	if obs.zone != nil {
		when += " = " + localText(r.UTC, obs.zone)
	}
	fmt.Fprintf(w, "at %s (JD_UTC %.6f)\n\n", when, r.JDUTC)

	t := newTable(w)
	airmass := "— (below the horizon)"
	if r.Airmass != nil {
		airmass = fmt.Sprintf("%.3f", *r.Airmass)
	}
	t.row("Altitude (airless)", fmt.Sprintf("%.3f°", r.AltDeg))
	t.row("Altitude (refracted)", fmt.Sprintf("%.3f°", r.AltRefractedDeg))
	t.row("Azimuth", fmt.Sprintf("%.3f° (from north through east)", r.AzDeg))
	t.row("Airmass", airmass)
	t.row("Hour angle", fmt.Sprintf("%+.4f h (%s)", r.HourAngleH, hourAngleWord(r.HourAngleH)))
	t.row("Apparent place", fmt.Sprintf("RA %s, Dec %s (of date)", ephem.FormatRA(r.RAAppH), ephem.FormatDec(r.DecAppDeg)))
	t.row("Local sidereal time", ephem.FormatRA(r.LSTH))
	t.row("HJD_UTC", fmt.Sprintf("%.7f", r.HJD))
	t.row("BJD_TDB", fmt.Sprintf("%.7f", r.BJDTDB))
	t.row("Sun", fmt.Sprintf("altitude %.2f°, %.1f° from the star", r.SunAltDeg, r.SunSepDeg))
	t.row("Moon", fmt.Sprintf("altitude %.2f°, %.1f° from the star, %.0f%% illuminated", r.MoonAltDeg, r.MoonSepDeg, 100*r.MoonIllum))
	t.flush()
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "\nCaution: %s.\n", warn)
	}
}

// hourAngleWord says on which side of the meridian an hour angle lies.
func hourAngleWord(h float64) string {
	switch {
	case h < 0:
		return "east of the meridian, climbing"
	case h > 0:
		return "west of the meridian, sinking"
	}
	return "on the meridian"
}
