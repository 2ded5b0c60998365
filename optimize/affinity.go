package optimize

import "math"

// h0 is the effective head at rated speed at rated-equivalent flow X.
func (u *unitModel) h0(X float64) float64 {
	x := X / u.scale
	return u.c[0] + x*(u.c[1]+x*(u.c[2]+x*u.c[3]))
}

// speed returns the speed at which a unit delivers flow q at header head h.
func (u *unitModel) speed(q, h float64) (float64, bool) {
	x := q / u.scale
	if !u.cubic {
		a, b, cc := u.c[0], u.c[1]*x, u.c[2]*x*x-h
		disc := b*b - 4*a*cc
		if disc < 0 {
			return 0, false
		}
		s := (-b + math.Sqrt(disc)) / (2 * a)
		return s, s > 0
	}
	f := func(s float64) float64 { return s*s*u.h0(q/s) - h }
	lo, hi := 1e-3, 1.0
	for f(hi) < 0 {
		hi *= 2
		if hi > 64 {
			return 0, false
		}
	}
	if f(lo) > 0 {
		return 0, false
	}
	for it := 0; it < 100 && hi-lo > 1e-14; it++ {
		m := (lo + hi) / 2
		if f(m) < 0 {
			lo = m
		} else {
			hi = m
		}
	}
	return (lo + hi) / 2, true
}

// flowAt returns the flow of a unit at speed s against header head h, on
// the falling branch of its effective curve.
func (u *unitModel) flowAt(s, h float64) (float64, bool) {
	target := h / (s * s)
	if !u.cubic {
		a, b, cc := u.c[2], u.c[1], u.c[0]-target
		if cc > 0 && a >= 0 && b >= 0 {
			return 0, false
		}
		var x float64
		if a == 0 {
			x = -cc / b
		} else {
			disc := b*b - 4*a*cc
			if disc < 0 {
				return 0, false
			}
			x = (-b - math.Sqrt(disc)) / (2 * a)
			if a > 0 {
				x = (-b + math.Sqrt(disc)) / (2 * a)
			}
		}
		if x < 0 {
			return 0, false
		}
		return x * u.scale * s, true
	}
	hi := 3 * float64(u.pump.LastFlow)
	peak, pv := 0.0, u.h0(0)
	for i := 1; i <= 200; i++ {
		X := hi * float64(i) / 200
		if v := u.h0(X); v > pv {
			peak, pv = X, v
		}
	}
	if target > pv || target < u.h0(hi) {
		return 0, false
	}
	lo := peak
	for it := 0; it < 100 && hi-lo > 1e-14*hi; it++ {
		m := (lo + hi) / 2
		if u.h0(m) > target {
			lo = m
		} else {
			hi = m
		}
	}
	return (lo + hi) / 2 * s, true
}

// flowAtX returns the flow at which a unit runs at rated-equivalent flow X
// (q/s = X) against header head h: s = √(h / H₀eff(X)), q = X·s.
func (u *unitModel) flowAtX(X, h float64) (float64, bool) {
	he := u.h0(X)
	if he <= 0 {
		return 0, false
	}
	return X * math.Sqrt(h/he), true
}
