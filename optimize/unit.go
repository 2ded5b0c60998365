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
	// hmax is the highest head of the effective curve at rated speed, m:
	// the shutoff head for a curve that falls from zero flow, the peak of a
	// humped one (which lies above its shutoff head).
	hmax float64
	rho  float64
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
	xp := u.peakX()
	if xp > 0 {
		u.qmin = math.Max(u.qmin, 1.02*xp)
	}
	u.hmax = u.h0(xp)
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
