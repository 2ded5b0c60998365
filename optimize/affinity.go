package optimize

import (
	"math"

	"wattstage/curves"
)

// The affinity-law inverses of a unit against the header head, in the plain
// floats of the solver's hot path (m³/s, m): each is the typed method of the
// unit's net curve in curves, converted at the call.

// speed returns the speed at which a unit delivers flow q at header head h.
func (u *unitModel) speed(q, h float64) (float64, bool) {
	return u.net.SpeedFor(curves.Flow(q), curves.Head(h))
}

// flowAt returns the flow of a unit at speed s against header head h, on
// the falling branch of its net curve. Where h lies below the end of that
// branch (a cubic fit with c₃ > 0 turns up again past its minimum) it
// returns +Inf: the unit would run past the branch's end, and so past its
// runout, which newUnitModel caps there; every caller's runout or range
// check refuses it, and a flow that only grows with speed stays monotone
// for the searches over speed.
func (u *unitModel) flowAt(s, h float64) (float64, bool) {
	q, ok := u.net.FlowAt(s, curves.Head(h))
	if !ok {
		return u.pastBranch(s, h)
	}
	return float64(q), true
}

// pastBranch is flowAt where the net curve has no flow at (s, h): +Inf
// below the end of its falling branch, none above its top.
func (u *unitModel) pastBranch(s, h float64) (float64, bool) {
	if s > 0 && h < s*s*u.hmax {
		return math.Inf(1), true
	}
	return 0, false
}
