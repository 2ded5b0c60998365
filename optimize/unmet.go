package optimize

import (
	"fmt"
	"math"

	"wattstage/curves"
)

// unmet explains why no combination serves the flow.
func (s *Solver) unmet(res Result, Q, hr float64, c Constraint) Result {
	res.Status = Unmet
	u := s.plant.Units
	// Capacity at the required head with every allowed unit at its highest
	// allowed flow.
	capacity := 0.0
	for _, cnt := range s.combos {
		if !c.allows(cnt) {
			continue
		}
		hc := math.Max(hr, s.headCap(cnt))
		for k := 0; k <= 16; k++ {
			h := hr + (hc-hr)*float64(k)/16
			sum := 0.0
			for i, n := range cnt {
				if n > 0 {
					if sp := s.units[i].bounds(h); sp.ok {
						sum += float64(n) * sp.hi
					}
				}
			}
			capacity = math.Max(capacity, sum)
		}
	}
	if capacity < Q {
		res.Limit = LimitCapacity
		res.Shortfall = curves.Flow(Q - capacity)
		if capacity == 0 {
			res.Reason = fmt.Sprintf("no unit can make the required head of %s", u.FormatHead(curves.Head(hr)))
		} else {
			res.Reason = fmt.Sprintf("the units can deliver at most %s at the required head of %s; short by %s",
				u.FormatFlow(curves.Flow(capacity)), u.FormatHead(curves.Head(hr)), u.FormatFlow(res.Shortfall))
		}
		return res
	}
	res.Limit = LimitGap
	res.Reason = fmt.Sprintf("no combination of running units delivers %s at %s or more without breaking a unit's minimum flow, speed or motor limit",
		u.FormatFlow(curves.Flow(Q)), u.FormatHead(curves.Head(hr)))
	return res
}
