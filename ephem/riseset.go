package ephem

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
)

// Object is anything whose position can be followed through a night: the
// Sun, the Moon or a star (*StarVec).
type Object interface {
	// Position returns where the object stands in the view s.
	Position(s *Sky) Position
}

type sunObject struct{}

func (sunObject) Position(s *Sky) Position { return s.Sun() }

type moonObject struct{}

func (moonObject) Position(s *Sky) Position { return s.Moon() }

type moonCentreObject struct{}

func (moonCentreObject) Position(s *Sky) Position { return s.MoonGeocentric() }

// The Sun and the Moon as Objects. Moon is seen from the site (topocentric);
// MoonCentre is seen from the Earth's centre, the definition of moonrise
// and moonset at +0.125° (Meeus 1998, ch. 15).
var (
	Sun        Object = sunObject{}
	Moon       Object = moonObject{}
	MoonCentre Object = moonCentreObject{}
)

// Position makes a prepared star an Object.
func (v *StarVec) Position(s *Sky) Position { return s.Star(v) }

// Standard altitudes (degrees, airless, of the object's centre) of the rise
// and set events (USNO "Rise, Set, and Twilight Definitions"; Meeus 1998,
// ch. 15): the Sun's upper limb on the horizon with standard refraction, the
// three twilights, a star with standard refraction, and the Moon's centre
// (geocentric) for a mean parallax.
const (
	SunriseAltDeg      = -0.8333
	CivilAltDeg        = -6
	NauticalAltDeg     = -12
	AstronomicalAltDeg = -18
	StarRiseAltDeg     = -0.5667
	MoonriseAltDeg     = 0.125
)

// ErrCircumpolar and ErrNeverRises say that an object does not cross the
// altitude asked for in the span: it stays above it, or below it, throughout.
var (
	ErrCircumpolar = errors.New("stays above that altitude all the time (circumpolar): no rise or set")
	ErrNeverRises  = errors.New("stays below that altitude all the time: no rise or set")
)

// Event is an instant that may not happen: At is meaningful only when OK.
// It encodes in JSON as an ISO 8601 string or null.
type Event struct {
	At Time
	OK bool
}

// MarshalJSON writes the instant as a string, or null when it does not happen.
func (e Event) MarshalJSON() ([]byte, error) {
	if !e.OK {
		return []byte("null"), nil
	}
	return json.Marshal(e.At.String())
}

// String returns the instant, or "—" when it does not happen.
func (e Event) String() string {
	if !e.OK {
		return "—"
	}
	return e.At.String()
}

// Crossing is an instant at which an object's airless altitude passes a
// threshold, upwards (Rising) or downwards.
type Crossing struct {
	At     Time
	Rising bool
}

// sampleStep is the step (days) at which altitude curves are sampled before
// their crossings are refined: 10 minutes. A dip or peak narrower than the
// step is found by fitting a parabola through the samples about it.
const sampleStep = 10.0 / 1440

// rootTol is the accuracy (days) to which crossing instants are refined:
// about 0.05 s.
const rootTol = 6e-7

// curve samples one function of time (the altitude of an object, or the sine
// of its hour angle) over a span, for the search of its crossings.
type curve struct {
	fn   func(jd float64) float64 // jd: Julian date (UTC)
	t, y []float64
}

// newCurve samples fn of the object's Position from site over [from, to],
// with one Frame per day of the span.
func newCurve(site Site, obj Object, from, to Time, fn func(Position) float64) (*curve, error) {
	if err := site.Validate(); err != nil {
		return nil, err
	}
	if !from.Valid() || !to.Valid() {
		return nil, fmt.Errorf("ephem: search span %s to %s is %w", from, to, ErrOutOfRange)
	}
	if !from.Before(to) {
		return nil, fmt.Errorf("ephem: search span from %s to %s is empty", from, to)
	}
	if to.Sub(from) > 400 {
		return nil, fmt.Errorf("ephem: search span from %s to %s is longer than 400 days", from, to)
	}
	days := int(math.Ceil(to.Sub(from)))
	frames := make([]*Frame, days)
	for d := range frames {
		frames[d] = NewFrame(mustJD(from.jd + float64(d) + 0.5))
	}
	sc := site.consts()
	eval := func(jd float64) float64 {
		i := max(0, min(int(jd-from.jd), len(frames)-1))
		var s Sky
		frames[i].fillSky(&s, site, mustJD(jd), &sc)
		return fn(obj.Position(&s))
	}
	return sampleCurve(from.jd, to.jd, eval), nil
}

// sampleCurve samples fn at sampleStep or a little less over [from, to]
// (Julian dates, UTC), both ends included.
func sampleCurve(from, to float64, fn func(float64) float64) *curve {
	c := &curve{fn: fn}
	n := int(math.Ceil((to-from)/sampleStep)) + 1
	step := (to - from) / float64(n-1)
	c.t = make([]float64, n)
	c.y = make([]float64, n)
	for i := range c.t {
		c.t[i] = from + float64(i)*step
		if i == n-1 {
			c.t[i] = to
		}
		c.y[i] = fn(c.t[i])
	}
	return c
}

// roots returns the instants where the sampled function crosses level, with
// the direction of each crossing.
func (c *curve) roots(level float64) []Crossing {
	return c.rootsIn(level, 0, len(c.t), nil)
}

// rootsIn appends to out the crossings of level found in the sample
// intervals [t[i], t[i+1]] with lo ≤ i < hi−1, in time order.
func (c *curve) rootsIn(level float64, lo, hi int, out []Crossing) []Crossing {
	g := func(jd float64) float64 { return c.fn(jd) - level }
	n := len(c.t)
	lo, hi = max(lo, 0), min(hi, n)
	for i := lo; i+1 < hi; i++ {
		a, b := c.y[i]-level, c.y[i+1]-level
		if a == 0 && i > 0 {
			continue // counted as the end of the previous interval
		}
		if (a < 0) != (b < 0) || b == 0 {
			t := solve(g, c.t[i], c.t[i+1], a, b)
			out = append(out, Crossing{At: mustJD(t), Rising: b > a})
			continue
		}
		// A peak or dip between samples can cross the level and come back
		// without a sign change at the samples: look at each local extremum.
		if i == 0 {
			continue
		}
		p := c.y[i-1] - level
		if !((a > p && a > b) || (a < p && a < b)) {
			continue
		}
		// a is an extreme sample; both neighbours share its sign.
		maxim := a > p
		te, ye := extremum(g, c.t[i-1], c.t[i+1], maxim)
		if (ye < 0) == (a < 0) || ye == 0 {
			continue
		}
		t1 := solve(g, c.t[i-1], te, p, ye)
		t2 := solve(g, te, c.t[i+1], ye, b)
		// The first crossing may fall in the interval before i, which was
		// already scanned without a sign change: keep both, in order.
		out = append(out, Crossing{At: mustJD(t1), Rising: ye > p}, Crossing{At: mustJD(t2), Rising: b > ye})
	}
	return out
}

// solve finds a root of g in [a, b] given g(a) = fa and g(b) = fb of opposite
// signs (or one zero), by the Illinois variant of regula falsi, to rootTol.
func solve(g func(float64) float64, a, b, fa, fb float64) float64 {
	if fa == 0 {
		return a
	}
	if fb == 0 {
		return b
	}
	side := 0
	for i := 0; i < 60 && b-a > rootTol; i++ {
		r := (a*fb - b*fa) / (fb - fa)
		if !(r > a && r < b) {
			r = (a + b) / 2
		}
		fr := g(r)
		switch {
		case fr == 0:
			return r
		case (fr < 0) == (fb < 0):
			b, fb = r, fr
			if side == -1 {
				fa /= 2
			}
			side = -1
		default:
			a, fa = r, fr
			if side == 1 {
				fb /= 2
			}
			side = 1
		}
	}
	return (a*fb - b*fa) / (fb - fa)
}

// extremum finds the maximum (or minimum) of g in [a, b] by golden-section
// search and returns its place and value.
func extremum(g func(float64) float64, a, b float64, maximum bool) (float64, float64) {
	sign := 1.0
	if !maximum {
		sign = -1
	}
	const invPhi = 0.6180339887498949
	x1 := b - invPhi*(b-a)
	x2 := a + invPhi*(b-a)
	f1, f2 := sign*g(x1), sign*g(x2)
	for b-a > 1e-5 { // about a second
		if f1 > f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - invPhi*(b-a)
			f1 = sign * g(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + invPhi*(b-a)
			f2 = sign * g(x2)
		}
	}
	x := (a + b) / 2
	return x, g(x)
}

// Crossings returns, in time order, every instant in [from, to) at which the
// object's airless altitude passes thresholdDeg, each marked rising or
// setting. The span may be up to 400 days long. Instants are accurate to
// about 0.1 s for the method (add the model's own error: see package doc).
func Crossings(site Site, obj Object, from, to Time, thresholdDeg float64) ([]Crossing, error) {
	if math.IsNaN(thresholdDeg) || thresholdDeg < -90 || thresholdDeg > 90 {
		return nil, fmt.Errorf("ephem: altitude threshold %v: degrees must be in [-90, 90]", thresholdDeg)
	}
	c, err := newCurve(site, obj, from, to, altitudeOf)
	if err != nil {
		return nil, err
	}
	return c.roots(thresholdDeg), nil
}

func altitudeOf(p Position) float64 { return p.AltDeg }

// sinHourAngle is zero at upper and lower transit, and rises through zero
// at upper transit (the hour angle grows with time).
func sinHourAngle(p Position) float64 { return math.Sin(p.HourAngleH * 15 * deg2rad) }

// Transits returns, in time order, every upper transit (culmination on the
// meridian, hour angle 0) of the object in [from, to).
func Transits(site Site, obj Object, from, to Time) ([]Time, error) {
	c, err := newCurve(site, obj, from, to, sinHourAngle)
	if err != nil {
		return nil, err
	}
	var out []Time
	for _, r := range c.roots(0) {
		if r.Rising {
			out = append(out, r.At)
		}
	}
	return out, nil
}

// RiseSet holds the first rise, transit and set of an object in a span.
type RiseSet struct {
	Rise, Transit, Set Event
}

// RiseTransitSet returns the first rise (upward crossing of thresholdDeg),
// upper transit and set of the object in [from, from + 1 day). When the
// object crosses the threshold neither way in that day, it returns the
// transit with ErrCircumpolar or ErrNeverRises.
func RiseTransitSet(site Site, obj Object, from Time, thresholdDeg float64) (RiseSet, error) {
	to := from.AddDays(1)
	cs, err := Crossings(site, obj, from, to, thresholdDeg)
	if err != nil {
		return RiseSet{}, err
	}
	var rs RiseSet
	for _, c := range cs {
		if c.Rising && !rs.Rise.OK {
			rs.Rise = Event{At: c.At, OK: true}
		}
		if !c.Rising && !rs.Set.OK {
			rs.Set = Event{At: c.At, OK: true}
		}
	}
	tr, err := Transits(site, obj, from, to)
	if err != nil {
		return RiseSet{}, err
	}
	if len(tr) > 0 {
		rs.Transit = Event{At: tr[0], OK: true}
	}
	if len(cs) == 0 {
		if obj.Position(NewSky(site, from)).AltDeg > thresholdDeg {
			return rs, ErrCircumpolar
		}
		return rs, ErrNeverRises
	}
	return rs, nil
}
