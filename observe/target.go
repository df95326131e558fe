package observe

import (
	"fmt"
	"math"
	"strings"

	"example.org/vigil/ephem"
)

// Class is the kind of variable star a target is.
type Class int

// The classes of target.
const (
	Other Class = iota
	Pulsating
	Eclipsing
)

// String returns "other", "pulsating" or "eclipsing".
func (c Class) String() string {
	switch c {
	case Pulsating:
		return "pulsating"
	case Eclipsing:
		return "eclipsing"
	case Other:
		return "other"
	}
	return fmt.Sprintf("Class(%d)", int(c))
}

// ParseClass reads "pulsating", "eclipsing" or "other" (any case).
func ParseClass(s string) (Class, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "pulsating":
		return Pulsating, nil
	case "eclipsing":
		return Eclipsing, nil
	case "other":
		return Other, nil
	}
	return 0, fmt.Errorf("class %q: want pulsating, eclipsing or other", s)
}

// Kind says whether an ephemeris's epoch marks maximum or minimum light.
type Kind int

// The kinds of extremum.
const (
	Max Kind = iota + 1 // maximum light (smallest magnitude)
	Min                 // minimum light (largest magnitude)
)

// String returns "max" or "min", the names the command line uses.
func (k Kind) String() string {
	switch k {
	case Max:
		return "max"
	case Min:
		return "min"
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// ParseKind reads "max" or "min" (also "maximum", "minimum"; any case).
func ParseKind(s string) (Kind, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "max", "maximum":
		return Max, nil
	case "min", "minimum":
		return Min, nil
	}
	return 0, fmt.Errorf("kind %q: want max or min", s)
}

// Comp is a comparison or check star with its catalogue magnitudes.
type Comp struct {
	ID string
	V  float64 // catalogue V magnitude
	BV float64 // catalogue B−V colour; NaN when not known
}

// Target is a variable star to observe: where it is, what it is, when its
// extrema fall, how bright it gets, and which stars to compare it with.
type Target struct {
	Name  string
	Star  ephem.Star // ICRS / J2000 place, optional proper motion
	Class Class
	// Ephemeris gives the times of the extrema; Kind says what its epoch T0
	// marks (maximum or minimum light).
	Ephemeris ephem.Ephemeris
	Kind      Kind
	// Secondary asks for the secondary minima of an eclipsing binary at
	// half-integer cycles (E + 0.5) as well.
	Secondary bool
	// MagBright and MagFaint are the magnitude range (brightest, faintest);
	// NaN when not known.
	MagBright, MagFaint float64
	Comps               []Comp // comparison stars
	Checks              []Comp // check stars
	// LastTimingJD is the Julian date (on the ephemeris's time scale) of the
	// most recent timing of an extremum of this star; 0 when there is none.
	// The ranking favours stars whose last timing is old.
	LastTimingJD float64
	Notes        string
}

// NewTarget returns a target with the fields a minimal catalogue entry
// needs and the others empty (no magnitudes, no comparison stars).
func NewTarget(name string, star ephem.Star, class Class, eph ephem.Ephemeris, kind Kind) Target {
	return Target{Name: name, Star: star, Class: class, Ephemeris: eph, Kind: kind,
		MagBright: math.NaN(), MagFaint: math.NaN()}
}

// Validate reports the first unusable field of t.
func (t *Target) Validate() error {
	name := strings.TrimSpace(t.Name)
	if name == "" {
		return fmt.Errorf("observe: target name is empty")
	}
	if name != t.Name || strings.HasPrefix(name, "#") {
		return fmt.Errorf("observe: target name %q: want no leading or trailing blanks and no leading '#'", t.Name)
	}
	if err := t.Star.Validate(); err != nil {
		return fmt.Errorf("observe: target %q: %w", t.Name, err)
	}
	if t.Class != Other && t.Class != Pulsating && t.Class != Eclipsing {
		return fmt.Errorf("observe: target %q: unknown class %d", t.Name, int(t.Class))
	}
	if t.Kind != Max && t.Kind != Min {
		return fmt.Errorf("observe: target %q: unknown kind %d: want max or min", t.Name, int(t.Kind))
	}
	if err := t.Ephemeris.Validate(); err != nil {
		return fmt.Errorf("observe: target %q: %w", t.Name, err)
	}
	if !math.IsNaN(t.MagBright) && !math.IsNaN(t.MagFaint) && t.MagBright > t.MagFaint {
		return fmt.Errorf("observe: target %q: magnitude range %v to %v: the bright limit must not be fainter", t.Name, t.MagBright, t.MagFaint)
	}
	for _, m := range []float64{t.MagBright, t.MagFaint} {
		if math.IsInf(m, 0) || (!math.IsNaN(m) && (m < -30 || m > 40)) {
			return fmt.Errorf("observe: target %q: magnitude %v: want a value in [-30, 40]", t.Name, m)
		}
	}
	if math.IsNaN(t.LastTimingJD) || (t.LastTimingJD != 0 && (t.LastTimingJD < 2e6 || t.LastTimingJD > 2.6e6)) {
		return fmt.Errorf("observe: target %q: last timing %v: want a full Julian date, or 0 for none", t.Name, t.LastTimingJD)
	}
	for _, set := range [][]Comp{t.Comps, t.Checks} {
		for _, c := range set {
			if err := c.validate(); err != nil {
				return fmt.Errorf("observe: target %q: %w", t.Name, err)
			}
		}
	}
	return nil
}

func (c Comp) validate() error {
	id := strings.TrimSpace(c.ID)
	if id == "" || strings.ContainsAny(c.ID, "=;/") {
		return fmt.Errorf("comparison star id %q: want a non-empty id without '=', ';' or '/'", c.ID)
	}
	if math.IsNaN(c.V) || math.IsInf(c.V, 0) || c.V < -30 || c.V > 40 {
		return fmt.Errorf("comparison star %q: V %v: want a magnitude in [-30, 40]", c.ID, c.V)
	}
	if math.IsInf(c.BV, 0) || (!math.IsNaN(c.BV) && math.Abs(c.BV) > 10) {
		return fmt.Errorf("comparison star %q: B-V %v: want a colour within ±10, or none", c.ID, c.BV)
	}
	return nil
}

// eventKind returns the label of an extremum: the ephemeris's own kind, or
// Min for a secondary minimum at a half-integer cycle.
func (t *Target) eventKind(secondary bool) Kind {
	if secondary {
		return Min
	}
	return t.Kind
}

// FindTarget returns the index in targets of the target called name: the one
// of exactly that name, or else the only one equal to it ignoring case; -1
// when there is none, -2 when several differ from it only in case.
func FindTarget(targets []Target, name string) int {
	fold := -1
	for i := range targets {
		switch {
		case targets[i].Name == name:
			return i
		case strings.EqualFold(targets[i].Name, name) && fold == -1:
			fold = i
		case strings.EqualFold(targets[i].Name, name):
			fold = -2
		}
	}
	return fold
}
