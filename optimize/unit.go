package optimize

import (
	"math"

	"wattstage/curves"
	"wattstage/plant"
)

// unitModel evaluates one pump model's units against the header head. The
// unit's curve as seen from the header is net, the pump curve less the
// branch loss k·Q² between the unit and the header (curves.Pump.NetCurve):
// a unit at speed s and flow q meets the header head H where
// s²·H₀net(q/s) = H, since the loss scales with q² and hence with s² along
// an affinity parabola. Every inverse of that curve (speed for a flow, flow
// for a speed) is the one typed implementation in curves.
type unitModel struct {
	idx      int
	m        *plant.Model
	pump     *curves.Pump
	net      curves.HeadCurve // the pump curve less the branch loss
	variable bool
	smin     float64
	smax     float64
	qmin     float64 // minimum flow at rated speed, m³/s
	// qrun is the runout at rated speed, m³/s, capped at the end of the
	// net curve's falling branch (past it a cubic fit turns up again: an
	// extrapolation that describes no pump).
	qrun     float64
	shaftMax float64 // W, rated × service factor
	// hmax is the highest head of the net curve at rated speed, m: the
	// shutoff head for a curve that falls from zero flow, the peak of a
	// humped one (which lies above its shutoff head).
	hmax float64
	rho  float64
	// mayOverload is false when no allowed state can exceed shaftMax: the
	// shaft power at top speed, over every flow up to runout, stays below it
	// (shaft power rises with speed at a given rated-equivalent flow).
	mayOverload bool
}

func newUnitModel(idx int, m *plant.Model, rho float64) *unitModel {
	u := &unitModel{idx: idx, m: m, pump: m.Pump, net: m.Pump.NetCurve(m.BranchK), rho: rho,
		variable: m.Drive.Variable(), smin: m.MinSpeed, smax: m.MaxSpeed,
		qmin: float64(m.MinFlow), qrun: float64(m.Runout),
		shaftMax: float64(m.Motor.Rated) * m.Motor.SF()}
	if !u.variable {
		u.smin, u.smax = 1, 1
	}
	if u.qrun <= 0 {
		u.qrun = math.Inf(1)
	}
	u.qrun = math.Min(u.qrun, float64(u.net.EndFlow()))
	// A humped (drooping) curve: run only on its falling branch, 2 % right
	// of the peak, where flow is a well-defined function of head (on the
	// rising side two flows share a head and parallel units hunt; common
	// practice). The peak acts as a further minimum flow.
	if xp := float64(u.net.PeakFlow()); xp > 0 {
		u.qmin = math.Max(u.qmin, 1.02*xp)
	}
	u.hmax = float64(u.net.MaxHead())
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
