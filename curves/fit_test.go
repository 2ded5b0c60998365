package curves

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// polyAt evaluates Σ c[k] x^k (lowest power first) in unscaled x: the
// reference the fitted Poly is compared with.
func polyAt(c []float64, x float64) float64 {
	s := 0.0
	for k := len(c) - 1; k >= 0; k-- {
		s = s*x + c[k]
	}
	return s
}

// TestFitPolyExactRecovery fits points sampled from a known polynomial: a
// least-squares fit of the right degree must reproduce it to rounding, with
// residuals near zero [D: the exact polynomial is in the span of the basis].
func TestFitPolyExactRecovery(t *testing.T) {
	cases := []struct {
		name   string
		coef   []float64 // true polynomial in unscaled x, lowest power first
		lowest int
		degree int
		x      []float64
	}{
		{"quadratic, 3 points", []float64{40, 0.05, -0.0021}, 0, 2, []float64{0, 60, 120}},
		{"quadratic, 7 points", []float64{40, 0.05, -0.0021}, 0, 2, []float64{0, 20, 40, 60, 80, 100, 120}},
		{"cubic, 6 points", []float64{35, 0.12, -0.0031, 6.5e-6}, 0, 3, []float64{0, 25, 50, 75, 100, 125}},
		{"through origin, degree 1..2", []float64{0, 0.018, -0.0001}, 1, 2, []float64{20, 50, 90, 130}},
		{"through origin, degree 1..3", []float64{0, 0.02, -1.5e-4, 2e-7}, 1, 3, []float64{10, 40, 70, 100, 130}},
		{"SI-sized flows (m³/s)", []float64{24, 30, -2500}, 0, 2, []float64{0, 0.02, 0.04, 0.06, 0.08}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			y := make([]float64, len(c.x))
			for i, x := range c.x {
				y[i] = polyAt(c.coef, x)
			}
			p, st, err := FitPoly(c.x, y, c.lowest, c.degree)
			if err != nil {
				t.Fatal(err)
			}
			if st.Degree != c.degree || len(st.Residuals) != len(c.x) {
				t.Fatalf("stats degree %d, %d residuals", st.Degree, len(st.Residuals))
			}
			// Rounding only: 1e-9 of the largest value.
			ymax := 0.0
			for _, v := range y {
				ymax = math.Max(ymax, math.Abs(v))
			}
			if st.RMS > 1e-9*ymax || st.MaxAbs > 1e-9*ymax {
				t.Errorf("RMS %.3g, max %.3g for an exact polynomial", st.RMS, st.MaxAbs)
			}
			// The fitted polynomial equals the true one between the points too.
			lo, hi := c.x[0], c.x[len(c.x)-1]
			for i := 0; i <= 20; i++ {
				x := lo + (hi-lo)*float64(i)/20
				if d := math.Abs(p.Eval(x) - polyAt(c.coef, x)); d > 1e-9*ymax {
					t.Errorf("at x=%g fit %.12g, true %.12g", x, p.Eval(x), polyAt(c.coef, x))
				}
				// Derivative against the analytic derivative of the true polynomial.
				dc := make([]float64, len(c.coef)-1)
				for k := 1; k < len(c.coef); k++ {
					dc[k-1] = float64(k) * c.coef[k]
				}
				if d := math.Abs(p.Deriv(x) - polyAt(dc, x)); d > 1e-8*ymax/(hi-lo) {
					t.Errorf("at x=%g derivative %.12g, true %.12g", x, p.Deriv(x), polyAt(dc, x))
				}
			}
		})
	}
}

// TestFitPolyResiduals checks residuals, RMS, MaxAbs and RelRMS of a fit
// that cannot pass through its points: a straight line through
// (0,0) (1,1) (2,0) (3,1) is y = 0.2 + 0.2 x (slope Sxy/Sxx = 1/5), residuals
// 0.2, −0.6, 0.6, −0.2 (fitted minus given) [D: normal equations by hand].
func TestFitPolyResiduals(t *testing.T) {
	x := []float64{0, 1, 2, 3}
	y := []float64{0, 1, 0, 1}
	p, st, err := FitPoly(x, y, 0, 1)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-12
	want := []float64{0.2, -0.6, 0.6, -0.2}
	for i, r := range st.Residuals {
		if math.Abs(r-want[i]) > tol {
			t.Errorf("residual %d = %.15g, want %g", i, r, want[i])
		}
	}
	// [D] RMS = √((0.04+0.36+0.36+0.04)/4) = √0.2; mean |y| = 0.5.
	if math.Abs(st.RMS-math.Sqrt(0.2)) > tol {
		t.Errorf("RMS %.15g, want √0.2", st.RMS)
	}
	if math.Abs(st.MaxAbs-0.6) > tol {
		t.Errorf("MaxAbs %.15g, want 0.6", st.MaxAbs)
	}
	if math.Abs(st.RelRMS-math.Sqrt(0.2)/0.5) > tol {
		t.Errorf("RelRMS %.15g, want %.15g", st.RelRMS, math.Sqrt(0.2)/0.5)
	}
	if math.Abs(p.Eval(0)-0.2) > tol || math.Abs(p.Deriv(1.7)-0.2) > tol {
		t.Errorf("line %.15g + %.15g x, want 0.2 + 0.2 x", p.Eval(0), p.Deriv(1.7))
	}
}

// normalEquations solves (AᵀA) c = Aᵀy in powers of u = x/mean(x), k =
// lowest..degree, by gonum's general LU solve: an independent route to the
// least-squares coefficients (different factorisation, different scaling).
// It returns a function evaluating the solution at x.
func normalEquations(t *testing.T, x, y []float64, lowest, degree int) func(float64) float64 {
	t.Helper()
	mean := 0.0
	for _, xi := range x {
		mean += xi / float64(len(x))
	}
	m := degree - lowest + 1
	a := mat.NewDense(len(x), m, nil)
	for i, xi := range x {
		for j := 0; j < m; j++ {
			a.Set(i, j, math.Pow(xi/mean, float64(j+lowest)))
		}
	}
	var ata mat.Dense
	ata.Mul(a.T(), a)
	var aty mat.VecDense
	aty.MulVec(a.T(), mat.NewVecDense(len(y), y))
	var c mat.VecDense
	if err := c.SolveVec(&ata, &aty); err != nil {
		t.Fatalf("normal equations: %v", err)
	}
	return func(v float64) float64 {
		s := 0.0
		for j := 0; j < m; j++ {
			s += c.AtVec(j) * math.Pow(v/mean, float64(j+lowest))
		}
		return s
	}
}

// TestFitPolyAgainstNormalEquations compares the QR fit with the normal
// equations on scattered data (values read off a smooth curve with errors
// added by hand, so that the fit does not pass through the points).
func TestFitPolyAgainstNormalEquations(t *testing.T) {
	cases := []struct {
		name           string
		x, y           []float64
		lowest, degree int
	}{
		{"head quadratic", []float64{0, 200, 400, 600, 800, 1000}, []float64{120.4, 119.1, 114.8, 106.9, 96.2, 81.5}, 0, 2},
		{"head cubic", []float64{0, 200, 400, 600, 800, 1000, 1200}, []float64{120.4, 119.1, 114.8, 106.9, 96.2, 81.5, 63.0}, 0, 3},
		{"efficiency through origin", []float64{200, 400, 600, 800, 1000, 1200}, []float64{0.42, 0.66, 0.79, 0.83, 0.80, 0.70}, 1, 3},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, st, err := FitPoly(c.x, c.y, c.lowest, c.degree)
			if err != nil {
				t.Fatal(err)
			}
			ref := normalEquations(t, c.x, c.y, c.lowest, c.degree)
			for _, x := range c.x {
				want := ref(x)
				if d := math.Abs(p.Eval(x) - want); d > 1e-9*math.Abs(want) {
					t.Errorf("at x=%g QR fit %.12g, normal equations %.12g", x, p.Eval(x), want)
				}
			}
			// Residuals reported are those of the independent solution.
			for i, x := range c.x {
				want := ref(x) - c.y[i]
				if d := math.Abs(st.Residuals[i] - want); d > 1e-9*math.Abs(c.y[i]) {
					t.Errorf("residual %d: %.12g, independent %.12g", i, st.Residuals[i], want)
				}
			}
		})
	}
}

// TestFitPolyThreePointInterpolation: with three points a quadratic
// least-squares fit is the interpolating parabola (Lagrange form) [D].
func TestFitPolyThreePointInterpolation(t *testing.T) {
	x := []float64{0.011, 0.037, 0.052}
	y := []float64{31.7, 27.9, 22.4}
	p, _, err := FitPoly(x, y, 0, 2)
	if err != nil {
		t.Fatal(err)
	}
	lagrange := func(v float64) float64 {
		s := 0.0
		for i := range x {
			l := 1.0
			for j := range x {
				if j != i {
					l *= (v - x[j]) / (x[i] - x[j])
				}
			}
			s += y[i] * l
		}
		return s
	}
	for i := 0; i <= 10; i++ {
		v := 0.06 * float64(i) / 10
		if d := math.Abs(p.Eval(v) - lagrange(v)); d > 1e-9*math.Abs(lagrange(v)) {
			t.Errorf("at %g fit %.12g, Lagrange %.12g", v, p.Eval(v), lagrange(v))
		}
	}
}

func TestFitPolyErrors(t *testing.T) {
	cases := []struct {
		name           string
		x, y           []float64
		lowest, degree int
		want           error
	}{
		{"too few points", []float64{1, 2}, []float64{3, 4}, 0, 2, ErrTooFewPoints},
		{"all flows equal", []float64{5, 5, 5, 5}, []float64{1, 2, 3, 4}, 0, 2, ErrIllConditioned},
		// Points 1e-9 apart relative: the columns 1, x, x² are equal to ~1e-9
		// and the condition number is far above 1e8.
		{"flows nearly equal", []float64{1, 1 + 1e-9, 1 + 2e-9, 1 + 3e-9}, []float64{1, 2, 3, 4}, 0, 2, ErrIllConditioned},
		{"NaN in y", []float64{1, 2, 3}, []float64{1, math.NaN(), 3}, 0, 2, ErrNotFinite},
		{"Inf in x", []float64{1, math.Inf(1), 3}, []float64{1, 2, 3}, 0, 2, ErrNotFinite},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, _, err := FitPoly(c.x, c.y, c.lowest, c.degree)
			if !errors.Is(err, c.want) {
				t.Errorf("got %v, want %v", err, c.want)
			}
		})
	}
}

func TestPolyEvalScaling(t *testing.T) {
	// p(v) = 2 + 3 (v/10) + 4 (v/10)²  at v = 5: 2 + 1.5 + 1 = 4.5 [D].
	p := Poly{C: []float64{2, 3, 4}, Scale: 10}
	if got := p.Eval(5); math.Abs(got-4.5) > 1e-15 {
		t.Errorf("Eval = %g, want 4.5", got)
	}
	// dp/dv = (3 + 8 v/10)/10 = 0.7 at v = 5 [D].
	if got := p.Deriv(5); math.Abs(got-0.7) > 1e-15 {
		t.Errorf("Deriv = %g, want 0.7", got)
	}
	// Lowest 1: p(v) = x(2 + 3x) with x = v (Scale 0 means 1): 2·2 + 3·4 = 16 at v = 2.
	q := Poly{C: []float64{2, 3}, Lowest: 1}
	if got := q.Eval(2); got != 16 {
		t.Errorf("Eval through origin = %g, want 16", got)
	}
	if got := q.Deriv(2); got != 14 { // 2 + 6x = 14
		t.Errorf("Deriv through origin = %g, want 14", got)
	}
}
