package observe

import (
	"errors"
	"math"
	"strings"
	"testing"

	"example.org/vigil/ephem"
)

func TestReadVOTableExample(t *testing.T) {
	ts, err := ReadVOTableFile("testdata/targets_example.vot", VOTableOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(ts) != 2 {
		t.Fatalf("got %d targets, want 2", len(ts))
	}
	// Values as written in testdata/targets_example.vot: RA "h:m:s", period
	// in hours (8.909628 h = 0.3712345 d), epoch error in minutes, the epochs
	// on BJD_TDB by the TIMESYS the epoch FIELD refers to.
	const tol = 1e-12
	a, c := ts[0], ts[1]
	for _, x := range []struct {
		name      string
		got, want float64
	}{
		{"Alder RA (h)", a.Star.RAHours, 5.5}, {"Alder Dec", a.Star.DecDeg, 30},
		{"Alder P (d)", a.Ephemeris.PeriodDays, 0.3712345}, {"Alder σT0 (d)", a.Ephemeris.EpochErr, 1.2 / 1440},
		{"Alder T0", a.Ephemeris.Epoch, 2459000.1234}, {"Cedar RA (h)", c.Star.RAHours, 13.05},
		{"Cedar P (d)", c.Ephemeris.PeriodDays, 1.2345678},
	} {
		if math.Abs(x.got-x.want) > tol*math.Max(1, math.Abs(x.want)) {
			t.Errorf("%s: got %.12g want %.12g", x.name, x.got, x.want)
		}
	}
	if a.Ephemeris.Scale != ephem.BJDTDB || a.Class != Pulsating || a.Kind != Max {
		t.Errorf("Alder Var: scale %v class %v kind %v, want bjd pulsating max", a.Ephemeris.Scale, a.Class, a.Kind)
	}
	if c.Class != Eclipsing || c.Kind != Min {
		t.Errorf("Cedar Ecl: class %v kind %v, want eclipsing min", c.Class, c.Kind)
	}
}

// voDoc builds a one-row VOTable with the given FIELDs and cells.
func voDoc(fields, cells string) string {
	return `<?xml version="1.0"?>
<VOTABLE version="1.4"><RESOURCE><TABLE>
` + fields + `
<DATA><TABLEDATA>
<TR>` + cells + `</TR>
</TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>`
}

const (
	voFields = `<FIELD name="id" ucd="meta.id;meta.main"/>
<FIELD name="ra" unit="deg" ucd="pos.eq.ra;meta.main"/>
<FIELD name="dec" unit="deg" ucd="pos.eq.dec;meta.main"/>
<FIELD name="hjd0" unit="d" ucd="time.epoch"/>
<FIELD name="period" unit="d" ucd="time.period"/>`
	voCells = `<TD>X</TD><TD>82.5</TD><TD>-5.5</TD><TD>2460000.5</TD><TD>1.5</TD>`
)

func TestReadVOTableMapping(t *testing.T) {
	for _, tc := range []struct {
		name, fields, cells string
		raH, decDeg, p      float64
		scale               ephem.TimeScale
	}{
		{"UCDs, RA in deg, HJD by name", voFields, voCells, 5.5, -5.5, 1.5, ephem.HJD},
		{"common names only, RA in h", `<FIELD name="Name"/><FIELD name="RAJ2000" unit="h"/><FIELD name="DEJ2000" unit="deg"/>
<FIELD name="BJD0" unit="d"/><FIELD name="Period" unit="d"/>`, voCells[:10] + `<TD>5.5</TD><TD>-5.5</TD><TD>2460000.5</TD><TD>1.5</TD>`, 5.5, -5.5, 1.5, ephem.BJDTDB},
		{"MJD epoch, period in s", `<FIELD name="id" ucd="meta.id;meta.main"/><FIELD name="ra" unit="deg" ucd="pos.eq.ra;meta.main"/>
<FIELD name="dec" unit="deg" ucd="pos.eq.dec;meta.main"/><FIELD name="mjd_max" unit="d" ucd="time.epoch"/><FIELD name="p" unit="s" ucd="time.period"/>
<FIELD name="timescale"/>`, `<TD>X</TD><TD>82.5</TD><TD>-5.5</TD><TD>60000</TD><TD>43200</TD><TD>bjd</TD>`, 5.5, -5.5, 0.5, ephem.BJDTDB},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ts, err := ReadVOTable(strings.NewReader(voDoc(tc.fields, tc.cells)), "t.vot", VOTableOptions{})
			if err != nil {
				t.Fatal(err)
			}
			g := ts[0]
			if math.Abs(g.Star.RAHours-tc.raH) > 1e-12 || g.Star.DecDeg != tc.decDeg || math.Abs(g.Ephemeris.PeriodDays-tc.p) > 1e-12 || g.Ephemeris.Scale != tc.scale {
				t.Errorf("got RA %v h, Dec %v, P %v d, scale %v; want %v, %v, %v, %v", g.Star.RAHours, g.Star.DecDeg,
					g.Ephemeris.PeriodDays, g.Ephemeris.Scale, tc.raH, tc.decDeg, tc.p, tc.scale)
			}
		})
	}
}

func TestReadVOTableBad(t *testing.T) {
	noScale := strings.Replace(voFields, `name="hjd0"`, `name="t_max"`, 1)
	for _, tc := range []struct {
		name, doc, field, want string
	}{
		{"no period field", voDoc(strings.Replace(voFields, `name="period" unit="d" ucd="time.period"`, `name="vmag" unit="mag" ucd="phot.mag"`, 1), voCells), "", "FIELD for period"},
		{"RA without unit", voDoc(strings.Replace(voFields, `name="ra" unit="deg"`, `name="ra"`, 1), voCells), "ra", "no unit"},
		{"period in furlongs", voDoc(strings.Replace(voFields, `name="period" unit="d"`, `name="period" unit="fortnight"`, 1), voCells), "period", `"fortnight"`},
		{"scale unknown", voDoc(noScale, voCells), "t_max", "HJD or BJD_TDB"},
		{"period not a number", voDoc(voFields, strings.Replace(voCells, "<TD>1.5</TD>", "<TD>long</TD>", 1)), "period", `"long"`},
		{"period zero", voDoc(voFields, strings.Replace(voCells, "<TD>1.5</TD>", "<TD>0</TD>", 1)), "", "period 0"},
		{"reduced JD", voDoc(voFields, strings.Replace(voCells, "2460000.5", "60000.5", 1)), "hjd0", "full Julian date"},
		{"binary data", strings.Replace(voDoc(voFields, voCells), "<TABLEDATA>", "<BINARY><STREAM/></BINARY><TABLEDATA>", 1), "", "TABLEDATA"},
		{"not a VOTable", "name,ra\nX,1\n", "", "not a VOTable"},
		{"short row", voDoc(voFields, "<TD>X</TD>"), "", "1 cells for 5 FIELDs"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ts, err := ReadVOTable(strings.NewReader(tc.doc), "t.vot", VOTableOptions{})
			if err == nil {
				t.Fatalf("got %d targets and no error, want one mentioning %q", len(ts), tc.want)
			}
			var ve *VOTableError
			if !errors.As(err, &ve) || ve.File != "t.vot" || ve.Field != tc.field {
				t.Errorf("error %q: want a VOTableError naming t.vot and FIELD %q", err, tc.field)
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not mention %q", err, tc.want)
			}
		})
	}
	// The scale may be chosen by the caller when the file is silent.
	ts, err := ReadVOTable(strings.NewReader(voDoc(noScale, voCells)), "t.vot", VOTableOptions{Scale: ephem.HJD})
	if err != nil || ts[0].Ephemeris.Scale != ephem.HJD {
		t.Errorf("with a chosen scale: got %v, %v; want HJD", ts, err)
	}
}
