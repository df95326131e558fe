package ephem

import (
	"math"
	"strings"
	"testing"
)

// Airmass: Pickering (2002), DIO 12, 3. The check values are methods.md §4
// ([C]: the formula evaluated with numpy), Pickering column; each is rounded
// to its last printed digit, which sets the tolerance.
func TestAirmassPickering(t *testing.T) {
	const source = "Pickering (2002) formula, methods.md §4 [C]"
	for _, c := range []struct {
		altDeg, want, tol float64
	}{
		{90, 1.0000, 0.00005},
		{60, 1.1541, 0.00005},
		{30, 1.9932, 0.00005},
		{20, 2.9001, 0.00005},
		{10, 5.5807, 0.00005},
		{5, 10.334, 0.0005},
		{0, 38.749, 0.0005},
	} {
		x, ok := Airmass(c.altDeg)
		if !ok {
			t.Errorf("Airmass(%v): not ok, want %v (%s)", c.altDeg, c.want, source)
			continue
		}
		if d := x - c.want; math.Abs(d) > c.tol {
			t.Errorf("Airmass(%v°) = %.5f, want %.5g (%s), diff %.2g, tol %.2g", c.altDeg, x, c.want, source, d, c.tol)
		}
	}
}

// TestAirmassAgainstOtherFormulae checks the agreement Airmass's doc claims:
// the secant to 0.1% above 60° and Kasten & Young (1989), Applied Optics 28,
// 4735, to 0.5% above 5° (KY values from methods.md §4, [C]).
func TestAirmassAgainstOtherFormulae(t *testing.T) {
	for h := 60.0; h <= 90; h += 0.5 {
		x, _ := Airmass(h)
		sec := 1 / math.Sin(h*deg2rad)
		if r := math.Abs(x/sec - 1); r > 0.001 {
			t.Errorf("Airmass(%v°) = %.5f, secant %.5f: differ by %.3f%%, want ≤ 0.1%%", h, x, sec, 100*r)
		}
	}
	for _, c := range []struct{ h, ky float64 }{{60, 1.1540}, {30, 1.9943}, {20, 2.9031}, {10, 5.5860}, {5, 10.306}} {
		x, _ := Airmass(c.h)
		if r := math.Abs(x/c.ky - 1); r > 0.005 {
			t.Errorf("Airmass(%v°) = %.5f, Kasten & Young %.5g: differ by %.2f%%, want ≤ 0.5%%", c.h, x, c.ky, 100*r)
		}
	}
	// Monotonic: lower is more air.
	prev := 0.0
	for h := 90.0; h >= 0; h -= 0.25 {
		x, _ := Airmass(h)
		if x < prev {
			t.Errorf("Airmass(%v°) = %v is below Airmass(%v°) = %v", h, x, h+0.25, prev)
		}
		prev = x
	}
}

func TestAirmassBelowHorizon(t *testing.T) {
	for _, h := range []float64{-0.001, -5, -90, 90.001, math.NaN(), math.Inf(1)} {
		if x, ok := Airmass(h); ok || !math.IsNaN(x) {
			t.Errorf("Airmass(%v) = %v, %v; want NaN, false", h, x, ok)
		}
	}
}

// Refraction: Sæmundsson (1986), Meeus 1998, eq. 16.4.
func TestRefraction(t *testing.T) {
	// Ex. 16.a, p. 107: the Sun's upper limb at true altitude 33.246′ is
	// raised by 24.618′.
	const tolEx16a = 0.0005 * arcminDeg // the book prints 0.001′
	if got, want := RefractionDeg(33.246*arcminDeg), 24.618*arcminDeg; math.Abs(got-want) > tolEx16a {
		t.Errorf("RefractionDeg(33.246′) = %.4f′, want %.3f′ (Meeus 1998, Ex. 16.a, p. 107), diff %.4f′, tol %.4f′",
			got*60, want*60, (got-want)*60, tolEx16a*60)
	}
	// Sæmundsson inverts Bennett (Meeus eq. 16.3) to within 4″ (Meeus 1998,
	// p. 107): at apparent altitude h0 Bennett gives R_B, so the true
	// altitude is h0 − R_B and RefractionDeg of it must return R_B.
	// R_B from methods.md §4 [C]; Ex. 16.a gives 28.754′ at 0.5°.
	const tolBennett = 4 * arcsecDeg
	for _, c := range []struct {
		h0, rB float64 // degrees, arcminutes
		source string
	}{
		{0, 34.478, "methods.md §4 [C]"},
		{0.5, 28.754, "Meeus 1998, Ex. 16.a, p. 107"},
		{10, 5.392, "methods.md §4 [C]"},
		{45, 0.995, "methods.md §4 [C]"},
	} {
		rB := c.rB * arcminDeg
		got := RefractionDeg(c.h0 - rB)
		if d := got - rB; math.Abs(d) > tolBennett {
			t.Errorf("RefractionDeg(%.4f°) = %.3f′, want Bennett's %.3f′ at apparent %v° (%s), diff %.1f″, tol %.0f″",
				c.h0-rB, got*60, c.rB, c.h0, c.source, d*3600, tolBennett*3600)
		}
		if d := RefractedAltDeg(c.h0-rB) - c.h0; math.Abs(d) > tolBennett {
			t.Errorf("RefractedAltDeg(%.4f°) = %.5f°, want %v°, diff %.1f″", c.h0-rB, c.h0+d, c.h0, d*3600)
		}
	}
	for _, c := range []struct {
		name string
		h    float64
	}{{"below −1°", -1.5}, {"NaN", math.NaN()}, {"above 90°", 91}} {
		if r := RefractionDeg(c.h); r != 0 {
			t.Errorf("RefractionDeg(%v) (%s) = %v, want 0", c.h, c.name, r)
		}
	}
	// At the zenith the formula dips a hair below zero; the result is 0.
	if r := RefractionDeg(90); r < 0 || r > 0.1*arcsecDeg {
		t.Errorf("RefractionDeg(90°) = %v″, want 0 (within 0.1″)", r*3600)
	}
}

// Linear ephemeris: methods.md §6 ([C]: T0 + P·E with the elements quoted
// there from the GCVS; the numbers follow from the formula).
func TestEphemerisPrediction(t *testing.T) {
	const tolDays = 0.00005 // the check values are printed to 0.0001 d
	for _, c := range []struct {
		name       string
		e          Ephemeris
		after      float64
		wantCycle  float64
		wantT      float64
		wantSource string
	}{
		{"delta Cep", Ephemeris{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: HJD}, 2460666.0, 4583, 2460669.3858, "methods.md §6 [C]"},
		{"eta Aql", Ephemeris{Epoch: 2436084.656, PeriodDays: 7.176641, Scale: HJD}, 2460666.0, 3426, 2460671.8281, "methods.md §6 [C]"},
	} {
		if err := c.e.Validate(); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		E := math.Ceil(c.e.Cycle(c.after))
		if E != c.wantCycle {
			t.Errorf("%s: first cycle after JD %.1f = %v, want %v (%s)", c.name, c.after, E, c.wantCycle, c.wantSource)
		}
		if got := c.e.At(E); math.Abs(got-c.wantT) > tolDays {
			t.Errorf("%s: At(%v) = %.5f, want %.4f (%s), diff %.2g d, tol %.2g d", c.name, E, got, c.wantT, c.wantSource, got-c.wantT, tolDays)
		}
	}
}

// TestEphemerisInvariants: an exact ephemeris has O−C of zero (Cycle inverts
// At), phases lie in [0, 1), and the quadratic term behaves as T0 + PE + QE²
// defines (Sterken 2005, ASP Conf. Ser. 335, 3).
func TestEphemerisInvariants(t *testing.T) {
	const tolOCDays = 1e-8 // 0.9 ms; float64 JDs resolve 40 µs
	for _, e := range []Ephemeris{
		{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: HJD},
		{Epoch: 2455000.3, PeriodDays: 0.3971, Q: 2.5e-10, Scale: BJDTDB},
		{Epoch: 2455000.3, PeriodDays: 0.3971, Q: -4e-10, Scale: BJDTDB},
		{Epoch: 2451545.0, PeriodDays: 300, Q: 1e-4, Scale: HJD},
	} {
		for _, E := range []float64{-20000, -1500.5, -1, 0, 0.5, 1, 4583, 30000} {
			jd := e.At(E)
			if got := e.Cycle(jd); math.Abs(got-E)*e.PeriodAt(E) > tolOCDays {
				t.Errorf("%+v: Cycle(At(%v)) = %.9f, want %v (O−C %.3g d, tol %.1g d)", e, E, got, E, (got-E)*e.PeriodAt(E), tolOCDays)
			}
			ph := e.Phase(jd + 0.25*e.PeriodAt(E))
			want := E + 0.25 - math.Floor(E+0.25)
			if ph < 0 || ph >= 1 || math.Abs(ph-want) > 1e-6 {
				t.Errorf("%+v: Phase a quarter period after cycle %v = %v, want %v", e, E, ph, want)
			}
		}
		// The instantaneous period is the derivative of At.
		for _, E := range []float64{-1000, 0, 1000} {
			num := (e.At(E+0.5) - e.At(E-0.5))
			if math.Abs(num-e.PeriodAt(E)) > 1e-6 {
				t.Errorf("%+v: PeriodAt(%v) = %.9f, want dT/dE = %.9f", e, E, e.PeriodAt(E), num)
			}
		}
	}
	e := Ephemeris{Epoch: 2455000, PeriodDays: 1.5, EpochErr: 0.0003, PeriodErr: 0.000004, Scale: HJD}
	if got, want := e.Sigma(100), math.Sqrt(0.0003*0.0003+0.0004*0.0004); math.Abs(got-want) > 1e-12 {
		t.Errorf("Sigma(100) = %v, want sqrt(σT0² + (E σP)²) = %v", got, want)
	}
	if got := e.Sigma(0); math.Abs(got-0.0003) > 1e-12 {
		t.Errorf("Sigma(0) = %v, want σT0 = 0.0003", got)
	}
}

func TestEphemerisValidate(t *testing.T) {
	ok := Ephemeris{Epoch: 2455000, PeriodDays: 1.5, Scale: HJD}
	for _, c := range []struct {
		name, want string
		edit       func(*Ephemeris)
	}{
		{"reduced JD epoch", "full Julian date", func(e *Ephemeris) { e.Epoch = 55000 }},
		{"NaN epoch", "epoch", func(e *Ephemeris) { e.Epoch = math.NaN() }},
		{"zero period", "period", func(e *Ephemeris) { e.PeriodDays = 0 }},
		{"negative period", "must be positive", func(e *Ephemeris) { e.PeriodDays = -1 }},
		{"NaN period", "period", func(e *Ephemeris) { e.PeriodDays = math.NaN() }},
		{"huge Q", "quadratic", func(e *Ephemeris) { e.Q = 0.01 }},
		// The old bound |Q| ≤ 1e-3·P let the period reach zero 500 cycles
		// from T0.
		{"Q at the old bound 1e-3·P", "fall to zero at cycle -500 ", func(e *Ephemeris) { e.Q = 1.5e-3 }},
		// T0 = 2455000, P = 1.5: P + 2QE = 0 at T* = T0 − P²/(4Q), which
		// lies before 1620 (JD 2312752.5) only for Q < 3.954e-6 and after
		// 2200 (JD 2524593.5) only for Q > −8.083e-6.
		{"Q > 0 just past the limit", "zero at cycle", func(e *Ephemeris) { e.Q = 3.96e-6 }},
		{"Q < 0 just past the limit", "zero at cycle", func(e *Ephemeris) { e.Q = -8.09e-6 }},
		{"infinite Q", "finite", func(e *Ephemeris) { e.Q = math.Inf(1) }},
		{"NaN Q", "quadratic term Q NaN", func(e *Ephemeris) { e.Q = math.NaN() }},
		{"no scale", "time scale TimeScale(0): want hjd", func(e *Ephemeris) { e.Scale = 0 }},
		{"unknown scale", "time scale TimeScale(7): want hjd", func(e *Ephemeris) { e.Scale = 7 }},
		{"negative σT0", "epoch uncertainty", func(e *Ephemeris) { e.EpochErr = -1 }},
		{"NaN σP", "period uncertainty", func(e *Ephemeris) { e.PeriodErr = math.NaN() }},
	} {
		e := ok
		c.edit(&e)
		err := e.Validate()
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Validate() = %v, want an error containing %q", c.name, err, c.want)
		}
	}
	if err := ok.Validate(); err != nil {
		t.Errorf("Validate() of a good ephemeris = %v", err)
	}
	// Accepted quadratic terms keep the period positive across 1620–2200.
	for _, q := range []float64{3.95e-6, 1e-9, -1e-9, -8.08e-6} {
		e := ok
		e.Q = q
		if err := e.Validate(); err != nil {
			t.Errorf("Q = %v: Validate() = %v, want nil", q, err)
			continue
		}
		for _, jd := range []float64{minJD, maxJD} {
			if p := e.PeriodAt(e.Cycle(jd)); !(p > 0) {
				t.Errorf("Q = %v: period at JD %.1f = %v, want > 0", q, jd, p)
			}
		}
	}
}

// Formatting: sexagesimal output by the definitions of the units, with
// rounding carried upwards (common practice).
func TestFormat(t *testing.T) {
	for _, c := range []struct {
		hours float64
		want  string
	}{
		{0, "00:00:00.00"},
		{5.5, "05:30:00.00"},
		{sexHours(22, 29, 10.26502), "22:29:10.27"},
		{sexHours(23, 59, 59.996), "00:00:00.00"}, // rounds to 24h, wraps
		{sexHours(12, 59, 59.999), "13:00:00.00"}, // carries into the hour
		{-1, "23:00:00.00"},
		{25.5, "01:30:00.00"},
	} {
		if got := FormatRA(c.hours); got != c.want {
			t.Errorf("FormatRA(%v) = %q, want %q", c.hours, got, c.want)
		}
	}
	for _, c := range []struct {
		deg  float64
		want string
	}{
		{0, "+00:00:00.0"},
		{math.Copysign(0, -1), "-00:00:00.0"},
		{-0.5, "-00:30:00.0"},
		{sexDeg(false, 58, 24, 54.7139), "+58:24:54.7"},
		{sexDeg(true, 5, 23, 28), "-05:23:28.0"},
		{sexDeg(false, 10, 59, 59.97), "+11:00:00.0"},
		{-90, "-90:00:00.0"},
	} {
		if got := FormatDec(c.deg); got != c.want {
			t.Errorf("FormatDec(%v) = %q, want %q", c.deg, got, c.want)
		}
	}
	for _, c := range []struct {
		days    float64
		seconds bool
		want    string
	}{
		{0.5, false, "12:00"},
		{0.5, true, "12:00:00"},
		{1.5 / 24, false, "1:30"},
		{(59*60 + 59.6) / secPerDay, false, "1:00"},
		{(59*60 + 59.6) / secPerDay, true, "1:00:00"},
		{-0.25, false, "-6:00"},
		{1.25, false, "30:00"},
	} {
		if got := FormatDuration(c.days, c.seconds); got != c.want {
			t.Errorf("FormatDuration(%v, %v) = %q, want %q", c.days, c.seconds, got, c.want)
		}
	}
	// What Format writes, Parse reads back (to the printed precision).
	for _, h := range []float64{0, 0.001, 5.123456, 12, 23.99} {
		back, err := ParseRA(FormatRA(h))
		if err != nil || math.Abs(wrapDiffHours(back, h))*3600 > 0.005 {
			t.Errorf("ParseRA(FormatRA(%v)) = %v, %v; want %v within 0.005 s", h, back, err, h)
		}
	}
	for _, d := range []float64{-90, -45.678, -0.01, 0, 0.01, 33.3333, 90} {
		back, err := ParseDec(FormatDec(d))
		if err != nil || math.Abs(back-d)*3600 > 0.05 {
			t.Errorf("ParseDec(FormatDec(%v)) = %v, %v; want %v within 0.05″", d, back, err, d)
		}
	}
}
