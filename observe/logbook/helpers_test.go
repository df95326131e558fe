package logbook

import (
	"database/sql"
	"io"
	"math"
	"os"
	"path/filepath"
	"sync"
	"testing"
	"time"

	"vigil/ephem"
	"vigil/observe"
)

var (
	demoOnce sync.Once
	demoPath string
	demoErr  error
	demoDir  string
)

func TestMain(m *testing.M) {
	code := m.Run()
	if demoDir != "" {
		os.RemoveAll(demoDir)
	}
	os.Exit(code)
}

// sharedDemo returns the path of a demo logbook made once for the tests
// that only read it. Open it with openShared.
func sharedDemo(t testing.TB) string {
	t.Helper()
	demoOnce.Do(func() {
		demoDir, demoErr = os.MkdirTemp("", "vigil-logbook-test-")
		if demoErr != nil {
			return
		}
		demoPath = filepath.Join(demoDir, "demo.db")
		var lb *Logbook
		lb, demoErr = CreateDemo(demoPath)
		if demoErr == nil {
			demoErr = lb.Close()
		}
	})
	if demoErr != nil {
		t.Fatalf("making the demo logbook: %v", demoErr)
	}
	return demoPath
}

// demoCopy opens a private copy of the demo logbook, closed at the end of
// the test.
func demoCopy(t testing.TB) *Logbook {
	t.Helper()
	src := sharedDemo(t)
	dst := filepath.Join(t.TempDir(), "demo.db")
	in, err := os.Open(src)
	if err != nil {
		t.Fatal(err)
	}
	defer in.Close()
	out, err := os.Create(dst)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := io.Copy(out, in); err != nil {
		t.Fatal(err)
	}
	if err := out.Close(); err != nil {
		t.Fatal(err)
	}
	return openT(t, dst)
}

// openT opens a logbook closed at the end of the test.
func openT(t testing.TB, path string) *Logbook {
	t.Helper()
	lb, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// emptyT creates an empty logbook closed at the end of the test.
func emptyT(t testing.TB) *Logbook {
	t.Helper()
	lb, err := Create(filepath.Join(t.TempDir(), "vigil.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// Fixture names of the small logbook the tests build.
const (
	fxSite   = "Ridge Top"
	fxTarget = "Test Star A"
)

var fxDate = time.Date(2025, 3, 14, 0, 0, 0, 0, time.UTC)

func fxSiteValue(t testing.TB) observe.Site {
	t.Helper()
	s, err := observe.NewSite(fxSite, 47.25, 8.5, 420, "Europe/Zurich", 15, observe.Horizon{{AzDeg: 90, AltDeg: 10}, {AzDeg: 180, AltDeg: 25}})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func fxTargetValue() observe.Target {
	tg := observe.NewTarget(fxTarget, ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Eclipsing,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 1.2345678, Scale: ephem.BJDTDB, EpochErr: 0.0005}, observe.Min)
	tg.Comps = []observe.Comp{{ID: "C1", V: 11.2, BV: 0.6}, {ID: "C2", V: 12.05, BV: math.NaN()}}
	tg.Checks = []observe.Comp{{ID: "K1", V: 11.65, BV: 0.55}}
	tg.MagBright, tg.MagFaint = 10.9, 11.8
	tg.Secondary = true
	tg.Notes = "a test star"
	return tg
}

// fixture returns an empty logbook with one site, one target and one night.
func fixture(t testing.TB) (*Logbook, int64) {
	t.Helper()
	lb := emptyT(t)
	if err := lb.AddSite(fxSiteValue(t)); err != nil {
		t.Fatal(err)
	}
	if err := lb.AddTarget(fxTargetValue(), "test catalogue"); err != nil {
		t.Fatal(err)
	}
	id, err := lb.AddNight(Night{Site: fxSite, Date: fxDate, Observer: "tester", Equipment: "test kit"})
	if err != nil {
		t.Fatal(err)
	}
	return lb, id
}

// fxMeasurement is a measurement of the fixture's target in night.
func fxMeasurement(night int64, jd float64) Measurement {
	return Measurement{Target: fxTarget, NightID: night, JDUTC: jd, ExposureS: 60, Filter: "V", Airmass: 1.234,
		InstMag: -7.512, InstErr: 0.004, Comps: []RawMag{{"C1", -8.120, 0.005}, {"C2", -7.262, math.NaN()}},
		Checks: []RawMag{{"K1", -7.668, 0.006}}, Mag: 11.808, MagErr: 0.006, HJD: jd + 0.001, BJDTDB: jd + 0.0018,
		Notes: "", Visual: ""}
}

// counts returns the number of rows of every table.
func counts(t testing.TB, lb *Logbook) map[string]int {
	t.Helper()
	out := map[string]int{}
	for _, bt := range backupTables {
		var n int
		if err := lb.db.QueryRow("SELECT count(*) FROM " + bt.name).Scan(&n); err != nil {
			t.Fatal(err)
		}
		out[bt.name] = n
	}
	return out
}

// wls solves weighted least squares y ≈ Σ_j c_j basis[i][j] with weights
// w (normal equations, Gauss–Jordan), returning the coefficients and their
// covariance (Σ w basisᵀ basis)⁻¹ (the weights are 1/σ²).
func wls(basis [][]float64, y, w []float64) (c []float64, cov [][]float64) {
	k := len(basis[0])
	a := make([][]float64, k)
	for i := range a {
		a[i] = make([]float64, 2*k+1)
		a[i][k+1+i] = 1
	}
	for r := range y {
		for i := 0; i < k; i++ {
			for j := 0; j < k; j++ {
				a[i][j] += w[r] * basis[r][i] * basis[r][j]
			}
			a[i][k] += w[r] * basis[r][i] * y[r]
		}
	}
	for col := 0; col < k; col++ {
		piv := col
		for r := col + 1; r < k; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[piv][col]) {
				piv = r
			}
		}
		a[col], a[piv] = a[piv], a[col]
		f := 1 / a[col][col]
		for j := range a[col] {
			a[col][j] *= f
		}
		for r := 0; r < k; r++ {
			if r != col {
				g := a[r][col]
				for j := range a[r] {
					a[r][j] -= g * a[col][j]
				}
			}
		}
	}
	c = make([]float64, k)
	cov = make([][]float64, k)
	for i := 0; i < k; i++ {
		c[i] = a[i][k]
		cov[i] = a[i][k+1 : 2*k+1]
	}
	return c, cov
}

// openRaw opens a logbook file without identifying or migrating it.
func openRaw(dsn string) (*sql.DB, error) { return sql.Open("sqlite", dsn) }
