package reduce

import (
	"math"
	"strings"
	"testing"

	"example.org/vigil/ephem"
)

func TestParseComp(t *testing.T) {
	for _, c := range []struct {
		in      string
		want    Comp
		wantErr string // part of the error; "" for none
	}{
		{"A=11.20", Comp{"A", 11.20}, ""},
		{" C12 = 9.5 ", Comp{"C12", 9.5}, ""},
		{"A", Comp{}, "no catalogue magnitude"},
		{"A=", Comp{}, "no catalogue magnitude"},
		{"=11.2", Comp{}, "no ID"},
		{"A=bright", Comp{}, `"bright" is not a number`},
		{"A=NaN", Comp{}, "not a number"},
		{"A=99", Comp{}, "expected a number in [-30, 40]"},
		{"A B=11", Comp{}, "without blanks"},
	} {
		t.Run(c.in, func(t *testing.T) {
			got, err := ParseComp(c.in)
			switch {
			case c.wantErr == "" && (err != nil || got != c.want):
				t.Errorf("got %+v, %v; want %+v", got, err, c.want)
			case c.wantErr != "" && (err == nil || !strings.Contains(err.Error(), c.wantErr)):
				t.Errorf("got error %v, want one saying %q", err, c.wantErr)
			}
		})
	}
}

func TestPhotometryValidate(t *testing.T) {
	star := ephem.Star{RAHours: 1, DecDeg: 2}
	for _, c := range []struct {
		name string
		p    Photometry
		want string
	}{
		{"no comparison star", Photometry{Star: star}, "no comparison star"},
		{"comparison given twice", Photometry{Comps: []Comp{{"A", 11}, {"A", 12}}, Star: star}, `"A" is given twice`},
		{"twice, differing in case", Photometry{Comps: []Comp{{"A", 11}, {"a", 12}}, Star: star}, "given twice"},
		{"check also a comparison", Photometry{Comps: []Comp{{"A", 11}}, Check: &Comp{"A", 11}, Star: star}, "given twice"},
		{"ID of a reserved column", Photometry{Comps: []Comp{{"target", 11}}, Star: star}, "clashes with the column name"},
		{"ID clashing with an error column", Photometry{Comps: []Comp{{"A", 11}, {"A_err", 12}}, Star: star}, "clashes"},
		{"no catalogue magnitude", Photometry{Comps: []Comp{{"A", math.NaN()}}, Star: star}, "catalogue magnitude NaN"},
		{"bad target position", Photometry{Comps: []Comp{{"A", 11}}, Star: ephem.Star{DecDeg: 91}}, "declination"},
		{"bad site", Photometry{Comps: []Comp{{"A", 11}}, Star: star, Site: &ephem.Site{LatDeg: -91}}, "site"},
		{"negative extinction", Photometry{Comps: []Comp{{"A", 11}}, Star: star, Transform: Transform{ExtinctionK: -0.1}}, "extinction coefficient"},
		{"colour term without comp colour", Photometry{Comps: []Comp{{"A", 11}}, Star: star, Transform: Transform{ColorCoeff: 0.05}}, "no colour index"},
		{"bad rule", Photometry{Comps: []Comp{{"A", 11}}, Star: star, Reject: &RejectRule{}}, "rejection rule"},
	} {
		t.Run(c.name, func(t *testing.T) {
			err := c.p.Validate()
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("got %v, want an error saying %q", err, c.want)
			}
		})
	}
	ok := Photometry{Comps: []Comp{{"A", 11}, {"B", 12}}, Check: &Comp{"K", 11.5}, Star: star}
	if err := ok.Validate(); err != nil {
		t.Errorf("a good set-up: got %v", err)
	}
}
