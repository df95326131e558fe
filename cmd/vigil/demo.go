package main

import (
	"example.org/vigil/internal/demo"
)

// demoSiteAlias is a short name --site accepts for the demo's main
// observatory (demo.Site, named demo.SiteName). Without --logbook it needs no
// logbook: `vigil sky --site demo` opens and creates no file.
const demoSiteAlias = "demo"

// demoObserver returns the demo's main observatory, the one definition the
// program shares (package vigil/internal/demo), with its time zone, lowest
// altitude and horizon profile.
func demoObserver() observer {
	s := demo.Site()
	return observer{site: s.Site, zone: s.Location(), place: &s}
}
