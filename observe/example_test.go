package observe_test

import (
	"fmt"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// ExamplePredict lists the maxima of an invented star over a day and a half.
// The UTC instants agree with astropy's (testdata/predict/events.csv, "Alder
// Var": cycle 5122 at 2025-08-14T02:07:55.988Z) to about 0.01 s.
func ExamplePredict() {
	site, _ := observe.NewSite("Hilltop", 50, 10, 300, "Europe/Berlin", 20, nil)
	star := ephem.Star{RAHours: 5.5, DecDeg: 30}
	eph := ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 0.3712345, Scale: ephem.BJDTDB}
	target := observe.NewTarget("Alder Var", star, observe.Pulsating, eph, observe.Max)
	from, _ := ephem.ParseInstant("2025-08-13T12:00:00Z")
	to, _ := ephem.ParseInstant("2025-08-15T00:00:00Z")
	c := observe.DefaultConstraints()
	c.MoonMinSepDeg = 0 // as the command line: altitude and Sun only
	events, err := observe.Predict(site, target, from, to, c)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, e := range events {
		verdict := "observable"
		if !e.Observable {
			verdict = "not observable: " + e.Reasons.String()
		}
		fmt.Printf("E=%.0f %s alt %5.1f° Sun %6.1f° %s\n", e.Cycle, e.UTC, e.AltDeg, e.SunAltDeg, verdict)
	}
	// Output:
	// E=5121 2025-08-13T17:13:23.996Z alt  -5.0° Sun   12.8° not observable: too low, daylight
	// E=5122 2025-08-14T02:07:55.993Z alt  29.8° Sun  -16.4° observable
	// E=5123 2025-08-14T11:02:27.986Z alt  44.1° Sun   53.9° not observable: daylight
	// E=5124 2025-08-14T19:56:59.992Z alt  -9.5° Sun  -11.4° not observable: too low, twilight
}

// Example shows the usual chain: a site with a horizon profile, a target
// catalogue, the plan of one night, best event first.
func Example() {
	site, err := observe.NewSite("Garden", 50, 10, 300, "Europe/Berlin", 20,
		observe.Horizon{{AzDeg: 0, AltDeg: 15}, {AzDeg: 180, AltDeg: 30}})
	if err != nil {
		fmt.Println(err)
		return
	}
	csv := `name,ra,dec,class,epoch,timescale,period,epoch_err,period_err
Alder Var,05:30:00,+30:00:00,pulsating,2459000.1234,bjd,0.3712345,0.001,0.000001
Cedar Ecl,13.05,61.2,eclipsing,2448500.25,hjd,1.2345678,0.0005,0.000002
`
	targets, err := observe.ReadTargetsCSV(strings.NewReader(csv), "catalogue.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	planner, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		fmt.Println(err)
		return
	}
	night, err := planner.Night(targets, time.Date(2025, 8, 13, 0, 0, 0, 0, time.UTC))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("dark from", night.Twilights.DarkFrom.At.Time().In(site.Location()).Format("15:04"),
		"to", night.Twilights.DarkTo.At.Time().In(site.Location()).Format("15:04"))
	for _, e := range night.Ranked() {
		fmt.Printf("%s %s %s at %.0f°, usable %.0f%%, score %.2f\n", e.Target, e.Kind, e.Local.Format("15:04"),
			e.AltDeg, 100*e.Window.UsableFraction, e.Score)
	}
	// Output:
	// dark from 22:03 to 04:46
	// Cedar Ecl min 01:40 at 28°, usable 100%, score 0.72
	// Alder Var max 04:07 at 30°, usable 86%, score 0.31
}

// ExampleHorizon_AltDeg interpolates a horizon profile across north.
func ExampleHorizon_AltDeg() {
	h := observe.Horizon{{AzDeg: 30, AltDeg: 10}, {AzDeg: 300, AltDeg: 40}}
	fmt.Printf("%.1f %.1f %.1f\n", h.AltDeg(30), h.AltDeg(165), h.AltDeg(0))
	// Output:
	// 10.0 25.0 20.0
}
