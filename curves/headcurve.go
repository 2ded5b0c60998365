package curves

import "math"

// HeadCurve is a rated-speed head curve H₀(X), a polynomial of degree 2 or 3
// in the rated-speed flow X, read through the affinity laws: at speed ratio
// s a pump on it gives H = s²·H₀(q/s) at flow q (every pump handbook;
// docs/sources.md §3). It holds the three inverses a staging search needs —
// the speed for a flow at a head, the flow for a speed at a head, and the
// flow where an affinity parabola meets a head — closed form for a
// quadratic, by safeguarded Newton on the falling branch for a cubic of
// either sign of its x³ term.
//
// A pump's own curve is Pump.HeadCurve; Pump.NetCurve folds in the loss of
// the branch between the pump and a common header.
type HeadCurve struct {
	c     [4]float64 // coefficients in x = X/scale, lowest power first
	scale float64    // m³/s
	cubic bool       // c[3] is used: the inverses solve a cubic
	// fallLo and fallHi bound the falling branch, m³/s at rated speed: from
	// the highest head within the datasheet range (0 for a curve that falls
	// from zero flow) to the first minimum of the fit, or 3× the last
	// datasheet flow for a cubic (past the last point the fit is an
	// extrapolation, and a cubic with c₃ > 0 turns up again there). fallHi
	// is +Inf for a quadratic that falls for ever.
	fallLo, fallHi float64
}

// newHeadCurve builds the curve of polynomial p (degree 2 or 3, in flow at
// rated speed) fitted to datasheet points up to flow last.
func newHeadCurve(p Poly, last float64) HeadCurve {
	c := HeadCurve{scale: p.Scale, cubic: len(p.C) > 3}
	if c.scale == 0 {
		c.scale = 1
	}
	copy(c.c[:], p.C)
	c.fallLo, c.fallHi = c.fallingBranch(last)
	return c
}

// NetCurve returns the head the pump hands to a common header through a
// branch whose loss is k·Q² (k in m per (m³/s)², ≥ 0): H₀(X) − k·X² at
// rated speed. Along an affinity parabola q = s·X the loss k·q² = s²·k·X²
// scales with s² as the pump head does, so the net head at speed s and flow
// q is s²·(H₀(q/s) − k·(q/s)²) and every inverse of the pump's own curve
// applies to it unchanged. The falling branch is found again, since the loss
// moves the peak of a humped curve to lower flow and the minimum of an
// S-shaped cubic to higher flow.
func (p *Pump) NetCurve(k float64) HeadCurve {
	if k < 0 || math.IsNaN(k) || math.IsInf(k, 0) {
		panic("curves: branch loss coefficient must be finite and not negative")
	}
	if k == 0 {
		return p.curve
	}
	n := p.curve
	n.c[2] -= k * n.scale * n.scale
	n.fallLo, n.fallHi = n.fallingBranch(float64(p.LastFlow))
	return n
}

// HeadCurve returns the pump's own rated-speed head curve.
func (p *Pump) HeadCurve() HeadCurve { return p.curve }

// At returns the head at rated speed and flow X: H₀(X).
func (c *HeadCurve) At(X Flow) Head {
	x := float64(X) / c.scale
	return Head(c.c[0] + x*(c.c[1]+x*(c.c[2]+x*c.c[3])))
}

// Head returns the head at flow q and speed ratio s: s²·H₀(q/s).
func (c *HeadCurve) Head(q Flow, s float64) Head {
	if s <= 0 {
		return 0
	}
	return Head(s*s) * c.At(q/Flow(s))
}

// MaxHead is the highest head of the curve at rated speed: H₀ at the top of
// its falling branch (the shutoff head, or the peak of a humped curve). At
// speed s the highest head is s²·MaxHead.
func (c *HeadCurve) MaxHead() Head { return c.At(Flow(c.fallLo)) }

// PeakFlow is the rated-speed flow at the top of the falling branch: 0 for
// a curve that falls from zero flow, the peak of a humped one.
func (c *HeadCurve) PeakFlow() Flow { return Flow(c.fallLo) }

// EndFlow is the rated-speed flow at the end of the falling branch: +Inf
// for a quadratic that falls for ever.
func (c *HeadCurve) EndFlow() Flow { return Flow(c.fallHi) }

// derivs returns H₀(X) and dH₀/dX (m per m³/s) at rated-speed flow X.
func (c *HeadCurve) derivs(X float64) (h, dh float64) {
	x := X / c.scale
	h = c.c[0] + x*(c.c[1]+x*(c.c[2]+x*c.c[3]))
	dh = (c.c[1] + x*(2*c.c[2]+x*3*c.c[3])) / c.scale
	return h, dh
}

// SpeedFor returns the speed ratio at which the curve gives flow q at head
// h: the root s of s²·H₀(q/s) = h, with q/s on the falling branch where
// there is one (the branch FlowAt uses). ok is false where no positive
// speed up to 64× rated does.
//
// For a quadratic H₀ = a₀ + a₁x + a₂x² (x = X/scale) it is the larger root
// of a₀s² + a₁(q/scale)s + a₂(q/scale)² − h = 0. For a cubic the root is
// sought in X = q/s, where g(X) = h − (q/X)²·H₀(X) rises along the falling
// branch (both factors fall there), so the root is unique; a bracket in s
// alone fails when c₃ > 0, since s²H₀(q/s) → +∞ as s → 0.
func (c *HeadCurve) SpeedFor(q Flow, h Head) (s float64, ok bool) {
	if h <= 0 {
		return 0, false
	}
	if !c.cubic {
		x := float64(q) / c.scale
		a, b, cc := c.c[0], c.c[1]*x, c.c[2]*x*x-float64(h)
		disc := b*b - 4*a*cc
		if disc < 0 {
			return 0, false
		}
		if b <= 0 {
			s = (-b + math.Sqrt(disc)) / (2 * a)
		} else {
			s = 2 * cc / (-b - math.Sqrt(disc)) // the same root, without cancellation
		}
		if s <= 0 || float64(q) > s*c.fallHi {
			return 0, false
		}
		return s, true
	}
	if q <= 0 {
		return math.Sqrt(float64(h) / c.c[0]), c.c[0] > 0
	}
	Q, H := float64(q), float64(h)
	g := func(X float64) (float64, float64) {
		h0, d0 := c.derivs(X)
		r := Q / X
		return H - r*r*h0, 2*r*r*h0/X - r*r*d0
	}
	const maxSpeed = 64
	lo := math.Max(c.fallLo, Q/maxSpeed)
	if v, _ := g(lo); v > 0 {
		// Above the head the curve makes at the top of its falling branch:
		// the point lies left of a hump, as with a quadratic fit.
		if lo == Q/maxSpeed {
			return 0, false
		}
		if v, _ := g(Q / maxSpeed); v > 0 {
			return 0, false
		}
		return Q / safeNewton(g, Q/maxSpeed, lo), true
	}
	if v, _ := g(c.fallHi); v < 0 {
		return 0, false // past the end of the falling branch
	}
	return Q / safeNewton(g, lo, c.fallHi), true
}

// FlowAt returns the flow at speed s against head h on the falling branch:
// the root of s²·H₀(q/s) = h with q/s between PeakFlow and EndFlow. ok is
// false where the head is above what the curve makes at that speed, or
// below the end of its falling branch.
//
// For a quadratic the root of a₂x² + a₁x + a₀ − h/s² = 0 on the falling
// side of its vertex: the larger root when a₂ < 0, the smaller when a₂ > 0.
func (c *HeadCurve) FlowAt(s float64, h Head) (q Flow, ok bool) {
	if s <= 0 {
		return 0, false
	}
	target := float64(h) / (s * s) // H₀(X) = target with X = q/s
	if !c.cubic {
		a, b, cc := c.c[2], c.c[1], c.c[0]-target
		var x float64
		if a == 0 {
			if b >= 0 {
				return 0, false
			}
			x = -cc / b
		} else {
			disc := b*b - 4*a*cc
			if disc < 0 {
				return 0, false
			}
			// (−b − √disc)/(2a) is the root right of the vertex when a < 0
			// and left of it when a > 0: on the falling side either way.
			// Written as 2cc/(−b + √disc) where b < 0, to avoid cancellation
			// (and to meet the linear root as a → 0).
			if b < 0 {
				x = 2 * cc / (-b + math.Sqrt(disc))
			} else {
				x = (-b - math.Sqrt(disc)) / (2 * a)
			}
		}
		X := x * c.scale
		if x < 0 || X < c.fallLo*(1-1e-12) || X > c.fallHi {
			return 0, false
		}
		return Flow(X * s), true
	}
	hLo, _ := c.derivs(c.fallLo)
	hHi, _ := c.derivs(c.fallHi)
	if target > hLo || target < hHi {
		return 0, false
	}
	f := func(X float64) (float64, float64) {
		h0, d0 := c.derivs(X)
		return target - h0, -d0
	}
	return Flow(safeNewton(f, c.fallLo, c.fallHi) * s), true
}

// FlowAlong returns the flow where the affinity parabola through rated-speed
// flow X meets head h: q = X·s with s = √(h / H₀(X)). ok is false where
// H₀(X) ≤ 0.
func (c *HeadCurve) FlowAlong(X Flow, h Head) (Flow, bool) {
	he := c.At(X)
	if he <= 0 {
		return 0, false
	}
	return X * Flow(math.Sqrt(float64(h/he))), true
}

// fallingBranch returns the rated-speed flows between which the curve
// falls (see HeadCurve.fallLo). A quadratic has it in closed form from its
// vertex −a₁/(2a₂); a cubic is scanned on 400 points and refined by
// bisection on H₀′.
func (c *HeadCurve) fallingBranch(last float64) (lo, hi float64) {
	if !c.cubic {
		a, b := c.c[2], c.c[1]
		switch {
		case a < 0:
			// Concave: falls right of its vertex for ever.
			return math.Max(0, -b/(2*a)) * c.scale, math.Inf(1)
		case a > 0 && b < 0:
			return 0, -b / (2 * a) * c.scale // convex: falls down to its vertex
		case a == 0 && b < 0:
			return 0, math.Inf(1)
		}
		return 0, 0 // rises from zero flow: no falling branch
	}
	h := func(X float64) float64 { v, _ := c.derivs(X); return v }
	dh := func(X float64) float64 { _, d := c.derivs(X); return d }
	const n = 400
	peak, pv := 0.0, h(0)
	for i := 1; i <= n; i++ {
		x := last * float64(i) / n
		if v := h(x); v > pv {
			peak, pv = x, v
		}
	}
	if peak > 0 {
		// Refine the interior maximum: H₀′ changes sign from + to −.
		a, b := math.Max(0, peak-last/n), math.Min(last, peak+last/n)
		if dh(a) > 0 && dh(b) < 0 {
			peak = bisect(func(x float64) float64 { return -dh(x) }, a, b)
		}
	}
	end := 3 * last
	step := (end - peak) / n
	for i := 1; i <= n; i++ {
		x := peak + step*float64(i)
		if dh(x) >= 0 {
			end = bisect(dh, x-step, x)
			break
		}
	}
	return peak, end
}

// safeNewton finds the root of a rising f on [lo, hi], f(lo) ≤ 0 ≤ f(hi),
// by Newton steps kept inside a shrinking bracket, with a bisection step
// wherever Newton would leave the bracket or fails to halve the step before
// the last (the safeguarded Newton–Raphson of Press et al., Numerical
// Recipes, 3rd ed. (2007), §9.4, "rtsafe"). f returns its value and
// derivative. It stops when a Newton step is below 1e-14 of the root (the
// error left is then of the order of its square) or the bracket below
// 1e-15 of it.
func safeNewton(f func(float64) (float64, float64), lo, hi float64) float64 {
	x := 0.5 * (lo + hi)
	dxOld, dx := hi-lo, hi-lo
	v, d := f(x)
	for it := 0; it < 100; it++ {
		if v == 0 {
			return x
		}
		if ((x-hi)*d-v)*((x-lo)*d-v) > 0 || math.Abs(2*v) > math.Abs(dxOld*d) {
			dxOld, dx = dx, 0.5*(hi-lo)
			x = lo + dx
		} else {
			dxOld, dx = dx, v/d
			x -= dx
		}
		if math.Abs(dx) <= 1e-14*math.Abs(x) || hi-lo <= 1e-15*math.Abs(x) {
			return x
		}
		v, d = f(x)
		if v < 0 {
			lo = x
		} else {
			hi = x
		}
	}
	return x
}
