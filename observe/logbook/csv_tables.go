package logbook

import (
	"bytes"
	"database/sql"
	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
	"example.org/vigil/observe"
	"fmt"
	"path/filepath"
	"strings"
	"time"
)

// The importers of each CSV table, inside the import's transaction.

func importSites(tx *stmtCache, tab *table.Table) (int, error) {
	if err := tab.Require("name", "lat_deg", "lon_deg", "time_zone", "min_alt_deg"); err != nil {
		return 0, err
	}
	seen := map[string]int{}
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		var s observe.Site
		s.Name = r.String("name")
		if err := checkName("site name", s.Name); err != nil {
			return 0, r.Wrap("name", err)
		}
		var err error
		if s.LatDeg, err = ephem.ParseLatitude(r.String("lat_deg")); err != nil {
			return 0, r.Wrap("lat_deg", err)
		}
		if s.LonDeg, err = ephem.ParseLongitude(r.String("lon_deg")); err != nil {
			return 0, r.Wrap("lon_deg", err)
		}
		elev, ok, err := r.Float("elev_m")
		if err != nil {
			return 0, err
		}
		if ok {
			s.ElevM = elev
		}
		if err := s.Site.Validate(); err != nil {
			return 0, r.Wrap("elev_m", err)
		}
		s.TimeZone = r.String("time_zone")
		if s.MinAltDeg, err = r.MustFloat("min_alt_deg"); err != nil {
			return 0, err
		}
		if s.MinAltDeg < -5 || s.MinAltDeg >= 90 {
			return 0, r.Errorf("min_alt_deg", "lowest useful altitude %v: degrees must be in [-5, 90)", s.MinAltDeg)
		}
		if s.Horizon, err = parseHorizon(r.String("horizon")); err != nil {
			return 0, r.Wrap("horizon", err)
		}
		if err := checkSite(&s); err != nil {
			return 0, r.Wrap("time_zone", err) // the only check left: the zone
		}
		key := strings.ToLower(s.Name)
		if line, dup := seen[key]; dup {
			return 0, r.Errorf("name", "site %q repeats the one on line %d", s.Name, line)
		}
		seen[key] = r.Line()
		if _, err := addSite(tx, s, false); err != nil {
			return 0, r.Wrap("name", err)
		}
	}
	return tab.Len(), nil
}

func importTargets(tx *stmtCache, tab *table.Table, in csvInput) (int, error) {
	ts, err := observe.ReadTargetsCSV(bytes.NewReader(in.data), in.name)
	if err != nil {
		return 0, err
	}
	if len(ts) != tab.Len() {
		return 0, &table.Error{File: in.name, Err: fmt.Errorf("read %d targets from %d rows", len(ts), tab.Len())}
	}
	for i, t := range ts {
		r := tab.Row(i)
		meanMag, err := optCell(r, "mean_mag_v")
		if err != nil {
			return 0, err
		}
		adopted := time.Now()
		if s := r.String("ephemeris_adopted"); s != "" {
			if adopted, err = parseStamp(s); err != nil {
				return 0, r.Wrap("ephemeris_adopted", err)
			}
		}
		source := r.String("ephemeris_source")
		if source == "" {
			source = "imported from " + filepath.Base(in.name)
		}
		if _, err := addTarget(tx, t, meanMag, source, adopted, false); err != nil {
			return 0, rowErr(r, "name", err)
		}
	}
	return len(ts), nil
}

func importEphemerides(tx *stmtCache, res *resolver, tab *table.Table) (int, error) {
	if err := tab.Require("target", "epoch", "timescale", "period", "adopted"); err != nil {
		return 0, err
	}
	n := 0
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		ti, err := res.target(r.String("target"))
		if err != nil {
			return 0, r.Wrap("target", err)
		}
		var e ephem.Ephemeris
		if e.Epoch, err = r.MustFloat("epoch"); err != nil {
			return 0, err
		}
		if e.Scale, err = ephem.ParseTimeScale(r.String("timescale")); err != nil {
			return 0, r.Wrap("timescale", err)
		}
		if e.PeriodDays, err = r.MustFloat("period"); err != nil {
			return 0, err
		}
		for _, f := range []struct {
			col string
			dst *float64
		}{{"q", &e.Q}, {"epoch_err", &e.EpochErr}, {"period_err", &e.PeriodErr}} {
			v, ok, err := r.Float(f.col)
			if err != nil {
				return 0, err
			}
			if ok {
				*f.dst = v
			}
		}
		if err := e.Validate(); err != nil {
			return 0, r.Wrap(ephemerisColumn(err), err)
		}
		adopted, err := parseStamp(r.String("adopted"))
		if err != nil {
			return 0, r.Wrap("adopted", err)
		}
		source := r.String("source")
		var dup int
		if err := tx.QueryRow(`SELECT count(*) FROM ephemerides WHERE target_id = ? AND epoch = ? AND period_days = ?
			AND q_days = ? AND timescale = ? AND epoch_err IS ? AND period_err IS ? AND adopted_utc = ? AND source = ?`,
			ti.id, e.Epoch, e.PeriodDays, e.Q, e.Scale.String(), nullIfZero(e.EpochErr), nullIfZero(e.PeriodErr),
			stamp(adopted), source).Scan(&dup); err != nil {
			return 0, err
		}
		if dup > 0 {
			continue // already in the history (e.g. from targets.csv of the same export)
		}
		if err := insertEphemeris(tx, ti.id, e, adopted, source); err != nil {
			return 0, r.Wrap("source", err)
		}
		n++
	}
	return n, nil
}

// ephemerisColumn says which column an ephem.Ephemeris.Validate error is
// about.
func ephemerisColumn(err error) string {
	s := err.Error()
	for _, m := range []struct{ word, col string }{{"epoch uncertainty", "epoch_err"}, {"period uncertainty", "period_err"},
		{"epoch", "epoch"}, {"quadratic", "q"}, {"period", "period"}, {"time scale", "timescale"}} {
		if strings.Contains(s, m.word) {
			return m.col
		}
	}
	return ""
}

// nightOf reads a row's site and date columns and finds the night.
func nightOf(res *resolver, r table.Row) (int64, error) {
	site := r.String("site")
	if site == "" {
		return 0, r.Wrap("site", fmt.Errorf("%w: the site of the night", table.ErrMissing))
	}
	date, err := parseNightDate(r.String("date"))
	if err != nil {
		return 0, r.Wrap("date", err)
	}
	if _, err := res.site(site); err != nil {
		return 0, r.Wrap("site", err)
	}
	id, err := res.night(site, date)
	if err != nil {
		return 0, r.Wrap("date", err)
	}
	return id, nil
}

func importNights(tx *stmtCache, res *resolver, tab *table.Table) (int, error) {
	if err := tab.Require("site", "date"); err != nil {
		return 0, err
	}
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		n := Night{Site: r.String("site"), Observer: r.String("observer"), Equipment: r.String("equipment"),
			Conditions: r.String("conditions"), Notes: r.String("notes")}
		var err error
		if n.Date, err = parseNightDate(r.String("date")); err != nil {
			return 0, r.Wrap("date", err)
		}
		if err := n.Validate(); err != nil {
			return 0, rowErr(r, "", err)
		}
		if _, err := res.site(n.Site); err != nil {
			return 0, r.Wrap("site", err)
		}
		if _, err := addNight(tx, n, false); err != nil {
			return 0, r.Wrap("date", err)
		}
	}
	return tab.Len(), nil
}

func importPlans(tx *stmtCache, res *resolver, tab *table.Table) (int, error) {
	if err := tab.Require("site", "date", "target"); err != nil {
		return 0, err
	}
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		nid, err := nightOf(res, r)
		if err != nil {
			return 0, err
		}
		if _, err := res.target(r.String("target")); err != nil {
			return 0, r.Wrap("target", err)
		}
		var last sql.NullInt64
		if err := tx.QueryRow("SELECT max(position) FROM plans WHERE night_id = ?", nid).Scan(&last); err != nil {
			return 0, err
		}
		if err := addPlanItem(tx, nid, int(last.Int64)+1, PlanItem{Target: r.String("target"), Note: r.String("note")}); err != nil {
			return 0, r.Wrap("target", err)
		}
	}
	return tab.Len(), nil
}

func importMeasurements(tx *stmtCache, res *resolver, tab *table.Table, importID int64) (int, error) {
	if err := tab.Require("target", "site", "date", "jd_utc"); err != nil {
		return 0, err
	}
	w, err := newMeasurementWriter(tx.tx, res)
	if err != nil {
		return 0, err
	}
	defer w.close()
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		m := Measurement{Target: r.String("target"), Filter: r.String("filter"), Visual: r.String("visual"), Notes: r.String("notes")}
		if m.Target == "" {
			return 0, r.Wrap("target", fmt.Errorf("%w: every measurement names its target", table.ErrMissing))
		}
		if _, err := res.target(m.Target); err != nil {
			return 0, r.Wrap("target", err)
		}
		if m.NightID, err = nightOf(res, r); err != nil {
			return 0, err
		}
		if m.JDUTC, err = r.MustFloat("jd_utc"); err != nil {
			return 0, err
		}
		for _, f := range []struct {
			col string
			dst *float64
		}{{"exposure_s", &m.ExposureS}, {"airmass", &m.Airmass}, {"inst_mag", &m.InstMag}, {"inst_err", &m.InstErr},
			{"mag", &m.Mag}, {"mag_err", &m.MagErr}, {"hjd", &m.HJD}, {"bjd_tdb", &m.BJDTDB}} {
			if *f.dst, err = optCell(r, f.col); err != nil {
				return 0, err
			}
		}
		if m.Comps, err = parseRaw(r.String("comp_inst")); err != nil {
			return 0, r.Wrap("comp_inst", err)
		}
		if m.Checks, err = parseRaw(r.String("check_inst")); err != nil {
			return 0, r.Wrap("check_inst", err)
		}
		if _, err := w.add(&m, importID); err != nil {
			return 0, rowErr(r, "", err)
		}
	}
	if err := w.flush(); err != nil {
		return 0, err
	}
	return tab.Len(), nil
}

func importTimings(tx *stmtCache, res *resolver, tab *table.Table, importID int64) (int, error) {
	if err := tab.Require("target", "jd", "timescale", "origin"); err != nil {
		return 0, err
	}
	w, err := newTimingWriter(tx.tx, res)
	if err != nil {
		return 0, err
	}
	defer w.ins.Close()
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		t := Timing{Target: r.String("target"), Method: r.String("method"), Source: r.String("source"),
			Filter: r.String("filter"), Observer: r.String("observer"), Notes: r.String("notes")}
		if t.Target == "" {
			return 0, r.Wrap("target", fmt.Errorf("%w: every timing names its target", table.ErrMissing))
		}
		ti, err := res.target(t.Target)
		if err != nil {
			return 0, r.Wrap("target", err)
		}
		if t.JD, err = r.MustFloat("jd"); err != nil {
			return 0, err
		}
		if t.Scale, err = ephem.ParseTimeScale(r.String("timescale")); err != nil {
			return 0, r.Wrap("timescale", err)
		}
		if t.SigmaDays, err = optCell(r, "sigma_days"); err != nil {
			return 0, err
		}
		t.Kind = ti.kind
		if s := r.String("kind"); s != "" {
			if t.Kind, err = observe.ParseKind(s); err != nil {
				return 0, r.Wrap("kind", err)
			}
		}
		if t.Secondary, err = parseBool(r.String("secondary")); err != nil {
			return 0, r.Wrap("secondary", err)
		}
		if t.Origin, err = ParseOrigin(r.String("origin")); err != nil {
			return 0, r.Wrap("origin", err)
		}
		if r.String("site") != "" || r.String("date") != "" {
			if t.NightID, err = nightOf(res, r); err != nil {
				return 0, err
			}
		}
		if _, err := w.add(&t, importID); err != nil {
			return 0, rowErr(r, "", err)
		}
	}
	return tab.Len(), nil
}
