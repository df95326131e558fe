package main

import (
	"fmt"
	"strings"

	"vigil/ephem"
)

// tonight prints what `vigil` without arguments shows until the window
// exists: tonight's events at the demo site, in local time and UTC, and where
// the Moon stands now. It opens no logbook.
func tonight(e *env) error {
	return writeTonight(e, demoObserver(), "")
}

// tonightIn prints tonight at the first site of the logbook at path, as
// `vigil --logbook PATH` does until it opens the window on that logbook.
func tonightIn(e *env, path string) error {
	book := &bookFlag{e: e, explicit: path}
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
		return "", false, fmt.Errorf("flag --logbook: %q follows it: alone, vigil --logbook PATH shows tonight at the logbook's first site; with a command, give --logbook after the command's name (vigil sky --logbook PATH ...)", rest[0])
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
	fmt.Fprintf(w, "\nThe window will open here in a later version; `vigil help` lists the commands.\n")
	return nil
}
