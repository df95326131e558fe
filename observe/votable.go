package observe

import (
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
)

// VOTableError is a fault at one place of a VOTable file.
type VOTableError struct {
	File  string
	Line  int    // 0 when the fault is the whole file
	Field string // the FIELD at fault, if any
	Err   error
}

func (e *VOTableError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ": line %d", e.Line)
	}
	if e.Field != "" {
		fmt.Fprintf(&b, " (FIELD %q)", e.Field)
	}
	b.WriteString(": ")
	b.WriteString(e.Err.Error())
	return b.String()
}

func (e *VOTableError) Unwrap() error { return e.Err }

// VOTableOptions says what to assume where a VOTable is silent.
type VOTableOptions struct {
	// Scale is the time scale of the epochs when neither a TIMESYS element,
	// nor the epoch FIELD's name, nor a timescale column tells it. 0 refuses
	// such a file.
	Scale ephem.TimeScale
}

// voField is one FIELD of the table.
type voField struct {
	name, id, ucd, unit, ref string
	line                     int
}

// roles maps each target property to the UCDs (IVOA UCD1+ words, all of
// which must be present) and then the common column names that identify it.
var roles = []struct {
	role     string
	ucds     [][]string
	names    []string
	required bool
}{
	{"name", [][]string{{"meta.id", "meta.main"}}, []string{"name", "id", "main_id", "star", "target", "designation"}, true},
	{"ra", [][]string{{"pos.eq.ra", "meta.main"}}, []string{"ra", "raj2000", "_raj2000", "ra_icrs", "radeg", "ra_deg", "ra_h"}, true},
	{"dec", [][]string{{"pos.eq.dec", "meta.main"}}, []string{"dec", "dej2000", "_dej2000", "de_icrs", "decj2000", "dedeg", "dec_deg"}, true},
	{"epoch_err", [][]string{{"stat.error", "time.epoch"}}, []string{"epoch_err", "e_epoch", "e_t0"}, false},
	{"period_err", [][]string{{"stat.error", "time.period"}}, []string{"period_err", "e_period", "e_per", "e_p"}, false},
	{"epoch", [][]string{{"time.epoch"}}, []string{"epoch", "t0", "hjd0", "bjd0", "epoch_jd"}, true},
	{"period", [][]string{{"time.period"}}, []string{"period", "per", "p", "period_d"}, true},
	{"pm_ra", [][]string{{"pos.pm", "pos.eq.ra"}}, []string{"pmra", "pm_ra"}, false},
	{"pm_dec", [][]string{{"pos.pm", "pos.eq.dec"}}, []string{"pmdec", "pmde", "pm_dec"}, false},
	{"class", [][]string{{"src.class"}, {"meta.code.class"}}, []string{"class", "type", "vartype", "var_type"}, false},
	{"kind", nil, []string{"kind"}, false},
	{"timescale", nil, []string{"timescale", "time_scale"}, false},
	{"mag_bright", nil, []string{"mag_bright", "magmax", "max_mag"}, false},
	{"mag_faint", nil, []string{"mag_faint", "magmin", "min_mag"}, false},
}

// ReadVOTableFile reads targets from the IVOA VOTable file at path.
func ReadVOTableFile(path string, opt VOTableOptions) ([]Target, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, &VOTableError{File: path, Err: err}
	}
	defer f.Close()
	return ReadVOTable(f, path, opt)
}

// ReadVOTable reads targets from the first TABLE of an IVOA VOTable
// (Ochsenbein et al., IVOA Recommendation "VOTable Format Definition" 1.4,
// 2019) whose data are in TABLEDATA. FIELDs are mapped by their UCD first
// (meta.id;meta.main, pos.eq.ra;meta.main, pos.eq.dec;meta.main,
// time.period, time.epoch, ...) and by common column names second; units
// come from the unit attribute (RA in deg, h or "h:m:s"; Dec in deg or
// "d:m:s"; period in d, h, min or s; epochs as full JD or as MJD, the scale
// from a TIMESYS element, the field's name or a timescale column). Anything
// that cannot be mapped is refused with a message naming the FIELD and line;
// so is the whole file when any row is bad.
func ReadVOTable(r io.Reader, name string, opt VOTableOptions) ([]Target, error) {
	dec := xml.NewDecoder(r)
	fail := func(line int, field string, format string, args ...any) error {
		return &VOTableError{File: name, Line: line, Field: field, Err: fmt.Errorf(format, args...)}
	}
	var (
		fields   []voField
		timesys  = map[string]string{} // ID → "hjd" / "bjd" / "" (unknown)
		rows     [][]string
		rowLines []int
		inTable  bool
		tables   int
		cur      []string
		text     strings.Builder
		inTD     bool
		version  string
		sawRoot  bool
	)
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		line, _ := dec.InputPos()
		if err != nil {
			return nil, fail(line, "", "not well-formed XML: %v", err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			attr := func(k string) string {
				for _, a := range t.Attr {
					if strings.EqualFold(a.Name.Local, k) {
						return strings.TrimSpace(a.Value)
					}
				}
				return ""
			}
			switch t.Name.Local {
			case "VOTABLE":
				sawRoot, version = true, attr("version")
			case "TIMESYS":
				timesys[attr("ID")] = scaleOfTimesys(attr("timescale"), attr("refposition"))
			case "TABLE":
				tables++
				inTable = tables == 1
			case "FIELD":
				if inTable {
					fields = append(fields, voField{name: attr("name"), id: attr("ID"), ucd: attr("ucd"),
						unit: strings.Trim(attr("unit"), `"' `), ref: attr("ref"), line: line})
				}
			case "BINARY", "BINARY2", "FITS":
				if inTable {
					return nil, fail(line, "", "data in %s serialisation: only TABLEDATA is read; save the table with TABLEDATA", t.Name.Local)
				}
			case "TR":
				if inTable {
					cur = cur[:0]
					rowLines = append(rowLines, line)
				}
			case "TD":
				if inTable {
					if attr("encoding") != "" {
						return nil, fail(line, "", "TD with encoding %q: want plain text cells", attr("encoding"))
					}
					inTD = true
					text.Reset()
				}
			}
		case xml.CharData:
			if inTD {
				text.Write(t)
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "TD":
				if inTD {
					cur = append(cur, strings.TrimSpace(text.String()))
					inTD = false
				}
			case "TR":
				if inTable {
					rows = append(rows, append([]string(nil), cur...))
				}
			case "TABLE":
				inTable = false
			}
		}
	}
	_ = version
	if !sawRoot {
		return nil, fail(0, "", "no VOTABLE element: not a VOTable file")
	}
	if tables == 0 || len(fields) == 0 {
		return nil, fail(0, "", "no TABLE with FIELDs")
	}
	col, err := mapFields(fields)
	if err != nil {
		return nil, &VOTableError{File: name, Err: err}
	}
	// The time scale of the epochs, where the file tells it.
	ep := fields[col["epoch"]]
	scale := ""
	if s, ok := timesys[ep.ref]; ok {
		scale = s
	}
	low := strings.ToLower(ep.name + " " + ep.id)
	switch {
	case scale != "":
	case strings.Contains(low, "bjd"):
		scale = "bjd"
	case strings.Contains(low, "hjd"):
		scale = "hjd"
	}
	mjd := strings.Contains(low, "mjd") || strings.Contains(strings.ToLower(ep.unit), "mjd")

	out := make([]Target, 0, len(rows))
	seen := map[string]bool{}
	for i, row := range rows {
		line := rowLines[i]
		if len(row) != len(fields) {
			return nil, fail(line, "", "row %d has %d cells for %d FIELDs", i+1, len(row), len(fields))
		}
		cell := func(role string) (string, voField, bool) {
			j, ok := col[role]
			if !ok {
				return "", voField{}, false
			}
			return row[j], fields[j], row[j] != ""
		}
		num := func(role string) (float64, voField, bool, error) {
			s, f, ok := cell(role)
			if !ok {
				return math.NaN(), f, false, nil
			}
			v, err := strconv.ParseFloat(s, 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				return math.NaN(), f, false, fail(line, f.name, "%q is not a number", s)
			}
			return v, f, true, nil
		}
		t := Target{MagBright: math.NaN(), MagFaint: math.NaN()}
		var ok bool
		var f voField
		if t.Name, f, ok = cell("name"); !ok {
			return nil, fail(line, f.name, "%w name: every target needs one", errMissing)
		}
		if seen[strings.ToLower(t.Name)] {
			return nil, fail(line, f.name, "target %q repeats an earlier row", t.Name)
		}
		seen[strings.ToLower(t.Name)] = true
		var err error
		if t.Star.RAHours, err = voAngle(true)(cell("ra")); err != nil {
			return nil, fail(line, fields[col["ra"]].name, "%v", err)
		}
		if t.Star.DecDeg, err = voAngle(false)(cell("dec")); err != nil {
			return nil, fail(line, fields[col["dec"]].name, "%v", err)
		}
		p, f, ok, err := num("period")
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, fail(line, f.name, "%w period", errMissing)
		}
		k, kerr := timeUnitDays(f.unit)
		if kerr != nil {
			return nil, fail(f.line, f.name, "%v", kerr)
		}
		t.Ephemeris.PeriodDays = p * k
		if v, f, ok, err := num("period_err"); err != nil {
			return nil, err
		} else if ok {
			k, kerr := timeUnitDays(f.unit)
			if kerr != nil {
				return nil, fail(f.line, f.name, "%v", kerr)
			}
			t.Ephemeris.PeriodErr = v * k
		}
		e0, f, ok, err := num("epoch")
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, fail(line, f.name, "%w epoch", errMissing)
		}
		if mjd {
			e0 += 2400000.5
		}
		if e0 < 2e6 {
			return nil, fail(line, f.name, "epoch %v: want a full Julian date (or an MJD column named so); a reduced JD is ambiguous", e0)
		}
		t.Ephemeris.Epoch = e0
		if v, f, ok, err := num("epoch_err"); err != nil {
			return nil, err
		} else if ok {
			k, kerr := timeUnitDays(f.unit)
			if kerr != nil {
				return nil, fail(f.line, f.name, "%v", kerr)
			}
			t.Ephemeris.EpochErr = v * k
		}
		sc := scale
		if s, _, ok := cell("timescale"); ok {
			sc = s
		}
		switch {
		case sc != "":
			ts, err := ephem.ParseTimeScale(sc)
			if err != nil {
				return nil, fail(line, ep.name, "%v", err)
			}
			t.Ephemeris.Scale = ts
		case opt.Scale != 0:
			t.Ephemeris.Scale = opt.Scale
		default:
			return nil, fail(ep.line, ep.name, "cannot tell whether the epochs are HJD or BJD_TDB: add a TIMESYS, name the field with hjd or bjd, add a timescale column, or choose the scale when importing")
		}
		for _, pm := range []struct {
			role string
			dst  *float64
		}{{"pm_ra", &t.Star.PMRA}, {"pm_dec", &t.Star.PMDec}} {
			v, f, ok, err := num(pm.role)
			if err != nil {
				return nil, err
			}
			if ok {
				k, kerr := pmUnit(f.unit)
				if kerr != nil {
					return nil, fail(f.line, f.name, "%v", kerr)
				}
				*pm.dst = v * k
			}
		}
		for _, m := range []struct {
			role string
			dst  *float64
		}{{"mag_bright", &t.MagBright}, {"mag_faint", &t.MagFaint}} {
			v, _, ok, err := num(m.role)
			if err != nil {
				return nil, err
			}
			if ok {
				*m.dst = v
			}
		}
		if s, f, ok := cell("class"); ok {
			t.Class = classOf(s)
			_ = f
		}
		t.Kind = Max
		if t.Class == Eclipsing {
			t.Kind = Min
		}
		if s, f, ok := cell("kind"); ok {
			if t.Kind, err = ParseKind(s); err != nil {
				return nil, fail(line, f.name, "%v", err)
			}
		}
		if err := t.Validate(); err != nil {
			return nil, fail(line, "", "%v", err)
		}
		out = append(out, t)
	}
	return out, nil
}

var errMissing = errors.New("missing")

// mapFields assigns FIELDs to roles: by UCD first, then by name.
func mapFields(fields []voField) (map[string]int, error) {
	col := map[string]int{}
	used := map[int]bool{}
	for _, r := range roles {
	ucd:
		for _, want := range r.ucds {
			for j, f := range fields {
				if used[j] || !hasUCDWords(f.ucd, want) {
					continue
				}
				// time.epoch alone must not take an error column.
				if r.role == "epoch" || r.role == "period" {
					if hasUCDWords(f.ucd, []string{"stat.error"}) {
						continue
					}
				}
				col[r.role], used[j] = j, true
				break ucd
			}
		}
	}
	for _, r := range roles {
		if _, ok := col[r.role]; ok {
			continue
		}
		for j, f := range fields {
			if used[j] {
				continue
			}
			n := strings.ToLower(f.name)
			for _, want := range r.names {
				if n == want || strings.ToLower(f.id) == want {
					col[r.role], used[j] = j, true
					break
				}
			}
			if _, ok := col[r.role]; ok {
				break
			}
		}
	}
	for _, r := range roles {
		if _, ok := col[r.role]; !ok && r.required {
			var names []string
			for _, f := range fields {
				names = append(names, fmt.Sprintf("%s [%s]", f.name, f.ucd))
			}
			return nil, fmt.Errorf("%w FIELD for %s: none has its UCD or a common name (fields: %s)",
				errMissing, r.role, strings.Join(names, ", "))
		}
	}
	return col, nil
}

// hasUCDWords reports whether the UCD (words separated by ';') holds every
// word of want (case ignored).
func hasUCDWords(ucd string, want []string) bool {
	words := map[string]bool{}
	for _, w := range strings.Split(strings.ToLower(ucd), ";") {
		words[strings.TrimSpace(w)] = true
	}
	for _, w := range want {
		if !words[w] {
			return false
		}
	}
	return len(want) > 0
}

// voAngle returns the reader of an RA (hours) or Dec (degrees) cell, by its
// FIELD's unit.
func voAngle(isRA bool) func(s string, f voField, ok bool) (float64, error) {
	return func(s string, f voField, ok bool) (float64, error) { return voAngleCell(s, f, ok, isRA) }
}

func voAngleCell(s string, f voField, ok, isRA bool) (float64, error) {
	if !ok {
		return 0, fmt.Errorf("%w value", errMissing)
	}
	unit := strings.ToLower(f.unit)
	sexa := strings.ContainsAny(s, ": ") || strings.Contains(unit, ":")
	switch {
	case sexa && isRA:
		return ephem.ParseRA(s)
	case sexa:
		return ephem.ParseDec(s)
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", s)
	}
	switch unit {
	case "deg", "degree", "degrees":
		if isRA {
			v /= 15
		}
	case "h", "hour", "hours", "hr":
		if !isRA {
			return 0, fmt.Errorf("unit %q: a declination wants deg or \"d:m:s\"", f.unit)
		}
	case "rad":
		v *= rad2deg
		if isRA {
			v /= 15
		}
	case "":
		return 0, fmt.Errorf("no unit: cannot tell degrees from hours; give the FIELD a unit (deg, h, \"h:m:s\")")
	default:
		return 0, fmt.Errorf("unit %q: want deg, h, rad or a sexagesimal form", f.unit)
	}
	if isRA && (v < 0 || v >= 24) {
		return 0, fmt.Errorf("right ascension %v h: want [0, 24)", v)
	}
	if !isRA && (v < -90 || v > 90) {
		return 0, fmt.Errorf("declination %v°: want [-90, 90]", v)
	}
	return v, nil
}

// timeUnitDays returns the number of days in one unit of a period or epoch
// error.
func timeUnitDays(unit string) (float64, error) {
	switch strings.ToLower(unit) {
	case "d", "day", "days":
		return 1, nil
	case "h", "hr", "hour", "hours":
		return 1.0 / 24, nil
	case "min":
		return 1.0 / 1440, nil
	case "s":
		return 1 / secPerDay, nil
	case "":
		return 0, fmt.Errorf("no unit: give the FIELD a unit (d, h, min or s)")
	}
	return 0, fmt.Errorf("unit %q: want d, h, min or s", unit)
}

// pmUnit returns the factor to mas/yr.
func pmUnit(unit string) (float64, error) {
	switch strings.ReplaceAll(strings.ToLower(unit), " ", "") {
	case "mas/yr", "mas/a", "mas.yr-1", "mas.a-1":
		return 1, nil
	case "arcsec/yr", "arcsec/a", "arcsec.yr-1", "arcsec.a-1":
		return 1000, nil
	}
	return 0, fmt.Errorf("proper-motion unit %q: want mas/yr or arcsec/yr", unit)
}

// scaleOfTimesys maps a VOTable 1.4 TIMESYS to hjd or bjd ("" when it is
// neither).
func scaleOfTimesys(timescale, refpos string) string {
	ts, rp := strings.ToUpper(timescale), strings.ToUpper(refpos)
	switch {
	case ts == "TDB" && rp == "BARYCENTER":
		return "bjd"
	case ts == "UTC" && rp == "HELIOCENTER":
		return "hjd"
	}
	return ""
}

// classOf maps a class cell: vigil's own names, or variability-type codes
// (common practice: types starting with E are eclipsing binaries; Cepheids,
// RR Lyrae, δ Scuti, SX Phoenicis, Miras, semiregulars and RV Tauri stars
// pulsate). Anything else is Other.
func classOf(s string) Class {
	if c, err := ParseClass(s); err == nil {
		return c
	}
	u := strings.ToUpper(strings.TrimSpace(s))
	if strings.HasPrefix(u, "E") {
		return Eclipsing
	}
	for _, p := range []string{"CEP", "DCEP", "CW", "RR", "DSCT", "SXPHE", "M", "SR", "RV", "BCEP"} {
		if strings.HasPrefix(u, p) {
			return Pulsating
		}
	}
	return Other
}
