package logbook

import (
	"database/sql"
	"errors"
	"fmt"
	"strings"

	"example.org/vigil/observe"
)

// AddSite stores a new observing site with its horizon profile and time
// zone. Names are unique regardless of case.
func (lb *Logbook) AddSite(s observe.Site) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		_, err := addSite(tx, s, false)
		return err
	}))
}

func addSite(q querier, s observe.Site, demo bool) (int64, error) {
	if err := checkSite(&s); err != nil {
		return 0, err
	}
	if id, err := siteID(q, s.Name); err == nil {
		var have string
		q.QueryRow("SELECT name FROM sites WHERE id = ?", id).Scan(&have)
		return 0, fmt.Errorf("site %q is already in the logbook (as %q)", s.Name, have)
	} else if !errors.Is(err, ErrNotFound) {
		return 0, err
	}
	res, err := q.Exec(`INSERT INTO sites(name, lat_deg, lon_deg, elev_m, time_zone, min_alt_deg, demo) VALUES (?, ?, ?, ?, ?, ?, ?)`,
		s.Name, s.LatDeg, s.LonDeg, s.ElevM, s.TimeZone, s.MinAltDeg, boolInt(demo))
	if err != nil {
		return 0, fmt.Errorf("site %q: %w", s.Name, err)
	}
	id, err := res.LastInsertId()
	if err != nil {
		return 0, err
	}
	return id, putHorizon(q, id, s.Horizon)
}

// checkSite validates s as observe does (which also loads the time zone) and
// adds the logbook's own rules on names.
func checkSite(s *observe.Site) error {
	if err := checkName("site name", s.Name); err != nil {
		return err
	}
	if err := s.Validate(); err != nil {
		return err
	}
	if err := checkText("time zone", s.TimeZone); err != nil {
		return err
	}
	return nil
}

func putHorizon(q querier, siteID int64, h observe.Horizon) error {
	if _, err := q.Exec("DELETE FROM horizon_points WHERE site_id = ?", siteID); err != nil {
		return err
	}
	for _, p := range h {
		if _, err := q.Exec("INSERT INTO horizon_points(site_id, az_deg, alt_deg) VALUES (?, ?, ?)", siteID, p.AzDeg, p.AltDeg); err != nil {
			return err
		}
	}
	return nil
}

// siteID returns the ID of the site named name (any case), or an error
// wrapping ErrNotFound.
func siteID(q querier, name string) (int64, error) {
	var id int64
	err := q.QueryRow("SELECT id FROM sites WHERE name = ?", name).Scan(&id)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, fmt.Errorf("site %q: %w in the logbook", name, ErrNotFound)
	}
	return id, err
}

// Site returns the site named name (any case), its time zone loaded.
func (lb *Logbook) Site(name string) (observe.Site, error) {
	sites, err := loadSites(lb.db, "WHERE name = ?", name)
	if err != nil {
		return observe.Site{}, lb.wrap(err)
	}
	if len(sites) == 0 {
		return observe.Site{}, lb.wrap(fmt.Errorf("site %q: %w in the logbook", name, ErrNotFound))
	}
	return sites[0], nil
}

// Sites returns every site, in order of name.
func (lb *Logbook) Sites() ([]observe.Site, error) {
	sites, err := loadSites(lb.db, "")
	return sites, lb.wrap(err)
}

func loadSites(q querier, where string, args ...any) ([]observe.Site, error) {
	rows, err := q.Query(`SELECT id, name, lat_deg, lon_deg, elev_m, time_zone, min_alt_deg FROM sites `+where+` ORDER BY name`, args...)
	if err != nil {
		return nil, err
	}
	type rec struct {
		id                        int64
		name, tz                  string
		lat, lon, elev, minAltDeg float64
	}
	var recs []rec
	for rows.Next() {
		var r rec
		if err := rows.Scan(&r.id, &r.name, &r.lat, &r.lon, &r.elev, &r.tz, &r.minAltDeg); err != nil {
			rows.Close()
			return nil, err
		}
		recs = append(recs, r)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, err
	}
	out := make([]observe.Site, 0, len(recs))
	for _, r := range recs {
		h, err := loadHorizon(q, r.id)
		if err != nil {
			return nil, err
		}
		s := observe.Site{TimeZone: r.tz, MinAltDeg: r.minAltDeg, Horizon: h}
		s.Name, s.LatDeg, s.LonDeg, s.ElevM = r.name, r.lat, r.lon, r.elev
		if err := s.Validate(); err != nil {
			return nil, fmt.Errorf("stored site %q is not usable: %w", r.name, err)
		}
		out = append(out, s)
	}
	return out, nil
}

func loadHorizon(q querier, siteID int64) (observe.Horizon, error) {
	rows, err := q.Query("SELECT az_deg, alt_deg FROM horizon_points WHERE site_id = ? ORDER BY az_deg", siteID)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var h observe.Horizon
	for rows.Next() {
		var p observe.HorizonPoint
		if err := rows.Scan(&p.AzDeg, &p.AltDeg); err != nil {
			return nil, err
		}
		h = append(h, p)
	}
	return h, rows.Err()
}

// UpdateSite replaces the site named name with s (which may rename it). Its
// nights stay with it.
func (lb *Logbook) UpdateSite(name string, s observe.Site) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		id, err := siteID(tx, name)
		if err != nil {
			return err
		}
		if err := checkSite(&s); err != nil {
			return err
		}
		if other, err := siteID(tx, s.Name); err == nil && other != id {
			return fmt.Errorf("site %q is already in the logbook", s.Name)
		}
		if _, err := tx.Exec(`UPDATE sites SET name = ?, lat_deg = ?, lon_deg = ?, elev_m = ?, time_zone = ?, min_alt_deg = ? WHERE id = ?`,
			s.Name, s.LatDeg, s.LonDeg, s.ElevM, s.TimeZone, s.MinAltDeg, id); err != nil {
			return fmt.Errorf("site %q: %w", s.Name, err)
		}
		return putHorizon(tx, id, s.Horizon)
	}))
}

// DeleteSite removes the site named name. It refuses while nights observed
// there are in the logbook: delete those first.
func (lb *Logbook) DeleteSite(name string) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		id, err := siteID(tx, name)
		if err != nil {
			return err
		}
		var n int
		if err := tx.QueryRow("SELECT count(*) FROM nights WHERE site_id = ?", id).Scan(&n); err != nil {
			return err
		}
		if n > 0 {
			return fmt.Errorf("site %q has %d %s in the logbook: delete them first", name, n, plural(n, "night", "nights"))
		}
		_, err = tx.Exec("DELETE FROM sites WHERE id = ?", id)
		return err
	}))
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// formatHorizon writes a horizon profile in the sites table's cell format,
// "az/alt; az/alt" (degrees), every number exactly.
func formatHorizon(h observe.Horizon) string {
	parts := make([]string, len(h))
	for i, p := range h {
		parts[i] = fmtFloat(p.AzDeg) + "/" + fmtFloat(p.AltDeg)
	}
	return strings.Join(parts, "; ")
}

// parseHorizon reads the cell format formatHorizon writes; an empty cell is
// a flat horizon.
func parseHorizon(s string) (observe.Horizon, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	var h observe.Horizon
	for _, item := range strings.Split(s, ";") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		az, alt, ok := strings.Cut(item, "/")
		if !ok {
			return nil, fmt.Errorf("horizon point %q: want azimuth/altitude in degrees, e.g. 45/20", item)
		}
		var p observe.HorizonPoint
		var err error
		if p.AzDeg, err = parseFinite(az); err != nil {
			return nil, fmt.Errorf("horizon point %q: azimuth %w", item, err)
		}
		if p.AltDeg, err = parseFinite(alt); err != nil {
			return nil, fmt.Errorf("horizon point %q: altitude %w", item, err)
		}
		h = append(h, p)
	}
	if err := h.Validate(); err != nil {
		return nil, err
	}
	return h, nil
}
