package ephem

import (
	"fmt"
	"testing"
	"time"
)

// Benchmarks of the work the planner and the reduction trigger. Run with
//
//	go test ./ephem/ -run '^$' -bench . -benchmem
//
// and compare changes with benchstat.

var (
	benchSink     float64
	benchTimeSink Time
	benchSite     = Site{Name: "50N 10E", LatDeg: 50, LonDeg: 10, ElevM: 300}
	benchStar     = Star{RAHours: sexHours(22, 29, 10.26502), DecDeg: sexDeg(false, 58, 24, 54.7139), PMRA: 15.35, PMDec: -3.54}
	benchInstant  = mustJD(2460666.3333333335) // 2024-12-21T20:00:00Z
)

// BenchmarkStarAltitude measures one star's altitude at one instant: through
// an existing Frame (Frame.Sky + Sky.StarAltDeg, the planner's path), from
// scratch (NewSky), and for n stars on one Sky.
func BenchmarkStarAltitude(b *testing.B) {
	v := benchStar.Vec()
	b.Run("FrameSky", func(b *testing.B) {
		f := NewFrame(benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			benchSink = f.Sky(benchSite, benchInstant).StarAltDeg(&v)
		}
	})
	b.Run("NewSky", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = NewSky(benchSite, benchInstant).StarAltDeg(&v)
		}
	})
	for _, n := range []int{1, 100, 10000} {
		b.Run(fmt.Sprintf("OneSky/stars=%d", n), func(b *testing.B) {
			stars := make([]StarVec, n)
			for i := range stars {
				stars[i] = Star{RAHours: float64(i%240) / 10, DecDeg: float64(i%170) - 85}.Vec()
			}
			s := NewSky(benchSite, benchInstant)
			b.ReportAllocs()
			for b.Loop() {
				for i := range stars {
					benchSink = s.StarAltDeg(&stars[i])
				}
			}
		})
	}
	b.Run("Star", func(b *testing.B) {
		s := NewSky(benchSite, benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			benchSink = s.Star(&v).AzDeg
		}
	})
}

func BenchmarkNewFrame(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		benchSink = NewFrame(benchInstant).eps
	}
}

// BenchmarkNightOf measures one night's Sun and Moon events.
func BenchmarkNightOf(b *testing.B) {
	for _, c := range []struct {
		name string
		site Site
		day  time.Time
	}{
		{"50N/December", benchSite, time.Date(2024, 12, 21, 0, 0, 0, 0, time.UTC)},
		{"78N/June", Site{Name: "78N", LatDeg: 78, LonDeg: 15}, time.Date(2024, 6, 21, 0, 0, 0, 0, time.UTC)},
	} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				n, err := NightOf(c.site, c.day)
				if err != nil {
					b.Fatal(err)
				}
				benchSink = n.MoonIllum
			}
		})
	}
}

// BenchmarkRiseTransitSet measures a star's rise, transit and set in a day.
func BenchmarkRiseTransitSet(b *testing.B) {
	v := Star{RAHours: 5, DecDeg: 20}.Vec()
	b.ReportAllocs()
	for b.Loop() {
		rs, err := RiseTransitSet(benchSite, &v, benchInstant, StarRiseAltDeg)
		if err != nil {
			b.Fatal(err)
		}
		benchTimeSink = rs.Set.At
	}
}

// BenchmarkBJDTDB measures the barycentric correction of one instant: on an
// existing Sky, from a Frame, and from scratch (BJDTDBOf).
func BenchmarkBJDTDB(b *testing.B) {
	v := benchStar.Vec()
	b.Run("Sky", func(b *testing.B) {
		s := NewSky(benchSite, benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			benchSink = s.BJDTDB(&v)
		}
	})
	b.Run("FrameSky", func(b *testing.B) {
		f := NewFrame(benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			benchSink = f.Sky(benchSite, benchInstant).BJDTDB(&v)
		}
	})
	b.Run("Frame.BJDTDB/geocentric", func(b *testing.B) {
		f := NewFrame(benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			benchSink = f.BJDTDB(&v, benchInstant)
		}
	})
	b.Run("BJDTDBOf", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = BJDTDBOf(benchInstant, benchStar, benchSite)
		}
	})
}

// BenchmarkSeenAt measures the inverse: when an event at a BJD_TDB is seen.
func BenchmarkSeenAt(b *testing.B) {
	v := benchStar.Vec()
	bjd := NewSky(benchSite, benchInstant).BJDTDB(&v)
	b.Run("SeenAt", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			t, err := SeenAt(BJDTDB, bjd, benchStar, benchSite)
			if err != nil {
				b.Fatal(err)
			}
			benchTimeSink = t
		}
	})
	b.Run("Frame.SeenAt", func(b *testing.B) {
		f := NewFrame(benchInstant)
		b.ReportAllocs()
		for b.Loop() {
			t, err := f.SeenAt(BJDTDB, bjd, &v, &benchSite)
			if err != nil {
				b.Fatal(err)
			}
			benchTimeSink = t
		}
	})
}

// BenchmarkSkySpan measures the planner's sky: building it for spans of
// several lengths, and its fast answers for one star at one instant.
func BenchmarkSkySpan(b *testing.B) {
	for _, days := range []float64{1, 7, 31} {
		b.Run(fmt.Sprintf("New/days=%g", days), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sp, err := NewSkySpan(benchSite, benchInstant, benchInstant.AddDays(days))
				if err != nil {
					b.Fatal(err)
				}
				benchSink = sp.moon0
			}
		})
	}
	sp, err := NewSkySpan(benchSite, benchInstant, benchInstant.AddDays(31))
	if err != nil {
		b.Fatal(err)
	}
	v := benchStar.Vec()
	at := benchInstant.AddDays(3.3)
	bjd := NewSky(benchSite, at).BJDTDB(&v)
	b.Run("Sky+Star", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			s := sp.Sky(at)
			benchSink = s.Star(&v).AltDeg
		}
	})
	b.Run("Star", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = sp.Star(&v, at).AltDeg
		}
	})
	b.Run("Circumstances", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = sp.Circumstances(&v, at).MoonSepDeg
		}
	})
	b.Run("SunAltDeg", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = sp.SunAltDeg(at)
		}
	})
	b.Run("SeenAt", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			t, err := sp.SeenAt(BJDTDB, bjd, &v)
			if err != nil {
				b.Fatal(err)
			}
			benchTimeSink = t
		}
	})
	b.Run("SunBelow", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			benchSink = float64(len(sp.SunBelow(NauticalAltDeg)))
		}
	})
}

// BenchmarkDiurnalCircle measures the closed forms of a star's daily path.
func BenchmarkDiurnalCircle(b *testing.B) {
	c := NewDiurnalCircle(50, 20)
	b.Run("AltAz", func(b *testing.B) {
		for b.Loop() {
			benchSink, _ = c.AltAz(2.5)
		}
	})
	b.Run("HourAngleAt", func(b *testing.B) {
		for b.Loop() {
			benchSink, _ = c.HourAngleAt(20)
		}
	})
}
