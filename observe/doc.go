// Package observe plans nights of variable-star observing: targets and
// sites, the predicted extrema of every target in a span of time, whether
// each can be observed from the site (at its instant and over a coverage
// window around it), night plans ranked for their value, a forecast of many
// nights, and the data of an altitude chart. It imports ephem for the sky
// and time, and nothing of the window or the plotting libraries.
//
// # Conventions
//
// As in ephem: longitude EAST positive; azimuth from north through east;
// altitudes airless (geometric, topocentric) unless a name says refracted;
// Julian dates carry their scale in the name or beside them (an ephemeris
// is on HJD_UTC or BJD_TDB, Event.UTC is an instant). The night of a date
// runs from local mean noon to local mean noon, as ephem.NightOf counts it;
// local clock times use the site's IANA time zone.
//
// # Predictions
//
// Planner.Predict lists every extremum T(E) = T0 + P·E + Q·E² whose UTC
// instant lies in [from, to) (an event exactly at from is in, one exactly at
// to is out), with E + 0.5 for secondary minima when asked. The UTC instant
// at which an extremum is seen is the root of T(E) = HJD(t) or BJD_TDB(t)
// (Eastman, Siverd & Gaudi 2010), solved by ephem.SkySpan.SeenAt (within a
// millisecond of ephem.SeenAt); it agrees with astropy to 0.04 s over
// 1985–2041 (testdata/predict). The prediction's own uncertainty is
// sqrt(σT0² + (E·σP)²) (ephem.Ephemeris.Sigma).
//
// # Verdicts
//
// An instant is usable when the Sun is below Constraints.SunAltDeg, the star
// above the site's lowest useful altitude and above its horizon profile
// (interpolated linearly in azimuth), and, while the Moon is up, at least
// Constraints.MoonMinSepDeg from it. Reasons name what fails: too low, behind
// the horizon profile, twilight, daylight (the Sun above −0.8333°), Moon too
// close. The coverage window runs ±w about the extremum (w a fraction of the
// period, capped, or a fixed width); Coverage.UsableFraction is the part of
// it that is usable, Coverage.Whole says all of it is. When the Sun is up and
// the star is within SolarWarningSepDeg of it, Event.SolarWarning is set:
// show SolarWarningText.
//
// # Ranking
//
// Each event gets a score in [0, 1]:
//
//	S = C · (1 + B) · (1 + A + U) / 6
//
// C the usable fraction of the window; B = 1 when the whole window and the
// extremum are usable (so complete coverage counts double); A =
// min(age/AgeScaleDays, 1), the age of the star's last timing (1 when it
// was never timed), favouring neglected stars; U = min(σ/w, 1), the
// prediction's uncertainty against the window's half-width, favouring stars
// whose ephemeris most needs a new timing. NightPlan.Ranked sorts by it.
// The weights are a choice (common practice: complete coverage first, then
// the stars that need a timing), not a published method.
//
// # Speed
//
// A forecast computes once what depends only on the site and the instant —
// an ephem.SkySpan over the span (one ephem Frame per day, the Moon sampled
// hourly, the Sun's altitude sampled for its crossings) and the spans in
// which the Sun is below the limit — and shares it across the targets, which
// are spread over goroutines. Per extremum, ephem gives the instant it is
// seen (SkySpan.SeenAt) and, for those with some darkness in their window,
// where the star, the Sun and the Moon stand (SkySpan.Circumstances). The
// star's altitude is a sinusoid in hour angle (Meeus 1998, eq. 13.6), so the
// spans above the lowest altitude follow in closed form from its apparent
// place, computed at anchors 32 days apart on a fixed grid of Julian dates
// and interpolated (ephem.DiurnalCircle, Meeus eq. 15.1); only a horizon
// profile is sampled, in hour angle, once per target and 32-day block of
// that grid. So an event's window does not depend on the span asked for.
// BenchmarkForecast10k measures 10,000 targets over 30 nights.
//
// # File formats
//
// Targets import from CSV (ReadTargetsCSV; columns documented in csv.go and
// shown in testdata/targets_example.csv) and from IVOA VOTable files with
// TABLEDATA (ReadVOTable, testdata/targets_example.vot), and export to the
// same CSV (WriteTargetsCSVFile, written whole or not at all).
//
// # References
//
//   - J. Meeus, Astronomical Algorithms, 2nd ed., Willmann-Bell 1998: ch. 12
//     (sidereal time), ch. 13 (horizontal coordinates), ch. 15 (rising and
//     setting, eq. 15.1), through ephem.
//   - D. Dowell, P. Jarratt (1971), BIT 11, 168: the Illinois method, for
//     the crossings of a horizon profile.
//   - J. D. Eastman, R. Siverd, B. S. Gaudi (2010), PASP 122, 935: HJD and
//     BJD_TDB.
//   - C. Sterken (2005), ASP Conf. Ser. 335, 3: the ephemeris T0 + P·E + Q·E².
//   - K. Pickering (2002), DIO 12, 3: air mass.
//   - USNO Astronomical Applications Department, "Rise, Set, and Twilight
//     Definitions": −0.8333°, −6°, −12°, −18°.
//   - F. Ochsenbein et al. (2019), IVOA Recommendation "VOTable Format
//     Definition" 1.4; IVOA "UCD1+ controlled vocabulary".
//   - M. Okabe, K. Ito (2008), "Color Universal Design": the chart colours.
package observe
