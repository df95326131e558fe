package reduce

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// benchPhotometry returns the set-up and n exposures of the benchmarks: an
// ensemble of 5 comparison stars with errors and a check star, seen from a
// site, over nights of 1000 exposures 30 s apart (so n/1000 UTC days, each
// needing an ephem frame).
func benchPhotometry(n int) (*Photometry, []Exposure) {
	p := &Photometry{
		Comps: []Comp{{"C1", 11.2}, {"C2", 12.05}, {"C3", 10.7}, {"C4", 11.64}, {"C5", 12.31}},
		Check: &Comp{"K", 11.65},
		Star:  synthStar, Site: synthSite,
	}
	rng := rand.New(rand.NewPCG(100, 1000))
	exps := make([]Exposure, n)
	for k := range exps {
		night, i := k/1000, k%1000
		e := NewExposure(2460000.3+float64(night)+float64(i)*30/86400, 5)
		z := 20 + 0.05*math.Sin(float64(k)/50)
		e.Target = Inst{Mag: 11.8 - z + 0.005*rng.NormFloat64(), Err: 0.005}
		for j, c := range p.Comps {
			e.Comps[j] = Inst{Mag: c.Mag - z + 0.005*rng.NormFloat64(), Err: 0.005}
		}
		e.Check = Inst{Mag: 11.65 - z + 0.008*rng.NormFloat64(), Err: 0.008}
		exps[k] = e
	}
	return p, exps
}

// BenchmarkReduce100k reduces 100,000 exposures with an ensemble of 5
// comparison stars, a check star, HJD and BJD_TDB from a site, and the
// outlier test (the goal: under 0.5 s on two cores, aim 0.1 s).
func BenchmarkReduce100k(b *testing.B) {
	p, exps := benchPhotometry(100_000)
	b.ReportAllocs()
	for b.Loop() {
		red, err := p.Reduce(exps)
		if err != nil || len(red.Rows) != len(exps) {
			b.Fatalf("reduced %d of %d: %v", len(red.Rows), len(exps), err)
		}
	}
}

// BenchmarkReduce runs the same reduction at several sizes.
func BenchmarkReduce(b *testing.B) {
	for _, n := range []int{1_000, 10_000, 100_000} {
		p, exps := benchPhotometry(n)
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := p.Reduce(exps); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkConvertTimes100k converts 100,000 instants to HJD and BJD_TDB
// from a site.
func BenchmarkConvertTimes100k(b *testing.B) {
	_, exps := benchPhotometry(100_000)
	jd := make([]float64, len(exps))
	for i, e := range exps {
		jd[i] = e.JDUTC
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := ConvertTimes(jd, synthStar, synthSite); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkReadPhotometry100k reads a CSV table of 100,000 exposures.
func BenchmarkReadPhotometry100k(b *testing.B) {
	p, exps := benchPhotometry(100_000)
	var sb strings.Builder
	sb.WriteString("jd_utc,target,target_err,C1,C1_err,C2,C2_err,C3,C3_err,C4,C4_err,C5,C5_err,K,K_err\n")
	for _, e := range exps {
		fmt.Fprintf(&sb, "%.6f,%.4f,%.4f", e.JDUTC, e.Target.Mag, e.Target.Err)
		for _, c := range e.Comps {
			fmt.Fprintf(&sb, ",%.4f,%.4f", c.Mag, c.Err)
		}
		fmt.Fprintf(&sb, ",%.4f,%.4f\n", e.Check.Mag, e.Check.Err)
	}
	text := sb.String()
	b.SetBytes(int64(len(text)))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := p.Read(strings.NewReader(text), "bench.csv", Columns{}); err != nil {
			b.Fatal(err)
		}
	}
}
