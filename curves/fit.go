package curves

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Sentinel errors of curve fitting.
var (
	ErrTooFewPoints    = errors.New("curves: too few points for the fit")
	ErrIllConditioned  = errors.New("curves: curve fit is ill-conditioned")
	ErrNotFinite       = errors.New("curves: value is NaN or infinite")
	ErrDuplicateFlow   = errors.New("curves: duplicate flow in curve points")
	ErrRisingHead      = errors.New("curves: head curve rises with flow")
	ErrNegativeFit     = errors.New("curves: fitted curve goes negative inside the fitted range")
	ErrBEPOutsidePoint = errors.New("curves: best efficiency point lies outside the datasheet points")
)

// maxCondition is the largest condition number of the scaled design matrix
// accepted by Fit. With flows scaled to [0, 1] a well-spread set of points
// gives a condition number below 1e3; 1e8 leaves about eight significant
// digits in the coefficients.
const maxCondition = 1e8

// Poly is a polynomial in a scaled variable x = v/Scale:
// p(v) = Σ C[k] x^(k+Lowest).
type Poly struct {
	C      []float64 // coefficients, lowest power first
	Lowest int       // power of the first coefficient (1 for a fit through the origin)
	Scale  float64   // the variable is divided by Scale before evaluation; 0 means 1
}

// Eval returns p(v).
func (p Poly) Eval(v float64) float64 {
	x := v
	if p.Scale != 0 {
		x = v / p.Scale
	}
	s := 0.0
	for k := len(p.C) - 1; k >= 0; k-- {
		s = s*x + p.C[k]
	}
	for i := 0; i < p.Lowest; i++ {
		s *= x
	}
	return s
}

// Deriv returns dp/dv at v.
func (p Poly) Deriv(v float64) float64 {
	sc := p.Scale
	if sc == 0 {
		sc = 1
	}
	x := v / sc
	d := 0.0
	for k := len(p.C) - 1; k >= 0; k-- {
		pow := k + p.Lowest
		if pow == 0 {
			continue
		}
		d += float64(pow) * p.C[k] * math.Pow(x, float64(pow-1))
	}
	return d / sc
}

// FitStats reports how well a least-squares fit matches its points.
type FitStats struct {
	Residuals []float64 // fitted minus given, per point, in the fitted quantity's SI unit
	RMS       float64   // root mean square residual
	MaxAbs    float64   // largest absolute residual
	RelRMS    float64   // RMS divided by the mean absolute given value
	Condition float64   // condition number of the scaled design matrix
	Degree    int       // highest power fitted
}

// FitPoly fits y ≈ Σ c_k (x/scale)^k for k = lowest..degree by linear least
// squares (QR via gonum/mat). The flows are scaled by their largest value so
// that the design matrix is well conditioned.
func FitPoly(x, y []float64, lowest, degree int) (Poly, FitStats, error) {
	n := len(x)
	m := degree - lowest + 1
	if n != len(y) || m <= 0 {
		panic("curves: FitPoly called with mismatched or empty input")
	}
	if n < m {
		return Poly{}, FitStats{}, fmt.Errorf("%w: %d points for %d coefficients", ErrTooFewPoints, n, m)
	}
	scale := 0.0
	for i := range x {
		if !finite(x[i]) || !finite(y[i]) {
			return Poly{}, FitStats{}, ErrNotFinite
		}
		scale = math.Max(scale, math.Abs(x[i]))
	}
	if scale == 0 {
		scale = 1
	}
	a := mat.NewDense(n, m, nil)
	b := mat.NewVecDense(n, append([]float64(nil), y...))
	for i := range x {
		xs := x[i] / scale
		for j := 0; j < m; j++ {
			a.Set(i, j, math.Pow(xs, float64(j+lowest)))
		}
	}
	cond := mat.Cond(a, 2)
	if math.IsInf(cond, 0) || math.IsNaN(cond) || cond > maxCondition {
		return Poly{}, FitStats{Condition: cond}, fmt.Errorf("%w (condition number %.3g)", ErrIllConditioned, cond)
	}
	var qr mat.QR
	qr.Factorize(a)
	var c mat.VecDense
	if err := qr.SolveVecTo(&c, false, b); err != nil {
		return Poly{}, FitStats{Condition: cond}, fmt.Errorf("%w: %v", ErrIllConditioned, err)
	}
	p := Poly{C: make([]float64, m), Lowest: lowest, Scale: scale}
	for j := 0; j < m; j++ {
		p.C[j] = c.AtVec(j)
	}
	st := FitStats{Residuals: make([]float64, n), Condition: cond, Degree: degree}
	sumSq, sumAbs := 0.0, 0.0
	for i := range x {
		r := p.Eval(x[i]) - y[i]
		st.Residuals[i] = r
		sumSq += r * r
		sumAbs += math.Abs(y[i])
		st.MaxAbs = math.Max(st.MaxAbs, math.Abs(r))
	}
	st.RMS = math.Sqrt(sumSq / float64(n))
	if sumAbs > 0 {
		st.RelRMS = st.RMS / (sumAbs / float64(n))
	}
	return p, st, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
