package app

import (
	"strings"
	"testing"
)

func TestFilterTargets(t *testing.T) {
	ts := smallTargets()
	ts[1].Notes = "Algol-like, deep primary"
	cases := []struct {
		query string
		want  string
	}{
		{"", "Test Alpha,Test Beta,Test Gamma"},
		{"   ", "Test Alpha,Test Beta,Test Gamma"},
		{"gam", "Test Gamma"},
		{"TEST a", "Test Alpha,Test Beta,Test Gamma"}, // every name has an "a"
		{"eclipsing", "Test Beta"},                    // by class
		{"algol", "Test Beta"},                        // by notes
		{"pulsating alpha", "Test Alpha"},             // every word must match
		{"delta", ""},
	}
	for _, tc := range cases {
		var names []string
		for _, tg := range FilterTargets(ts, tc.query) {
			names = append(names, tg.Name)
		}
		if got := strings.Join(names, ","); got != tc.want {
			t.Errorf("FilterTargets(%q) = %s, want %s", tc.query, got, tc.want)
		}
	}
}

func TestStarRows(t *testing.T) {
	nd, ts := modelNight()
	nd.Stars = map[string]StarTonight{}
	for _, e := range nd.Events {
		nd.tally(e)
	}
	cases := []struct {
		name string
		nd   *NightData
		want []StarRow
	}{
		{"while planning", nil, []StarRow{
			{Name: "Test Alpha", Detail: "pulsating", Next: "…"},
			{Name: "Test Beta", Detail: "eclipsing", Next: "…"},
			{Name: "Test Gamma", Detail: "pulsating", Next: "…"},
		}},
		// Alpha's whole window at 02:40 beats its partly usable one at 17:30.
		{"planned", nd, []StarRow{
			{Name: "Test Alpha", Detail: "pulsating · whole", Next: "max 02:40", Catch: CatchWhole},
			{Name: "Test Beta", Detail: "eclipsing · whole", Next: "max 21:14", Catch: CatchWhole},
			{Name: "Test Gamma", Detail: "pulsating · not observable", Next: "max 23:05", Catch: CatchNot},
		}},
	}
	for _, tc := range cases {
		got := StarRows(ts, tc.nd)
		for i := range tc.want {
			if got[i] != tc.want[i] {
				t.Errorf("%s, row %d: got %+v, want %+v", tc.name, i, got[i], tc.want[i])
			}
		}
	}
	nd.Stars = map[string]StarTonight{}
	if r := StarRows(ts[:1], nd)[0]; r.Next != "—" || r.Catch != CatchNoEvent || !strings.Contains(r.Detail, "no max/min tonight") {
		t.Errorf("a star without events: got %+v, want Next — and no max/min tonight", r)
	}
	if got := starListEmpty(0, ""); !strings.Contains(got, "No stars yet") {
		t.Errorf("empty list text %q does not say there are no stars", got)
	}
	if got := starListEmpty(3, "zz"); !strings.Contains(got, "zz") {
		t.Errorf("no-match text %q does not quote the search", got)
	}
}
