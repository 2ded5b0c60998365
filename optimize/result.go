package optimize

import (
	"fmt"
	"math"

	"wattstage/curves"
)

// build turns a solved state into a Result with every unit's breakdown, the
// limits it sits on and the warnings a practitioner should see.
func (s *Solver) build(res Result, st *state) Result {
	copy(res.Counts, st.counts)
	res.HeaderHead = curves.Head(st.h)
	res.Status = Served
	for i, n := range st.counts {
		if n == 0 {
			continue
		}
		u := s.units[i]
		sp := u.bounds(st.h)
		for k := 0; k < n; k++ {
			q := st.q[i]
			if k >= n-st.split[i].j {
				q = st.split[i].qb
			}
			res.Units = append(res.Units, s.unitState(u, q, st.h, sp))
		}
	}
	for _, un := range res.Units {
		res.Power += un.Electrical
	}
	res.Hydraulic = curves.HydraulicPower(s.rho, res.PumpedFlow, res.HeaderHead)
	res.Limit = pointLimit(&res)
	if res.BypassFlow > 0 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("bypass open: the plant minimum flow of %s is held, %s through the bypass",
			s.plant.Units.FormatFlow(res.PumpedFlow), s.plant.Units.FormatFlow(res.BypassFlow)))
	}
	if excess := res.HeaderHead - res.RequiredHead; float64(excess) > 1e-6*float64(res.RequiredHead)+1e-9 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("runs %s above the control curve (valves absorb it): %s",
			s.plant.Units.FormatHead(excess), aboveCurveReason(&res)))
	}
	for _, un := range res.Units {
		if _, doe := s.plant.Models[un.Model].Drive.(curves.DOEDrive); doe && un.DriveEff == 1 {
			res.Warnings = append(res.Warnings, "drive efficiency shown as 100 %: at this light motor load the DOE appendix A motor-and-drive fit falls below the motor's own loss, so the input is floored at the motor alone and the drive's own loss is not counted (the input is understated a little)")
			break
		}
	}
	for j, un := range res.Units {
		if !un.Preferred {
			res.Warnings = append(res.Warnings, fmt.Sprintf("unit %d (%s) outside its preferred operating region (70–120 %% of BEP flow, ANSI/HI 9.6.3)",
				j+1, s.plant.Models[un.Model].Name))
		}
		if un.Speed > 1+1e-9 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("unit %d (%s) above rated speed (%.1f %%): confirm the pump, motor and coupling are rated for it",
				j+1, s.plant.Models[un.Model].Name, 100*un.Speed))
		}
		if un.Load > 1+1e-9 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("unit %d (%s) motor at %.0f %% of its rated output, into its service factor: confirm with the motor manufacturer",
				j+1, s.plant.Models[un.Model].Name, 100*un.Load))
		}
	}
	return res
}

func (s *Solver) unitState(u *unitModel, q, h float64, sp span) Unit {
	sv := 1.0
	if u.variable {
		sv, _ = u.speed(q, h)
	}
	ch := u.chain(q, sv)
	un := Unit{Model: u.idx, Speed: sv, Flow: curves.Flow(q), Head: curves.Head(h + u.m.BranchK*q*q),
		PumpEff: u.pump.Eff(curves.Flow(q), sv), MotorEff: ch.MotorEff, DriveEff: ch.DriveEff,
		Load: ch.Load, Shaft: ch.Shaft, Electrical: ch.Electrical}
	tol := 1e-7 * math.Max(sp.hi, 1e-12)
	switch {
	case !u.variable:
		un.Limit = LimitFixedSpeed
	case sp.ok && q <= sp.lo+tol && sp.loLim != limNone:
		un.Limit = sp.loLim.Limit()
	case sp.ok && q >= sp.hi-tol:
		un.Limit = sp.hiLim.Limit()
	}
	x := q / sv
	bep := float64(u.pump.BEPFlow)
	un.Preferred = x >= 0.7*bep && x <= 1.2*bep
	return un
}

// pointLimit names the limit that shapes the point, most telling first.
func pointLimit(r *Result) Limit {
	if r.BypassFlow > 0 {
		return LimitPlantBypass
	}
	order := []Limit{LimitOverload, LimitRunout, LimitMaxSpeed, LimitMinFlow, LimitMinSpeed}
	for _, l := range order {
		for _, u := range r.Units {
			if u.Limit == l {
				return l
			}
		}
	}
	return LimitNone
}

func aboveCurveReason(r *Result) string {
	for _, u := range r.Units {
		switch u.Limit {
		case LimitMinSpeed:
			return "a unit at its minimum speed would otherwise move too much flow"
		case LimitMinFlow:
			return "a unit at its minimum flow would otherwise move too much flow"
		case LimitFixedSpeed:
			return "a fixed-speed unit rides its curve"
		}
	}
	return "it costs less power than running on the curve"
}
