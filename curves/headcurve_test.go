package curves

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// headCurvePump builds a pump whose head points lie exactly on
// H₀ = Σ h[k]·(Q/qb)ᵏ (so the fit reproduces it), fitted with degree 3
// when h has four terms, with a parabolic efficiency peaking at 80 % at
// Q = qb. Invented data: the checks are the algebra of the affinity laws,
// not the pump.
func headCurvePump(t *testing.T, qb float64, h []float64, rising bool) *Pump {
	t.Helper()
	var pts []PumpPoint
	for _, x := range []float64{0, 0.25, 0.5, 0.75, 1, 1.15, 1.3} {
		hv := 0.0
		for k := len(h) - 1; k >= 0; k-- {
			hv = hv*x + h[k]
		}
		pts = append(pts, PumpPoint{Flow: Flow(x * qb), Head: Head(hv), Eff: 0.8 * x * (2 - x)})
	}
	opt := PumpOptions{AllowRising: rising}
	if len(h) == 4 {
		opt.HeadDegree = 3
	}
	p, err := NewPump(pts, opt)
	if err != nil {
		t.Fatalf("pump %v: %v", h, err)
	}
	return p
}

// The curves of the inverse tests: quadratic and cubic, of both signs of
// the highest term, humped and falling, with and without a branch loss
// (k in m per (m³/s)²; 0.05·30 m at 0.1 m³/s is 5 % of the BEP head).
var headCurveCases = []struct {
	name   string
	h      []float64 // H₀ in m against x = Q/0.1 m³/s
	rising bool
	k      float64
}{
	{"quadratic falling", []float64{37.5, 0, -7.5}, false, 0},
	{"quadratic falling, branch loss", []float64{37.5, 0, -7.5}, false, 150},
	{"quadratic convex", []float64{40, -16, 6}, false, 0},
	{"quadratic convex, branch loss", []float64{40, -16, 6}, false, 150},
	{"quadratic humped", []float64{33, 6, -9}, true, 0},
	{"cubic c3 > 0", []float64{36, 0, -9, 3}, false, 0},
	{"cubic c3 > 0, branch loss", []float64{36, 0, -9, 3}, false, 150},
	{"cubic c3 < 0", []float64{37.5, -3, -3, -1.5}, false, 0},
	{"cubic c3 < 0, branch loss", []float64{37.5, -3, -3, -1.5}, false, 150},
	{"cubic humped", []float64{33, 12, -12, -3}, true, 0},
	{"cubic humped, branch loss", []float64{33, 12, -12, -3}, true, 150},
}

// TestHeadCurveInverses checks every inverse against the forward affinity
// law H = s²·H₀(q/s) − k·q² (every pump handbook; docs/sources.md §3),
// computed here from the fitted polynomial, at flows across the falling
// branch and speeds from 30 % to 110 %: the speed for the flow and head,
// the flow for the speed and head, and the flow along the parabola through
// q/s all return the point they came from, to 1e-11 relative.
func TestHeadCurveInverses(t *testing.T) {
	const tol = 1e-11 // a few hundred ulps: the roots are solved to 1e-14
	for _, c := range headCurveCases {
		t.Run(c.name, func(t *testing.T) {
			p := headCurvePump(t, 0.1, c.h, c.rising)
			net := p.NetCurve(c.k)
			lo, hi := float64(net.PeakFlow()), math.Min(float64(net.EndFlow()), 1.3*0.1)
			if !(hi > lo) {
				t.Fatalf("falling branch %g–%g m³/s", lo, float64(net.EndFlow()))
			}
			for i := 1; i < 10; i++ {
				X := lo + (hi-lo)*float64(i)/10
				for _, s := range []float64{0.3, 0.67, 1, 1.1} {
					q := X * s
					// The forward law, written out from the fitted polynomial.
					h := s*s*p.HeadPoly().Eval(X) - c.k*q*q
					if got := float64(net.Head(Flow(q), s)); math.Abs(got-h) > tol*h {
						t.Errorf("X %.4g s %g: Head %.15g m, forward law %.15g m", X, s, got, h)
					}
					if got, ok := net.SpeedFor(Flow(q), Head(h)); !ok || math.Abs(got-s) > tol*s {
						t.Errorf("X %.4g: SpeedFor(%.6g m³/s, %.6g m) = %.15g, %v; want %g", X, q, h, got, ok, s)
					}
					if got, ok := net.FlowAt(s, Head(h)); !ok || math.Abs(float64(got)-q) > tol*q {
						t.Errorf("X %.4g: FlowAt(%g, %.6g m) = %.15g m³/s, %v; want %.15g", X, s, h, float64(got), ok, q)
					}
					if got, ok := net.FlowAlong(Flow(X), Head(h)); !ok || math.Abs(float64(got)-q) > tol*q {
						t.Errorf("X %.4g: FlowAlong(%.6g m) = %.15g m³/s, %v; want %.15g", X, h, float64(got), ok, q)
					}
				}
			}
		})
	}
}

// TestHeadCurveFlowAtMatchesEigenRoots checks FlowAt on the cubic curves
// against the real roots of H₀(X) − k X² − h/s² = 0 found as eigenvalues
// of the polynomial's companion matrix by gonum/mat (an outside
// general-purpose library; the companion-matrix method is that of
// MATLAB's roots and numpy.roots): the one root on the falling branch is
// FlowAt's, to 1e-9 relative (the eigenvalues are good to about 1e-12).
func TestHeadCurveFlowAtMatchesEigenRoots(t *testing.T) {
	for _, c := range headCurveCases {
		if len(c.h) != 4 {
			continue
		}
		t.Run(c.name, func(t *testing.T) {
			p := headCurvePump(t, 0.1, c.h, c.rising)
			net := p.NetCurve(c.k)
			hp := p.HeadPoly()
			sc := hp.Scale
			// Coefficients in x = X/scale, branch loss folded in.
			a := []float64{hp.C[0], hp.C[1], hp.C[2] - c.k*sc*sc, hp.C[3]}
			compared := 0
			for _, s := range []float64{0.5, 1} {
				for _, h := range []float64{12, 20, 28} {
					got, ok := net.FlowAt(s, Head(h))
					// Companion matrix of x³ + (a2/a3)x² + (a1/a3)x + (a0 − h/s²)/a3.
					a0 := a[0] - h/(s*s)
					cm := mat.NewDense(3, 3, []float64{
						0, 0, -a0 / a[3],
						1, 0, -a[1] / a[3],
						0, 1, -a[2] / a[3],
					})
					var eig mat.Eigen
					if !eig.Factorize(cm, mat.EigenNone) {
						t.Fatal("eigen decomposition failed")
					}
					want, found := 0.0, 0
					for _, r := range eig.Values(nil) {
						X := real(r) * sc
						if math.Abs(imag(r)) < 1e-9*cmplx.Abs(r) && X >= float64(net.PeakFlow()) && X <= float64(net.EndFlow()) {
							want, found = X*s, found+1
						}
					}
					switch {
					case found > 1:
						t.Fatalf("s %g h %g m: %d roots on the falling branch", s, h, found)
					case found == 0 && ok:
						t.Errorf("s %g h %g m: FlowAt gives %.9g m³/s, no root on the falling branch", s, h, float64(got))
					case found == 1 && (!ok || math.Abs(float64(got)-want) > 1e-9*want):
						t.Errorf("s %g h %g m: FlowAt %.12g m³/s %v, companion-matrix root %.12g m³/s", s, h, float64(got), ok, want)
					}
					compared += found
				}
			}
			if compared == 0 {
				t.Error("no head met the falling branch: nothing compared")
			}
		})
	}
}

// TestSpeedForPositiveCubicTerm: for H₀/H_b = 1.2 − 0.3x² + 0.1x³
// (x = Q/Q_b) the speed giving x = 0.5 at h = 0.5·H_b solves
// s²(1.2 − 0.3(0.5/s)² + 0.1(0.5/s)³) = 0.5, that is
// 1.2s³ − 0.575s + 0.0125 = 0 [derived by hand], whose roots are
// s = 0.68108176443261 and s = 0.0217606348722793 (bisection on that
// cubic, by hand-written script). The second puts q/s = 23·Q_b, far past
// the minimum of the fit at x = 2: only the first is on the falling
// branch. A bracket in s from zero speed up fails here, since the x³ term
// sends s²H₀(q/s) to +∞ as s → 0.
func TestSpeedForPositiveCubicTerm(t *testing.T) {
	const qb, hb = 0.1, 30.0 // invented BEP, m³/s and m
	p := headCurvePump(t, qb, []float64{1.2 * hb, 0, -0.3 * hb, 0.1 * hb}, false)
	s, ok := p.SpeedFor(Flow(0.5*qb), Head(0.5*hb))
	if want := 0.68108176443261; !ok || math.Abs(s-want) > 1e-12 {
		t.Errorf("SpeedFor = %.15g, %v; want %.14g", s, ok, want)
	}
	own := p.HeadCurve()
	if end := float64(own.EndFlow()) / qb; math.Abs(end-2) > 1e-9 {
		t.Errorf("falling branch ends at x = %.12g, want 2 (H₀′ = −0.6x + 0.3x² = 0)", end)
	}
}

// TestFlowAtConvexQuadratic: H₀ = 40 − 16x + 6x² (x = Q/0.1 m³/s) falls
// to its vertex at x = 4/3 (H₀ = 29.33 m) and rises after it. At rated
// speed and 34 m, 6x² − 16x + 6 = 0 gives x = (8 ∓ √28)/6 = 0.4514 and
// 2.215 [derived by hand]: the flow is the first, on the falling side
// (the second lies past the vertex); below the vertex head there is none.
func TestFlowAtConvexQuadratic(t *testing.T) {
	p := headCurvePump(t, 0.1, []float64{40, -16, 6}, false)
	q, ok := p.FlowAt(1, 34)
	if want := 0.1 * (8 - math.Sqrt(28)) / 6; !ok || math.Abs(float64(q)-want) > 1e-12 {
		t.Errorf("FlowAt(1, 34 m) = %.15g m³/s, %v; want %.15g", float64(q), ok, want)
	}
	if q, ok := p.FlowAt(1, 29); ok {
		t.Errorf("FlowAt(1, 29 m) = %.6g m³/s; below the vertex head 29.33 m there is no flow on the falling side", float64(q))
	}
}

// TestNetCurveBranchLoss: the net head is the pump head less k·q² at any
// speed (the loss scales with q², and so with s² along an affinity
// parabola; docs/sources.md §3), and the loss moves the minimum of an
// S-shaped cubic to higher flow: for 36 − 9x² + 3x³ with k·0.1² = 1.5 m,
// H₀′ = −21x + 9x² = 0 at x = 7/3 [derived by hand], past the pump's own
// x = 2.
func TestNetCurveBranchLoss(t *testing.T) {
	p := headCurvePump(t, 0.1, []float64{36, 0, -9, 3}, false)
	net := p.NetCurve(150)
	for _, pt := range []struct{ q, s float64 }{{0.05, 0.6}, {0.1, 1}, {0.12, 1.1}} {
		want := float64(p.Head(Flow(pt.q), pt.s)) - 150*pt.q*pt.q
		if got := float64(net.Head(Flow(pt.q), pt.s)); math.Abs(got-want) > 1e-12*want {
			t.Errorf("q %g s %g: net head %.15g m, pump head less loss %.15g m", pt.q, pt.s, got, want)
		}
	}
	if end := float64(net.EndFlow()) / 0.1; math.Abs(end-7.0/3) > 1e-9 {
		t.Errorf("net falling branch ends at x = %.12g, want 7/3", end)
	}
}
