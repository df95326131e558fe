// Package demo makes the demo logbook of the first run: an invented
// scenario of observatories, variable stars and several years of their
// observation, generated from a fixed seed (the same records every time)
// and stored by observe/logbook (logbook.CreateDemo), flagged so that the
// user can remove it whole (Logbook.ClearDemo; any import does too).
//
// It sits above observe and reduce, as the window does: what the demo
// observer makes of the invented data (reduced magnitudes, visual
// estimates, timings, means) is computed by package reduce exactly as the
// user's own data would be; what belongs to the invention (light-curve
// shapes, the stars' true elements with a period change and a third body,
// the noise, which nights are observed) is here.
//
// # API
//
// Create makes a new logbook holding the demo; OpenOrCreate opens an
// existing logbook or, when there is no file, creates the demo (the command
// line and the window call it for the default logbook). Site returns the
// demo's main observatory, the one definition of it the program shares.
//
// # The scenario
//
// Sites: the fictitious Ashgrove Hill Observatory (demo) at 52.1172° N,
// 1.4538° W (longitude −1.4538, east positive), 140 m, Europe/London,
// lowest useful altitude 20°, trees to the north-east and a roof to the
// south; and a fictitious school observatory in the southern hemisphere.
//
// Stars: eight invented stars, Ashgrove V1 to V8, spread in right
// ascension so that at least two are up at Ashgrove at every local
// midnight: RR Lyrae-like (P ≈ 0.567 d), Cepheid-like (P ≈ 5.70 d, with an
// intensity-mean V for its distance, reduce.IntensityMean of its light
// curve), δ Scuti-like (P ≈ 0.087 d), Algol-like with a growing period
// (P ≈ 2.87 d, Q = 5×10⁻⁹ d: a parabola in O−C), W UMa-like with a
// light-travel-time orbit (P ≈ 0.369 d, a 6.2-year wave of ±0.0062 d in
// O−C; Irwin 1952), a detached binary with secondary minima, an RRc-like
// pulsator and a long-period star followed by eye. Their extrema fall at
// T(E) = T0 + P·E + Q·E² + τ on BJD_TDB (Sterken 2005).
//
// Observations, 2019–2026, with the star above the site's lowest altitude
// and horizon and the Sun below −12° for every frame:
//
//   - light curves around extrema: raw instrumental magnitudes of target,
//     comparison and check stars (the stars' true magnitudes plus a
//     nightly zero point, extinction of 0.22 mag per air mass, a common
//     transparency jitter and photometric noise), reduced by
//     reduce.Photometry (the weighted ensemble of Honeycutt 1992, with the
//     topocentric HJD and BJD_TDB of Eastman et al. 2010);
//   - nightly frames of the Cepheid-like star, reduced the same way;
//   - visual estimates of the long-period star by the fractional method
//     ("B 3 V 2 C"), read by reduce.ParseEstimate;
//   - the observer's own timings: reduce.Extremum on each night's light
//     curve in a window of fixed width (Kwee & van Woerden for eclipses, a
//     polynomial of fixed degree for pulsators), and a parabola through
//     the visual estimates around each well-covered maximum;
//   - invented published timings on HJD, with invented sources.
//
// Every record says it is a demo: site names end in "(demo)"; notes,
// observers, equipment and sources say demo or invented.
//
// # References
//
//   - R. K. Honeycutt (1992), PASP 104, 435: ensemble photometry.
//   - J. D. Eastman, R. Siverd, B. S. Gaudi (2010), PASP 122, 935: HJD and
//     BJD_TDB.
//   - K. K. Kwee & H. van Woerden (1956), BAN 12, 327: times of minima.
//   - C. Sterken (2005), ASP Conf. Ser. 335, 3: the O−C diagram and the
//     ephemeris T0 + P·E + Q·E².
//   - J. B. Irwin (1952), ApJ 116, 211: the light-travel-time effect.
package demo
