package app

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// TimingPublishedInput is what the form for a published timing holds, as
// typed.
type TimingPublishedInput struct {
	JD, Scale, Sigma, Kind string
	Secondary              bool
	Source                 string
}

// TimingPublishedErrors are the form's faults by field ("jd", "scale",
// "sigma", "kind", "secondary", "source"), each in words saying what is
// expected.
type TimingPublishedErrors map[string]string

// TimingParsePublished checks the form and returns the timing to store for
// the star. A field at fault gets its message in the returned map (nil
// when every field is good).
func TimingParsePublished(in TimingPublishedInput, target string) (logbook.Timing, TimingPublishedErrors) {
	errs := TimingPublishedErrors{}
	t := logbook.Timing{Target: target, Origin: logbook.Published, Secondary: in.Secondary, SigmaDays: math.NaN()}
	jd := strings.TrimSpace(in.JD)
	if jd == "" {
		errs["jd"] = "the time of the extremum is needed: a full Julian date such as 2452407.3297"
	} else if v, err := strconv.ParseFloat(jd, 64); err != nil || !(v > 1e6 && v < 1e7) {
		errs["jd"] = fmt.Sprintf("%q: want a full Julian date such as 2452407.3297", jd)
	} else if _, err := ephem.FromJDUTC(v); err != nil {
		errs["jd"] = fmt.Sprintf("%q: %v", jd, err)
	} else {
		t.JD = v
	}
	if ts, err := ephem.ParseTimeScale(strings.TrimSpace(in.Scale)); err != nil {
		errs["scale"] = err.Error()
	} else {
		t.Scale = ts
	}
	if s := strings.TrimSpace(in.Sigma); s != "" {
		if v, err := strconv.ParseFloat(s, 64); err != nil || !(v > 0) || v > 1 {
			errs["sigma"] = fmt.Sprintf("%q: want an uncertainty in days such as 0.0004, or nothing when it is not known", s)
		} else {
			t.SigmaDays = v
		}
	}
	if k, err := observe.ParseKind(strings.TrimSpace(in.Kind)); err != nil {
		errs["kind"] = err.Error()
	} else {
		t.Kind = k
		if in.Secondary && k != observe.Min {
			errs["secondary"] = "only a minimum can be a secondary one"
		}
	}
	t.Source = strings.TrimSpace(in.Source)
	if t.Source == "" {
		errs["source"] = "a published timing needs its source: the publication, e.g. \"Journal 12, 34 (2011)\""
	}
	if len(errs) > 0 {
		return t, errs
	}
	if err := t.Validate(); err != nil {
		errs["jd"] = err.Error()
		return t, errs
	}
	return t, nil
}
