package logbook

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"example.org/vigil/internal/table"
	"example.org/vigil/observe"
)

// TestCSVRoundTrip exports every table of a demo logbook (fxDemo), imports
// them into a new logbook, exports again, and wants the same bytes; and the
// same targets, sites and measurements through the API. The whole demo
// scenario goes through the same round trip in vigil/internal/demo.
func TestCSVRoundTrip(t *testing.T) {
	src := openT(t, sharedDemo(t))
	dir1, dir2 := t.TempDir(), t.TempDir()
	if err := src.ExportCSVDir(dir1); err != nil {
		t.Fatal(err)
	}
	dst := emptyT(t)
	n, err := dst.ImportCSVDir(dir1)
	if err != nil {
		t.Fatal(err)
	}
	before := counts(t, src)
	for table, want := range map[Table]int{SitesTable: before["sites"], TargetsTable: before["targets"],
		NightsTable: before["nights"], PlansTable: before["plans"], MeasurementsTable: before["measurements"],
		TimingsTable: before["timings"], EphemeridesTable: before["ephemerides"] - before["targets"]} {
		if n[table] != want {
			t.Errorf("imported %d rows of %s, want %d", n[table], table, want)
		}
	}
	if err := dst.ExportCSVDir(dir2); err != nil {
		t.Fatal(err)
	}
	for _, tb := range Tables {
		a, _ := os.ReadFile(filepath.Join(dir1, tb.FileName()))
		b, _ := os.ReadFile(filepath.Join(dir2, tb.FileName()))
		if !bytes.Equal(a, b) || len(a) == 0 {
			t.Errorf("%s: the second export differs from the first (%d and %d bytes)", tb.FileName(), len(a), len(b))
		}
	}
	after := counts(t, dst)
	for _, name := range []string{"sites", "horizon_points", "targets", "ephemerides", "comps", "nights", "plans", "measurements", "raw_comps", "timings"} {
		if after[name] != before[name] {
			t.Errorf("table %s: %d rows after the round trip, want %d", name, after[name], before[name])
		}
	}
	ta, _ := src.Targets()
	tb, _ := dst.Targets()
	if fmt.Sprintf("%v", ta) != fmt.Sprintf("%v", tb) {
		t.Errorf("Targets differ after the round trip")
	}
	sa, _ := src.Sites()
	sb, _ := dst.Sites()
	if sitesText(sa) != sitesText(sb) {
		t.Errorf("Sites differ after the round trip")
	}
	for _, tg := range ta {
		ma, _ := src.MeasurementsOf(tg.Name, 0)
		mb, _ := dst.MeasurementsOf(tg.Name, 0)
		if len(ma) != len(mb) {
			t.Errorf("%s: %d measurements, want %d", tg.Name, len(mb), len(ma))
			continue
		}
		for i := range ma {
			a, b := ma[i], mb[i]
			a.ID, b.ID, a.NightID, b.NightID, a.ImportID, b.ImportID = 0, 0, 0, 0, 0, 0
			if !sameMeasurement(a, b) {
				t.Errorf("%s: measurement %d differs after the round trip: %+v vs %+v", tg.Name, i, a, b)
				break
			}
		}
		ha, _ := src.EphemerisHistory(tg.Name)
		hb, _ := dst.EphemerisHistory(tg.Name)
		if fmt.Sprintf("%v", ha) != fmt.Sprintf("%v", hb) {
			t.Errorf("%s: the ephemeris history differs after the round trip: %v vs %v", tg.Name, ha, hb)
		}
	}
	// The targets file stays readable by the planner's catalogue reader.
	cat, err := observe.ReadTargetsCSVFile(filepath.Join(dir1, TargetsTable.FileName()))
	if err != nil || len(cat) != len(ta) {
		t.Errorf("observe.ReadTargetsCSVFile of the export: %d targets, %v", len(cat), err)
	}
	// The import was recorded, and the demo did not come along as demo.
	if c := after["imports"]; c != len(Tables) {
		t.Errorf("%d imports recorded, want %d", c, len(Tables))
	}
	if demo, _ := dst.IsDemo(); demo {
		t.Errorf("an imported export of the demo is flagged demo")
	}
}

// importCase is one bad import: what it feeds, and where and what the error
// must say.
type importCase struct {
	name       string
	table      Table
	csv        string
	line, col  int
	colName    string
	phrase     string
	notTableEr bool
}

// fixtureCSVs are good rows, for the bad ones to differ from.
const (
	goodSites   = "name,lat_deg,lon_deg,elev_m,time_zone,min_alt_deg,horizon\n"
	goodTimings = "target,jd,timescale,sigma_days,kind,secondary,origin,method,source,site,date\n"
	goodMeas    = "target,site,date,jd_utc,inst_mag,inst_err,comp_inst,check_inst,mag,mag_err\n"
)

// TestImportErrors feeds bad tables and wants, for each, a *table.Error
// at the right line and column saying what was wrong, and nothing stored.
func TestImportErrors(t *testing.T) {
	for _, tc := range []importCase{
		{name: "bad number", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5x,0.004,,,,\n",
			line: 2, col: 44, colName: "inst_mag", phrase: `"-7.5x" is not a number`},
		{name: "timing of an unknown target", table: TimingsTable, csv: goodTimings + "Test Star A,2460749.43,bjd,0.0005,min,,own,kvw,,Ridge Top,2025-03-14\nNo Such Star,2460750.1,bjd,,min,,own,,,,\n",
			line: 3, col: 1, colName: "target", phrase: `target "No Such Star": not found`},
		{name: "site already in the logbook", table: SitesTable, csv: goodSites + "ridge top,45,7,100,UTC,10,\n",
			line: 2, col: 1, colName: "name", phrase: "already in the logbook"},
		{name: "site twice in the file", table: SitesTable, csv: goodSites + "Hill A,45,7,100,UTC,10,\nHILL A,45,7,100,UTC,10,\n",
			line: 3, col: 1, colName: "name", phrase: "repeats the one on line 2"},
		{name: "latitude out of range", table: SitesTable, csv: goodSites + "Hill B,95,7,100,UTC,10,\n",
			line: 2, col: 8, colName: "lat_deg", phrase: "95"},
		{name: "bad horizon cell", table: SitesTable, csv: goodSites + "Hill C,45,7,100,UTC,10,\"0/5; 90-10\"\n",
			line: 2, col: 24, colName: "horizon", phrase: "azimuth/altitude"},
		{name: "unknown time zone", table: SitesTable, csv: goodSites + "Hill D,45,7,100,Moon/Base,10,\n",
			line: 2, col: 17, colName: "time_zone", phrase: "Moon/Base"},
		{name: "missing column", table: TimingsTable, csv: "target,jd,timescale\nTest Star A,2460749.4,bjd\n",
			line: 1, col: 0, phrase: `missing column "origin"`},
		{name: "published timing without source", table: TimingsTable, csv: goodTimings + "Test Star A,2460749.43,hjd,0.0005,min,,published,,,,\n",
			line: 2, col: 0, colName: "source", phrase: "needs its source"},
		{name: "timing on an unknown night", table: TimingsTable, csv: goodTimings + "Test Star A,2460749.43,bjd,,min,,own,,,Ridge Top,2025-03-20\n",
			line: 2, colName: "date", phrase: "not found"},
		{name: "bad time scale", table: TimingsTable, csv: goodTimings + "Test Star A,2460749.43,tt,,min,,own,,,,\n",
			line: 2, col: 24, colName: "timescale", phrase: `"tt"`},
		{name: "secondary maximum", table: TimingsTable, csv: goodTimings + "Test Star A,2460749.43,bjd,,max,yes,own,,,,\n",
			line: 2, colName: "secondary", phrase: "must be a minimum"},
		{name: "unknown comparison star", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5,0.004,C1=-8.1/0.005; C7=-7.2,K1=-7.6,,\n",
			line: 2, colName: "comp_inst", phrase: `"C7" is not among`},
		{name: "bad comparison cell", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5,0.004,C1:-8.1,,,\n",
			line: 2, colName: "comp_inst", phrase: "ID=instrumental magnitude"},
		{name: "measurement on an unknown night", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,2025-04-01,2460749.4,-7.5,,,,,\n",
			line: 2, colName: "date", phrase: "not found"},
		{name: "bad date", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,14/03/2025,2460749.4,-7.5,,,,,\n",
			line: 2, colName: "date", phrase: "YYYY-MM-DD"},
		{name: "measurement without a value", table: MeasurementsTable, csv: goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,,,,,,\n",
			line: 2, phrase: "no value"},
		{name: "target already in the logbook", table: TargetsTable, csv: "name,ra,dec,epoch,period\ntest star a,5.5,30,2459000.1,1.2\n",
			line: 2, colName: "name", phrase: "already in the logbook"},
		{name: "target with a bad period", table: TargetsTable, csv: "name,ra,dec,epoch,period\nNew Star,5.5,30,2459000.1,-1\n",
			line: 2, colName: "period", phrase: "period"},
		{name: "target with a bad mean magnitude", table: TargetsTable, csv: "name,ra,dec,epoch,period,mean_mag_v\nNew Star,5.5,30,2459000.1,1.2,bright\n",
			line: 2, colName: "mean_mag_v", phrase: "not a number"},
		{name: "ephemeris of an unknown target", table: EphemeridesTable, csv: "target,epoch,timescale,period,adopted\nNobody,2459000.1,bjd,1.2,2020-01-01T00:00:00Z\n",
			line: 2, col: 1, colName: "target", phrase: "not found"},
		{name: "ephemeris with a bad adoption date", table: EphemeridesTable, csv: "target,epoch,timescale,period,adopted\nTest Star A,2459000.1,bjd,1.2,last year\n",
			line: 2, colName: "adopted", phrase: "ISO 8601"},
		{name: "night at an unknown site", table: NightsTable, csv: "site,date\nNowhere,2025-05-01\n",
			line: 2, col: 1, colName: "site", phrase: "not found"},
		{name: "night already in the logbook", table: NightsTable, csv: "site,date\nRidge Top,2025-03-14\n",
			line: 2, colName: "date", phrase: "already in the logbook"},
		{name: "plan naming an unknown target", table: PlansTable, csv: "site,date,target\nRidge Top,2025-03-14,Nobody\n",
			line: 2, colName: "target", phrase: "not found"},
		{name: "broken quoting", table: SitesTable, csv: goodSites + "\"Hill E,45,7,100,UTC,10,\n",
			line: 2, phrase: "quote"},
		{name: "no header", table: SitesTable, csv: "# only a comment\n", phrase: "no header row"},
		{name: "text that is not UTF-8", table: NightsTable, csv: "site,date,notes\nRidge Top,2025-05-02,caf\xe9\n",
			line: 2, colName: "notes", phrase: "UTF-8"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			lb, _ := fixture(t)
			before := counts(t, lb)
			name := string(tc.table) + ".csv"
			n, err := lb.ImportCSV(tc.table, strings.NewReader(tc.csv), name)
			if err == nil {
				t.Fatalf("imported %d rows, want an error", n)
			}
			var te *table.Error
			if !errors.As(err, &te) {
				t.Fatalf("got %T %v, want a *table.Error", err, err)
			}
			if te.File != name || te.Line != tc.line || (tc.col != 0 && te.Column != tc.col) || (tc.colName != "" && te.Name != tc.colName) {
				t.Errorf("got %q at file %q line %d column %d (%s); want line %d column %d (%s)", err, te.File, te.Line, te.Column,
					te.Name, tc.line, tc.col, tc.colName)
			}
			if !strings.Contains(err.Error(), tc.phrase) {
				t.Errorf("got %q, want it to say %q", err, tc.phrase)
			}
			if after := counts(t, lb); fmt.Sprint(after) != fmt.Sprint(before) {
				t.Errorf("a failed import changed the logbook: %v → %v", before, after)
			}
		})
	}
}

// TestImportAllOrNothing imports a long measurements table whose last row
// is bad, and a directory whose last table is bad: nothing may be stored.
func TestImportAllOrNothing(t *testing.T) {
	lb, _ := fixture(t)
	var b strings.Builder
	b.WriteString(goodMeas)
	for i := 0; i < 2000; i++ {
		fmt.Fprintf(&b, "Test Star A,Ridge Top,2025-03-14,%.6f,-7.5,0.004,C1=-8.1/0.005; C2=-7.2,K1=-7.6/0.006,11.8,0.006\n", 2460749.3+float64(i)*1e-4)
	}
	b.WriteString("Test Star A,Ridge Top,2025-03-14,2460749.9,-7.5,-0.004,,,,\n")
	before := counts(t, lb)
	if _, err := lb.ImportCSV(MeasurementsTable, strings.NewReader(b.String()), "m.csv"); err == nil || !strings.Contains(err.Error(), "line 2002") {
		t.Fatalf("got %v, want an error on line 2002", err)
	}
	if after := counts(t, lb); fmt.Sprint(after) != fmt.Sprint(before) {
		t.Errorf("a failed import stored rows: %v → %v", before, after)
	}
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "sites.csv"), []byte(goodSites+"Hill F,45,7,100,UTC,10,\n"), 0o644)
	os.WriteFile(filepath.Join(dir, "nights.csv"), []byte("site,date\nHill F,2025-06-01\n"), 0o644)
	os.WriteFile(filepath.Join(dir, "timings.csv"), []byte(goodTimings+"Nobody,2460749.43,bjd,,min,,own,,,,\n"), 0o644)
	if _, err := lb.ImportCSVDir(dir); err == nil || !strings.Contains(err.Error(), "timings.csv") {
		t.Fatalf("got %v, want an error naming timings.csv", err)
	}
	if after := counts(t, lb); fmt.Sprint(after) != fmt.Sprint(before) {
		t.Errorf("a failed directory import stored rows: %v → %v", before, after)
	}
	// The same directory without the bad file goes in whole.
	os.Remove(filepath.Join(dir, "timings.csv"))
	n, err := lb.ImportCSVDir(dir)
	if err != nil || n[SitesTable] != 1 || n[NightsTable] != 1 {
		t.Errorf("the good directory: %v, %v", n, err)
	}
	if _, err := lb.ImportCSVDir(t.TempDir()); err == nil {
		t.Errorf("an empty directory: no error")
	}
}

// TestImportGood imports one good table of each kind into the fixture.
func TestImportGood(t *testing.T) {
	lb, night := fixture(t)
	for _, tc := range []struct {
		table Table
		csv   string
		rows  int
	}{
		{SitesTable, goodSites + "# a comment\nHill G,\"52:07:02\",\"-1:27:14\",,UTC,20,\"0/5; 180/25.5\"\n", 1},
		{TargetsTable, "name,ra,dec,epoch,period,class,mean_mag_v,ephemeris_adopted,ephemeris_source\nNew Star,05:30:00,+30:00:00,2459000.1,1.2,pulsating,9.31,2020-02-03T04:05:06Z,my notes\n", 1},
		{EphemeridesTable, "target,epoch,timescale,period,q,adopted,source\nNew Star,2458000.1,hjd,1.19,,2015-01-01T00:00:00Z,old paper\n", 1},
		{NightsTable, "site,date,observer\nHill G,2025-06-01,me\n", 1},
		{PlansTable, "site,date,target,note\nHill G,2025-06-01,New Star,first\nHill G,2025-06-01,Test Star A,\n", 2},
		{MeasurementsTable, goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5,0.004,C1=-8.1/0.005; C2=-7.2,K1=-7.6/0.006,11.8,0.006\n" +
			"New Star,Hill G,2025-06-01,2460828.45,,,,,9.9,\n", 2},
		{TimingsTable, goodTimings + "Test Star A,2460749.43,bjd,0.0005,,true,own,kvw,,Ridge Top,2025-03-14\nNew Star,2456000.5,hjd,,max,,published,,A Paper (2012),,\n", 2},
	} {
		n, err := lb.ImportCSV(tc.table, strings.NewReader(tc.csv), string(tc.table)+".csv")
		if err != nil || n != tc.rows {
			t.Errorf("%s: imported %d, %v; want %d rows", tc.table, n, err, tc.rows)
		}
	}
	s, err := lb.Site("Hill G")
	if err != nil || s.LatDeg != 52+7.0/60+2.0/3600 || s.LonDeg > -1.45 || s.ElevM != 0 || len(s.Horizon) != 2 || s.Horizon[1].AltDeg != 25.5 {
		t.Errorf("the imported site: %+v, %v", s, err)
	}
	h, _ := lb.EphemerisHistory("New Star")
	if len(h) != 2 || h[0].Source != "old paper" || h[1].Source != "my notes" || h[1].Adopted.Year() != 2020 {
		t.Errorf("the imported history: %+v", h)
	}
	if m, _ := lb.MeanMagV("New Star"); m != 9.31 {
		t.Errorf("mean V: %v", m)
	}
	ts, _ := lb.TimingsOf(fxTarget)
	if len(ts) != 1 || !ts[0].Secondary || ts[0].Kind != observe.Min || ts[0].NightID != night || ts[0].ImportID == 0 {
		t.Errorf("the imported timing (kind from the target): %+v", ts)
	}
	p, _ := lb.Plan(func() int64 { n, _ := lb.Night("Hill G", fxDate.AddDate(0, 2, 18)); return n.ID }())
	if len(p) != 2 || p[0].Target != "New Star" || p[0].Note != "first" {
		t.Errorf("the imported plan: %+v", p)
	}
}

func TestParseTable(t *testing.T) {
	for _, tb := range Tables {
		if got, err := ParseTable(strings.ToUpper(string(tb))); err != nil || got != tb {
			t.Errorf("ParseTable(%q): %v, %v", tb, got, err)
		}
	}
	if _, err := ParseTable("stars"); err == nil || !strings.Contains(err.Error(), "sites, targets") {
		t.Errorf("ParseTable of an unknown name: %v", err)
	}
	lb := emptyT(t)
	if _, err := lb.ImportCSV(Table("stars"), strings.NewReader("a\n1\n"), "x.csv"); err == nil {
		t.Errorf("ImportCSV of an unknown table: no error")
	}
	var b bytes.Buffer
	if err := lb.ExportCSV(Table("stars"), &b); err == nil {
		t.Errorf("ExportCSV of an unknown table: no error")
	}
}

// sitesText writes sites' exported fields (the unexported time zone is a
// pointer, different in every copy).
func sitesText(ss []observe.Site) string {
	var b strings.Builder
	for _, s := range ss {
		fmt.Fprintf(&b, "%+v %q %v %v\n", s.Site, s.TimeZone, s.MinAltDeg, s.Horizon)
	}
	return b.String()
}
