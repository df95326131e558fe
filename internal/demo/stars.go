package demo

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// The demo scenario: two invented observatories and eight invented variable
// stars. Every name is made up so that it cannot be taken for a real
// designation, and every record says it is a demo.

// demoTag ends every demo site's name; demoNote starts the notes of every
// other demo record.
const (
	demoTag  = " (demo)"
	demoNote = "Demo (invented data)"
)

// SiteName is the name of the demo's main observatory (Site).
const SiteName = "Ashgrove Hill Observatory" + demoTag

// The demo's other observatory, its observers and their equipment.
const (
	demoSchoolName = "Bellbird Ridge School Observatory" + demoTag
	demoObserver   = "Demo Observer"
	demoSchoolObs  = "Demo School Astronomy Club"
	demoEquipment  = "Demo kit: 254 mm Newtonian reflector, cooled CCD camera, V filter"
	demoSchoolKit  = "Demo kit: 200 mm Schmidt-Cassegrain, CMOS camera, V filter"
)

// Site returns the demo's main observatory, the one source of its
// definition: the fictitious Ashgrove Hill Observatory (demo) in the
// English Midlands at 52.1172° N, 1.4538° W (WEST of Greenwich, so its
// east-positive longitude is −1.4538), 140 m, time zone Europe/London,
// lowest useful altitude 20°, with trees to the north-east (up to 35°) and
// a roof to the south (24°).
//
// The values are constants of this package, checked by its tests; Site
// panics only if they were edited into an invalid site.
func Site() observe.Site {
	s, err := ashgrove()
	if err != nil {
		panic(fmt.Sprintf("demo: the demo site's definition is invalid: %v", err))
	}
	return s
}

// ashgrove builds the demo's main observatory (see Site).
func ashgrove() (observe.Site, error) {
	return observe.NewSite(SiteName, 52.1172, -1.4538, 140, "Europe/London", 20, observe.Horizon{
		{AzDeg: 0, AltDeg: 8}, {AzDeg: 25, AltDeg: 8}, {AzDeg: 35, AltDeg: 30}, {AzDeg: 50, AltDeg: 35},
		{AzDeg: 65, AltDeg: 30}, {AzDeg: 75, AltDeg: 8}, // trees to the north-east
		{AzDeg: 155, AltDeg: 8}, {AzDeg: 160, AltDeg: 24}, {AzDeg: 200, AltDeg: 24}, {AzDeg: 205, AltDeg: 8}, // the roof to the south
	})
}

// demoSites returns the two demo observatories: Ashgrove Hill (Site), and
// a school in the southern hemisphere with a building to the west.
func demoSites() ([]observe.Site, error) {
	ash, err := ashgrove()
	if err != nil {
		return nil, err
	}
	school, err := observe.NewSite(demoSchoolName, -34.0521, 150.7411, 70, "Australia/Sydney", 25, observe.Horizon{
		{AzDeg: 250, AltDeg: 5}, {AzDeg: 258, AltDeg: 32}, {AzDeg: 292, AltDeg: 32}, {AzDeg: 300, AltDeg: 5}, // the school hall
	})
	if err != nil {
		return nil, err
	}
	return []observe.Site{ash, school}, nil
}

// publishedSpec describes the invented published timings of a demo star.
type publishedSpec struct {
	fromYear, toYear int
	n                int
	sigmaDays        [2]float64 // range of the stated uncertainties
	secondaryEvery   int        // every k-th is a secondary minimum (0: none)
	sources          []string   // invented publications, used in turn
}

// demoStar is one invented star: what the catalogue says, the hidden truth
// its data are drawn from, and how the demo observer watches it.
type demoStar struct {
	name     string
	star     ephem.Star
	class    observe.Class
	kind     observe.Kind
	second   bool // secondary minima are predicted and timed
	truth    trueElements
	shape    lightShape
	comps    []observe.Comp
	checks   []observe.Comp
	history  []logbook.AdoptedEphemeris // in order of adoption; the last is current
	notes    string
	meanMagV bool // store the intensity-mean V (a Cepheid, for its distance)

	// How the demo observer covers an extremum: the half-length of a run
	// about it, the cadence, the exposure, and how it is timed: the
	// half-width of the window, the method (reduce.MethodPoly when empty)
	// and, for a polynomial, its degree.
	runHalfDays, cadenceMin, exposureS float64
	fitHalfDays                        float64
	fitMethod                          reduce.ExtremumMethod
	fitDegree                          int
	runsPerSeason                      int // at Ashgrove
	schoolRuns                         int // at the school, over the years
	nightly                            bool
	visual                             bool
	published                          publishedSpec
}

// catalogueSource and the adoption date of the demo's first ephemerides.
var (
	demoCatalogue = "Ashgrove demo catalogue (invented), 2018"
	demoAdopted   = time.Date(2019, 1, 5, 20, 0, 0, 0, time.UTC)
)

// demoStars returns the eight invented stars, spread in right ascension so
// that some are up on any night of the year from Ashgrove Hill.
func demoStars() []demoStar {
	lin := func(epoch, p float64, scale ephem.TimeScale, eErr, pErr float64) ephem.Ephemeris {
		return ephem.Ephemeris{Epoch: epoch, PeriodDays: p, Scale: scale, EpochErr: eErr, PeriodErr: pErr}
	}
	first := func(e ephem.Ephemeris) logbook.AdoptedEphemeris {
		return logbook.AdoptedEphemeris{Ephemeris: e, Adopted: demoAdopted, Source: demoCatalogue}
	}
	circular := []string{"Invented Circular of Eclipsing Binaries, no. 41 (2003)", "Invented Circular of Eclipsing Binaries, no. 57 (2008)",
		"Invented Circular of Eclipsing Binaries, no. 73 (2014)", "Invented Circular of Eclipsing Binaries, no. 88 (2018)"}
	journal := []string{"Journal of Imaginary Variable Stars 12, 34 (2011)", "Journal of Imaginary Variable Stars 15, 201 (2014)",
		"Journal of Imaginary Variable Stars 19, 77 (2018)"}
	for i := range circular {
		circular[i] += " [demo, invented]"
	}
	for i := range journal {
		journal[i] += " [demo, invented]"
	}

	// V4's period grows: T(E) = T0 + P·E + Q·E² with Q = 5×10⁻⁹ d. The
	// catalogue's linear ephemeris is the tangent of that parabola in 2004
	// (on HJD, as published then); the one adopted in 2023 is the tangent
	// then (on BJD_TDB). Either way the O−C of the timings is a parabola.
	v4 := trueElements{epoch: 2459002.21843, periodDays: 2.8673541, q: 5e-9}
	tangent := func(e trueElements, cycle float64) (epoch, period float64) {
		return e.eventTime(cycle), e.periodDays + 2*e.q*cycle
	}
	v4e1, v4p1 := tangent(v4, -2300)
	v4e2, v4p2 := tangent(v4, 500)
	// Catalogues print 5 decimals of a day for epochs, 7 for periods.
	v4e1, v4e2 = roundTo(v4e1-hjdOffsetGuess, 5), roundTo(v4e2, 5)
	v4p1, v4p2 = roundTo(v4p1, 7), roundTo(v4p2, 7)

	v5 := trueElements{epoch: 2459000.18731, periodDays: 0.3691234,
		ltt: lightTime{amplitudeDays: 0.0062, periodDays: 2263, zeroJD: 2458500}}

	return []demoStar{
		{
			name: "Ashgrove V1", star: ephem.Star{RAHours: 0.9151, DecDeg: 24.31}, class: observe.Pulsating, kind: observe.Max,
			truth:  trueElements{epoch: 2459001.31274, periodDays: 0.5672381},
			shape:  lightShape{kind: shapePulsator, base: 11.35, amp: 1.03, width: 0.9},
			comps:  []observe.Comp{{ID: "C1", V: 11.482, BV: 0.52}, {ID: "C2", V: 12.104, BV: 0.61}, {ID: "C3", V: 10.968, BV: 0.47}},
			checks: []observe.Comp{{ID: "K1", V: 11.795, BV: 0.58}},
			history: []logbook.AdoptedEphemeris{
				first(lin(2456001.4021, 0.567237, ephem.HJD, 0.002, 0.000002)),
				{Ephemeris: lin(2459001.31274, 0.5672381, ephem.BJDTDB, 0.0006, 0.0000004), Adopted: time.Date(2021, 11, 2, 21, 15, 0, 0, time.UTC),
					Source: "own O-C fit of the 2019-2021 maxima [demo, invented]"},
			},
			notes:       demoNote + ": an RR Lyrae-like pulsator, fast rise and slow decline; not a real star.",
			runHalfDays: 0.07, cadenceMin: 2, exposureS: 60, fitHalfDays: 0.035, fitDegree: 3, runsPerSeason: 2, schoolRuns: 1,
			published: publishedSpec{fromYear: 2012, toYear: 2018, n: 6, sigmaDays: [2]float64{0.0015, 0.003}, sources: journal},
		},
		{
			name: "Ashgrove V2", star: ephem.Star{RAHours: 21.3124, DecDeg: 41.18}, class: observe.Pulsating, kind: observe.Max,
			truth:    trueElements{epoch: 2459003.442, periodDays: 5.703124},
			shape:    lightShape{kind: shapePulsator, base: 8.92, amp: 0.79, width: 0.8},
			comps:    []observe.Comp{{ID: "C1", V: 9.214, BV: 0.71}, {ID: "C2", V: 9.687, BV: 0.83}, {ID: "C3", V: 8.801, BV: 0.66}},
			checks:   []observe.Comp{{ID: "K1", V: 9.455, BV: 0.77}},
			history:  []logbook.AdoptedEphemeris{first(lin(2459003.442, 5.703124, ephem.BJDTDB, 0.02, 0.00002))},
			notes:    demoNote + ": a Cepheid-like pulsator with a mean V magnitude for its period-luminosity distance; not a real star.",
			meanMagV: true,
			nightly:  true, cadenceMin: 3, exposureS: 30,
			published: publishedSpec{fromYear: 2014, toYear: 2018, n: 4, sigmaDays: [2]float64{0.03, 0.06}, sources: journal},
		},
		{
			name: "Ashgrove V3", star: ephem.Star{RAHours: 8.1172, DecDeg: 12.62}, class: observe.Pulsating, kind: observe.Max,
			truth:       trueElements{epoch: 2459000.05118, periodDays: 0.0871234},
			shape:       lightShape{kind: shapeSine, base: 10.41, amp: 0.31},
			comps:       []observe.Comp{{ID: "C1", V: 10.655, BV: 0.31}, {ID: "C2", V: 10.214, BV: 0.28}, {ID: "C3", V: 11.032, BV: 0.44}},
			checks:      []observe.Comp{{ID: "K1", V: 10.876, BV: 0.39}},
			history:     []logbook.AdoptedEphemeris{first(lin(2459000.05118, 0.0871234, ephem.BJDTDB, 0.0004, 0.00000002))},
			notes:       demoNote + ": a short-period delta Scuti-like pulsator; not a real star.",
			runHalfDays: 0.06, cadenceMin: 1.5, exposureS: 45, fitHalfDays: 0.012, fitDegree: 2, runsPerSeason: 1, schoolRuns: 2,
			published: publishedSpec{fromYear: 2015, toYear: 2018, n: 3, sigmaDays: [2]float64{0.0008, 0.0015}, sources: journal},
		},
		{
			name: "Ashgrove V4", star: ephem.Star{RAHours: 3.6041, DecDeg: 48.93}, class: observe.Eclipsing, kind: observe.Min,
			truth:  v4,
			shape:  lightShape{kind: shapeAlgol, base: 9.82, amp: 1.23, depth2: 0.08, width: 0.022},
			comps:  []observe.Comp{{ID: "C1", V: 10.102, BV: 0.12}, {ID: "C2", V: 9.655, BV: 0.35}, {ID: "C3", V: 10.731, BV: 0.58}},
			checks: []observe.Comp{{ID: "K1", V: 10.344, BV: 0.41}},
			history: []logbook.AdoptedEphemeris{
				{Ephemeris: lin(v4e1, v4p1, ephem.HJD, 0.0008, 0.0000006), Adopted: demoAdopted, Source: circular[0]},
				{Ephemeris: lin(v4e2, v4p2, ephem.BJDTDB, 0.0004, 0.0000002), Adopted: time.Date(2023, 9, 14, 22, 40, 0, 0, time.UTC),
					Source: "own O-C fit of the 2019-2023 minima, linear [demo, invented]"},
			},
			notes:       demoNote + ": an Algol-like eclipsing binary whose period grows (a parabola in O-C); not a real star.",
			runHalfDays: 0.12, cadenceMin: 3, exposureS: 30, fitHalfDays: 0.05, fitMethod: reduce.MethodKvW, runsPerSeason: 2,
			published: publishedSpec{fromYear: 2001, toYear: 2018, n: 24, sigmaDays: [2]float64{0.0008, 0.002}, sources: circular},
		},
		{
			name: "Ashgrove V5", star: ephem.Star{RAHours: 13.2274, DecDeg: 31.74}, class: observe.Eclipsing, kind: observe.Min, second: true,
			truth:  v5,
			shape:  lightShape{kind: shapeContact, base: 10.95, amp: 0.67, depth2: 0.55},
			comps:  []observe.Comp{{ID: "C1", V: 11.208, BV: 0.66}, {ID: "C2", V: 11.597, BV: 0.72}, {ID: "C3", V: 10.842, BV: 0.55}},
			checks: []observe.Comp{{ID: "K1", V: 11.380, BV: 0.69}},
			history: []logbook.AdoptedEphemeris{
				first(lin(2455000.2146, 0.3691228, ephem.HJD, 0.001, 0.000001)),
				{Ephemeris: lin(v5.epoch, v5.periodDays, ephem.BJDTDB, 0.0008, 0.0000001), Adopted: time.Date(2022, 5, 20, 23, 5, 0, 0, time.UTC),
					Source: "own O-C fit of the 2009-2022 minima, linear [demo, invented]"},
			},
			notes:       demoNote + ": a W UMa-like contact binary; a third body makes its O-C wobble (light-travel time); not a real star.",
			runHalfDays: 0.05, cadenceMin: 2, exposureS: 60, fitHalfDays: 0.025, fitMethod: reduce.MethodKvW, runsPerSeason: 3,
			published: publishedSpec{fromYear: 2009, toYear: 2018, n: 30, sigmaDays: [2]float64{0.0004, 0.0008}, secondaryEvery: 3, sources: circular},
		},
		{
			name: "Ashgrove V6", star: ephem.Star{RAHours: 17.5832, DecDeg: -8.41}, class: observe.Eclipsing, kind: observe.Min, second: true,
			truth:       trueElements{epoch: 2459001.04406, periodDays: 1.7393186},
			shape:       lightShape{kind: shapeAlgol, base: 10.22, amp: 0.86, depth2: 0.25, width: 0.028},
			comps:       []observe.Comp{{ID: "C1", V: 10.493, BV: 0.44}, {ID: "C2", V: 10.911, BV: 0.51}, {ID: "C3", V: 10.118, BV: 0.38}},
			checks:      []observe.Comp{{ID: "K1", V: 10.705, BV: 0.47}},
			history:     []logbook.AdoptedEphemeris{first(lin(roundTo(2459001.04406-hjdOffsetGuess, 5), 1.7393186, ephem.HJD, 0.0006, 0.0000008))},
			notes:       demoNote + ": a detached eclipsing binary with secondary minima at phase 0.5; not a real star.",
			runHalfDays: 0.07, cadenceMin: 2.5, exposureS: 45, fitHalfDays: 0.035, fitMethod: reduce.MethodKvW, runsPerSeason: 1, schoolRuns: 6,
			published: publishedSpec{fromYear: 2010, toYear: 2018, n: 8, sigmaDays: [2]float64{0.0008, 0.0015}, secondaryEvery: 2, sources: journal},
		},
		{
			name: "Ashgrove V7", star: ephem.Star{RAHours: 15.4063, DecDeg: 5.27}, class: observe.Pulsating, kind: observe.Max,
			truth:       trueElements{epoch: 2459000.22093, periodDays: 0.3318271},
			shape:       lightShape{kind: shapeSine, base: 12.03, amp: 0.48},
			comps:       []observe.Comp{{ID: "C1", V: 12.315, BV: 0.42}, {ID: "C2", V: 11.874, BV: 0.36}, {ID: "C3", V: 12.660, BV: 0.50}},
			checks:      []observe.Comp{{ID: "K1", V: 12.198, BV: 0.45}},
			history:     []logbook.AdoptedEphemeris{first(lin(2459000.22093, 0.3318271, ephem.BJDTDB, 0.001, 0.0000005))},
			notes:       demoNote + ": a first-overtone RR Lyrae-like pulsator with a nearly sinusoidal light curve; not a real star.",
			runHalfDays: 0.06, cadenceMin: 2, exposureS: 90, fitHalfDays: 0.04, fitDegree: 2, runsPerSeason: 1, schoolRuns: 3,
			published: publishedSpec{fromYear: 2013, toYear: 2018, n: 3, sigmaDays: [2]float64{0.002, 0.004}, sources: journal},
		},
		{
			name: "Ashgrove V8", star: ephem.Star{RAHours: 11.0133, DecDeg: 62.07}, class: observe.Pulsating, kind: observe.Max,
			truth: trueElements{epoch: 2458985.0, periodDays: 287.4},
			shape: lightShape{kind: shapeSine, base: 8.3, amp: 3.3},
			comps: []observe.Comp{{ID: "A", V: 8.05, BV: 0.9}, {ID: "B", V: 8.71, BV: 1.0}, {ID: "C", V: 9.32, BV: 0.8},
				{ID: "D", V: 9.95, BV: 1.1}, {ID: "E", V: 10.58, BV: 0.7}, {ID: "F", V: 11.24, BV: 0.9}, {ID: "G", V: 11.87, BV: 1.0}},
			history:   []logbook.AdoptedEphemeris{first(lin(2458985.0, 287.4, ephem.BJDTDB, 3, 0.3))},
			notes:     demoNote + ": a long-period pulsator followed by eye (visual estimates, fractional method); not a real star.",
			visual:    true,
			published: publishedSpec{fromYear: 2008, toYear: 2018, n: 6, sigmaDays: [2]float64{2, 4}, sources: journal},
		},
	}
}

// hjdOffsetGuess is a rough BJD_TDB − HJD_UTC (about 69 s of TDB − UTC) for
// the demo's old catalogue ephemerides on HJD; they need only be close.
const hjdOffsetGuess = 69.2 / 86400

// roundTo rounds v to the given number of decimals (the nearest float64 to
// that decimal number).
func roundTo(v float64, decimals int) float64 {
	p := math.Pow(10, float64(decimals))
	return math.Round(v*p) / p
}

// target returns the demo star as the catalogue holds it, with its first
// ephemeris.
func (d *demoStar) target() observe.Target {
	t := observe.NewTarget(d.name, d.star, d.class, d.history[0].Ephemeris, d.kind)
	t.Secondary = d.second
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 0; i < 1000; i++ {
		m := d.shape.magAt(float64(i) / 1000)
		lo, hi = math.Min(lo, m), math.Max(hi, m)
	}
	t.MagBright, t.MagFaint = math.Round(lo*100)/100, math.Round(hi*100)/100
	t.Comps, t.Checks = d.comps, d.checks
	t.Notes = d.notes
	return t
}

// meanSamples is the number of phases, evenly spaced, at which the light
// curve is sampled for its intensity mean.
const meanSamples = 4000

// record returns the star as the demo logbook stores it: the catalogue
// entry with its first ephemeris, the ephemerides adopted since, and for a
// Cepheid-like star its intensity-mean V (see lightShape.intensityMean), to
// 3 decimals as a catalogue prints it.
func (d *demoStar) record() (logbook.DemoTarget, error) {
	mean := math.NaN()
	if d.meanMagV {
		m, err := d.shape.intensityMean(meanSamples)
		if err != nil {
			return logbook.DemoTarget{}, fmt.Errorf("%s: intensity mean: %w", d.name, err)
		}
		mean = roundTo(m, 3)
	}
	return logbook.DemoTarget{Target: d.target(), MeanMagV: mean, Adopted: d.history[0].Adopted,
		Source: d.history[0].Source, Later: d.history[1:]}, nil
}
