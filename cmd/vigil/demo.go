package main

import (
	"fmt"
	"time"
	_ "time/tzdata" // the demo site's time zone, on systems without a zone database

	"vigil/ephem"
)

// The demo site: a fictitious observatory in the English Midlands, WEST of
// Greenwich (so its longitude is negative, east-positive convention). It is
// the site `vigil` shows without arguments and the one name `--site` knows
// until the logbook holds the user's own sites.
const (
	demoSiteName = "Ashgrove Hill Observatory (demo)"
	demoLatDeg   = 52.1172
	demoLonDeg   = -1.4538 // east positive: 1.4538° west
	demoElevM    = 140
	demoZoneName = "Europe/London"
)

// demoSiteAlias is a short name --site also accepts for the demo site.
const demoSiteAlias = "demo"

// demoObserver returns the demo site with its time zone.
func demoObserver() (observer, error) {
	site, err := ephem.NewSite(demoSiteName, demoLatDeg, demoLonDeg, demoElevM)
	if err != nil {
		return observer{}, fmt.Errorf("demo site: %w", err)
	}
	zone, err := time.LoadLocation(demoZoneName)
	if err != nil {
		return observer{}, fmt.Errorf("demo site: time zone %q: %w", demoZoneName, err)
	}
	return observer{site: site, zone: zone}, nil
}
