package reduce

import (
	"fmt"
	"math"
	"strings"
	"sync/atomic"

	"example.org/vigil/ephem"
)

// Reduce turns instrumental photometry into the target's standard
// magnitudes, the differential method with one comparison star or an
// ensemble (Honeycutt 1992, PASP 104, 435, for the weighted ensemble).
//
// Each comparison star i measured in an exposure gives a zero point
// Z_i = C_i − c_i (catalogue minus instrumental magnitude, plus the terms of
// Photometry.Transform when set). The exposure's zero point Z is the mean
// of the Z_i, weighted by 1/err_i² when every comparison star used has an
// error (Inst.Err > 0) in that exposure, else with equal weights. The
// target's magnitude is V = v + Z and its error err = sqrt(target_err² +
// σ_Z²), where σ_Z is the comparison star's error (one comparison star), or
// 1/sqrt(Σ 1/err_i²) (weighted), or the standard error of the mean of the
// Z_i, s/√n with the sample standard deviation s (equal weights); missing
// errors count as 0. With one comparison star this is V = v − c + C.
//
// A comparison star not measured in an exposure is left out of that
// exposure. An exposure with no target magnitude, or with no comparison
// star left, is skipped and listed in Reduction.Skipped. A comparison star
// that disagrees with the others over the whole set is left out of every
// exposure by the rule of RejectRule (never with fewer than three
// comparison stars, nor with KeepAllComps) and listed with the reason in
// Reduction.Rejected.
//
// The check star is reduced with the same zero point as the target;
// Reduction.Check gives its mean, sample standard deviation and offset from
// its catalogue magnitude, and Reduction.Warnings says when they look wrong
// (see CheckOffsetWarnMag).
//
// Times: each exposure's JDUTC becomes HJD_UTC and BJD_TDB for the target,
// topocentric with a Site, else geocentric (see ConvertTimes).
//
// Bad input (a time outside ephem's range, an infinite magnitude, a negative
// error, an airmass below 1, a missing airmass the extinction correction
// needs) returns an *ExposureError naming the first exposure at fault.
func (p *Photometry) Reduce(exps []Exposure) (*Reduction, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	red := &Reduction{}
	sel, err := p.selectFilter(exps, red)
	if err != nil {
		return nil, err
	}
	lt, err := newLightTimer(p.Star, p.Site, p.Frames)
	if err != nil {
		return nil, err
	}
	pr, err := p.prepare(exps, sel, lt)
	if err != nil {
		return nil, err
	}
	m := len(p.Comps)
	left := make([]bool, m)
	if !p.KeepAllComps && m >= 3 {
		ids := make([]string, m)
		for j, c := range p.Comps {
			ids[j] = c.ID
		}
		var warn string
		left, red.Rejected, warn = ensembleReject(ids, pr.z, pr.e, len(sel), p.rule())
		if warn != "" {
			red.Warnings = append(red.Warnings, warn)
		}
	}
	red.Rows = make([]Reduced, 0, len(sel))
	for k, i := range sel {
		z, e := pr.z[k*m:(k+1)*m], pr.e[k*m:(k+1)*m]
		zp, szp, n, weighted := ensembleZeroPoint(z, e, left)
		if math.IsNaN(pr.tgt[k]) {
			red.Skipped = append(red.Skipped, Skip{Index: i, Line: exps[i].Line, Reason: "no target magnitude"})
			continue
		}
		if n == 0 {
			reason := "no comparison star measured"
			if measured := countMeasured(z); measured > 0 {
				reason = "its comparison stars were all left out (see Rejected)"
			}
			red.Skipped = append(red.Skipped, Skip{Index: i, Line: exps[i].Line, Reason: reason})
			continue
		}
		row := Reduced{
			Index: i, Line: exps[i].Line,
			JDUTC: exps[i].JDUTC, HJD: pr.hjd[k], BJDTDB: pr.bjd[k],
			Mag:          pr.tgt[k] + zp,
			Err:          math.Hypot(pr.tgtErr[k], szp),
			ZeroPointErr: szp, NComps: n, Weighted: weighted,
			CheckMag: math.NaN(), CheckErr: math.NaN(),
		}
		row.ZeroPoint = row.Mag - exps[i].Target.Mag
		if p.Check != nil && !math.IsNaN(pr.chk[k]) {
			row.CheckMag = pr.chk[k] + zp
			row.CheckErr = math.Hypot(pr.chkErr[k], szp)
		}
		red.Rows = append(red.Rows, row)
	}
	if p.Check != nil {
		red.Check = checkSummary(*p.Check, red.Rows)
		red.Warnings = append(red.Warnings, red.Check.warnings()...)
	}
	if pr.stale {
		red.Warnings = append(red.Warnings, fmt.Sprintf(
			"some exposures are later than %s, up to which the leap-second table is known to be complete: HJD_UTC is unaffected, BJD_TDB may be off by a whole second if a leap second was added since",
			ephem.LeapSecondsValidUntil().Format("2006-01-02")))
	}
	return red, nil
}

// selectFilter returns the indices of the exposures to reduce: those in
// Photometry.Filter, or all when every exposure shares one filter.
func (p *Photometry) selectFilter(exps []Exposure, red *Reduction) ([]int, error) {
	sel := make([]int, 0, len(exps))
	if p.Filter != "" {
		red.Filter = p.Filter
		for i := range exps {
			if strings.EqualFold(strings.TrimSpace(exps[i].Filter), p.Filter) {
				sel = append(sel, i)
			} else {
				red.OtherFilter++
			}
		}
		return sel, nil
	}
	first := -1
	for i := range exps {
		f := strings.TrimSpace(exps[i].Filter)
		if f != "" && first < 0 {
			first, red.Filter = i, f
		} else if f != "" && !strings.EqualFold(f, red.Filter) {
			return nil, &ExposureError{Index: i, Line: exps[i].Line, Field: "filter", Err: fmt.Errorf(
				"filter %q differs from %q of exposure %d: reduce one filter at a time (choose it with the filter setting)", f, red.Filter, first+1)}
		}
		sel = append(sel, i)
	}
	return sel, nil
}

// photoPrep holds what Reduce needs of each selected exposure k, ready for
// the ensemble: the comparison stars' zero points Z′ (Transform.
// primedZeroPoint; NaN when not measured) and errors (0 when unknown) in
// z[k*m+j] and e[k*m+j], the target's and check star's instrumental
// magnitudes plus their own transformation terms, and the times.
type photoPrep struct {
	z, e        []float64
	tgt, tgtErr []float64
	chk, chkErr []float64
	hjd, bjd    []float64
	stale       bool // an exposure lies beyond the leap-second table
}

// prepare checks and converts the selected exposures, in parallel chunks.
func (p *Photometry) prepare(exps []Exposure, sel []int, lt *lightTimer) (*photoPrep, error) {
	n, m := len(sel), len(p.Comps)
	pr := &photoPrep{
		z: make([]float64, n*m), e: make([]float64, n*m),
		tgt: make([]float64, n), tgtErr: make([]float64, n),
		chk: make([]float64, n), chkErr: make([]float64, n),
		hjd: make([]float64, n), bjd: make([]float64, n),
	}
	tr := p.Transform
	compVec := make([]*ephem.StarVec, m)
	compColor := make([]float64, m)
	for j, c := range p.Comps {
		if s, ok := tr.Positions[c.ID]; ok {
			v := s.Vec()
			compVec[j] = &v
		}
		compColor[j] = tr.CompColor[c.ID]
	}
	var checkVec *ephem.StarVec
	if p.Check != nil {
		if s, ok := tr.Positions[p.Check.ID]; ok {
			v := s.Vec()
			checkVec = &v
		}
	}
	staleAfter, _ := ephem.FromTime(ephem.LeapSecondsValidUntil())
	var firstErr photoFirstError
	var stale atomic.Bool
	photoParallel(n, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			i := sel[k]
			ex := &exps[i]
			fail := func(field string, err error) {
				firstErr.set(k, &ExposureError{Index: i, Line: ex.Line, Field: field, Err: err})
			}
			t, err := ephem.FromJDUTC(ex.JDUTC)
			if err != nil {
				fail("jd_utc", err)
				return
			}
			if staleAfter.Valid() && t.After(staleAfter) {
				stale.Store(true)
			}
			if len(ex.Comps) != m {
				fail("", fmt.Errorf("has %d comparison star measurements, expected %d (one per comparison star)", len(ex.Comps), m))
				return
			}
			var sky *ephem.Sky
			pr.hjd[k], pr.bjd[k], sky = lt.at(t)
			airmass := func(in Inst, v *ephem.StarVec) (float64, error) {
				if tr.ExtinctionK == 0 || math.IsNaN(in.Mag) {
					return 0, nil
				}
				return photoAirmass(in.Airmass, v, sky)
			}
			// The target.
			if err := checkInst(ex.Target); err != nil {
				fail("target", err)
				return
			}
			x, err := airmass(ex.Target, &lt.vec)
			if err != nil {
				fail("target", err)
				return
			}
			pr.tgt[k] = ex.Target.Mag + tr.starTerm(x, tr.TargetColor)
			pr.tgtErr[k] = knownErr(ex.Target.Err)
			// The comparison stars.
			for j, c := range p.Comps {
				in := ex.Comps[j]
				if err := checkInst(in); err != nil {
					fail(c.ID, err)
					return
				}
				x, err := airmass(in, compVec[j])
				if err != nil {
					fail(c.ID, err)
					return
				}
				pr.z[k*m+j] = tr.primedZeroPoint(c.Mag, in.Mag, x, compColor[j])
				pr.e[k*m+j] = knownErr(in.Err)
			}
			// The check star.
			pr.chk[k], pr.chkErr[k] = math.NaN(), 0
			if p.Check != nil {
				if err := checkInst(ex.Check); err != nil {
					fail(p.Check.ID, err)
					return
				}
				x, err := airmass(ex.Check, checkVec)
				if err != nil {
					fail(p.Check.ID, err)
					return
				}
				pr.chk[k] = ex.Check.Mag + tr.starTerm(x, tr.CheckColor)
				pr.chkErr[k] = knownErr(ex.Check.Err)
			}
		}
	})
	if err := firstErr.get(); err != nil {
		return nil, err
	}
	pr.stale = stale.Load()
	return pr, nil
}

// knownErr returns a one-sigma error, with 0 for unknown (NaN or 0).
func knownErr(e float64) float64 {
	if e > 0 {
		return e
	}
	return 0
}

func countMeasured(z []float64) int {
	n := 0
	for _, v := range z {
		if !math.IsNaN(v) {
			n++
		}
	}
	return n
}

// ensembleZeroPoint returns the zero point of one exposure from the zero
// points z of its comparison stars (NaN: not measured) with errors e (0:
// unknown), leaving out the stars marked in left: the weighted mean with
// weights 1/e² and σ = 1/sqrt(Σ 1/e²) when every star used has an error,
// else the plain mean and σ = s/√n (s the sample standard deviation); one
// star gives its own zero point and error. n is the number of stars used.
func ensembleZeroPoint(z, e []float64, left []bool) (zp, sigma float64, n int, weighted bool) {
	first, allErr := -1, true
	for i, v := range z {
		if math.IsNaN(v) || left[i] {
			continue
		}
		if first < 0 {
			first = i
		}
		n++
		allErr = allErr && e[i] > 0
	}
	switch {
	case n == 0:
		return math.NaN(), math.NaN(), 0, false
	case n == 1:
		return z[first], e[first], 1, false
	}
	ref := z[first] // sums of differences from ref keep the digits of Z ≈ 20 mag
	if allErr {
		var sw, swd float64
		for i, v := range z {
			if math.IsNaN(v) || left[i] {
				continue
			}
			w := 1 / (e[i] * e[i])
			sw += w
			swd += w * (v - ref)
		}
		return ref + swd/sw, 1 / math.Sqrt(sw), n, true
	}
	var sd float64
	for i, v := range z {
		if !math.IsNaN(v) && !left[i] {
			sd += v - ref
		}
	}
	mean := sd / float64(n)
	var ss float64
	for i, v := range z {
		if !math.IsNaN(v) && !left[i] {
			d := v - ref - mean
			ss += d * d
		}
	}
	return ref + mean, math.Sqrt(ss / float64(n-1) / float64(n)), n, false
}
