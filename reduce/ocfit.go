package reduce

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// SecondsPerYear converts a period change dP/dt in days per day to seconds
// per year: 86400 s × 365.25 d (Julian year).
const SecondsPerYear = 86400 * 365.25

// OCLinear is a linear ephemeris T(E) = Epoch + Period·E fitted to timings by
// weighted least squares (Sterken 2005, ASP Conf. Ser. 335, 3). Epoch is at
// cycle 0 of the ephemeris the O−C were computed with.
type OCLinear struct {
	Epoch, Period       float64 // Julian date, days
	EpochErr, PeriodErr float64 // one-sigma, days
	CovEpochPeriod      float64 // covariance of Epoch and Period, days²
	Chi2                float64 // Σ w·r² (weighted) or Σ r² in days² (unweighted)
	Dof                 int     // timings − 2

	oc      ocPoly
	rmsDays float64 // unweighted rms residual
}

// OCQuadratic is a quadratic ephemeris T(E) = Epoch + Period·E + Q·E² fitted
// to timings by weighted least squares (Sterken 2005). The period at cycle E
// is Period + 2QE; its rate of change is DPdt = 2Q/Period.
type OCQuadratic struct {
	Epoch, Period, Q                  float64 // Julian date, days, days
	EpochErr, PeriodErr, QErr         float64 // one-sigma
	Cov                               [3][3]float64
	DPdt, DPdtErr                     float64 // days per day
	DPdtSecPerYear, DPdtErrSecPerYear float64 // the same in seconds per year
	Chi2                              float64
	Dof                               int // timings − 3

	oc ocPoly
}

// ocPoly is a fitted O−C polynomial in the centred, scaled cycle
// u = (E − centre)/scale: O−C(E) = Σ c[k]·u^k.
type ocPoly struct {
	centre, scale float64
	c             []float64
}

func (p ocPoly) at(cycle float64) float64 {
	return timingPolyEval(p.c, (cycle-p.centre)/p.scale)
}

// OC returns the O−C (days) that the linear fit predicts at cycle E, against
// the ephemeris the O−C were computed with: a line to draw over the O−C
// diagram.
func (f OCLinear) OC(cycle float64) float64 { return f.oc.at(cycle) }

// OC returns the O−C (days) that the quadratic fit predicts at cycle E.
func (f OCQuadratic) OC(cycle float64) float64 { return f.oc.at(cycle) }

// ocFit fits a polynomial of degree deg to the O−C (days) against cycle E,
// weighted by w (nil for equal weights), on the centred and scaled cycle
// number so that the normal matrix stays well conditioned. It returns the
// coefficients and covariance of the polynomial in E itself (constant term at
// E = 0), propagated by the Jacobian of the change of variable, and χ². The
// covariance is the formal one when weighted, and is scaled by χ²/dof when
// not.
func ocFit(cycle, oc, w []float64, deg int) (coef []float64, cov *mat.SymDense, chi2 float64, p ocPoly, err error) {
	n := len(cycle)
	np := deg + 1
	centre, sw := 0.0, 0.0
	for i, e := range cycle {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		centre += wi * e
		sw += wi
	}
	centre /= sw
	scale := 0.0
	for _, e := range cycle {
		scale = max(scale, math.Abs(e-centre))
	}
	if scale == 0 {
		scale = 1
	}
	x := mat.NewDense(n, np, nil)
	for i, e := range cycle {
		u := (e - centre) / scale
		v := 1.0
		for k := range np {
			x.Set(i, k, v)
			v *= u
		}
	}
	c, covU, chi2, err := timingLSQ(x, oc, w)
	if err != nil {
		return nil, nil, 0, ocPoly{}, err
	}
	if w == nil && n > np {
		covU.ScaleSym(chi2/float64(n-np), covU)
	}
	coef, cov = ocUncentre(c, covU, centre, scale)
	return coef, cov, chi2, ocPoly{centre, scale, c}, nil
}

// ocUncentre converts the coefficients c of a polynomial in
// u = (E − centre)/scale, with covariance covU, to those of the same
// polynomial in E (constant term at E = 0): Σ c_k ((E − e0)/s)^k = Σ_j a_j E^j
// with a_j = Σ_{k≥j} c_k s^−k binom(k, j) (−e0)^(k−j), that is a = J·c, and
// covariance J·covU·Jᵀ.
func ocUncentre(c []float64, covU mat.Symmetric, centre, scale float64) ([]float64, *mat.SymDense) {
	np := len(c)
	jac := mat.NewDense(np, np, nil)
	for k := range np {
		sk := math.Pow(scale, -float64(k))
		for j := 0; j <= k; j++ {
			jac.Set(j, k, sk*timingBinomial(k, j)*math.Pow(-centre, float64(k-j)))
		}
	}
	coef := make([]float64, np)
	mat.NewVecDense(np, coef).MulVec(jac, mat.NewVecDense(np, c))
	cov := mat.NewSymDense(np, nil)
	var tmp, full mat.Dense
	tmp.Mul(jac, covU)
	full.Mul(&tmp, jac.T())
	for i := range np {
		for j := i; j < np; j++ {
			cov.SetSym(i, j, full.At(i, j))
		}
	}
	return coef, cov
}

func timingBinomial(n, k int) float64 {
	r := 1.0
	for i := 1; i <= k; i++ {
		r = r * float64(n-k+i) / float64(i)
	}
	return r
}

// timingLSQCond is the largest condition number of a design matrix that the
// least-squares fits accept (the data are centred and scaled first, so only
// degenerate data come near it).
const timingLSQCond = 1e12

// timingLSQ solves the weighted linear least-squares problem
// min Σ w_i (y_i − Σ_k X_ik c_k)² by the QR factorisation of the weighted
// design matrix (gonum mat), and returns the coefficients c, their
// covariance (XᵀWX)⁻¹ and χ² = Σ w_i r_i². w nil means equal weights 1. The
// rows of x are scaled by √w_i in place. It returns a mat.Condition error
// when the design is degenerate.
func timingLSQ(x *mat.Dense, y, w []float64) (c []float64, cov *mat.SymDense, chi2 float64, err error) {
	n, np := x.Dims()
	if n < np {
		return nil, nil, 0, fmt.Errorf("reduce: %d points for %d parameters: want at least as many points", n, np)
	}
	yw := make([]float64, n)
	for i := range n {
		s := 1.0
		if w != nil {
			s = math.Sqrt(w[i])
		}
		yw[i] = s * y[i]
		if s != 1 {
			row := x.RawRowView(i)
			for k := range row {
				row[k] *= s
			}
		}
	}
	var qr mat.QR
	qr.Factorize(x)
	if cond := qr.Cond(); cond > timingLSQCond || math.IsNaN(cond) {
		return nil, nil, 0, mat.Condition(cond)
	}
	var sol mat.VecDense
	if err := qr.SolveVecTo(&sol, false, mat.NewVecDense(n, yw)); err != nil {
		return nil, nil, 0, err
	}
	c = make([]float64, np)
	for k := range np {
		c[k] = sol.AtVec(k)
	}
	for i := range n {
		r := yw[i]
		for k, v := range x.RawRowView(i) {
			r -= v * c[k]
		}
		chi2 += r * r
	}
	// Covariance (XᵀWX)⁻¹ = (RᵀR)⁻¹. The design is centred and scaled, so
	// forming XᵀWX (a few columns) loses nothing, and it spares copying R
	// out of the n-row factorisation.
	xtx := mat.NewSymDense(np, nil)
	xtx.SymOuterK(1, x.T())
	var ch mat.Cholesky
	if !ch.Factorize(xtx) {
		return nil, nil, 0, mat.Condition(math.Inf(1))
	}
	cov = mat.NewSymDense(np, nil)
	if err := ch.InverseTo(cov); err != nil {
		return nil, nil, 0, err
	}
	return c, cov, chi2, nil
}

// ocLinearFit fits T(E) = T0 + P·E to the timings behind the O−C values oc
// (days, against ephemeris eph) at cycles cycle.
func ocLinearFit(epoch, period float64, cycle, oc, w []float64) (OCLinear, error) {
	coef, cov, chi2, p, err := ocFit(cycle, oc, w, 1)
	if err != nil {
		return OCLinear{}, fmt.Errorf("reduce: linear ephemeris fit: %w", err)
	}
	rss := 0.0
	for i, e := range cycle {
		r := oc[i] - p.at(e)
		rss += r * r
	}
	return OCLinear{
		rmsDays:        math.Sqrt(rss / float64(len(cycle))),
		Epoch:          epoch + coef[0],
		Period:         period + coef[1],
		EpochErr:       math.Sqrt(cov.At(0, 0)),
		PeriodErr:      math.Sqrt(cov.At(1, 1)),
		CovEpochPeriod: cov.At(0, 1),
		Chi2:           chi2,
		Dof:            len(cycle) - 2,
		oc:             p,
	}, nil
}

// ocQuadraticFit fits T(E) = T0 + P·E + Q·E² to the timings behind oc
// (against an ephemeris with quadratic term q0), and derives dP/dt = 2Q/P
// with its error from the covariance of P and Q.
func ocQuadraticFit(epoch, period, q0 float64, cycle, oc, w []float64) (OCQuadratic, error) {
	coef, cov, chi2, p, err := ocFit(cycle, oc, w, 2)
	if err != nil {
		return OCQuadratic{}, fmt.Errorf("reduce: quadratic ephemeris fit: %w", err)
	}
	f := OCQuadratic{
		Epoch:  epoch + coef[0],
		Period: period + coef[1],
		Q:      q0 + coef[2],
		Chi2:   chi2,
		Dof:    len(cycle) - 3,
		oc:     p,
	}
	for i := range 3 {
		for j := range 3 {
			f.Cov[i][j] = cov.At(i, j)
		}
	}
	f.EpochErr = math.Sqrt(f.Cov[0][0])
	f.PeriodErr = math.Sqrt(f.Cov[1][1])
	f.QErr = math.Sqrt(f.Cov[2][2])
	// dP/dt = 2Q/P (Sterken 2005); gradient (∂/∂P, ∂/∂Q) = (−2Q/P², 2/P).
	f.DPdt = 2 * f.Q / f.Period
	gP, gQ := -2*f.Q/(f.Period*f.Period), 2/f.Period
	v := gP*gP*f.Cov[1][1] + gQ*gQ*f.Cov[2][2] + 2*gP*gQ*f.Cov[1][2]
	f.DPdtErr = math.Sqrt(max(v, 0))
	f.DPdtSecPerYear = f.DPdt * SecondsPerYear
	f.DPdtErrSecPerYear = f.DPdtErr * SecondsPerYear
	return f, nil
}

// OCSignificance is the level of the F-test that decides between the linear
// and the quadratic ephemeris.
const OCSignificance = 0.01

// ocExactDays: timings that lie on the linear ephemeris to within this rms
// (under a millisecond, far below any timing's precision) are taken as exact,
// and the F-test, which would compare rounding errors, is not made.
const ocExactDays = 1e-8

// ocFTest compares the linear and quadratic fits by an F-test on the one
// added term: F = (χ²_lin − χ²_quad) / (χ²_quad / dof_quad), with (1,
// dof_quad) degrees of freedom (gonum stat/distuv.F). It returns F and the
// probability of a larger F if the quadratic term were zero.
func ocFTest(lin OCLinear, quad OCQuadratic) (f, p float64) {
	drop := lin.Chi2 - quad.Chi2
	switch {
	case quad.Dof < 1:
		return math.NaN(), math.NaN()
	case lin.rmsDays < ocExactDays || drop <= 0:
		return 0, 1
	case quad.Chi2 == 0:
		return math.Inf(1), 0
	}
	f = drop / (quad.Chi2 / float64(quad.Dof))
	return f, distuv.F{D1: 1, D2: float64(quad.Dof)}.Survival(f)
}
