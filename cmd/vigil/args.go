package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
)

// This file holds the flags several commands share: the site (--lat --lon
// --elev, or --site), the instant (--at) and the date of a night (--date).
// Each is converted with the engine's parsers; the messages name the flag.

// observer is a site and, when it is known, its civil time zone. Coordinates
// alone do not tell the zone: then zone is nil and tables print UTC only.
// A site named by --site (from the logbook, or the demo's) comes whole in
// place, with its lowest useful altitude and horizon profile, which the
// planner needs; place is nil for --lat/--lon.
type observer struct {
	site  ephem.Site
	zone  *time.Location
	place *observe.Site
}

// siteFlags are the flags that say where the observer stands, and the
// logbook that --site names a site of.
type siteFlags struct {
	lat, lon, elev, name *string
	book                 *bookFlag
}

// siteNameUsage is the help of --site.
const siteNameUsage = "a site of the logbook instead of --lat/--lon/--elev: its name, in any case, or a part of it that only one site's name contains; " +
	"demo is the demo site (" + demo.SiteName + ") and needs no logbook"

// addSiteFlags declares --lat, --lon, --elev, --site and --logbook on f.
func addSiteFlags(e *env, f *flags) *siteFlags {
	const unlessSite = "required unless --site"
	s := &siteFlags{
		lat:  f.value("lat", "DEG", "", "site latitude in degrees, north positive, decimal (52.1172) or sexagesimal (+52:07:02)", unlessSite),
		lon:  f.value("lon", "DEG", "", "site longitude in degrees, EAST positive (west of Greenwich is negative: -1.4538), decimal or sexagesimal", unlessSite),
		elev: f.value("elev", "METRES", "0", "site elevation in metres above sea level", ""),
		name: f.value("site", "NAME", "", siteNameUsage, ""),
	}
	s.book = addLogbookFlag(e, f)
	return s
}

// resolve returns the observer the flags describe. --site opens the logbook
// (except for demo without --logbook); --lat/--lon never do.
func (s *siteFlags) resolve(f *flags) (observer, error) {
	if f.given("site") {
		for _, n := range []string{"lat", "lon", "elev"} {
			if f.given(n) {
				return observer{}, &flagError{flag: "site", err: fmt.Errorf("give either --site or --lat/--lon/--elev, not both (--%s was given too)", n)}
			}
		}
		name := strings.TrimSpace(*s.name)
		if name == "" {
			return observer{}, &flagError{flag: "site", err: fmt.Errorf("empty value: want the name of a site of the logbook, or %s", demoSiteAlias)}
		}
		if strings.EqualFold(name, demoSiteAlias) && !f.given("logbook") {
			return demoObserver(), nil
		}
		lb, err := s.book.open()
		if err != nil {
			return observer{}, err
		}
		site, err := findSite(lb, name)
		if err != nil {
			return observer{}, err
		}
		return placeObserver(site), nil
	}
	for _, n := range []string{"lat", "lon"} {
		if !f.given(n) {
			return observer{}, f.missing(n)
		}
	}
	lat, err := get(f, "lat", *s.lat, ephem.ParseLatitude)
	if err != nil {
		return observer{}, err
	}
	lon, err := get(f, "lon", *s.lon, ephem.ParseLongitude)
	if err != nil {
		return observer{}, err
	}
	elev, err := get(f, "elev", *s.elev, parseMetres)
	if err != nil {
		return observer{}, err
	}
	// Latitude and longitude passed their parsers, which check the same
	// ranges as NewSite: a refusal here can only be about the elevation.
	site, err := ephem.NewSite("", lat, lon, elev)
	if err != nil {
		return observer{}, &flagError{flag: "elev", err: err}
	}
	return observer{site: site}, nil
}

// parseMetres reads an elevation in metres.
func parseMetres(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("elevation %q: want a number of metres above sea level, e.g. 140", s)
	}
	return v, nil
}

// nowWord is the value of --at that means the present instant.
const nowWord = "now"

// parseInstantFlag returns a parser for --at and its kin: ParseInstant, plus
// "now" for the clock's present instant.
func parseInstantFlag(now func() time.Time) func(string) (ephem.Time, error) {
	return func(s string) (ephem.Time, error) {
		if strings.EqualFold(strings.TrimSpace(s), nowWord) {
			return ephem.FromTime(now())
		}
		return ephem.ParseInstant(s)
	}
}

// tonightWord is the value of --date that means the night under way or to
// come.
const tonightWord = "tonight"

// parseDateFlag returns a parser for --date: ParseDate, plus "tonight", the
// night of the observer's present local date (see tonightDate).
func parseDateFlag(now func() time.Time, obs observer) func(string) (time.Time, error) {
	return func(s string) (time.Time, error) {
		if strings.EqualFold(strings.TrimSpace(s), tonightWord) {
			d := tonightDate(now(), obs)
			return ephem.ParseDate(d.Format(time.DateOnly))
		}
		return ephem.ParseDate(s)
	}
}

// tonightDate returns the date of the night that is under way or comes next
// at the instant now: the local date, or the day before it until local noon
// (a night belongs to the date it begins on). Local means the site's civil
// time when its zone is known, else its local mean time, UTC + longitude/15 h,
// the time that bounds a night in ephem.NightOf.
func tonightDate(now time.Time, obs observer) time.Time {
	var local time.Time
	if obs.zone != nil {
		local = now.In(obs.zone)
	} else {
		local = now.UTC().Add(time.Duration(obs.site.LonDeg / 15 * float64(time.Hour)))
	}
	y, m, d := local.Date()
	if local.Hour() < 12 {
		d--
	}
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
}
