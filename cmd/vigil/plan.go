package main

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

var planCommand = command{
	name:    "plan",
	summary: "the extrema of a list of targets over one night or several, with verdicts and a ranking",
	run:     runPlan,
}

// planResponse is the answer of vigil plan (not fixed by the contract; its
// fields are documented in the command's --help).
type planResponse struct {
	Site        planSite        `json:"site"`
	Constraints planConstraints `json:"constraints"`
	Targets     int             `json:"targets"` // targets read from the file
	Ranked      bool            `json:"ranked"`  // events best first (else in time order)
	Nights      []planNight     `json:"nights"`
}

type planSite struct {
	Name      string  `json:"name"`
	LatDeg    float64 `json:"lat_deg"`
	LonDeg    float64 `json:"lon_deg"` // east positive
	ElevM     float64 `json:"elev_m"`
	TimeZone  string  `json:"time_zone"`   // of the local times
	MinAltDeg float64 `json:"min_alt_deg"` // lowest useful airless altitude
}

type planConstraints struct {
	SunAltDeg      float64 `json:"sun_alt_deg"`      // the Sun below this
	MoonSepDeg     float64 `json:"moon_sep_deg"`     // the star this far from the Moon while it is up
	WindowFraction float64 `json:"window_fraction"`  // coverage half-width, as a fraction of the period
	WindowMaxHours float64 `json:"window_max_hours"` // and at most this
	All            bool    `json:"all"`              // events with no usable part listed too
}

// planInstant is an instant in UTC and in the site's time zone.
type planInstant struct {
	UTC   ephem.Time `json:"utc"`
	Local string     `json:"local"`
}

type planNight struct {
	Date      string        `json:"date"`  // the date the night begins on
	Start     planInstant   `json:"start"` // local mean noon of date
	End       planInstant   `json:"end"`   // local mean noon of the next day
	Twilights planTwilights `json:"twilights"`
	N         int           `json:"n"` // events listed
	Events    []planEvent   `json:"events"`
}

// planTwilights are the Sun's crossings in a night; null when one does not
// happen.
type planTwilights struct {
	Sunset       *planInstant `json:"sunset"`        // -0.8333°
	CivilDusk    *planInstant `json:"civil_dusk"`    // -6°
	NauticalDusk *planInstant `json:"nautical_dusk"` // -12°
	AstroDusk    *planInstant `json:"astro_dusk"`    // -18°
	DarkFrom     *planInstant `json:"dark_from"`     // the Sun below --sun-alt
	DarkTo       *planInstant `json:"dark_to"`
	AstroDawn    *planInstant `json:"astro_dawn"`
	NauticalDawn *planInstant `json:"nautical_dawn"`
	CivilDawn    *planInstant `json:"civil_dawn"`
	Sunrise      *planInstant `json:"sunrise"`
}

type planEvent struct {
	Rank          int      `json:"rank"` // 1 = the night's best by score
	Target        string   `json:"target"`
	Kind          string   `json:"kind"` // max or min
	Secondary     bool     `json:"secondary"`
	Cycle         float64  `json:"cycle"`
	EphemerisTime float64  `json:"ephemeris_time"` // Julian date on timescale
	Timescale     string   `json:"timescale"`      // hjd or bjd
	SigmaDays     *float64 `json:"sigma_days"`     // null when the catalogue gives no errors
	planInstant
	JDUTC      float64    `json:"jd_utc"`
	AltDeg     float64    `json:"alt_deg"` // airless
	AzDeg      float64    `json:"az_deg"`
	Airmass    *float64   `json:"airmass"`
	SunAltDeg  float64    `json:"sun_alt_deg"`
	MoonAltDeg float64    `json:"moon_alt_deg"`
	MoonSepDeg float64    `json:"moon_sep_deg"`
	MoonIllum  float64    `json:"moon_illum"`
	Observable bool       `json:"observable"` // at the extremum
	Verdict    string     `json:"verdict"`    // whole, extremum, part or none
	Reasons    []string   `json:"reasons"`    // why the extremum is not observable
	Window     planWindow `json:"window"`
	Score      float64    `json:"score"`
	Warnings   []string   `json:"warnings,omitempty"`
}

type planWindow struct {
	Start          planInstant `json:"start"`
	End            planInstant `json:"end"`
	HalfWidthDays  float64     `json:"half_width_days"`
	UsableFraction float64     `json:"usable_fraction"`
	Whole          bool        `json:"whole"`
	Reasons        []string    `json:"reasons"`
}

// planAbout is the description of vigil plan, with its JSON fields.
const planAbout = `The predicted maxima and minima of every target in FILE that are seen in one
night at a site, or in each of --nights nights, in time order (or best first
with --rank), with the night's twilights. The night of a date runs from local
mean noon to local mean noon (UTC + longitude/15 h). An instant is usable when
the Sun is below --sun-alt, the star above --min-alt (airless), and, while the
Moon is up, at least --moon-sep from it. Around each extremum a coverage
window of ±F·P (at most ±--window-max hours) should be usable too; verdict is
whole (the extremum and all the window usable), extremum (the extremum usable,
not all the window), part (some of the window, not the extremum) or none
(listed only with --all). score (0..1) = C·(1+B)·(1+A+U)/6 with C the usable
fraction, B = 1 for a whole window, A the age of the last timing over a year
(1 when never timed), U the ephemeris's uncertainty over the window's
half-width (common practice, not a published method). Times in UTC and in the
site's zone: --tz with --lat/--lon (default UTC), a --site's own zone. A site
named by --site brings its lowest useful altitude (unless --min-alt is given)
and its horizon profile: behind the horizon counts as not usable.
Without --targets the targets are the logbook's, each with its current
ephemeris and its last timing. FILE is a target catalogue in CSV (columns name, ra, dec, epoch, period and
optional pm_ra, pm_dec, class, kind, timescale, q, epoch_err, period_err,
secondary, mag_bright, mag_faint, comps, checks, last_timing, notes) or an
IVOA VOTable (.vot, .xml) with TABLEDATA.
JSON: site {name, lat_deg, lon_deg, elev_m, time_zone, min_alt_deg},
constraints {sun_alt_deg, moon_sep_deg, window_fraction, window_max_hours, all},
targets, ranked, nights [{date, start, end, twilights {sunset, civil_dusk,
nautical_dusk, astro_dusk, dark_from, dark_to, astro_dawn, nautical_dawn,
civil_dawn, sunrise}, n, events [{rank, target, kind, secondary, cycle,
ephemeris_time, timescale, sigma_days, utc, local, jd_utc, alt_deg, az_deg,
airmass, sun_alt_deg, moon_alt_deg, moon_sep_deg, moon_illum, observable,
verdict, reasons, window {start, end, half_width_days, usable_fraction, whole,
reasons}, score, warnings}]}]. Instants are {utc, local} objects (local: ISO
8601 with the zone's offset), or null for a twilight that does not happen.`

func runPlan(e *env, args []string) error {
	f := newFlags(e.cmd,
		"[--targets FILE] (--lat DEG --lon DEG [--elev METRES] [--tz ZONE] | --site NAME) [--logbook PATH] --date YYYY-MM-DD|tonight [--nights N] [--min-alt DEG] [--sun-alt DEG] [--moon-sep DEG] [--window-fraction F] [--rank] [--json]",
		planAbout)
	pf := addPlannerFlags(e, f)
	dateText := f.required("date", "YYYY-MM-DD", "the date the (first) night begins on, or tonight: the site's local date, the day before until local noon")
	nightsText := f.value("nights", "N", "1", fmt.Sprintf("number of consecutive nights, 1 to %d", observe.MaxSpanDays), "")
	rank := f.toggle("rank", "list each night's events best first (by score) instead of in time order")
	all := f.toggle("all", "also list the events of which no part of the coverage window is usable")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	p, obs, err := pf.planner(f, *all)
	if err != nil {
		return err
	}
	date, err := get(f, "date", *dateText, parseDateFlag(e.now, obs))
	if err != nil {
		return err
	}
	nights, err := get(f, "nights", *nightsText, parseIntIn(1, observe.MaxSpanDays))
	if err != nil {
		return err
	}
	targets, path, err := pf.readTargets(f)
	if err != nil {
		return err
	}
	plans, err := p.Forecast(targets, date, nights)
	if err != nil {
		return &flagError{flag: "date", err: fmt.Errorf("%q: %w", *dateText, err)}
	}
	resp := planAnswer(p, targets, plans, *rank)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writePlanTable(e.stdout, path, obs, resp)
	return nil
}

// plannerFlags are the flags vigil plan and vigil chart share: the target
// file, the site (with its time zone) and the constraints.
type plannerFlags struct {
	site                                                   *siteFlags
	targets, tz, votScale                                  *string
	minAlt, sunAlt, moonSep, windowFraction, windowMaxHour *string
}

// Defaults of the planner's flags (observe.DefaultConstraints, and the
// contract's --min-alt 20).
const (
	planMinAltDeg      = 20
	planWindowMaxHours = 3
)

// addPlannerFlags declares the shared flags on f.
func addPlannerFlags(e *env, f *flags) *plannerFlags {
	def := observe.DefaultConstraints()
	pf := &plannerFlags{}
	pf.targets = f.value("targets", "FILE", "", "target catalogue: CSV with a header row ('#' starts a comment line), or an IVOA VOTable (.vot or .xml)", "optional; default the logbook's targets")
	pf.votScale = f.value("votable-timescale", "hjd|bjd", "", "time scale of the epochs of a VOTable that does not say (no TIMESYS, field name or timescale column)", "optional")
	pf.site = addSiteFlags(e, f)
	pf.tz = f.value("tz", "ZONE", "UTC", "IANA time zone of the local times with --lat/--lon (Europe/Berlin); a --site has its own", "")
	pf.minAlt = f.value("min-alt", "DEG", fmt.Sprint(planMinAltDeg), "lowest useful airless altitude of a star, degrees, from -5 to 90; with --site, the site's own unless given", "")
	pf.sunAlt = f.value("sun-alt", "DEG", fmt.Sprint(def.SunAltDeg), "the Sun must be below this airless altitude, degrees, from -30 to 10 (-12 is nautical twilight)", "")
	pf.moonSep = f.value("moon-sep", "DEG", fmt.Sprint(def.MoonMinSepDeg), "while the Moon is up, a star must be at least this far from it, degrees, 0 (off) to 180", "")
	pf.windowFraction = f.value("window-fraction", "F", fmt.Sprint(def.WindowFraction), "half-width of the coverage window around an extremum, as a fraction of the period, above 0 and at most 0.5", "")
	pf.windowMaxHour = f.value("window-max", "HOURS", fmt.Sprint(planWindowMaxHours), fmt.Sprintf("the window's half-width is at most this many hours, above 0 and at most %g", observe.MaxWindowDays*24), "")
	return pf
}

// planner resolves the site, its zone and the constraints into a planner.
func (pf *plannerFlags) planner(f *flags, keepAll bool) (*observe.Planner, observer, error) {
	obs, err := pf.site.resolve(f)
	if err != nil {
		return nil, observer{}, err
	}
	if f.given("tz") {
		if f.given("site") {
			return nil, observer{}, &flagError{flag: "tz", err: fmt.Errorf("give either --site (which has its own time zone) or --tz with --lat/--lon, not both")}
		}
		if obs.zone, err = get(f, "tz", *pf.tz, parseZone); err != nil {
			return nil, observer{}, err
		}
	}
	c := observe.DefaultConstraints()
	c.KeepAll = keepAll
	minAlt, err := get(f, "min-alt", *pf.minAlt, parseDegIn(-5, 90, false))
	if err != nil {
		return nil, observer{}, err
	}
	if c.SunAltDeg, err = get(f, "sun-alt", *pf.sunAlt, parseDegIn(-30, 10, true)); err != nil {
		return nil, observer{}, err
	}
	if c.MoonMinSepDeg, err = get(f, "moon-sep", *pf.moonSep, parseDegIn(0, 180, true)); err != nil {
		return nil, observer{}, err
	}
	if c.WindowFraction, err = get(f, "window-fraction", *pf.windowFraction, parseWindowFraction); err != nil {
		return nil, observer{}, err
	}
	hours, err := get(f, "window-max", *pf.windowMaxHour, parseWindowHours)
	if err != nil {
		return nil, observer{}, err
	}
	c.WindowMaxDays = hours / 24
	// A named site keeps its lowest altitude (unless --min-alt says
	// otherwise) and its horizon profile.
	var horizon observe.Horizon
	if obs.place != nil {
		horizon = obs.place.Horizon
		if !f.given("min-alt") {
			minAlt = obs.place.MinAltDeg
		}
	}
	site, err := observe.NewSite(obs.site.Name, obs.site.LatDeg, obs.site.LonDeg, obs.site.ElevM, zoneName(obs.zone), minAlt, horizon)
	if err != nil {
		return nil, observer{}, &flagError{flag: "min-alt", err: err}
	}
	p, err := observe.NewPlanner(site, c)
	if err != nil {
		return nil, observer{}, err
	}
	return p, obs, nil
}

// parseZone reads an IANA time-zone name.
func parseZone(s string) (*time.Location, error) {
	name := strings.TrimSpace(s)
	z, err := time.LoadLocation(name)
	if err != nil || name == "" || strings.EqualFold(name, "local") {
		return nil, fmt.Errorf("%q: want an IANA time-zone name such as Europe/Berlin, America/Denver or UTC", s)
	}
	return z, nil
}

// parseWindowFraction reads the coverage window's half-width as a fraction
// of the period, in (0, 0.5].
func parseWindowFraction(s string) (float64, error) {
	v, err := parseDegIn(0, 0.5, true)(s)
	if err != nil || v == 0 {
		return 0, fmt.Errorf("%q: want a fraction of the period above 0 and at most 0.5, such as 0.1", s)
	}
	return v, nil
}

// parseWindowHours reads the cap on the window's half-width, in hours.
func parseWindowHours(s string) (float64, error) {
	hi := observe.MaxWindowDays * 24
	v, err := parseDegIn(0, hi, true)(s)
	if err != nil || v == 0 {
		return 0, fmt.Errorf("%q: want a number of hours above 0 and at most %g", s, hi)
	}
	return v, nil
}

// readTargets reads the target catalogue named by --targets: a VOTable for
// .vot and .xml, else CSV. Faults in the file come with its name, line and
// column (or FIELD); a file that cannot be read is a fault of the flag.
// Without --targets the targets are the logbook's. The name returned says
// where they come from, for messages and headings.
func (pf *plannerFlags) readTargets(f *flags) ([]observe.Target, string, error) {
	if !f.given("targets") {
		if f.given("votable-timescale") {
			return nil, "", &flagError{flag: "votable-timescale", err: fmt.Errorf("applies to a --targets VOTable file (.vot, .xml) only: the logbook's targets carry their time scales")}
		}
		return logbookTargets(pf.site.book)
	}
	path, err := get(f, "targets", *pf.targets, nonEmpty("a file name"))
	if err != nil {
		return nil, "", err
	}
	var ts []observe.Target
	if isVOTable(path) {
		var opt observe.VOTableOptions
		if f.given("votable-timescale") {
			if opt.Scale, err = get(f, "votable-timescale", *pf.votScale, ephem.ParseTimeScale); err != nil {
				return nil, "", err
			}
		}
		ts, err = observe.ReadVOTableFile(path, opt)
		if err != nil && opt.Scale == 0 && strings.Contains(err.Error(), "HJD or BJD_TDB") {
			err = fmt.Errorf("%w (choose it with --votable-timescale hjd|bjd)", err)
		}
	} else {
		if f.given("votable-timescale") {
			return nil, "", &flagError{flag: "votable-timescale", err: fmt.Errorf("applies to VOTable files (.vot, .xml) only: a CSV catalogue gives the scale in its timescale column (%q is read as CSV)", path)}
		}
		ts, err = observe.ReadTargetsCSVFile(path)
	}
	if err != nil {
		return nil, "", targetsError(path, err)
	}
	if len(ts) == 0 {
		return nil, "", fmt.Errorf("%s: no targets in the file: want one row per target under the header", path)
	}
	return ts, path, nil
}

// logbookTargets returns the targets of the logbook, each with its current
// ephemeris, and "the logbook PATH" for messages.
func logbookTargets(book *bookFlag) ([]observe.Target, string, error) {
	lb, err := book.open()
	if err != nil {
		return nil, "", err
	}
	ts, err := lb.Targets()
	if err != nil {
		return nil, "", fmt.Errorf("reading the targets of the logbook %q: %w", lb.Path(), err)
	}
	if len(ts) == 0 {
		return nil, "", &flagError{flag: "logbook", err: fmt.Errorf("the logbook %q holds no targets: import some (vigil logbook import --table targets --input FILE) or give --targets FILE", lb.Path())}
	}
	return ts, "the logbook " + lb.Path(), nil
}

// isVOTable says whether a file name is read as a VOTable.
func isVOTable(path string) bool {
	low := strings.ToLower(path)
	return strings.HasSuffix(low, ".vot") || strings.HasSuffix(low, ".xml")
}

// targetsError names --targets when the file could not be opened or read
// (missing, a directory, no permission); other errors, which name the file,
// line and column (or FIELD), pass unchanged.
func targetsError(path string, err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return &flagError{flag: "targets", err: fmt.Errorf("cannot read %q: %v: want a readable CSV or VOTable file of targets", path, pe.Err)}
	}
	return err
}

// planAnswer fills the answer of vigil plan.
func planAnswer(p *observe.Planner, targets []observe.Target, plans []observe.NightPlan, ranked bool) planResponse {
	site, c := p.Site(), p.Constraints()
	zone := site.Location()
	r := planResponse{
		Site: planSite{Name: site.Name, LatDeg: site.LatDeg, LonDeg: site.LonDeg, ElevM: site.ElevM,
			TimeZone: zone.String(), MinAltDeg: site.MinAltDeg},
		Constraints: planConstraints{SunAltDeg: c.SunAltDeg, MoonSepDeg: c.MoonMinSepDeg,
			WindowFraction: c.WindowFraction, WindowMaxHours: c.WindowMaxDays * 24, All: c.KeepAll},
		Targets: len(targets), Ranked: ranked,
		Nights: make([]planNight, len(plans)),
	}
	at := func(t ephem.Time) planInstant { return planInstant{UTC: t, Local: localISO(t, zone)} }
	ev := func(e ephem.Event) *planInstant {
		if !e.OK {
			return nil
		}
		pi := at(e.At)
		return &pi
	}
	for i, n := range plans {
		tw := n.Twilights
		night := planNight{Date: n.Date.Format(time.DateOnly), Start: at(n.Start), End: at(n.End),
			Twilights: planTwilights{Sunset: ev(tw.Sunset), CivilDusk: ev(tw.CivilDusk), NauticalDusk: ev(tw.NauticalDusk),
				AstroDusk: ev(tw.AstroDusk), DarkFrom: ev(tw.DarkFrom), DarkTo: ev(tw.DarkTo), AstroDawn: ev(tw.AstroDawn),
				NauticalDawn: ev(tw.NauticalDawn), CivilDawn: ev(tw.CivilDawn), Sunrise: ev(tw.Sunrise)},
			N: len(n.Events), Events: []planEvent{}}
		best := n.Ranked()
		type key struct {
			target int
			cycle  float64
		}
		rankOf := make(map[key]int, len(best))
		for j, e := range best {
			rankOf[key{e.TargetIndex, e.Cycle}] = j + 1
		}
		order := n.Events
		if ranked {
			order = best
		}
		for j := range order {
			e := &order[j]
			tg := &targets[e.TargetIndex]
			pe := planEvent{
				Rank: rankOf[key{e.TargetIndex, e.Cycle}], Target: e.Target, Kind: e.Kind.String(), Secondary: e.Secondary,
				Cycle: e.Cycle, EphemerisTime: e.EphemerisJD, Timescale: e.Scale.String(),
				SigmaDays:   optional(e.SigmaDays, tg.Ephemeris.EpochErr > 0 || tg.Ephemeris.PeriodErr > 0),
				planInstant: at(e.UTC), JDUTC: e.UTC.JDUTC(),
				AltDeg: e.AltDeg, AzDeg: e.AzDeg, Airmass: num(e.Airmass), SunAltDeg: e.SunAltDeg,
				MoonAltDeg: e.MoonAltDeg, MoonSepDeg: e.MoonSepDeg, MoonIllum: e.MoonIllum,
				Observable: e.Observable, Verdict: verdict(e), Reasons: reasonList(e.Reasons),
				Window: planWindow{Start: at(e.Window.Start), End: at(e.Window.End), HalfWidthDays: e.Window.HalfWidthDays,
					UsableFraction: e.Window.UsableFraction, Whole: e.Window.Whole, Reasons: reasonList(e.Window.Reasons)},
				Score: e.Score,
			}
			if e.SolarWarning {
				pe.Warnings = []string{observe.SolarWarningText}
			}
			night.Events = append(night.Events, pe)
		}
		r.Nights[i] = night
	}
	return r
}

// verdict sums up how well an event can be observed: whole (the extremum
// and all its window usable), extremum (the extremum usable, not all the
// window), part (some of the window, not the extremum) or none.
func verdict(e *observe.Event) string {
	switch {
	case e.Window.Whole:
		return "whole"
	case e.Observable:
		return "extremum"
	case e.Window.UsableFraction > 0:
		return "part"
	}
	return "none"
}

// writePlanTable prints the answer of vigil plan for people.
func writePlanTable(w io.Writer, path string, obs observer, r planResponse) {
	zone, _ := time.LoadLocation(r.Site.TimeZone)
	fmt.Fprintf(w, "Plan for the %d targets of %s\nat %s\n", r.Targets, path, siteText(obs.site))
	fmt.Fprintf(w, "Times in local civil time (%s) and UTC. Usable: the Sun below %g°, the star above %g°, and %g° from the Moon while it is up.\n",
		r.Site.TimeZone, r.Constraints.SunAltDeg, r.Site.MinAltDeg, r.Constraints.MoonSepDeg)
	clock := func(p *planInstant) string {
		if p == nil {
			return "—"
		}
		return p.UTC.Time().Round(time.Minute).In(zone).Format("15:04")
	}
	for _, n := range r.Nights {
		d, _ := time.Parse(time.DateOnly, n.Date)
		tw := n.Twilights
		fmt.Fprintf(w, "\nNight of %s\n", d.Format("Monday 2 January 2006"))
		fmt.Fprintf(w, "  Sunset %s, civil %s, nautical %s, astronomical %s; dark %s–%s; astronomical %s, nautical %s, civil %s, sunrise %s (local)\n",
			clock(tw.Sunset), clock(tw.CivilDusk), clock(tw.NauticalDusk), clock(tw.AstroDusk), clock(tw.DarkFrom), clock(tw.DarkTo),
			clock(tw.AstroDawn), clock(tw.NauticalDawn), clock(tw.CivilDawn), clock(tw.Sunrise))
		if len(n.Events) == 0 {
			fmt.Fprintln(w, "  No extremum can be observed.")
			continue
		}
		t := newTable(w)
		t.row("  Rank", "Local", "UTC", "Target", "Kind", "Cycle", "Alt", "Airmass", "Moon", "Verdict", "Usable", "Score", "Not usable")
		for _, e := range n.Events {
			why := strings.Join(e.Reasons, ", ")
			if len(e.Window.Reasons) > 0 {
				if why != "" {
					why += "; "
				}
				why += "window: " + strings.Join(e.Window.Reasons, ", ")
			}
			t.row(fmt.Sprintf("  %d", e.Rank), e.UTC.Time().Round(time.Second).In(zone).Format("15:04:05"), utcText(e.UTC), e.Target, e.Kind,
				fmt.Sprintf("%g", e.Cycle), fmt.Sprintf("%.1f°", e.AltDeg), ptrText("%.2f", e.Airmass),
				fmt.Sprintf("%.0f° away, %.0f%% lit", e.MoonSepDeg, 100*e.MoonIllum), e.Verdict,
				fmt.Sprintf("%.0f%%", 100*e.Window.UsableFraction), fmt.Sprintf("%.3f", e.Score), why)
		}
		t.flush()
	}
	for _, n := range r.Nights {
		for _, e := range n.Events {
			if len(e.Warnings) > 0 {
				fmt.Fprintf(w, "\nCaution: %s\n", observe.SolarWarningText)
				return
			}
		}
	}
}
