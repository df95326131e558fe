// Package report prints the observing log of one night: a PDF to take to the
// telescope (A4 portrait, or US Letter) and a plain-text twin with the same
// content in aligned columns.
//
// The log holds the site (name, latitude, EAST-positive longitude,
// elevation, time zone); the night's twilights and the Moon; the planned
// extrema in time order with their predicted local time and UTC side by
// side, the prediction's uncertainty, where the star stands, the verdict and
// the usable part of the coverage window; the altitude chart (PDF only; the
// text version tabulates the altitudes by the hour instead); the Sun caution
// wherever an event carries observe's SolarWarning; ruled lines for notes at
// the eyepiece; and, after the night, the measurements and the timings taken.
//
// The package takes one plain input, NightLog, which the command line and
// the window fill (ForNight builds its planned part from an observe.Planner;
// the caller adds the logbook's measurements and timings). It imports
// observe, ephem, app/chart and the PDF library, and neither the window
// toolkit nor the logbook.
//
// # Conventions
//
// As everywhere in vigil: longitude EAST positive, azimuth from north through
// east, altitudes airless. Clock times are rounded to the nearest minute
// (measurements to the second); local times are in the site's IANA time
// zone, which is named in the log, with UTC beside them. A night runs from
// local mean noon to local mean noon (ephem.NightOf), so a clock time before
// noon belongs to the morning after the date. Timings are Julian dates on the
// scale printed beside them (HJD_UTC or BJD_TDB).
//
// Files are written whole or not at all (internal/safefile).
package report
