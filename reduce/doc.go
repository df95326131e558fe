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
//
// # References
//
//   - A. A. Henden & R. H. Kaitchuck (1982), Astronomical Photometry, Van
//     Nostrand Reinhold: differential photometry, first-order extinction and
//     colour transformation.
//   - W. E. Harris, M. P. Fitzgerald & B. C. Reed (1981), PASP 93, 507:
//     transformation equations.
//   - R. K. Honeycutt (1992), PASP 104, 435: ensemble photometry.
//   - J. D. Eastman, R. Siverd & B. S. Gaudi (2010), PASP 122, 935: BJD_TDB.
//   - K. K. Kwee & H. van Woerden (1956), BAN 12, 327: times of minima.
//   - H. J. Deeg (2021), Galaxies 9, 1: the Kwee–van Woerden error revisited.
//   - B. Efron (1979), Ann. Stat. 7, 1: the bootstrap.
//   - C. Sterken (2005), ASP Conf. Ser. 335, 3: the O−C diagram.
//   - J. B. Irwin (1952), ApJ 116, 211: light-travel time in a wide orbit.
//   - D. W. Marquardt (1963), J. SIAM 11, 431: non-linear least squares.
//   - M. Zechmeister & M. Kürster (2009), A&A 496, 577: the generalised
//     Lomb–Scargle periodogram.
//   - R. F. Stellingwerf (1978), ApJ 224, 953: phase dispersion minimisation.
//   - R. V. Baluev (2008), MNRAS 385, 1279: false-alarm probability.
//   - A. H. Barnett, J. Magland & L. af Klinteberg (2019), SIAM J. Sci.
//     Comput. 41, C479: the non-uniform FFT behind the fast periodogram.
//   - T. J. Deeming (1975), Ap&SS 36, 137: the spectral window.
//   - G. F. Benedict et al. (2007), AJ 133, 1810: the Cepheid
//     period–luminosity relation.
package reduce
