package optimize

import (
	"cmp"
	"math"
	"slices"

	"wattstage/curves"
)

// headCap is the highest header head every running unit of the combo can
// make: the least, over its models, of the curve's maximum head at the top
// speed, s_max²·max H₀eff. On a humped curve that maximum is the peak, above
// the shutoff head, and a fixed-speed unit there serves flows on its falling
// branch at heads above shutoff.
func (s *Solver) headCap(cnt []int) float64 {
	hc := math.Inf(1)
	for i, n := range cnt {
		if n > 0 {
			hc = math.Min(hc, s.units[i].topHead())
		}
	}
	return hc
}

// topHead is the highest header head a unit can make: its curve's maximum
// head at its top speed (affinity laws, H = s²·H₀).
func (u *unitModel) topHead() float64 { return u.hmax * u.smax * u.smax }

// mayRise reports whether a combo that fails at the required head could
// serve the flow at a higher header head: the flows its units give at their
// top speeds only fall as the head rises, so if they are short at the
// required head no higher head helps. (Runout and the minimum-speed floor,
// by contrast, move in the helpful direction as the head rises.)
func (s *Solver) mayRise(cnt []int, Q, hr float64) bool {
	sum := 0.0
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		u := s.units[i]
		q, ok := u.flowAt(u.smax, hr)
		if !ok {
			return false
		}
		sum += float64(n) * q
	}
	return sum >= Q*(1-1e-9)
}

// fewestMayServe is the fewest running units that may serve a load, or 0
// where no number of them can: the flows the units give at their top
// speeds at the required head only fall as the head rises (mayRise), so
// fewer units than the least number whose largest such flows reach the
// pumped flow cannot serve it. Solves by running-unit count start there
// instead of proving each smaller count short.
func (s *Solver) fewestMayServe(load curves.Flow) int {
	Q := float64(max(load, s.plant.MinFlow))
	hr := float64(s.plant.RequiredHead(load))
	tops := s.topBuf[:0]
	for i, u := range s.units {
		if q, ok := u.flowAt(u.smax, hr); ok && q > 0 {
			for range s.plant.Models[i].Count {
				tops = append(tops, q)
			}
		}
	}
	s.topBuf = tops
	slices.SortFunc(tops, func(a, b float64) int { return cmp.Compare(b, a) })
	sum := 0.0
	for n, q := range tops {
		if sum += q; sum >= Q*(1-1e-9) {
			return n + 1
		}
	}
	return 0
}

// lowestFeasibleHeadBound returns the lowest header head above the
// required one at which a combo serves the flow, or 0: a scan over the
// solve's head grid, then bisection at the first step that fits (or, for
// fixed-speed units alone, whose feasible head is a single point, at the
// step where their flow turns from too much to too little). It gives up as
// soon as the head reached makes ρ g Q H / η_BEP, a lower bound on the
// combo's input, exceed bound.
func (s *Solver) lowestFeasibleHeadBound(cnt []int, Q, hr, bound float64) float64 {
	etaMax := 0.0
	for i, n := range cnt {
		if n > 0 {
			etaMax = math.Max(etaMax, s.units[i].pump.BEPEff)
		}
	}
	hc := s.headCap(cnt)
	if hc <= hr {
		return 0
	}
	spans := s.scratch(&s.scanSpans, len(cnt))
	side := func(h float64) side { _, _, sd := s.sides(cnt, Q, h, spans); return sd }
	prev := hr
	_, _, prevSide := s.sidesAt(cnt, Q, hr, 0, spans)
	for k := 1; k <= gridPoints && s.grid[k-1] < hc; k++ {
		if s.rho*curves.Gravity*Q*s.grid[k-1]/etaMax > bound {
			return 0 // every head from here on costs more than the bound
		}
		h := s.grid[k]
		_, _, sd := s.sidesAt(cnt, Q, h, k, spans)
		crossing := prevSide == tooMuch && sd == tooLittle
		if sd != fits && !crossing {
			prev, prevSide = h, sd
			continue
		}
		if s.rho*curves.Gravity*Q*prev/etaMax > bound {
			return 0
		}
		a, b := prev, h
		// Fixed-speed units alone (a crossing) cannot share out a mismatch,
		// so their head is found to the last digits.
		prec := 1e-12
		if crossing {
			prec = 1e-15
		}
		for it := 0; it < 80 && b-a > prec*b; it++ {
			m := (a + b) / 2
			switch sm := side(m); {
			case sm == fits, crossing && sm == tooLittle:
				b = m
			default:
				a = m
			}
		}
		if _, _, sb := s.sides(cnt, Q, b, spans); sb == fits {
			return b
		}
		prev, prevSide = h, sd
	}
	return 0
}
