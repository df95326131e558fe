package reduce

import (
	"errors"
	"math"
	"path/filepath"
	"testing"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
)

const secondsPerDay = 86400

// lightTimeTolSec is the tolerance on HJD and BJD_TDB against astropy. The
// aim is 0.05 s and the limit 0.5 s (issue 4); ephem states "a few
// hundredths of a second" and reaches 0.061 s at worst on times.csv (stars
// near the ecliptic, 2013), so the test allows 0.1 s and logs the worst.
const lightTimeTolSec = 0.1

// reduceTestdata returns the path of a file in testdata/reduce at the
// repository root.
func reduceTestdata(name string) string {
	return filepath.Join("..", "testdata", "reduce", name)
}

// loadReduceTable reads a reference table of testdata/reduce.
func loadReduceTable(t *testing.T, name string) *table.Table {
	t.Helper()
	tb, err := table.ReadFile(reduceTestdata(name))
	if err != nil {
		t.Fatalf("reading reference table: %v", err)
	}
	return tb
}

// mustFloat reads a required number of a reference table.
func mustFloat(t *testing.T, r table.Row, col string) float64 {
	t.Helper()
	v, err := r.MustFloat(col)
	if err != nil {
		t.Fatalf("reference table: %v", err)
	}
	return v
}

// TestConvertTimesAstropy compares HJD_UTC and BJD_TDB with astropy 5.2.1
// (testdata/reduce/times.csv, made by make_reduce.py) for six stars, four
// sites and the Earth's centre, at 39 instants from 1980 to 2040.
func TestConvertTimesAstropy(t *testing.T) {
	tb := loadReduceTable(t, "times.csv")
	type group struct {
		site        *ephem.Site
		star        ephem.Star
		jd, hjd, bj []float64
	}
	var groups []*group
	index := map[string]*group{}
	for i := range tb.Len() {
		r := tb.Row(i)
		key := r.String("site") + "/" + r.String("star")
		g := index[key]
		if g == nil {
			g = &group{star: ephem.Star{RAHours: mustFloat(t, r, "ra_h"), DecDeg: mustFloat(t, r, "dec_deg")}}
			if r.String("site") != "geocentre" {
				g.site = &ephem.Site{Name: r.String("site"), LatDeg: mustFloat(t, r, "lat_deg"),
					LonDeg: mustFloat(t, r, "lon_deg"), ElevM: mustFloat(t, r, "elev_m")}
			}
			index[key] = g
			groups = append(groups, g)
		}
		g.jd = append(g.jd, mustFloat(t, r, "jd_utc"))
		g.hjd = append(g.hjd, mustFloat(t, r, "hjd_utc"))
		g.bj = append(g.bj, mustFloat(t, r, "bjd_tdb"))
	}
	var worstH, worstB float64
	for key, g := range index {
		t.Run(key, func(t *testing.T) {
			hjd, bjd, err := ConvertTimes(g.jd, g.star, g.site)
			if err != nil {
				t.Fatalf("ConvertTimes: %v", err)
			}
			for k := range g.jd {
				dh := (hjd[k] - g.hjd[k]) * secondsPerDay
				db := (bjd[k] - g.bj[k]) * secondsPerDay
				worstH, worstB = math.Max(worstH, math.Abs(dh)), math.Max(worstB, math.Abs(db))
				if math.Abs(dh) > lightTimeTolSec {
					t.Errorf("JD_UTC %.6f: HJD got %.8f, want %.8f (astropy), diff %.3f s, tol %.2f s", g.jd[k], hjd[k], g.hjd[k], dh, lightTimeTolSec)
				}
				if math.Abs(db) > lightTimeTolSec {
					t.Errorf("JD_UTC %.6f: BJD_TDB got %.8f, want %.8f (astropy), diff %.3f s, tol %.2f s", g.jd[k], bjd[k], g.bj[k], db, lightTimeTolSec)
				}
			}
		})
	}
	if len(groups) != 30 {
		t.Errorf("times.csv: got %d star/site groups, want 30", len(groups))
	}
	t.Logf("worst difference from astropy: HJD %.4f s, BJD_TDB %.4f s", worstH, worstB)
}

// TestConvertTimesMethodsCheck pins the two check values of methods.md §7
// (astropy 5.2.1): δ Cep from φ = +50°, λ = +10° E, 2024-12-21 20:00 UTC.
func TestConvertTimesMethodsCheck(t *testing.T) {
	site := &ephem.Site{LatDeg: 50, LonDeg: 10}
	star := ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}
	hjd, bjd, err := ConvertTimes([]float64{2460666.3333333}, star, site)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"HJD_UTC", hjd[0], 2460666.3341993}, // methods.md §7 [A]
		{"BJD_TDB", bjd[0], 2460666.3349804}, // methods.md §7 [A]
	} {
		// The check values carry 7 decimals: ±0.5e-7 d = 4 ms on top of
		// the tolerance.
		if d := (c.got - c.want) * secondsPerDay; math.Abs(d) > lightTimeTolSec+0.005 {
			t.Errorf("%s: got %.7f, want %.7f, diff %.3f s, tol %.3f s", c.name, c.got, c.want, d, lightTimeTolSec+0.005)
		}
	}
}

// TestConvertTimesParallel checks that many instants (several goroutines'
// worth) give exactly what they give one at a time.
func TestConvertTimesParallel(t *testing.T) {
	star := ephem.Star{RAHours: 5.5, DecDeg: -20}
	site := &ephem.Site{LatDeg: -30, LonDeg: -70, ElevM: 2000}
	jd := make([]float64, 5*photoMinChunk+17)
	for i := range jd {
		jd[i] = 2459000.5 + float64(i)*0.013
	}
	hjd, bjd, err := ConvertTimes(jd, star, site)
	if err != nil {
		t.Fatal(err)
	}
	for _, i := range []int{0, photoMinChunk - 1, photoMinChunk, 3*photoMinChunk + 5, len(jd) - 1} {
		h1, b1, err := ConvertTimes(jd[i:i+1], star, site)
		if err != nil {
			t.Fatal(err)
		}
		if h1[0] != hjd[i] || b1[0] != bjd[i] {
			t.Errorf("instant %d: in bulk HJD %.9f BJD %.9f, alone %.9f %.9f", i, hjd[i], bjd[i], h1[0], b1[0])
		}
	}
}

func TestConvertTimesBadInput(t *testing.T) {
	good := ephem.Star{RAHours: 1, DecDeg: 2}
	for _, c := range []struct {
		name string
		jd   []float64
		star ephem.Star
		site *ephem.Site
		want error // wrapped, or nil for any error
	}{
		{"time before 1620", []float64{2460000, 2000000}, good, nil, ephem.ErrOutOfRange},
		{"NaN time", []float64{math.NaN()}, good, nil, nil},
		{"RA of 25 h", []float64{2460000}, ephem.Star{RAHours: 25}, nil, nil},
		{"latitude 95", []float64{2460000}, good, &ephem.Site{LatDeg: 95}, nil},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, _, err := ConvertTimes(c.jd, c.star, c.site)
			if err == nil || (c.want != nil && !errors.Is(err, c.want)) {
				t.Errorf("got error %v, want %v", err, c.want)
			}
		})
	}
}
