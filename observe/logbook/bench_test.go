package logbook

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"
	"testing"
)

// measurementsCSV returns n measurements of the fixture's target on its
// night, with two comparison stars and a check star each.
func measurementsCSV(n int) []byte {
	var b bytes.Buffer
	b.WriteString(goodMeas)
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "Test Star A,Ridge Top,2025-03-14,%.7f,%.4f,0.0041,C1=%.4f/0.0052; C2=%.4f/0.0061,K1=%.4f/0.0049,%.4f,0.0065\n",
			2460749.3+float64(i)*1e-5, -7.5+float64(i%97)*1e-3, -8.12+float64(i%89)*1e-4, -7.262+float64(i%83)*1e-4,
			-7.668+float64(i%79)*1e-4, 11.8+float64(i%97)*1e-3)
	}
	return b.Bytes()
}

// BenchmarkImportMeasurements imports measurements tables of several sizes
// in one transaction each (the logbook's import path: parse, check every
// row against the logbook, insert the rows and their comparison stars).
func BenchmarkImportMeasurements(b *testing.B) {
	for _, n := range []int{1000, 10000, 100000} {
		data := measurementsCSV(n)
		b.Run(fmt.Sprintf("rows=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			b.SetBytes(int64(len(data)))
			for i := 0; i < b.N; i++ {
				b.StopTimer()
				lb, _ := fixture(b)
				b.StartTimer()
				got, err := lb.ImportCSV(MeasurementsTable, bytes.NewReader(data), "m.csv")
				if err != nil || got != n {
					b.Fatalf("imported %d, %v", got, err)
				}
				b.StopTimer()
				lb.Close()
				b.StartTimer()
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/row")
		})
	}
}

// BenchmarkTargets reads every target with its current ephemeris,
// comparison stars and last timing from logbooks of several sizes (the
// window's list of stars; the planner's input).
func BenchmarkTargets(b *testing.B) {
	for _, n := range []int{100, 1000, 10000} {
		b.Run(fmt.Sprintf("targets=%d", n), func(b *testing.B) {
			lb := manyTargets(b, n)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				ts, err := lb.Targets()
				if err != nil || len(ts) != n {
					b.Fatalf("got %d targets, %v", len(ts), err)
				}
			}
		})
	}
}

// BenchmarkTargets10k is the 10,000-target case on its own.
func BenchmarkTargets10k(b *testing.B) {
	lb := manyTargets(b, 10000)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if ts, err := lb.Targets(); err != nil || len(ts) != 10000 {
			b.Fatalf("got %d targets, %v", len(ts), err)
		}
	}
}

// BenchmarkImportMeasurements100k is the 100,000-row case on its own.
func BenchmarkImportMeasurements100k(b *testing.B) {
	data := measurementsCSV(100000)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		lb, _ := fixture(b)
		b.StartTimer()
		if got, err := lb.ImportCSV(MeasurementsTable, bytes.NewReader(data), "m.csv"); err != nil || got != 100000 {
			b.Fatalf("imported %d, %v", got, err)
		}
		b.StopTimer()
		lb.Close()
		b.StartTimer()
	}
}

// manyTargets makes a logbook of n targets, each with two ephemerides, three
// comparison stars and two timings, by importing CSV tables.
func manyTargets(b *testing.B, n int) *Logbook { return manyTargetsT(b, n) }

func manyTargetsT(b testing.TB, n int) *Logbook {
	b.Helper()
	lb, err := Create(filepath.Join(b.TempDir(), "many.db"))
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() { lb.Close() })
	var tg, eph, tm strings.Builder
	tg.WriteString("name,ra,dec,class,kind,epoch,timescale,period,comps,checks,ephemeris_adopted\n")
	eph.WriteString("target,epoch,timescale,period,adopted,source\n")
	tm.WriteString("target,jd,timescale,sigma_days,origin,source\n")
	for i := 0; i < n; i++ {
		name := fmt.Sprintf("Bench %05d", i)
		fmt.Fprintf(&tg, "%s,%.4f,%.3f,eclipsing,min,%.5f,bjd,%.7f,C1=11.2/0.6; C2=12.05,K1=11.65/0.55,2020-01-01T00:00:00Z\n",
			name, float64(i%2400)/100, float64(i%150)-60, 2459000+float64(i%1000)/1000, 0.3+float64(i%5000)/1000)
		fmt.Fprintf(&eph, "%s,%.5f,hjd,%.7f,2010-01-01T00:00:00Z,old\n", name, 2450000+float64(i%1000)/1000, 0.3+float64(i%5000)/1000)
		fmt.Fprintf(&tm, "%s,%.5f,bjd,0.0005,published,paper\n%s,%.5f,bjd,0.0004,published,paper\n", name,
			2459500+float64(i%700), name, 2459600+float64(i%700))
	}
	for _, x := range []struct {
		t    Table
		data string
	}{{TargetsTable, tg.String()}, {EphemeridesTable, eph.String()}, {TimingsTable, tm.String()}} {
		if _, err := lb.ImportCSV(x.t, strings.NewReader(x.data), string(x.t)); err != nil {
			b.Fatal(err)
		}
	}
	return lb
}

// BenchmarkImportCatalogue imports a catalogue of 10,000 targets (with
// their comparison stars), then 20,000 older ephemerides and 20,000
// timings for them.
func BenchmarkImportCatalogue10k(b *testing.B) {
	for i := 0; i < b.N; i++ {
		manyTargets(b, 10000)
	}
}
