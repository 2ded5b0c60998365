package optimize

import (
	"math"

	"wattstage/curves"
	"wattstage/plant"
)

// unitModel evaluates one pump model's units against the header head. A
// branch loss k·Q² between a unit and the header is folded into an
// effective rated-speed curve H₀eff(X) = H₀(X) − k X², so that a unit at
// speed s and flow q meets the header head H where s²·H₀eff(q/s) = H (the
// affinity laws apply to the pump; the branch loss scales with q² and hence
// with s² along an affinity parabola).
type unitModel struct {
	idx      int
	m        *plant.Model
	pump     *curves.Pump
	c        [4]float64 // effective head polynomial in x = X/scale, lowest power first
	cubic    bool
	scale    float64
	variable bool
	smin     float64
	smax     float64
	qmin     float64 // minimum flow at rated speed, m³/s
	qrun     float64 // runout at rated speed, m³/s
	shaftMax float64 // W, rated × service factor
	rho      float64
	// mayOverload is false when no allowed state can exceed shaftMax: the
	// shaft power at top speed, over every flow up to runout, stays below it
	// (shaft power rises with speed at a given rated-equivalent flow).
	mayOverload bool
}

func newUnitModel(idx int, m *plant.Model, rho float64) *unitModel {
	hp := m.Pump.HeadPoly()
	u := &unitModel{idx: idx, m: m, pump: m.Pump, scale: hp.Scale, rho: rho,
		variable: m.Drive.Variable(), smin: m.MinSpeed, smax: m.MaxSpeed,
		qmin: float64(m.MinFlow), qrun: float64(m.Runout),
		shaftMax: float64(m.Motor.Rated) * m.Motor.SF()}
	copy(u.c[:], hp.C)
	u.cubic = len(hp.C) > 3 && hp.C[3] != 0
	u.c[2] -= m.BranchK * u.scale * u.scale
	if !u.variable {
		u.smin, u.smax = 1, 1
	}
	if u.qrun <= 0 {
		u.qrun = math.Inf(1)
	}
	// A humped (drooping) curve: run only on its falling branch, 2 % right
	// of the peak, where flow is a well-defined function of head (on the
	// rising side two flows share a head and parallel units hunt; common
	// practice). The peak acts as a further minimum flow.
	if xp := u.peakX(); xp > 0 {
		u.qmin = math.Max(u.qmin, 1.02*xp)
	}
	u.mayOverload = u.peakShaft() > 0.999*u.shaftMax
	return u
}

// peakShaft is the largest shaft power at top speed over rated-equivalent
// flows from zero to runout (or to three times the last datasheet flow),
// on a 200-point scan: P(X·s, s) = s³·P₀(X) grows with s, so the top speed
// bounds every state. +Inf where the scan meets an undefined power.
func (u *unitModel) peakShaft() float64 {
	top := math.Min(u.qrun, 3*float64(u.pump.LastFlow))
	peak := 0.0
	for k := 0; k <= 200; k++ {
		x := top * float64(k) / 200
		p := float64(u.pump.ShaftPower(curves.Flow(x*u.smax), u.smax, u.rho))
		if math.IsNaN(p) || math.IsInf(p, 0) {
			return math.Inf(1)
		}
		// 1 % allowance for the scan's step between points.
		peak = math.Max(peak, 1.01*p)
	}
	return peak
}

// peakX returns the rated-equivalent flow at the peak of the effective head
// curve, or 0 where the curve falls from zero flow.
func (u *unitModel) peakX() float64 {
	top := 3 * float64(u.pump.LastFlow)
	best, bx := u.h0(0), 0.0
	const n = 600
	for k := 1; k <= n; k++ {
		x := top * float64(k) / n
		if v := u.h0(x); v > best {
			best, bx = v, x
		}
	}
	if bx == 0 {
		return 0
	}
	// Refine by golden section around the best sample.
	a, b := math.Max(0, bx-top/n), bx+top/n
	const g = 0.6180339887498949
	for it := 0; it < 60; it++ {
		m1, m2 := b-g*(b-a), a+g*(b-a)
		if u.h0(m1) < u.h0(m2) {
			a = m1
		} else {
			b = m2
		}
	}
	return (a + b) / 2
}

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

// power returns the electrical input of one unit at flow q and speed s.
func (u *unitModel) chain(q, s float64) curves.Chain {
	shaft := u.pump.ShaftPower(curves.Flow(q), s, u.rho)
	return u.m.Drive.Input(u.m.Motor, shaft, s)
}

// powerAt returns the electrical input of one variable unit delivering q at
// header head h; +Inf where no speed does.
func (u *unitModel) powerAt(q, h float64) float64 {
	s, ok := u.speed(q, h)
	if !ok {
		return math.Inf(1)
	}
	shaft := u.pump.ShaftPower(curves.Flow(q), s, u.rho)
	return float64(u.m.Drive.Electrical(u.m.Motor, shaft, s))
}

func (u *unitModel) shaftAt(q, h float64) float64 {
	s, ok := u.speed(q, h)
	if !ok {
		return math.Inf(1)
	}
	return float64(u.pump.ShaftPower(curves.Flow(q), s, u.rho))
}

// span is the interval of allowed per-unit flows at one header head, with
// the limit that sets each end.
type span struct {
	lo, hi       float64
	loLim, hiLim limCode
	ok           bool
	why          limCode // when !ok: the limit that empties the range
}

// limCode is a Limit as a small number, so that spans hold no pointers
// (they are copied often on the hot path).
type limCode uint8

const (
	limNone limCode = iota
	limMinSpeed
	limMaxSpeed
	limMinFlow
	limRunout
	limOverload
	limCapacity
	limFixed
)

var limNames = [...]Limit{LimitNone, LimitMinSpeed, LimitMaxSpeed, LimitMinFlow, LimitRunout, LimitOverload, LimitCapacity, LimitFixedSpeed}

// Limit returns the report name of the code.
func (c limCode) Limit() Limit { return limNames[c] }

// bounds returns the allowed flows of one unit at header head h. A
// fixed-speed unit has lo == hi (its curve flow) when allowed.
func (u *unitModel) bounds(h float64) span {
	if !u.variable {
		q, ok := u.flowAt(1, h)
		if !ok || q <= 0 {
			return span{why: limCapacity}
		}
		sp := span{lo: q, hi: q, loLim: limFixed, hiLim: limFixed, ok: true}
		switch {
		case q < u.qmin*(1-1e-12):
			return span{why: limMinFlow}
		case q > u.qrun*(1+1e-12):
			return span{why: limRunout}
		case u.pump.ShaftPower(curves.Flow(q), 1, u.rho) > curves.Power(u.shaftMax)*(1+1e-12):
			return span{why: limOverload}
		}
		return sp
	}
	sp := span{ok: true, loLim: limMinSpeed, hiLim: limMaxSpeed}
	hi, ok := u.flowAt(u.smax, h)
	if !ok || hi <= 0 {
		return span{why: limMaxSpeed}
	}
	sp.hi = hi
	if lo, ok := u.flowAt(u.smin, h); ok {
		sp.lo = lo
	} else {
		sp.loLim = limNone // the head alone keeps the speed above its minimum
	}
	if u.qmin > 0 {
		q, ok := u.flowAtX(u.qmin, h)
		if !ok {
			return span{why: limMinFlow}
		}
		if q > sp.lo {
			sp.lo, sp.loLim = q, limMinFlow
		}
	}
	if !math.IsInf(u.qrun, 1) {
		if q, ok := u.flowAtX(u.qrun, h); ok && q < sp.hi {
			sp.hi, sp.hiLim = q, limRunout
		}
	}
	if u.mayOverload && u.shaftAt(sp.hi, h) > u.shaftMax {
		if u.shaftAt(sp.lo, h) > u.shaftMax {
			return span{why: limOverload}
		}
		a, b := sp.lo, sp.hi
		for it := 0; it < 60 && b-a > 1e-13*b; it++ {
			m := (a + b) / 2
			if u.shaftAt(m, h) > u.shaftMax {
				b = m
			} else {
				a = m
			}
		}
		sp.hi, sp.hiLim = a, limOverload
	}
	if sp.lo > sp.hi {
		return span{why: sp.loLim}
	}
	return sp
}
