package optimize

import "math"

// brentRoot finds a root of f in [a, b] where f(a) and f(b) differ in sign,
// to within tol, by Brent's method: inverse quadratic interpolation and
// secant steps kept inside a shrinking bracket, with bisection when they
// stall (R. P. Brent, Algorithms for Minimization without Derivatives,
// Prentice-Hall 1973, ch. 4).
func brentRoot(f func(float64) float64, a, b, fa, fb, tol float64) float64 {
	if fa == 0 {
		return a
	}
	if fb == 0 {
		return b
	}
	const eps = 2.220446049250313e-16
	c, fc := a, fa
	dd := b - a
	e := dd
	for it := 0; it < 200; it++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			dd = b - a
			e = dd
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p, q = 2*xm*s, 1-s
			} else {
				qq, r := fa/fc, fb/fc
				p = s * (2*xm*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e, dd = dd, p/q
			} else {
				dd, e = xm, xm
			}
		} else {
			dd, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(dd) > tol1 {
			b += dd
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
	}
	return b
}
