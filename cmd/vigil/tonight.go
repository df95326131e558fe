package main

import (
	"fmt"

	"vigil/ephem"
)

// tonight prints what `vigil` without arguments shows until the window
// exists: tonight's events at the demo site, in local time and UTC, and where
// the Moon stands now.
func tonight(e *env) error {
	obs, err := demoObserver()
	if err != nil {
		return err
	}
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
	fmt.Fprintf(w, "Night of %s. %s\n\n", n.Date.Format("Monday 2 January 2006"), zoneNote(obs.zone))
	writeNightTable(w, n, obs.zone)

	sky := ephem.NewSky(obs.site, at)
	moon, sun := sky.Moon(), sky.Sun()
	fmt.Fprintf(w, "\nNow, %s (%s): Sun at %.1f°, Moon at %.1f° altitude (azimuth %.0f°), %.0f%% illuminated.\n",
		localText(at, obs.zone), utcText(at), sun.AltDeg, moon.AltDeg, moon.AzDeg, 100*sky.MoonIllumination())
	fmt.Fprintf(w, "\nThe window will open here in a later version; `vigil help` lists the commands.\n")
	return nil
}
