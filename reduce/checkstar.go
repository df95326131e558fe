package reduce

import (
	"fmt"
	"math"
)

// CheckSummary describes the check star over the exposures reduced: its
// catalogue magnitude, how many exposures measured it, the mean and sample
// standard deviation (n − 1; NaN below two) of its reduced magnitudes, and
// the mean's offset from the catalogue value. OffsetLarge and ScatterLarge
// say that the offset or the scatter exceeds what ordinary data show (see
// CheckOffsetWarnMag).
type CheckSummary struct {
	ID                        string
	CatalogMag                float64
	N                         int
	Mean, Std                 float64
	OffsetMag                 float64
	OffsetLarge, ScatterLarge bool
}

// The check star draws a warning when its mean is off its catalogue value
// by more than CheckOffsetWarnMag and by more than three standard errors of
// the mean, or when its scatter exceeds CheckScatterWarnMag and twice the
// RMS of its quoted errors (when every exposure has one). Common practice
// (methods.md §8 and §15): the check star's scatter is the honest external
// error of a night, and CCD or DSLR differential photometry reaches 0.005 to
// 0.02 mag, while catalogue sequences agree to a few hundredths.
const (
	CheckOffsetWarnMag  = 0.05
	CheckScatterWarnMag = 0.03
)

// checkSummary computes the check star's statistics from the reduced rows.
func checkSummary(c Comp, rows []Reduced) *CheckSummary {
	s := &CheckSummary{ID: c.ID, CatalogMag: c.Mag, Mean: math.NaN(), Std: math.NaN(), OffsetMag: math.NaN()}
	var sum, errSS float64
	errKnown := true
	for _, r := range rows {
		if math.IsNaN(r.CheckMag) {
			continue
		}
		s.N++
		sum += r.CheckMag - c.Mag // differences from the catalogue keep the digits
		errSS += r.CheckErr * r.CheckErr
		errKnown = errKnown && r.CheckErr > 0
	}
	if s.N == 0 {
		return s
	}
	off := sum / float64(s.N)
	s.Mean, s.OffsetMag = c.Mag+off, off
	se := math.NaN() // standard error of the mean
	if s.N >= 2 {
		var ss float64
		for _, r := range rows {
			if !math.IsNaN(r.CheckMag) {
				d := r.CheckMag - c.Mag - off
				ss += d * d
			}
		}
		s.Std = math.Sqrt(ss / float64(s.N-1))
		se = s.Std / math.Sqrt(float64(s.N))
	} else if errKnown {
		se = math.Sqrt(errSS)
	}
	s.OffsetLarge = math.Abs(off) > CheckOffsetWarnMag && !(math.Abs(off) <= 3*se)
	rmsErr := math.Sqrt(errSS / float64(s.N))
	s.ScatterLarge = s.Std > CheckScatterWarnMag && (!errKnown || s.Std > 2*rmsErr)
	return s
}

// warnings returns the check star's warnings as sentences.
func (s *CheckSummary) warnings() []string {
	var w []string
	if s.N == 0 {
		w = append(w, fmt.Sprintf("check star %q was not measured in any exposure reduced", s.ID))
	}
	if s.OffsetLarge {
		w = append(w, fmt.Sprintf("check star %q reads %.3f mag, %+.3f mag from its catalogue value %.3f (warning beyond %.2f mag): a comparison or check star's catalogue magnitude or identification may be wrong, or the filters differ",
			s.ID, s.Mean, s.OffsetMag, s.CatalogMag, CheckOffsetWarnMag))
	}
	if s.ScatterLarge {
		w = append(w, fmt.Sprintf("check star %q scatters by %.3f mag over %d exposures (warning beyond %.2f mag): the errors of the light curve are likely larger than quoted, or the check or a comparison star varies",
			s.ID, s.Std, s.N, CheckScatterWarnMag))
	}
	return w
}
