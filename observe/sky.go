package observe

import (
	"math"

	"example.org/vigil/ephem"
)

// skyTable is the planner's view of the sky over a span of days at one
// site: ephem's SkySpan (frames, sidereal time, the Sun and the Moon, the
// light-time geometry), computed once and shared by every target, and the
// spans in which the Sun is below the planner's limit and below the horizon.
type skyTable struct {
	site  *Site
	span  *ephem.SkySpan
	dark  spans // the Sun below Constraints.SunAltDeg
	night spans // the Sun below the horizon (ephem.SunriseAltDeg)
	// The anchors at which each star's apparent place is computed: nAnc
	// instants from anc0, ancStep apart, covering the table. They are the
	// whole multiples of anchorStepDays (JD UTC) from the last at or before
	// the table's start, each with its exact view in ancSky (its own
	// ephem.Frame), so that a star's place interpolated at an instant does
	// not depend on the span the table covers. A table within anchorStepDays
	// of either end of ephem's range, where that grid would leave the range,
	// spreads them evenly from its own start instead, with ancSky nil.
	anc0, ancStep float64
	nAnc          int
	ancSky        []*ephem.Sky
	clearRate     float64 // clearRate(site)
}

// newTable prepares the sky over [from, to] (JD UTC) with the Sun limit
// sunLimitDeg.
func newTable(site *Site, from, to, sunLimitDeg float64) (*skyTable, error) {
	span, err := ephem.NewSkySpan(site.Site, mustTime(from), mustTime(to))
	if err != nil {
		return nil, err
	}
	tb := &skyTable{
		site:      site,
		span:      span,
		dark:      toSpans(span.SunBelow(sunLimitDeg)),
		night:     toSpans(span.SunBelow(ephem.SunriseAltDeg)),
		clearRate: clearRate(site),
	}
	k0, k1 := math.Floor(from/anchorStepDays), math.Ceil(to/anchorStepDays)
	_, err0 := ephem.FromJDUTC(k0 * anchorStepDays)
	_, err1 := ephem.FromJDUTC(k1 * anchorStepDays)
	if err0 != nil || err1 != nil {
		tb.nAnc = int(math.Ceil((to-from)/anchorStepDays)) + 1
		tb.anc0, tb.ancStep = from, (to-from)/float64(tb.nAnc-1)
		return tb, nil
	}
	tb.nAnc = int(k1-k0) + 1
	tb.anc0, tb.ancStep = k0*anchorStepDays, anchorStepDays
	tb.ancSky = make([]*ephem.Sky, tb.nAnc)
	for i := range tb.ancSky {
		tb.ancSky[i] = ephem.NewSky(site.Site, mustTime(tb.anc0+float64(i)*anchorStepDays))
	}
	return tb, nil
}

// toSpans turns ephem's intervals into spans of Julian dates.
func toSpans(iv []ephem.Interval) spans {
	s := make(spans, 0, len(iv))
	for _, x := range iv {
		s = s.add(x.From.JDUTC(), x.To.JDUTC())
	}
	return s
}

// mustTime turns a Julian date known to lie in range into an ephem.Time.
func mustTime(jd float64) ephem.Time {
	t, err := ephem.FromJDUTC(jd)
	if err != nil {
		panic("observe: internal instant out of range: " + err.Error())
	}
	return t
}

// sky returns the view from the site at jd (UTC).
func (tb *skyTable) sky(jd float64) ephem.Sky { return tb.span.Sky(mustTime(jd)) }
