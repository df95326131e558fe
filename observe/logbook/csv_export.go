package logbook

import (
	"context"
	"database/sql"
	"encoding/csv"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"example.org/vigil/internal/safefile"
	"example.org/vigil/observe"
)

// Table names one of the logbook's CSV tables (see the package
// documentation for the columns of each).
type Table string

// The logbook's CSV tables, in the order an import of several must follow
// (each may refer to the ones before it).
const (
	SitesTable        Table = "sites"
	TargetsTable      Table = "targets"
	EphemeridesTable  Table = "ephemerides"
	NightsTable       Table = "nights"
	PlansTable        Table = "plans"
	MeasurementsTable Table = "measurements"
	TimingsTable      Table = "timings"
)

// Tables lists every CSV table in import order.
var Tables = []Table{SitesTable, TargetsTable, EphemeridesTable, NightsTable, PlansTable, MeasurementsTable, TimingsTable}

// ParseTable reads a table's name (any case).
func ParseTable(s string) (Table, error) {
	for _, t := range Tables {
		if strings.EqualFold(strings.TrimSpace(s), string(t)) {
			return t, nil
		}
	}
	names := make([]string, len(Tables))
	for i, t := range Tables {
		names[i] = string(t)
	}
	return "", fmt.Errorf("table %q: want one of %s", s, strings.Join(names, ", "))
}

// FileName returns the table's file name in an export directory, e.g.
// "sites.csv".
func (t Table) FileName() string { return string(t) + ".csv" }

// columns returns the columns the export writes, in order.
func (t Table) columns() []string {
	switch t {
	case SitesTable:
		return []string{"name", "lat_deg", "lon_deg", "elev_m", "time_zone", "min_alt_deg", "horizon"}
	case TargetsTable:
		return []string{"name", "ra", "dec", "pm_ra", "pm_dec", "class", "kind", "epoch", "timescale",
			"period", "q", "epoch_err", "period_err", "secondary", "mag_bright", "mag_faint", "comps", "checks",
			"last_timing", "notes", "mean_mag_v", "ephemeris_adopted", "ephemeris_source"}
	case EphemeridesTable:
		return []string{"target", "epoch", "timescale", "period", "q", "epoch_err", "period_err", "adopted", "source"}
	case NightsTable:
		return []string{"site", "date", "observer", "equipment", "conditions", "notes"}
	case PlansTable:
		return []string{"site", "date", "target", "note"}
	case MeasurementsTable:
		return []string{"target", "site", "date", "jd_utc", "exposure_s", "filter", "airmass", "inst_mag", "inst_err",
			"comp_inst", "check_inst", "visual", "mag", "mag_err", "hjd", "bjd_tdb", "notes"}
	case TimingsTable:
		return []string{"target", "jd", "timescale", "sigma_days", "kind", "secondary", "origin", "method", "source",
			"site", "date", "filter", "observer", "notes"}
	}
	return nil
}

// ExportCSV writes the table as CSV, a header row and one row per record,
// every number written exactly (the shortest text that reads back to the
// same float64), missing values as empty cells.
func (lb *Logbook) ExportCSV(t Table, w io.Writer) error {
	cols := t.columns()
	if cols == nil {
		return fmt.Errorf("logbook: exporting: %w", tableErr(t))
	}
	// One read transaction: the export is one consistent snapshot.
	tx, err := lb.db.BeginTx(context.Background(), &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return lb.wrap(err)
	}
	defer tx.Rollback()
	cw := csv.NewWriter(w)
	if err := cw.Write(cols); err != nil {
		return err
	}
	if err := exportRows(tx, t, cw.Write); err != nil {
		return lb.wrap(fmt.Errorf("exporting %s: %w", t, err))
	}
	cw.Flush()
	return cw.Error()
}

func tableErr(t Table) error {
	_, err := ParseTable(string(t))
	return err
}

// ExportCSVFile writes the table to the file at path, whole or not at all.
func (lb *Logbook) ExportCSVFile(t Table, path string) error {
	return safefile.Write(path, func(w io.Writer) error { return lb.ExportCSV(t, w) })
}

// ExportCSVDir writes every table into the directory dir (made if missing)
// under its FileName. Each file is written whole or not at all.
func (lb *Logbook) ExportCSVDir(dir string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("logbook: %w", err)
	}
	for _, t := range Tables {
		if err := lb.ExportCSVFile(t, filepath.Join(dir, t.FileName())); err != nil {
			return err
		}
	}
	return nil
}

func exportRows(q querier, t Table, write func([]string) error) error {
	switch t {
	case SitesTable:
		sites, err := loadSites(q, "")
		if err != nil {
			return err
		}
		for _, s := range sites {
			if err := write([]string{s.Name, fmtFloat(s.LatDeg), fmtFloat(s.LonDeg), fmtFloat(s.ElevM), s.TimeZone,
				fmtFloat(s.MinAltDeg), formatHorizon(s.Horizon)}); err != nil {
				return err
			}
		}
	case TargetsTable:
		return exportTargets(q, write)
	case EphemeridesTable:
		rows, err := q.Query(`SELECT t.name, e.epoch, e.timescale, e.period_days, e.q_days, e.epoch_err, e.period_err,
			e.adopted_utc, e.source FROM ephemerides e JOIN targets t ON t.id = e.target_id ORDER BY t.id, e.adopted_utc, e.id`)
		if err != nil {
			return err
		}
		defer rows.Close()
		for rows.Next() {
			var (
				name, scale, adopted, source string
				epoch, period, q             float64
				eErr, pErr                   sql.NullFloat64
			)
			if err := rows.Scan(&name, &epoch, &scale, &period, &q, &eErr, &pErr, &adopted, &source); err != nil {
				return err
			}
			if err := write([]string{name, fmtFloat(epoch), scale, fmtFloat(period), fmtFloat(q), zeroFloat(orZero(eErr)),
				zeroFloat(orZero(pErr)), adopted, source}); err != nil {
				return err
			}
		}
		return rows.Err()
	case NightsTable:
		ns, err := loadNights(q, "ORDER BY n.date, s.name")
		if err != nil {
			return err
		}
		for _, n := range ns {
			if err := write([]string{n.Site, dateKey(n.Date), n.Observer, n.Equipment, n.Conditions, n.Notes}); err != nil {
				return err
			}
		}
	case PlansTable:
		rows, err := q.Query(`SELECT s.name, n.date, t.name, p.note FROM plans p JOIN nights n ON n.id = p.night_id
			JOIN sites s ON s.id = n.site_id JOIN targets t ON t.id = p.target_id ORDER BY n.date, s.name, p.position`)
		if err != nil {
			return err
		}
		defer rows.Close()
		for rows.Next() {
			rec := make([]string, 4)
			if err := rows.Scan(&rec[0], &rec[1], &rec[2], &rec[3]); err != nil {
				return err
			}
			if err := write(rec); err != nil {
				return err
			}
		}
		return rows.Err()
	case MeasurementsTable:
		return exportMeasurements(q, write)
	case TimingsTable:
		return exportTimings(q, write)
	}
	return nil
}

func exportTargets(q querier, write func([]string) error) error {
	ts, ids, err := loadTargets(q, "ORDER BY t.id")
	if err != nil {
		return err
	}
	type extra struct {
		meanMag         sql.NullFloat64
		adopted, source string
	}
	extras := map[int64]extra{}
	rows, err := q.Query(`SELECT t.id, t.mean_mag_v, e.adopted_utc, e.source FROM targets t
		JOIN ephemerides e ON e.id = (SELECT id FROM ephemerides WHERE target_id = t.id ORDER BY adopted_utc DESC, id DESC LIMIT 1)`)
	if err != nil {
		return err
	}
	for rows.Next() {
		var id int64
		var x extra
		if err := rows.Scan(&id, &x.meanMag, &x.adopted, &x.source); err != nil {
			rows.Close()
			return err
		}
		extras[id] = x
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return err
	}
	for i, t := range ts {
		x := extras[ids[i]]
		sec := ""
		if t.Secondary {
			sec = "true"
		}
		e := t.Ephemeris
		if err := write([]string{t.Name, fmtFloat(t.Star.RAHours), fmtFloat(t.Star.DecDeg), zeroFloat(t.Star.PMRA),
			zeroFloat(t.Star.PMDec), t.Class.String(), t.Kind.String(), fmtFloat(e.Epoch), e.Scale.String(),
			fmtFloat(e.PeriodDays), zeroFloat(e.Q), zeroFloat(e.EpochErr), zeroFloat(e.PeriodErr), sec,
			optFloat(t.MagBright), optFloat(t.MagFaint), observe.FormatComps(t.Comps), observe.FormatComps(t.Checks),
			zeroFloat(t.LastTimingJD), t.Notes, optFloat(orNaN(x.meanMag)), x.adopted, x.source}); err != nil {
			return err
		}
	}
	return nil
}

func exportMeasurements(q querier, write func([]string) error) error {
	ms, err := loadMeasurements(q, "ORDER BY m.id")
	if err != nil {
		return err
	}
	nights, err := nightKeys(q)
	if err != nil {
		return err
	}
	for _, m := range ms {
		k := nights[m.NightID]
		if err := write([]string{m.Target, k[0], k[1], fmtFloat(m.JDUTC), optFloat(m.ExposureS), m.Filter,
			optFloat(m.Airmass), optFloat(m.InstMag), optFloat(m.InstErr), formatRaw(m.Comps), formatRaw(m.Checks),
			m.Visual, optFloat(m.Mag), optFloat(m.MagErr), optFloat(m.HJD), optFloat(m.BJDTDB), m.Notes}); err != nil {
			return err
		}
	}
	return nil
}

func exportTimings(q querier, write func([]string) error) error {
	ts, err := loadTimings(q, "ORDER BY t.id, tm.jd, tm.id")
	if err != nil {
		return err
	}
	nights, err := nightKeys(q)
	if err != nil {
		return err
	}
	for _, t := range ts {
		k := nights[t.NightID] // the zero key ("", "") for none
		sec := ""
		if t.Secondary {
			sec = "true"
		}
		if err := write([]string{t.Target, fmtFloat(t.JD), t.Scale.String(), optFloat(t.SigmaDays), t.Kind.String(), sec,
			t.Origin.String(), t.Method, t.Source, k[0], k[1], t.Filter, t.Observer, t.Notes}); err != nil {
			return err
		}
	}
	return nil
}

// nightKeys maps each night's ID to its site name and date.
func nightKeys(q querier) (map[int64][2]string, error) {
	ns, err := loadNights(q, "")
	if err != nil {
		return nil, err
	}
	out := make(map[int64][2]string, len(ns))
	for _, n := range ns {
		out[n.ID] = [2]string{n.Site, dateKey(n.Date)}
	}
	return out, nil
}
