package optimize

import (
	"fmt"

	"wattstage/curves"
	"wattstage/plant"
)

// UnitOutCheck says what the group can still do with its largest unit out.
type UnitOutCheck struct {
	Removed      string      // model of the unit taken out
	ServesDesign bool        // the rest serve design flow at the design head
	Design       Result      // the state at design flow (Unmet with shortfall if not)
	MaxFlow      curves.Flow // the largest load flow the rest serve on the system curve
	AtMax        Result      // the state at MaxFlow
	// Standby is true when the model has a unit in standby that takes the
	// failed unit's place: the check is then made with the full duty count.
	Standby bool
}

// CheckUnitOut removes one unit of the largest model (by BEP hydraulic
// power) and finds what the others deliver along the system curve.
func CheckUnitOut(p *plant.Plant, opt Options) (UnitOutCheck, error) {
	big, bp := -1, 0.0
	total := 0
	for i, m := range p.Models {
		total += m.Installed()
		hp := float64(m.Pump.BEPFlow) * float64(m.Pump.BEPHead)
		if hp > bp {
			big, bp = i, hp
		}
	}
	if total < 2 {
		return UnitOutCheck{}, fmt.Errorf("optimize: one-unit-out check needs at least two installed units")
	}
	q := *p
	q.Models = append([]plant.Model(nil), p.Models...)
	standby := p.Models[big].Standby > 0
	if !standby {
		q.Models[big].Count--
		if q.Models[big].Count == 0 {
			q.Models = append(q.Models[:big], q.Models[big+1:]...)
		}
	}
	s := New(&q, opt)
	c := UnitOutCheck{Removed: p.Models[big].Name, Standby: standby}
	c.Design = s.Solve(p.DesignFlow)
	c.ServesDesign = c.Design.Status == Served
	// The largest flow served: bisection between 0 and twice design flow.
	lo, hi := curves.Flow(0), 2*p.DesignFlow
	if s.Solve(hi).Status == Served {
		lo = hi
	}
	for it := 0; it < 50 && hi-lo > 1e-6*p.DesignFlow; it++ {
		m := (lo + hi) / 2
		if s.Solve(m).Status == Served {
			lo = m
		} else {
			hi = m
		}
	}
	c.MaxFlow = lo
	c.AtMax = s.Solve(lo)
	c.AtMax.Counts = remapCounts(c.AtMax.Counts, p, &q, big)
	c.Design.Counts = remapCounts(c.Design.Counts, p, &q, big)
	for _, r := range []*Result{&c.AtMax, &c.Design} {
		for i := range r.Units {
			r.Units[i].Model = remapModel(r.Units[i].Model, p, &q, big)
		}
	}
	return c, nil
}

// remapModel maps a model index of the reduced plant back to the full one.
func remapModel(i int, full, reduced *plant.Plant, big int) int {
	if len(reduced.Models) == len(full.Models) || i < big {
		return i
	}
	return i + 1
}

func remapCounts(c []int, full, reduced *plant.Plant, big int) []int {
	if len(reduced.Models) == len(full.Models) || c == nil {
		return c
	}
	out := make([]int, len(full.Models))
	for i, v := range c {
		out[remapModel(i, full, reduced, big)] = v
	}
	return out
}
