package report_test

import (
	"bytes"
	"fmt"
	"strings"
	"time"

	"example.org/vigil/app/report"
	"example.org/vigil/observe"
)

// ExampleForNight plans a night, prints its log as text and shows the
// evening's twilights. The UTC times agree with astropy's to the minute
// (methods sheet §5, φ = +50°, λ = +10° E, 2024-12-21: sunset 15:20:27,
// civil 15:58:59, nautical 16:40:35, astronomical 17:20:04 UTC).
func ExampleForNight() {
	site, err := observe.NewSite("Hilltop Yard", 50, 10, 300, "Europe/Berlin", 20, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	planner, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		fmt.Println(err)
		return
	}
	targets, err := observe.ReadTargetsCSVFile("../../observe/testdata/targets_example.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	log, err := report.ForNight(planner, targets, time.Date(2024, 12, 21, 0, 0, 0, 0, time.UTC))
	if err != nil {
		fmt.Println(err)
		return
	}
	log.Observer = "R. Example"
	var buf bytes.Buffer
	if err := log.WriteText(&buf); err != nil {
		fmt.Println(err)
		return
	}
	for _, line := range strings.Split(buf.String(), "\n") {
		if strings.HasPrefix(line, "  ") && (strings.Contains(line, "sunset") || strings.Contains(line, "dusk")) {
			fmt.Println(strings.TrimSpace(line))
		}
	}
	fmt.Println(len(log.Plan.Events), "planned extrema")
	// Output:
	// sunset (Sun −0.83°)           16:20    15:20
	// civil dusk (−6°)              16:59    15:59
	// nautical dusk (−12°)          17:41    16:41
	// astronomical dusk (−18°)      18:20    17:20
	// 6 planned extrema
}
