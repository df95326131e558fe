package app

import (
	"testing"
	"time"
)

func TestNightTitle(t *testing.T) {
	cases := []struct {
		date time.Time
		want string
	}{
		{time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), "Night of Tue 1 – Wed 2 Dec 2026"},
		{time.Date(2026, 11, 30, 0, 0, 0, 0, time.UTC), "Night of Mon 30 Nov – Tue 1 Dec 2026"},
		{time.Date(2026, 12, 31, 0, 0, 0, 0, time.UTC), "Night of Thu 31 Dec 2026 – Fri 1 Jan 2027"},
		{time.Date(2028, 2, 28, 0, 0, 0, 0, time.UTC), "Night of Mon 28 – Tue 29 Feb 2028"}, // leap year
	}
	for _, tc := range cases {
		if got := nightTitle(tc.date); got != tc.want {
			t.Errorf("nightTitle(%s) = %q, want %q", tc.date.Format(time.DateOnly), got, tc.want)
		}
	}
}

func TestSigmaText(t *testing.T) {
	cases := []struct {
		days float64
		want string
	}{
		{0.2 / 1440, "±0.2 min"}, {3.0 / 1440, "±3 min"}, {59.4 / 1440, "±59 min"},
		{80.0 / 1440, "±1 h 20 min"}, {119.7 / 1440, "±2 h 0 min"},
	}
	for _, tc := range cases {
		if got := sigmaText(tc.days); got != tc.want {
			t.Errorf("sigmaText(%g d) = %q, want %q", tc.days, got, tc.want)
		}
	}
}
