package app

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"example.org/vigil/internal/demo"
	"example.org/vigil/internal/table"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// measureCSV is a small photometry file with its own column names: three
// frames of the methods.md §8 ensemble check (target v = −7.512 against
// C1, C2, C3 at −8.120, −7.262, −8.628: V = 11.808 unweighted), the first
// two on the night of 1–2 December 2026, the third on the next night, the
// times as the start of 60 s exposures (JD UTC). target_err carries a
// large error that the mapping leaves out.
const measureCSV = `# frames for the import test
mid,expo,vmag,target_err,cmp_a,cmp_b,cmp_c,chk,band
2461376.380000,60,-7.512,0.5,-8.120,-7.262,-8.628,-7.668,V
2461376.390000,60,-7.512,0.5,-8.120,-7.262,-8.628,-7.668,V
2461377.400000,60,-7.512,0.5,-8.120,,-8.628,-7.668,V
`

// measureCSVMapping maps measureCSV for measureTestStar.
func measureCSVMapping() MeasureMapping {
	return MeasureMapping{Time: "mid", TimeFormat: reduce.TimeJD, Exposure: "expo", Target: "vmag", Filter: "band",
		Stars: map[string]MeasureStarColumns{"C1": {Mag: "cmp_a"}, "C2": {Mag: "cmp_b"}, "C3": {Mag: "cmp_c"}, "K": {Mag: "chk"}}}
}

// measureImportLogbook is a small logbook holding the demo site and
// measureTestStar.
func measureImportLogbook(t *testing.T) (*logbook.Logbook, MeasureRequest) {
	t.Helper()
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "import.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	star := measureTestStar()
	if err := lb.AddSite(demo.Site()); err != nil {
		t.Fatal(err)
	}
	if err := lb.AddTarget(star, "invented for the tests"); err != nil {
		t.Fatal(err)
	}
	return lb, MeasureRequest{Target: star, Site: demo.Site(), Date: measureNight}
}

func measureWrite(t *testing.T, text string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "frames.csv")
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func TestMeasureImportStoresEveryRow(t *testing.T) {
	lb, r := measureImportLogbook(t)
	im, err := OpenMeasureImport(measureWrite(t, measureCSV))
	if err != nil {
		t.Fatal(err)
	}
	if im.Rows != 3 || len(im.Header) != 9 || im.Sample[0][2] != "-7.512" {
		t.Fatalf("file read: %d rows, header %q, first row %q", im.Rows, im.Header, im.Sample[0])
	}
	pv := im.Preview(r, measureCSVMapping())
	if pv.Err != nil {
		t.Fatal(pv.Err)
	}
	nights, err := pv.Nights(lb, r.Site.Name)
	if err != nil {
		t.Fatal(err)
	}
	if len(nights) != 2 || nights[0].Frames != 2 || nights[1].Frames != 1 || !nights[0].New || !nights[1].New {
		t.Errorf("nights: %+v; want two new nights of 2 and 1 frames", nights)
	}
	// methods.md §8: V = 11.808 with the three stars; the third frame lacks
	// C2, so its zero point is the mean of 19.320 and 19.328: V = 11.812.
	want := []float64{11.808, 11.808, 11.812}
	for i, m := range pv.Measurements {
		if d := m.Mag - want[i]; math.Abs(d) > measureTol3 {
			t.Errorf("frame %d: V = %.4f, want %.3f (diff %.4f, tol %g)", i+1, m.Mag, want[i], d, measureTol3)
		}
		// The mid-exposure: start + 30 s.
		start := []float64{2461376.38, 2461376.39, 2461377.40}[i]
		if d := (m.JDUTC - start) * 86400; math.Abs(d-30) > 1e-3 || m.ExposureS != 60 {
			t.Errorf("frame %d: mid-exposure %.3f s after the start (want 30), exposure %v s", i+1, d, m.ExposureS)
		}
		// target_err is not mapped: the error is the zero point's alone,
		// not the file's 0.5 mag.
		if m.MagErr >= 0.5 || !math.IsNaN(m.InstErr) {
			t.Errorf("frame %d: error %v, inst error %v: the unmapped target_err column was used", i+1, m.MagErr, m.InstErr)
		}
	}
	n, err := StoreMeasureImport(lb, r, logbook.Night{Observer: "Test Observer"}, pv)
	if err != nil || n != 3 {
		t.Fatalf("stored %d (%v), want 3", n, err)
	}
	all, err := lb.MeasurementsOf(r.Target.Name, 0)
	if err != nil || len(all) != 3 {
		t.Fatalf("the logbook holds %d measurements (%v), want 3", len(all), err)
	}
	first, err := lb.Night(r.Site.Name, measureNight)
	if err != nil || first.Observer != "Test Observer" || all[0].NightID != first.ID || all[2].NightID == first.ID {
		t.Errorf("nights of the frames: %d, %d, %d; night record %+v (%v)", all[0].NightID, all[1].NightID, all[2].NightID, first, err)
	}
	if len(all[0].Comps) != 3 || len(all[2].Comps) != 2 || len(all[0].Checks) != 1 || all[0].Filter != "V" {
		t.Errorf("raw inputs: comps %+v / %+v, checks %+v, filter %q", all[0].Comps, all[2].Comps, all[0].Checks, all[0].Filter)
	}
}

func TestMeasureImportBadCellRefusesAll(t *testing.T) {
	lb, r := measureImportLogbook(t)
	bad := strings.Replace(measureCSV, "2461376.390000,60,-7.512,0.5,-8.120,-7.262", "2461376.390000,60,-7.512,0.5,-8.120,-7.26x", 1)
	path := measureWrite(t, bad)
	im, err := OpenMeasureImport(path)
	if err != nil {
		t.Fatal(err)
	}
	pv := im.Preview(r, measureCSVMapping())
	var te *table.Error
	// Line 4 of the file (a comment, the header, then the frames); the bad
	// cell starts at byte 37 of its line (36 bytes of "2461376.390000,60,-7.512,0.5,-8.120," before it).
	if !errors.As(pv.Err, &te) || te.Line != 4 || te.Column != 37 || te.Name != "cmp_b" || te.File != path {
		t.Fatalf("preview error: %v; want %s line 4, column 37 (cmp_b)", pv.Err, path)
	}
	if want := path + ": line 4, column 37 (cmp_b)"; !strings.HasPrefix(pv.Err.Error(), want) {
		t.Errorf("error text %q does not start with %q", pv.Err, want)
	}
	if n, err := StoreMeasureImport(lb, r, logbook.Night{}, pv); err == nil || n != 0 {
		t.Errorf("store after a bad preview: %d stored, error %v", n, err)
	}
	all, _ := lb.MeasurementsOf(r.Target.Name, 0)
	nights, _ := lb.Nights("")
	if len(all) != 0 || len(nights) != 0 {
		t.Errorf("after the refusal the logbook holds %d measurements and %d nights, want none", len(all), len(nights))
	}
}

// When the store fails after the nights were made, they are removed again.
func TestMeasureImportAllOrNothing(t *testing.T) {
	lb, r := measureImportLogbook(t)
	im, err := OpenMeasureImport(measureWrite(t, measureCSV))
	if err != nil {
		t.Fatal(err)
	}
	pv := im.Preview(r, measureCSVMapping())
	if pv.Err != nil {
		t.Fatal(pv.Err)
	}
	pv.Measurements[2].Comps[0].Label = "Nobody" // not among the star's: the logbook refuses it
	if _, err := StoreMeasureImport(lb, r, logbook.Night{}, pv); err == nil {
		t.Fatal("a frame naming an unknown comparison star was stored")
	}
	all, _ := lb.MeasurementsOf(r.Target.Name, 0)
	nights, _ := lb.Nights("")
	if len(all) != 0 || len(nights) != 0 {
		t.Errorf("after the failed import the logbook holds %d measurements and %d nights, want none", len(all), len(nights))
	}
}

func TestMeasureImportMapping(t *testing.T) {
	_, r := measureImportLogbook(t)
	cases := []struct {
		name, text string
		want       MeasureMapping
	}{
		{"the command line's layout", "jd_utc,target,target_err,C1,C1_err,C2,K,filter\n2461376.38,-7.5,0.01,-8.1,0.01,-7.2,-7.6,V\n",
			MeasureMapping{Time: "jd_utc", Target: "target", TargetErr: "target_err", Filter: "filter", Stars: map[string]MeasureStarColumns{
				"C1": {"C1", "C1_err"}, "C2": {"C2", ""}, "K": {"K", ""}}}},
		{"ISO times", "Date,Mag,Err\n2026-12-01T21:00:00Z,-7.5,0.01\n",
			MeasureMapping{Time: "Date", TimeFormat: reduce.TimeISO, Target: "Mag", TargetErr: "Err", Stars: map[string]MeasureStarColumns{}}},
		{"modified Julian dates", "mjd,var,exptime\n61375.88,-7.5,30\n",
			MeasureMapping{Time: "mjd", TimeFormat: reduce.TimeMJD, Target: "var", Exposure: "exptime", Stars: map[string]MeasureStarColumns{}}},
	}
	labels := []string{"C1", "C2", "C3", "K"}
	for _, tc := range cases {
		im, err := ReadMeasureImport(strings.NewReader(tc.text), tc.name)
		if err != nil {
			t.Fatal(err)
		}
		got := im.GuessMapping(labels)
		if got.Time != tc.want.Time || got.TimeFormat != tc.want.TimeFormat || got.Target != tc.want.Target ||
			got.TargetErr != tc.want.TargetErr || got.Filter != tc.want.Filter || got.Exposure != tc.want.Exposure ||
			len(got.Stars) != len(tc.want.Stars) {
			t.Errorf("%s: got %+v, want %+v", tc.name, got, tc.want)
		}
		for l, sc := range tc.want.Stars {
			if got.Stars[l] != sc {
				t.Errorf("%s: star %s mapped to %+v, want %+v", tc.name, l, got.Stars[l], sc)
			}
		}
	}
	// An incomplete mapping says what to choose.
	im, _ := ReadMeasureImport(strings.NewReader(measureCSV), "frames.csv")
	m := measureCSVMapping()
	m.Stars = nil
	if pv := im.Preview(r, m); pv.Err == nil || !strings.Contains(pv.Err.Error(), "at least one comparison star") {
		t.Errorf("no comparison star mapped: %v", pv.Err)
	}
}
