package logbook

import (
	"database/sql"
	"fmt"
	"time"
)

// The schema of a logbook file. Every table is STRICT, so that a REAL column
// holds exactly the float64 it was given and nothing else; a missing number
// is NULL, never 0. Migrations run in order, each in its own transaction,
// and each records itself in schema_version; a file is at the version of its
// highest row there.

// migration is one step of the schema: version n turns a file at version
// n-1 into one at version n.
type migration struct {
	version int
	what    string // one line, for the schema_version table and errors
	sql     string
}

// applicationID marks a SQLite file as a vigil logbook (PRAGMA
// application_id, the ASCII bytes "VGLB").
const applicationID = 0x56474C42

// migrations is the ordered list of schema steps. Never edit a step that has
// shipped: add a new one.
var migrations = []migration{
	{version: 1, what: "sites, targets, ephemerides, comparison stars, nights, plans, measurements, timings", sql: schemaV1},
	{version: 2, what: "targets.mean_mag_v; measurements indexed by target and time", sql: schemaV2},
}

// SchemaVersion is the newest schema this program knows (the version of the
// last migration); a file at a newer version is refused.
const SchemaVersion = 2

const schemaV1 = `
CREATE TABLE meta (
	key   TEXT PRIMARY KEY,
	value TEXT NOT NULL
) STRICT;

CREATE TABLE schema_version (
	version     INTEGER PRIMARY KEY,
	what        TEXT NOT NULL,
	applied_utc TEXT NOT NULL
) STRICT;

CREATE TABLE sites (
	id          INTEGER PRIMARY KEY,
	name        TEXT NOT NULL UNIQUE COLLATE NOCASE CHECK (name <> ''),
	lat_deg     REAL NOT NULL CHECK (lat_deg BETWEEN -90 AND 90),
	lon_deg     REAL NOT NULL CHECK (lon_deg > -180 AND lon_deg <= 180),
	elev_m      REAL NOT NULL,
	time_zone   TEXT NOT NULL,
	min_alt_deg REAL NOT NULL,
	demo        INTEGER NOT NULL DEFAULT 0 CHECK (demo IN (0, 1))
) STRICT;

CREATE TABLE horizon_points (
	site_id INTEGER NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
	az_deg  REAL NOT NULL CHECK (az_deg >= 0 AND az_deg < 360),
	alt_deg REAL NOT NULL CHECK (alt_deg BETWEEN -5 AND 90),
	PRIMARY KEY (site_id, az_deg)
) STRICT, WITHOUT ROWID;

CREATE TABLE targets (
	id             INTEGER PRIMARY KEY,
	name           TEXT NOT NULL UNIQUE COLLATE NOCASE CHECK (name <> ''),
	ra_h           REAL NOT NULL CHECK (ra_h >= 0 AND ra_h < 24),
	dec_deg        REAL NOT NULL CHECK (dec_deg BETWEEN -90 AND 90),
	pm_ra_mas_yr   REAL NOT NULL DEFAULT 0,
	pm_dec_mas_yr  REAL NOT NULL DEFAULT 0,
	class          TEXT NOT NULL CHECK (class IN ('pulsating', 'eclipsing', 'other')),
	kind           TEXT NOT NULL CHECK (kind IN ('max', 'min')),
	secondary      INTEGER NOT NULL DEFAULT 0 CHECK (secondary IN (0, 1)),
	mag_bright     REAL,
	mag_faint      REAL,
	last_timing_jd REAL,
	notes          TEXT NOT NULL DEFAULT '',
	demo           INTEGER NOT NULL DEFAULT 0 CHECK (demo IN (0, 1))
) STRICT;

CREATE TABLE ephemerides (
	id          INTEGER PRIMARY KEY,
	target_id   INTEGER NOT NULL REFERENCES targets(id) ON DELETE CASCADE,
	epoch       REAL NOT NULL,
	period_days REAL NOT NULL CHECK (period_days > 0),
	q_days      REAL NOT NULL DEFAULT 0,
	timescale   TEXT NOT NULL CHECK (timescale IN ('hjd', 'bjd')),
	epoch_err   REAL,
	period_err  REAL,
	adopted_utc TEXT NOT NULL,
	source      TEXT NOT NULL DEFAULT ''
) STRICT;
CREATE INDEX ephemerides_by_target ON ephemerides(target_id, adopted_utc, id);

CREATE TABLE comps (
	id        INTEGER PRIMARY KEY,
	target_id INTEGER NOT NULL REFERENCES targets(id) ON DELETE CASCADE,
	role      TEXT NOT NULL CHECK (role IN ('comp', 'check')),
	label     TEXT NOT NULL CHECK (label <> ''),
	v_mag     REAL NOT NULL,
	bv        REAL,
	UNIQUE (target_id, label)
) STRICT;

CREATE TABLE nights (
	id         INTEGER PRIMARY KEY,
	site_id    INTEGER NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
	date       TEXT NOT NULL CHECK (date GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'),
	observer   TEXT NOT NULL DEFAULT '',
	equipment  TEXT NOT NULL DEFAULT '',
	conditions TEXT NOT NULL DEFAULT '',
	notes      TEXT NOT NULL DEFAULT '',
	demo       INTEGER NOT NULL DEFAULT 0 CHECK (demo IN (0, 1)),
	UNIQUE (site_id, date)
) STRICT;

CREATE TABLE plans (
	night_id  INTEGER NOT NULL REFERENCES nights(id) ON DELETE CASCADE,
	position  INTEGER NOT NULL,
	target_id INTEGER NOT NULL REFERENCES targets(id) ON DELETE CASCADE,
	note      TEXT NOT NULL DEFAULT '',
	PRIMARY KEY (night_id, position),
	UNIQUE (night_id, target_id)
) STRICT, WITHOUT ROWID;

CREATE TABLE imports (
	id           INTEGER PRIMARY KEY,
	table_name   TEXT NOT NULL,
	file         TEXT NOT NULL,
	rows         INTEGER NOT NULL,
	imported_utc TEXT NOT NULL
) STRICT;

CREATE TABLE measurements (
	id         INTEGER PRIMARY KEY,
	night_id   INTEGER NOT NULL REFERENCES nights(id) ON DELETE CASCADE,
	target_id  INTEGER NOT NULL REFERENCES targets(id) ON DELETE CASCADE,
	import_id  INTEGER REFERENCES imports(id) ON DELETE SET NULL,
	jd_utc     REAL NOT NULL,
	exposure_s REAL,
	filter     TEXT NOT NULL DEFAULT '',
	airmass    REAL,
	inst_mag   REAL,
	inst_err   REAL,
	visual     TEXT NOT NULL DEFAULT '',
	mag        REAL,
	mag_err    REAL,
	hjd        REAL,
	bjd_tdb    REAL,
	notes      TEXT NOT NULL DEFAULT ''
) STRICT;
CREATE INDEX measurements_by_night ON measurements(night_id);

CREATE TABLE raw_comps (
	measurement_id INTEGER NOT NULL REFERENCES measurements(id) ON DELETE CASCADE,
	position       INTEGER NOT NULL,
	role           TEXT NOT NULL CHECK (role IN ('comp', 'check')),
	label          TEXT NOT NULL CHECK (label <> ''),
	inst_mag       REAL NOT NULL,
	inst_err       REAL,
	PRIMARY KEY (measurement_id, position)
) STRICT, WITHOUT ROWID;

CREATE TABLE timings (
	id         INTEGER PRIMARY KEY,
	target_id  INTEGER NOT NULL REFERENCES targets(id) ON DELETE CASCADE,
	night_id   INTEGER REFERENCES nights(id) ON DELETE SET NULL,
	import_id  INTEGER REFERENCES imports(id) ON DELETE SET NULL,
	jd         REAL NOT NULL,
	timescale  TEXT NOT NULL CHECK (timescale IN ('hjd', 'bjd')),
	sigma_days REAL,
	kind       TEXT NOT NULL CHECK (kind IN ('max', 'min')),
	secondary  INTEGER NOT NULL DEFAULT 0 CHECK (secondary IN (0, 1)),
	origin     TEXT NOT NULL CHECK (origin IN ('own', 'published')),
	method     TEXT NOT NULL DEFAULT '',
	source     TEXT NOT NULL DEFAULT '',
	filter     TEXT NOT NULL DEFAULT '',
	observer   TEXT NOT NULL DEFAULT '',
	notes      TEXT NOT NULL DEFAULT ''
) STRICT;
CREATE INDEX timings_by_target ON timings(target_id, jd);
CREATE INDEX timings_by_night ON timings(night_id);
`

// schemaV2 adds the intensity-mean V magnitude a period–luminosity distance
// needs, and the index MeasurementsOf reads a target's light curve by.
const schemaV2 = `
ALTER TABLE targets ADD COLUMN mean_mag_v REAL;
CREATE INDEX measurements_by_target ON measurements(target_id, jd_utc);
`

// backupTables lists every table in an order that satisfies the foreign
// keys (parents first), with the columns its rows are ordered by. The JSON
// backup writes them in this order.
var backupTables = []struct{ name, orderBy string }{
	{"meta", "key"},
	{"schema_version", "version"},
	{"sites", "id"},
	{"horizon_points", "site_id, az_deg"},
	{"targets", "id"},
	{"ephemerides", "id"},
	{"comps", "id"},
	{"nights", "id"},
	{"plans", "night_id, position"},
	{"imports", "id"},
	{"measurements", "id"},
	{"raw_comps", "measurement_id, position"},
	{"timings", "id"},
}

// migrate runs the migrations after version from up to version to, each in
// its own transaction that first checks the file is still where it was (two
// programs may open an old file at once).
func (lb *Logbook) migrate(from, to int) error {
	for _, m := range migrations {
		if m.version <= from || m.version > to {
			continue
		}
		err := lb.tx(func(tx *sql.Tx) error {
			var cur int
			if m.version > 1 {
				var v sql.NullInt64
				if err := tx.QueryRow("SELECT max(version) FROM schema_version").Scan(&v); err != nil {
					return err
				}
				cur = int(v.Int64)
			}
			if cur >= m.version {
				return nil // another process got there first
			}
			if cur != m.version-1 {
				return fmt.Errorf("the file is at version %d, want %d", cur, m.version-1)
			}
			if m.version == 1 {
				if _, err := tx.Exec(fmt.Sprintf("PRAGMA application_id = %d", applicationID)); err != nil {
					return err
				}
			}
			if _, err := tx.Exec(m.sql); err != nil {
				return err
			}
			if m.version == 1 {
				if _, err := tx.Exec(`INSERT INTO meta(key, value) VALUES ('format', ?), ('created_utc', ?), ('demo', '0')`,
					formatName, stamp(time.Now())); err != nil {
					return err
				}
			}
			_, err := tx.Exec("INSERT INTO schema_version(version, what, applied_utc) VALUES (?, ?, ?)", m.version, m.what, stamp(time.Now()))
			return err
		})
		if err != nil {
			return fmt.Errorf("logbook: %s: migrating the schema to version %d (%s): %w", lb.path, m.version, m.what, err)
		}
	}
	return nil
}
