package optimize

import (
	"math"

	"wattstage/curves"
)

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
	// flowAt, written out: the wrapper would cost this hot path a call.
	at := func(s float64) (float64, bool) {
		q, ok := u.net.FlowAt(s, curves.Head(h))
		if !ok {
			return u.pastBranch(s, h)
		}
		return float64(q), true
	}
	if !u.variable {
		q, ok := at(1)
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
	hi, ok := at(u.smax)
	if !ok || hi <= 0 {
		return span{why: limMaxSpeed}
	}
	sp.hi = hi
	if lo, ok := at(u.smin); ok {
		sp.lo = lo // +Inf below the end of the falling branch: too fast even at minimum speed
	} else {
		sp.loLim = limNone // the head alone keeps the speed above its minimum
	}
	if u.qmin > 0 {
		q, ok := u.net.FlowAlong(curves.Flow(u.qmin), curves.Head(h))
		if !ok {
			return span{why: limMinFlow}
		}
		if float64(q) > sp.lo {
			sp.lo, sp.loLim = float64(q), limMinFlow
		}
	}
	if !math.IsInf(u.qrun, 1) {
		if q, ok := u.net.FlowAlong(curves.Flow(u.qrun), curves.Head(h)); ok && float64(q) < sp.hi {
			sp.hi, sp.hiLim = float64(q), limRunout
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
