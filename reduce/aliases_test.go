package reduce

import (
	"strings"
	"testing"
)

// TestAliasNote checks the hints on peaks: harmonics, subharmonics and
// daily aliases within one peak width 1/T of the best frequency
// (methods.md §12, pitfalls).
func TestAliasNote(t *testing.T) {
	const best, span = 2.5, 100.0 // c/d, days: peak width 0.01 c/d
	for _, tc := range []struct {
		name string
		f    float64
		want string // "" for no hint
	}{
		{"twice the frequency", 5.004, "2 × best frequency"},
		{"half the frequency (an eclipsing binary's P/2)", 1.2551, "best frequency / 2 (period × 2)"},
		{"a third", 2.5 / 3, "best frequency / 3"},
		{"solar-day alias above", 3.5, "daily alias: best frequency +1 c/d"},
		{"sidereal-day alias below", 2.5 - 1.0027379, "daily alias: best frequency -1 c/d"},
		{"two days below", 2.5 - 2*1.0027379 + 0.009, "daily alias: best frequency -2 c/d"},
		{"just over a peak width from an alias", 3.5 + 0.0128, ""},
		{"unrelated", 1.9, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := AliasNote(tc.f, best, span)
			if tc.want == "" && got != "" || !strings.Contains(got, tc.want) {
				t.Errorf("AliasNote(%g c/d, best %g c/d, T %g d) = %q, want %q", tc.f, best, span, got, tc.want)
			}
		})
	}
}
