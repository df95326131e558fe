// Package logbook keeps a variable-star observer's records in one SQLite
// file: observing sites, target stars with the history of their
// ephemerides, comparison and check stars, observing nights with their
// plans, measurements (raw and reduced) and timings of maxima and minima,
// the user's own and published ones. It gives the window and the command
// line one Go API over them, CSV import and export of every table, a JSON
// backup that restores to an identical logbook, and the storage of a demo
// scenario (flagged, and removed whole when the user starts their own).
//
// It imports observe (sites, targets) and ephem (time scales, ephemerides),
// and nothing of reduce: the window maps measurements and timings between
// the two. The driver is modernc.org/sqlite, pure Go (no cgo).
//
// # Files
//
// A logbook is one SQLite file, by default vigil/vigil.db in the user's
// configuration directory (DefaultPath); the command line names another
// with --logbook PATH. Open opens an existing one, Create makes an empty
// one, CreateDemo one holding given demo records (the first run's scenario
// comes from package vigil/internal/demo, which calls it). A new file is
// built under a temporary name and renamed into place when complete, so a
// crash never leaves half a logbook.
//
// The file runs with foreign keys on, write-ahead logging, full
// synchronisation (a committed change survives a power cut), a busy timeout
// of 10 s, and transactions that take the write lock when they begin: two
// programs may write to one logbook, one waits for the other. Every change
// is one transaction; every import is one transaction, all of it or
// nothing (TestKillDuringImport kills an importing process at random
// moments and finds every import whole or absent and the file intact).
//
// # Schema and migrations
//
// The file carries PRAGMA application_id 0x56474C42 ("VGLB") and a
// schema_version table with one row per migration applied. Migrations run
// in order, each in its own transaction; a file written by an older vigil
// is brought up to date when opened. Open refuses, without touching it, a
// file that is not a vigil logbook (ErrNotLogbook) and one whose schema is
// newer than this program knows (ErrNewerSchema).
//
//	version  what
//	1        the tables below (without targets.mean_mag_v)
//	2        targets.mean_mag_v; index measurements(target_id, jd_utc)
//
// All tables are STRICT: a REAL column holds exactly the float64 it was
// given. A missing number is NULL (NaN in Go), never 0. The ephemeris
// uncertainties and a catalogue's last timing, which ephem and observe
// count as unknown when 0, are stored NULL then.
//
//	table           holds
//	meta            key/value: format "vigil logbook", created_utc, demo "0"/"1"
//	schema_version  version, what, applied_utc
//	sites           name (unique, any case), lat_deg, lon_deg (EAST positive), elev_m,
//	                time_zone (IANA), min_alt_deg, demo
//	horizon_points  site_id, az_deg (from north through east), alt_deg
//	targets         name (unique, any case), ra_h, dec_deg (ICRS/J2000), pm_ra_mas_yr,
//	                pm_dec_mas_yr, class, kind, secondary, mag_bright, mag_faint,
//	                last_timing_jd (from a catalogue), notes, demo, mean_mag_v
//	ephemerides     target_id, epoch, period_days, q_days, timescale (hjd|bjd),
//	                epoch_err, period_err, adopted_utc, source; the current
//	                ephemeris is the one adopted last (ties: the one added last)
//	comps           target_id, role (comp|check), label, v_mag, bv
//	nights          site_id, date (YYYY-MM-DD, the civil date the night begins on),
//	                observer, equipment, conditions, notes, demo; one per site and date
//	plans           night_id, position, target_id, note
//	imports         id, table_name, file, rows, imported_utc: one row per import
//	measurements    night_id, target_id, import_id, jd_utc (mid-exposure), exposure_s,
//	                filter, airmass, inst_mag, inst_err, visual, mag, mag_err,
//	                hjd (UTC scale), bjd_tdb
//	raw_comps       measurement_id, position, role (comp|check), label, inst_mag, inst_err
//	timings         target_id, night_id, import_id, jd, timescale (hjd|bjd), sigma_days,
//	                kind (max|min), secondary, origin (own|published), method, source,
//	                filter, observer, notes
//
// Deleting a target deletes its ephemerides, comparison stars,
// measurements, timings and plan entries. Deleting a night deletes its plan
// and measurements and keeps its timings (no longer tied to a night). A
// site with nights cannot be deleted.
//
// # CSV tables
//
// ExportCSV and ImportCSV read and write one table; ExportCSVDir and
// ImportCSVDir all of them, as sites.csv, targets.csv and so on (the
// directory import is one transaction). The input rules are those of
// internal/table: a header row naming the columns (any order, any case),
// '#' comment lines, unknown columns ignored, empty cells missing values,
// cells trimmed (so blanks around a text do not survive a CSV round trip;
// the JSON backup keeps everything).
// Records refer to each other by name (site, target) and by site and date
// (night), never by internal number. Exports write every number exactly
// (the shortest decimal that reads back to the same float64). An import
// only adds: a name already in the logbook is an error; so is one that
// repeats in the file. Every error is a *table.Error naming the file, line,
// column and what was expected, and then nothing is stored. Importing into
// the demo logbook first removes the demo (in the same transaction).
//
// sites.csv:
//
//	column       required  meaning
//	name         yes       the site's name, unique (any case)
//	lat_deg      yes       latitude, degrees north, decimal or sexagesimal
//	lon_deg      yes       longitude, degrees EAST of Greenwich (west is negative)
//	elev_m       no        elevation, metres (empty: 0)
//	time_zone    yes       IANA time zone, e.g. Europe/London, or UTC
//	min_alt_deg  yes       lowest useful altitude, degrees, in [-5, 90)
//	horizon      no        horizon profile "az/alt; az/alt" (degrees; azimuths
//	                       increasing in [0, 360)), e.g. "30/5; 45/32; 70/8"
//
// targets.csv: the target catalogue format of observe.ReadTargetsCSV (name,
// ra, dec, pm_ra, pm_dec, class, kind, epoch, timescale, period, q,
// epoch_err, period_err, secondary, mag_bright, mag_faint, comps, checks,
// last_timing, notes; comparison and check stars in the comps and checks
// cells, "ID=V/B-V; ID=V"), read by that function, and three more columns:
//
//	mean_mag_v         no   intensity-mean V magnitude (for a period–luminosity distance)
//	ephemeris_adopted  no   when the ephemeris was adopted, ISO 8601 UTC (empty: now)
//	ephemeris_source   no   where it comes from (empty: "imported from FILE")
//
// The export writes the current ephemeris and, in last_timing, the latest
// timing; an exported targets.csv stays readable by observe.ReadTargetsCSV.
//
// ephemerides.csv, the history of every target's ephemerides:
//
//	target      yes   the target's name
//	epoch       yes   T0, full Julian date on timescale
//	timescale   yes   hjd (heliocentric, UTC) or bjd (barycentric, TDB)
//	period      yes   P, days
//	q           no    quadratic term Q, days (empty: 0)
//	epoch_err   no    σ(T0), days (empty: unknown)
//	period_err  no    σ(P), days (empty: unknown)
//	adopted     yes   when the user adopted it, ISO 8601 UTC
//	source      no    where it comes from
//
// A row equal in every column to an entry already in the history is
// skipped (the current ephemeris comes in with targets.csv too).
//
// nights.csv: site (yes), date (yes, YYYY-MM-DD, the civil date the night
// begins on), observer, equipment, conditions, notes (no).
//
// plans.csv: site (yes), date (yes), target (yes), note (no); the targets
// of a night in the order of the file.
//
// measurements.csv:
//
//	target      yes   the target's name
//	site        yes   the night's site
//	date        yes   the night's date, YYYY-MM-DD
//	jd_utc      yes   mid-exposure, Julian date (UTC)
//	exposure_s  no    exposure, seconds
//	filter      no    e.g. V, B, CV; vis for the eye
//	airmass     no    air mass
//	inst_mag    no    the target's instrumental magnitude
//	inst_err    no    its error
//	comp_inst   no    comparison stars' instrumental magnitudes, "ID=mag/err; ID=mag"
//	check_inst  no    check stars', same format
//	visual      no    a visual estimate as written, e.g. "C1 2 V 3 C2"
//	mag         no    reduced magnitude
//	mag_err     no    its error
//	hjd         no    heliocentric Julian date (UTC scale)
//	bjd_tdb     no    barycentric Julian date (TDB scale)
//	notes       no    free text
//
// A measurement needs one of inst_mag, visual and mag. The IDs in comp_inst
// and check_inst must be among the target's comparison and check stars.
//
// timings.csv:
//
//	target      yes   the target's name
//	jd          yes   the time of the extremum, Julian date on timescale
//	timescale   yes   hjd or bjd
//	sigma_days  no    uncertainty, days
//	kind        no    max or min (empty: what the target's ephemeris marks)
//	secondary   no    true for a secondary minimum (empty: false)
//	origin      yes   own (from the user's data) or published
//	method      no    e.g. kvw, poly, visual
//	source      no    the publication; required for a published timing
//	site, date  no    the night an own timing was taken on (both or neither)
//	filter, observer, notes   no
//
// # Backup
//
// Backup writes every table of the file as one JSON document, rows in a
// fixed order, numbers exact; Restore makes a new file from it, loaded at
// the backup's schema version, checked (types, constraints, foreign keys,
// every record as the API checks it) and migrated. Backing up the restored
// logbook gives the same bytes.
//
// # The demo
//
// CreateDemo stores a demo scenario, DemoRecords: sites, targets with their
// ephemeris histories and mean V, nights with their plans, measurements and
// own timings, and published timings, in one transaction, each site, target
// and night marked demo (the demo column) and the logbook flagged (meta
// demo = "1", IsDemo). The scenario itself, invented stars observed from
// invented observatories, is generated by package vigil/internal/demo,
// which may use package reduce; this package only stores it. ClearDemo
// removes every record marked demo (a demo site that holds nights of the
// user's is kept, no longer marked); so does any import, in the import's
// transaction, before it adds its rows.
//
// # References
//
//   - C. Sterken (2005), ASP Conf. Ser. 335, 3: the O−C diagram and the
//     ephemeris T0 + P·E + Q·E².
//   - J. D. Eastman, R. Siverd, B. S. Gaudi (2010), PASP 122, 935: HJD and
//     BJD_TDB.
//   - SQLite, "Write-Ahead Logging", "STRICT Tables", "The SQLite Database
//     File Format" (application_id).
package logbook
