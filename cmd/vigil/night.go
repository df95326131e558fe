package main

import (
	"fmt"
	"io"
	"time"

	"example.org/vigil/ephem"
)

var nightCommand = command{
	name:    "night",
	summary: "the dark hours at a site: sunset, twilights, sunrise, moonrise, moonset and the Moon's phase",
	run:     runNight,
}

// nightResponse is the answer of vigil night. Its JSON tags are the contract
// (spec/cli.md, "vigil night"): do not rename or drop them. Events encode as
// ISO 8601 UTC strings, or null when they do not happen that night.
type nightResponse struct {
	Date          string      `json:"date"`  // the date the night begins on
	Start         ephem.Time  `json:"start"` // local mean noon of the date
	End           ephem.Time  `json:"end"`   // local mean noon of the next day
	Sunset        ephem.Event `json:"sunset"`
	Sunrise       ephem.Event `json:"sunrise"`
	CivilDusk     ephem.Event `json:"civil_dusk"`
	CivilDawn     ephem.Event `json:"civil_dawn"`
	NauticalDusk  ephem.Event `json:"nautical_dusk"`
	NauticalDawn  ephem.Event `json:"nautical_dawn"`
	AstroDusk     ephem.Event `json:"astro_dusk"`
	AstroDawn     ephem.Event `json:"astro_dawn"`
	Moonrise      ephem.Event `json:"moonrise"`
	Moonset       ephem.Event `json:"moonset"`
	MoonIllum     float64     `json:"moon_illum"`
	MoonIllumAt   ephem.Time  `json:"moon_illum_at"` // the instant moon_illum is for
	SunAlwaysUp   bool        `json:"sun_always_up"`
	SunAlwaysDown bool        `json:"sun_always_down"`
}

func runNight(e *env, args []string) error {
	f := newFlags(e.cmd,
		"(--lat DEG --lon DEG [--elev METRES] | --site NAME [--logbook PATH]) --date YYYY-MM-DD [--json]",
		`The dark hours of one night at a site. The night of a date runs from local
mean noon of that date to local mean noon of the next day (local mean time =
UTC + longitude/15 h). Sunset and sunrise: the Sun's centre at -0.8333°
airless altitude; civil, nautical and astronomical twilight at -6°, -12° and
-18°; moonrise and moonset: the Moon's centre at +0.125° geocentric altitude
(Meeus 1998, ch. 15), reported between sunset and sunrise only. An event that
does not happen that night is null (—). The Moon's illuminated fraction is
for the midpoint of sunset and sunrise.`)
	site := addSiteFlags(e, f)
	dateText := f.required("date", "YYYY-MM-DD", "the date the night begins on (its evening), or tonight: the site's local date, the day before until local noon")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	obs, err := site.resolve(f)
	if err != nil {
		return err
	}
	date, err := get(f, "date", *dateText, parseDateFlag(e.now, obs))
	if err != nil {
		return err
	}
	n, err := ephem.NightOf(obs.site, date)
	if err != nil {
		return &flagError{flag: "date", err: err}
	}
	resp := nightAnswer(n)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	fmt.Fprintf(e.stdout, "Night of %s at %s\n%s\n\n", n.Date.Format("Monday 2 January 2006"), siteText(obs.site), zoneNote(obs.zone))
	writeNightTable(e.stdout, n, obs.zone)
	return nil
}

// nightAnswer fills the answer of vigil night.
func nightAnswer(n ephem.Night) nightResponse {
	return nightResponse{
		Date:          n.Date.Format(time.DateOnly),
		Start:         n.Start,
		End:           n.End,
		Sunset:        n.Sunset,
		Sunrise:       n.Sunrise,
		CivilDusk:     n.CivilDusk,
		CivilDawn:     n.CivilDawn,
		NauticalDusk:  n.NauticalDusk,
		NauticalDawn:  n.NauticalDawn,
		AstroDusk:     n.AstroDusk,
		AstroDawn:     n.AstroDawn,
		Moonrise:      n.Moonrise,
		Moonset:       n.Moonset,
		MoonIllum:     n.MoonIllum,
		MoonIllumAt:   n.MoonIllumAt,
		SunAlwaysUp:   n.SunAlwaysUp,
		SunAlwaysDown: n.SunAlwaysDown,
	}
}

// writeNightTable prints a night's events for people, evening to morning,
// in UTC and, when the zone is known, in local civil time.
func writeNightTable(w io.Writer, n ephem.Night, zone *time.Location) {
	t := newTable(w)
	head := []string{"Event", "UTC"}
	if zone != nil {
		head = append(head, "Local")
	}
	t.row(head...)
	rows := []struct {
		name string
		ev   ephem.Event
	}{
		{"Sunset", n.Sunset},
		{"Civil dusk (Sun -6°)", n.CivilDusk},
		{"Nautical dusk (-12°)", n.NauticalDusk},
		{"Astronomical dusk (-18°)", n.AstroDusk},
		{"Astronomical dawn (-18°)", n.AstroDawn},
		{"Nautical dawn (-12°)", n.NauticalDawn},
		{"Civil dawn (-6°)", n.CivilDawn},
		{"Sunrise", n.Sunrise},
		{"Moonrise", n.Moonrise},
		{"Moonset", n.Moonset},
	}
	for _, r := range rows {
		t.row(append([]string{r.name}, eventCells(r.ev, zone)...)...)
	}
	t.flush()

	fmt.Fprintln(w)
	switch {
	case n.SunAlwaysUp:
		fmt.Fprintln(w, "The Sun stays up all night (midnight sun).")
	case n.SunAlwaysDown:
		fmt.Fprintln(w, "The Sun stays down all day (polar night).")
	}
	if n.AstroDusk.OK && n.AstroDawn.OK && n.AstroDusk.At.Before(n.AstroDawn.At) {
		fmt.Fprintf(w, "Astronomical darkness lasts %s (h:mm).\n", ephem.FormatDuration(n.AstroDawn.At.Sub(n.AstroDusk.At), false))
	} else if !n.AstroDusk.OK && !n.AstroDawn.OK && !n.SunAlwaysDown {
		fmt.Fprintln(w, "The Sun does not reach -18°: no astronomical darkness this night.")
	}
	fmt.Fprintf(w, "Moon %.0f%% illuminated (at %s); moonrise and moonset are shown between sunset and sunrise only.\n",
		100*n.MoonIllum, utcText(n.MoonIllumAt))
}
