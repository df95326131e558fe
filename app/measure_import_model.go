package app

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strings"
	"time"

	"example.org/vigil/internal/table"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// MeasureImport is a photometry file (CSV with a header row) opened for
// import: its header, its first rows for a look, and the whole text.
type MeasureImport struct {
	Name   string // the file's path, used in errors
	Header []string
	Sample [][]string // up to MeasureSampleRows data rows, cells by Header
	Rows   int        // data rows
	raw    []byte
	tab    *table.Table
}

// MeasureSampleRows is how many rows of the file the mapping step shows.
const MeasureSampleRows = 5

// OpenMeasureImport reads the file at path for import.
func OpenMeasureImport(path string) (*MeasureImport, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, &table.Error{File: path, Err: err}
	}
	return ReadMeasureImport(bytes.NewReader(b), path)
}

// ReadMeasureImport reads a photometry file from r; name is used in errors.
func ReadMeasureImport(r io.Reader, name string) (*MeasureImport, error) {
	b, err := io.ReadAll(r)
	if err != nil {
		return nil, &table.Error{File: name, Err: err}
	}
	t, err := table.Read(bytes.NewReader(b), name)
	if err != nil {
		return nil, err
	}
	im := &MeasureImport{Name: name, Header: t.Header, Rows: t.Len(), raw: b, tab: t}
	for i := 0; i < t.Len() && i < MeasureSampleRows; i++ {
		row := make([]string, len(t.Header))
		for j, h := range t.Header {
			row[j] = t.Row(i).String(h)
		}
		im.Sample = append(im.Sample, row)
	}
	return im, nil
}

// MeasureMapping says which column of the file holds what ("" for none).
type MeasureMapping struct {
	Time       string
	TimeFormat reduce.TimeFormat
	// Exposure, when set, names a column of exposure lengths (s): Time is
	// then the start of each exposure, and its middle is Time + Exposure/2.
	Exposure          string
	Target, TargetErr string
	Filter, Airmass   string
	// Stars maps a comparison or check star's label to its columns (only
	// the stars mapped are used).
	Stars map[string]MeasureStarColumns
	// OnlyFilter, when set, imports the frames of that filter only (the
	// others are counted); otherwise every frame must share one filter.
	OnlyFilter string
}

// MeasureStarColumns names the columns of a star's magnitude and error.
type MeasureStarColumns struct{ Mag, Err string }

// GuessMapping proposes a mapping from the header: columns named as the
// command line's photometry tables name them (jd_utc, target, target_err,
// C1, C1_err...) or in other common ways, and the time format from the
// column's name and first value.
func (im *MeasureImport) GuessMapping(labels []string) MeasureMapping {
	find := func(names ...string) string {
		for _, n := range names {
			for _, h := range im.Header {
				if strings.EqualFold(strings.TrimSpace(h), n) {
					return h
				}
			}
		}
		return ""
	}
	m := MeasureMapping{Stars: map[string]MeasureStarColumns{}}
	m.Time = find("jd_utc", "jd", "mjd_utc", "mjd", "time", "date", "date_obs", "date-obs", "utc", "datetime")
	m.Exposure = find("exposure_s", "exposure", "exptime", "exp_s")
	m.Target = find("target", "var", "variable", "target_mag", "inst_mag", "mag")
	m.TargetErr = find("target_err", "var_err", "variable_err", "target_mag_err", "inst_err", "err", "mag_err")
	m.Filter = find("filter", "band", "flt")
	m.Airmass = find("airmass", "air_mass", "x")
	for _, l := range labels {
		sc := MeasureStarColumns{Mag: find(l, l+"_mag", "comp_"+l), Err: find(l+"_err", l+"_mag_err", "comp_"+l+"_err")}
		if sc.Mag != "" {
			m.Stars[l] = sc
		}
	}
	m.TimeFormat = reduce.TimeJD
	if m.Time != "" {
		v := ""
		if len(im.Sample) > 0 {
			v = im.Sample[0][im.tab.Index(m.Time)]
		}
		low := strings.ToLower(m.Time)
		switch {
		case strings.Contains(low, "mjd"):
			m.TimeFormat = reduce.TimeMJD
		case strings.ContainsAny(v, "-:T") && !strings.HasPrefix(v, "-"):
			m.TimeFormat = reduce.TimeISO
		case v != "" && measureSmallNumber(v):
			m.TimeFormat = reduce.TimeMJD
		}
	}
	return m
}

// measureSmallNumber reports whether s reads as a number below 1e5 (a
// modified Julian date rather than a Julian date).
func measureSmallNumber(s string) bool {
	v, err := measureNumber(s, 0, 1e5, false)
	return err == nil && v < 1e5
}

// MeasurePreview is what an import would store, or why it cannot.
type MeasurePreview struct {
	// Err stops the import: a mapping left incomplete, or the first bad
	// cell of the file, named by file, line and column.
	Err error
	// Measurements are ready to store, one per frame reduced; Dates gives
	// the night (civil date it begins on) each belongs to.
	Measurements []logbook.Measurement
	Dates        []time.Time
	Red          *reduce.Reduction
}

// Preview reads the file as m maps it and reduces it for the star and site
// of r (reduce.Photometry.Read and Reduce, with the stars mapped): the
// frames reduced, those skipped and why, the comparison stars left out,
// the check star, and the night of each frame at the site.
func (im *MeasureImport) Preview(r MeasureRequest, m MeasureMapping) MeasurePreview {
	var pv MeasurePreview
	p := MeasurePhotometry(r.Target, &r.Site)
	p.Filter = strings.TrimSpace(m.OnlyFilter)
	var comps []reduce.Comp
	for _, c := range p.Comps {
		if m.Stars[c.ID].Mag != "" {
			comps = append(comps, c)
		}
	}
	p.Comps = comps
	if p.Check != nil && m.Stars[p.Check.ID].Mag == "" {
		p.Check = nil
	}
	switch {
	case m.Time == "":
		pv.Err = errors.New("choose the column that holds the time")
	case m.Target == "":
		pv.Err = errors.New("choose the column that holds the target's instrumental magnitude")
	case len(p.Comps) == 0:
		pv.Err = errors.New("choose the column of at least one comparison star")
	}
	if pv.Err != nil {
		return pv
	}
	cols := reduce.Columns{Time: m.Time, TimeFormat: m.TimeFormat, ExposureSec: m.Exposure, Target: m.Target,
		TargetErr: m.TargetErr, TargetAirmass: m.Airmass, Filter: m.Filter, Stars: map[string]reduce.StarColumns{}}
	// The reader takes columns left to their default names (target_err,
	// C1_err...) when the file has them: hide those not mapped.
	hide := map[string]bool{}
	hideDefault := func(given, def string) {
		if given == "" && im.tab.Has(def) {
			hide[strings.ToLower(def)] = true
		}
	}
	hideDefault(m.TargetErr, "target_err")
	hideDefault(m.Airmass, "airmass")
	hideDefault(m.Filter, "filter")
	stars := append([]reduce.Comp(nil), p.Comps...)
	if p.Check != nil {
		stars = append(stars, *p.Check)
	}
	for _, c := range stars {
		sc := m.Stars[c.ID]
		cols.Stars[c.ID] = reduce.StarColumns{Mag: sc.Mag, Err: sc.Err}
		hideDefault(sc.Err, c.ID+"_err")
		hideDefault("", c.ID+"_airmass")
	}
	exps, err := p.Read(bytes.NewReader(im.hidden(hide)), im.Name, cols)
	if err != nil {
		pv.Err = err
		return pv
	}
	red, err := p.Reduce(exps)
	if err != nil {
		var ee *reduce.ExposureError
		if errors.As(err, &ee) && ee.Index < im.tab.Len() {
			err = im.tab.Row(ee.Index).Wrap(measureColumnOf(ee.Field, cols), ee.Err)
		}
		pv.Err = err
		return pv
	}
	pv.Red = red
	for _, row := range red.Rows {
		e := exps[row.Index]
		ms := logbook.Measurement{Target: r.Target.Name, JDUTC: row.JDUTC, ExposureS: math.NaN(), Filter: e.Filter,
			Airmass: e.Target.Airmass, InstMag: e.Target.Mag, InstErr: e.Target.Err,
			Mag: row.Mag, MagErr: row.Err, HJD: row.HJD, BJDTDB: row.BJDTDB}
		if m.Exposure != "" {
			ms.ExposureS, _, _ = im.tab.Row(row.Index).Float(m.Exposure)
			if ms.ExposureS == 0 {
				ms.ExposureS = math.NaN()
			}
		}
		for j, c := range p.Comps {
			if !math.IsNaN(e.Comps[j].Mag) {
				ms.Comps = append(ms.Comps, logbook.RawMag{Label: c.ID, InstMag: e.Comps[j].Mag, InstErr: e.Comps[j].Err})
			}
		}
		if p.Check != nil && !math.IsNaN(e.Check.Mag) {
			ms.Checks = append(ms.Checks, logbook.RawMag{Label: p.Check.ID, InstMag: e.Check.Mag, InstErr: e.Check.Err})
		}
		if !(ms.MagErr > 0) {
			ms.MagErr = math.NaN() // no error known
		}
		if err := ms.Validate(); err != nil {
			pv.Err = im.tab.Row(row.Index).Wrap("", err)
			return pv
		}
		pv.Measurements = append(pv.Measurements, ms)
		pv.Dates = append(pv.Dates, Tonight(measureJDTime(row.JDUTC), &r.Site))
	}
	if len(pv.Measurements) == 0 {
		pv.Err = fmt.Errorf("%s: no frame could be reduced", im.Name)
	}
	return pv
}

// measureColumnOf names the column holding a reduce.ExposureError's field.
func measureColumnOf(field string, cols reduce.Columns) string {
	switch field {
	case "jd_utc":
		return cols.Time
	case "target":
		return cols.Target
	case "filter":
		if cols.Filter == "" {
			return "filter"
		}
		return cols.Filter
	}
	if sc, ok := cols.Stars[field]; ok && sc.Mag != "" {
		return sc.Mag
	}
	return field
}

// hidden returns the file's text with the header's columns named in hide
// (lower case) renamed so that no reader takes them; every line and every
// data byte stays where it was.
func (im *MeasureImport) hidden(hide map[string]bool) []byte {
	if len(hide) == 0 {
		return im.raw
	}
	h := append([]string(nil), im.Header...)
	for i, name := range h {
		if hide[strings.ToLower(strings.TrimSpace(name))] {
			h[i] = name + " (not used)"
		}
	}
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write(h)
	w.Flush()
	line := bytes.TrimRight(b.Bytes(), "\n")
	if bytes.ContainsAny(line, "\r\n") {
		return im.raw // a header cell spanning lines: leave the file alone
	}
	// Replace the header line (its number counts from 1).
	start, n := 0, 1
	for n < im.tab.HeaderLine() {
		k := bytes.IndexByte(im.raw[start:], '\n')
		if k < 0 {
			return im.raw
		}
		start += k + 1
		n++
	}
	end := len(im.raw)
	if k := bytes.IndexByte(im.raw[start:], '\n'); k >= 0 {
		end = start + k
		if end > start && im.raw[end-1] == '\r' {
			end--
		}
	}
	out := append([]byte(nil), im.raw[:start]...)
	out = append(out, line...)
	return append(out, im.raw[end:]...)
}
