// Package reduce turns measurements into magnitudes, timings and periods:
// differential photometry against comparison stars (one or an ensemble),
// visual estimates, light curves on HJD or BJD_TDB, times of maxima and
// minima, O−C diagrams with their ephemeris fits, and period searches.
//
// Conventions: magnitudes grow fainter upwards (maximum light is the
// smallest magnitude); a missing value is NaN, never 0; an error of 0 or NaN
// means "unknown", and weights 1/σ² are used only when every point has a
// positive error. Times are Julian dates on the scale the caller states;
// fits work on times and cycle numbers centred on their mean, so that raw
// Julian dates near 2.46e6 lose no precision.
package reduce
