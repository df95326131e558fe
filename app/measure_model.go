package app

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"time"

	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// MeasureRequest is what the Measurements page shows: a star, the site and
// the night (the civil date it begins on).
type MeasureRequest struct {
	Target observe.Target
	Site   observe.Site
	Date   time.Time
}

// Key identifies the request (star, site, night) for telling late results.
func (r MeasureRequest) Key() string {
	return strings.ToLower(r.Target.Name) + "\x00" + strings.ToLower(r.Site.Name) + "\x00" + r.Date.Format(time.DateOnly)
}

// MeasureData is what the page reads from the logbook for a request.
type MeasureData struct {
	Request MeasureRequest
	// Night is the logbook's record of the night; its ID is 0 while there
	// is none (it is made with the first measurement).
	Night logbook.Night
	// All holds the star's measurements of every night, in time order.
	All []logbook.Measurement
}

// LoadMeasure reads the night's record (or, when there is none yet, the
// observer and equipment of the latest earlier night at the site, to start
// from) and every measurement of the star.
func LoadMeasure(lb *logbook.Logbook, r MeasureRequest) (MeasureData, error) {
	d := MeasureData{Request: r}
	n, err := lb.Night(r.Site.Name, r.Date)
	switch {
	case err == nil:
		d.Night = n
	case errors.Is(err, logbook.ErrNotFound):
		d.Night = logbook.Night{Site: r.Site.Name, Date: r.Date}
		nights, err := lb.Nights(r.Site.Name)
		if err != nil {
			return d, err
		}
		for _, p := range nights {
			if p.Date.Before(r.Date) {
				d.Night.Observer, d.Night.Equipment = p.Observer, p.Equipment
			}
		}
	default:
		return d, err
	}
	if d.All, err = lb.MeasurementsOf(r.Target.Name, 0); err != nil {
		return d, err
	}
	return d, nil
}

// Tonight returns the star's measurements of the night, in time order.
func (d MeasureData) Tonight() []logbook.Measurement {
	if d.Night.ID == 0 {
		return nil
	}
	var out []logbook.Measurement
	for _, m := range d.All {
		if m.NightID == d.Night.ID {
			out = append(out, m)
		}
	}
	return out
}

// MeasureNight returns the logbook's record of the night of r, storing it
// first (logbook.AddNight, with the observer, equipment and conditions of
// details) when there is none; created says so.
func MeasureNight(lb *logbook.Logbook, r MeasureRequest, details logbook.Night) (n logbook.Night, created bool, err error) {
	n, err = lb.Night(r.Site.Name, r.Date)
	if err == nil || !errors.Is(err, logbook.ErrNotFound) {
		return n, false, err
	}
	details.ID, details.Site, details.Date = 0, r.Site.Name, r.Date
	id, err := lb.AddNight(details)
	if err != nil {
		return n, false, err
	}
	details.ID = id
	return details, true, nil
}

// SaveMeasureNight stores the observer, equipment and conditions of the
// night of r: a new record, or the existing one updated (its notes kept).
func SaveMeasureNight(lb *logbook.Logbook, r MeasureRequest, details logbook.Night) (logbook.Night, error) {
	n, created, err := MeasureNight(lb, r, details)
	if err != nil || created {
		return n, err
	}
	n.Observer, n.Equipment, n.Conditions = details.Observer, details.Equipment, details.Conditions
	return n, lb.UpdateNight(n)
}

// AddMeasureRow stores a reduced row in the night of r, making the night's
// record first when needed, and returns it with its ID and night set.
func AddMeasureRow(lb *logbook.Logbook, r MeasureRequest, details logbook.Night, m logbook.Measurement) (logbook.Measurement, logbook.Night, error) {
	n, created, err := MeasureNight(lb, r, details)
	if err != nil {
		return m, n, err
	}
	m.NightID = n.ID
	ids, err := lb.AddMeasurements([]logbook.Measurement{m})
	if err != nil {
		if created {
			_ = lb.DeleteNight(n.ID) // leave the logbook as it was
		}
		return m, n, err
	}
	m.ID = ids[0]
	return m, n, nil
}

// MeasureTable is the table of a night's measurements: its headings and
// one row of cells per measurement.
type MeasureTable struct {
	Columns []string
	Rows    []MeasureTableRow
	// Kinds says what each column holds (the view sizes them by it).
	Kinds []MeasureColumn
}

// MeasureTableRow is one measurement with its cells.
type MeasureTableRow struct {
	M     logbook.Measurement
	Cells []string
}

// MeasureColumn is the kind of a column of the table.
type MeasureColumn int

// The kinds of column.
const (
	MeasureColClock MeasureColumn = iota
	MeasureColEstimate
	MeasureColInst
	MeasureColFilter
	MeasureColNumber
	MeasureColJD
)

// BuildMeasureTable lays out the night's measurements of star t, the
// latest first (just under the entry row), clock times in loc and UTC side
// by side: the estimate column when a row is a
// visual estimate or visual is set (the entry's mode), and the columns of
// the instrumental magnitudes (target, each comparison star, the check
// star) when a row has them or visual is not set.
func BuildMeasureTable(t observe.Target, loc *time.Location, ms []logbook.Measurement, visual bool) MeasureTable {
	var anyVis, anyInst bool
	for _, m := range ms {
		anyVis = anyVis || m.Visual != ""
		anyInst = anyInst || !math.IsNaN(m.InstMag)
	}
	var tb MeasureTable
	add := func(name string, k MeasureColumn) {
		tb.Columns = append(tb.Columns, name)
		tb.Kinds = append(tb.Kinds, k)
	}
	add("Local", MeasureColClock)
	add("UTC", MeasureColClock)
	add("Mag", MeasureColNumber)
	add("± mag", MeasureColNumber)
	showVis := anyVis || visual
	showInst := (anyInst || !visual) && len(t.Comps) > 0
	if showVis {
		add("Estimate", MeasureColEstimate)
	}
	var labels []string
	if showInst {
		add("Target", MeasureColInst)
		for _, c := range t.Comps {
			add(c.ID, MeasureColInst)
			labels = append(labels, c.ID)
		}
		for _, c := range t.Checks {
			add(c.ID+" (check)", MeasureColInst)
			labels = append(labels, c.ID)
		}
	}
	add("Filter", MeasureColFilter)
	add("Air mass", MeasureColNumber)
	add("BJD_TDB", MeasureColJD)
	for i := len(ms) - 1; i >= 0; i-- {
		m := ms[i]
		ut := measureJDTime(m.JDUTC)
		cells := []string{ut.In(loc).Format("15:04:05"), ut.UTC().Format("15:04:05"), measureFixed(m.Mag, 3), measureFixed(m.MagErr, 3)}
		if showVis {
			cells = append(cells, m.Visual)
		}
		if showInst {
			cells = append(cells, measureInstText(m.InstMag, m.InstErr))
			for _, l := range labels {
				cells = append(cells, measureRawText(m, l))
			}
		}
		cells = append(cells, m.Filter, measureFixed(m.Airmass, 2), measureFixed(m.BJDTDB, 5))
		tb.Rows = append(tb.Rows, MeasureTableRow{M: m, Cells: cells})
	}
	return tb
}

// measureRawText writes the instrumental magnitude of the comparison or check star
// labelled l in m, "" when it was not measured.
func measureRawText(m logbook.Measurement, l string) string {
	for _, r := range append(append([]logbook.RawMag(nil), m.Comps...), m.Checks...) {
		if strings.EqualFold(r.Label, l) {
			return measureInstText(r.InstMag, r.InstErr)
		}
	}
	return ""
}

// measureInstText writes an instrumental magnitude with its error: "−7.512 ±0.005".
func measureInstText(mag, err float64) string {
	if math.IsNaN(mag) {
		return ""
	}
	s := strings.Replace(fmt.Sprintf("%.3f", mag), "-", "−", 1)
	if err > 0 {
		s += fmt.Sprintf(" ±%.3f", err)
	}
	return s
}

// measureFixed writes v with prec decimals, "—" when it is missing.
func measureFixed(v float64, prec int) string {
	if math.IsNaN(v) {
		return "—"
	}
	return strings.Replace(fmt.Sprintf("%.*f", prec, v), "-", "−", 1)
}

// measureJDTime returns the instant of a Julian date (UTC), rounded to the
// millisecond.
func measureJDTime(jd float64) time.Time {
	const unixEpochJD = 2440587.5
	ms := math.Round((jd - unixEpochJD) * 86400e3)
	return time.UnixMilli(int64(ms)).UTC()
}

// MeasureRowText says what a stored row gave: "21:14:05 GMT: 11.808 ± 0.003
// mag (3 comparison stars)".
func MeasureRowText(m logbook.Measurement, site *observe.Site) string {
	t := measureJDTime(m.JDUTC).In(site.Location())
	s := fmt.Sprintf("%s %s: %s mag", t.Format("15:04:05"), t.Format("MST"), measureFixed(m.Mag, 3))
	if m.MagErr > 0 {
		s = fmt.Sprintf("%s %s: %s ± %.3f mag", t.Format("15:04:05"), t.Format("MST"), measureFixed(m.Mag, 3), m.MagErr)
	}
	switch {
	case m.Visual != "":
		s += " from the estimate " + m.Visual
	case len(m.Comps) == 1:
		s += " against " + m.Comps[0].Label
	case len(m.Comps) > 1:
		s += fmt.Sprintf(" against %d comparison stars", len(m.Comps))
	}
	return s
}
