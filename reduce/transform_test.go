package reduce

import (
	"math"
	"testing"

	"example.org/vigil/ephem"
)

// TestTransformWorkedExample reproduces the single-comparison check of
// methods.md §8 (first-order extinction and colour term after Henden &
// Kaitchuck 1982 and Harris, Fitzgerald & Reed 1981, PASP 93, 507; value
// computed there from the formula [C]): V_var = 11.7822.
func TestTransformWorkedExample(t *testing.T) {
	tr := Transform{ExtinctionK: 0.20, ColorCoeff: -0.050, TargetColor: 1.100, CompColor: map[string]float64{"C": 0.600}}
	star := Measured{Inst: -7.512, Airmass: 1.512, Color: 1.100}
	comp := Measured{Inst: -8.120, Airmass: 1.508, Color: 0.600}
	const want = 11.7822 // methods.md §8 [C]
	if got := tr.Differential(star, comp, 11.200); !near(got, want, photoMagTol) {
		t.Errorf("Differential: got %.6f, want %.4f (methods.md §8), diff %.2g, tol %g", got, want, got-want, photoMagTol)
	}
	// Limiting case: no corrections is V = v − c + C.
	if got := (Transform{}).Differential(star, comp, 11.200); !near(got, -7.512+8.120+11.2, 1e-12) {
		t.Errorf("zero Transform: got %.6f, want v − c + C = 11.808", got)
	}
	// The same through Reduce, airmasses and colours from the data.
	p := &Photometry{Comps: []Comp{{"C", 11.200}}, Star: synthStar, Transform: tr}
	e := NewExposure(2460666.4, 1)
	e.Target = Inst{Mag: -7.512, Airmass: 1.512}
	e.Comps[0] = Inst{Mag: -8.120, Airmass: 1.508}
	red, err := p.Reduce([]Exposure{e})
	if err != nil {
		t.Fatal(err)
	}
	if got := red.Rows[0].Mag; !near(got, want, photoMagTol) {
		t.Errorf("Reduce: got %.6f, want %.4f (methods.md §8), tol %g", got, want, photoMagTol)
	}
}

// TestTransformAirmassFromPositions: with a site and positions, airmasses
// the data lack come from ephem (Pickering 2002 of the refracted altitude),
// and the result equals Differential with those airmasses given.
func TestTransformAirmassFromPositions(t *testing.T) {
	site := &ephem.Site{LatDeg: 50, LonDeg: 10}
	compStar := ephem.Star{RAHours: 22.6, DecDeg: 57.0}
	tr := Transform{ExtinctionK: 0.25, Positions: map[string]ephem.Star{"C": compStar}}
	p := &Photometry{Comps: []Comp{{"C", 11.2}}, Star: synthStar, Site: site, Transform: tr}
	jd := 2460666.3333333 // 2024-12-21 20:00 UTC: δ Cep high in the north-west
	e := NewExposure(jd, 1)
	e.Target.Mag, e.Comps[0].Mag = -7.5, -8.1
	red, err := p.Reduce([]Exposure{e})
	if err != nil {
		t.Fatal(err)
	}
	tm, _ := ephem.FromJDUTC(jd)
	sky := ephem.NewSky(*site, tm)
	xs := make([]float64, 2)
	for i, s := range []ephem.Star{synthStar, compStar} {
		v := s.Vec()
		x, ok := ephem.Airmass(ephem.RefractedAltDeg(sky.StarAltDeg(&v)))
		if !ok {
			t.Fatal("star below the horizon")
		}
		xs[i] = x
	}
	want := tr.Differential(Measured{Inst: -7.5, Airmass: xs[0]}, Measured{Inst: -8.1, Airmass: xs[1]}, 11.2)
	// Frames.For gives the frame of the nearest 0h UTC: altitudes agree to
	// well under an arcsecond, airmasses to 1e-5 and less.
	if got := red.Rows[0].Mag; !near(got, want, photoMagTol) {
		t.Errorf("got %.6f, want %.6f (airmasses %.5f, %.5f), tol %g", got, want, xs[0], xs[1], photoMagTol)
	}
	if math.Abs(red.Rows[0].Mag-(-7.5+8.1+11.2)) < 1e-4 {
		t.Errorf("the correction did nothing: differential airmass %.5f", xs[0]-xs[1])
	}
}
