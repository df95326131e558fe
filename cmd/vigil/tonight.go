package main

import (
	"fmt"
	"strings"

	"example.org/vigil/ephem"
)

var tonightCommand = command{
	name:    "tonight",
	summary: "tonight at a glance in plain text: twilights, moonrise and moonset in local time and UTC, the Sun and Moon now",
	run:     runTonight,
}

// runTonight prints tonight's events at a site (the demo site when none is
// given, or the first site of the logbook given with --logbook alone), in
// local time and UTC, and where the Sun and the Moon stand now.
func runTonight(e *env, args []string) error {
	f := newFlags(e.cmd, "[--site NAME | --lat DEG --lon DEG [--elev METRES]] [--logbook PATH]",
		`Tonight at a glance: sunset, the three twilights, sunrise, moonrise and
moonset in local time and UTC, how long it is dark, and where the Sun and the
Moon stand now. Without a site: the demo site, or with --logbook alone the
first site of that logbook. Times are local civil time when the site's time
zone is known (a logbook site), else local mean time is not shown.`)
	site := addSiteFlags(e, f)
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	switch {
	case f.given("site") || f.given("lat") || f.given("lon"):
		obs, err := site.resolve(f)
		if err != nil {
			return err
		}
		return writeTonight(e, obs, "")
	case f.given("logbook"):
		return tonightIn(e, site.book)
	}
	return writeTonight(e, demoObserver(), "")
}

// tonightIn prints tonight at the first site of the logbook book names.
func tonightIn(e *env, book *bookFlag) error {
	lb, err := book.open()
	if err != nil {
		return err
	}
	site, n, err := defaultSite(lb)
	if err != nil {
		return err
	}
	which := whichSite(n)
	note := fmt.Sprintf("Site: %s. Logbook: %s.", which, lb.Path())
	if book.created {
		note = fmt.Sprintf("Site: %s. Logbook: %s, created now with the demo scenario.", which, lb.Path())
	}
	return writeTonight(e, placeObserver(site), note)
}

// topLevelLogbook recognises `vigil --logbook PATH` (also -logbook and
// --logbook=PATH) and returns PATH; ok is false when args start otherwise.
// --logbook before a command's name is an error: it belongs after it.
func topLevelLogbook(args []string) (path string, ok bool, err error) {
	name, value, hasValue := strings.Cut(args[0], "=")
	if name != "--logbook" && name != "-logbook" {
		return "", false, nil
	}
	rest := args[1:]
	if !hasValue {
		if len(rest) == 0 {
			return "", false, fmt.Errorf("flag --logbook: needs PATH after it")
		}
		value, rest = rest[0], rest[1:]
	}
	if len(rest) > 0 {
		return "", false, fmt.Errorf("flag --logbook: %q follows it: alone, vigil --logbook PATH opens the window on that logbook; with a command, give --logbook after the command's name (vigil sky --logbook PATH ...)", rest[0])
	}
	if strings.TrimSpace(value) == "" {
		return "", false, fmt.Errorf("flag --logbook: empty value: want the path of a logbook file")
	}
	return value, true, nil
}

// writeTonight prints tonight's events at the observer's site, a note (the
// logbook the site comes from, or ""), and the Sun and Moon now.
func writeTonight(e *env, obs observer, note string) error {
	now := e.now()
	at, err := ephem.FromTime(now)
	if err != nil {
		return fmt.Errorf("the clock reads %s: %w", now.UTC().Format("2006-01-02T15:04:05Z"), err)
	}
	n, err := ephem.NightOf(obs.site, tonightDate(now, obs))
	if err != nil {
		return err
	}
	w := e.stdout
	fmt.Fprintf(w, "Tonight at %s\n", siteText(obs.site))
	if note != "" {
		fmt.Fprintln(w, note)
	}
	fmt.Fprintf(w, "Night of %s. %s\n\n", n.Date.Format("Monday 2 January 2006"), zoneNote(obs.zone))
	writeNightTable(w, n, obs.zone)

	sky := ephem.NewSky(obs.site, at)
	moon, sun := sky.Moon(), sky.Sun()
	fmt.Fprintf(w, "\nNow, %s (%s): Sun at %.1f°, Moon at %.1f° altitude (azimuth %.0f°), %.0f%% illuminated.\n",
		localText(at, obs.zone), utcText(at), sun.AltDeg, moon.AltDeg, moon.AzDeg, 100*sky.MoonIllumination())
	fmt.Fprintf(w, "\n`vigil` alone opens the window; `vigil help` lists the commands.\n")
	return nil
}
