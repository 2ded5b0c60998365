package optimize

import (
	"fmt"

	"wattstage/curves"
	"wattstage/plant"
)

// PartLoadCheck is the ASHRAE 90.1 §6.5.4.2 style check: the group's input
// at 50 % of design flow against its input at design flow (at most 30 %
// for hydronic variable-flow systems; per the user's code edition, verify
// locally).
type PartLoadCheck struct {
	Label    string
	DesignKW float64
	HalfKW   float64
	Ratio    float64 // HalfKW / DesignKW
	Limit    float64 // 0.30
	Pass     bool
	Note     string
}

// PartLoadLimit is the 30 %-of-design-power-at-50 %-flow limit of ASHRAE
// 90.1-2016/2019/2022 §6.5.4.2 and IECC-based codes (DOMAIN §8).
const PartLoadLimit = 0.30

// CheckPartLoad evaluates one strategy at design flow and at half of it.
func CheckPartLoad(label string, p *plant.Plant, st Strategy) PartLoadCheck {
	run := st.Run([]Step{{Load: p.DesignFlow, Hours: 1}, {Load: p.DesignFlow / 2, Hours: 1}})
	c := PartLoadCheck{Label: label, Limit: PartLoadLimit}
	d, h := run.Points[0], run.Points[1]
	if d.Status != Served || h.Status != Served {
		c.Note = "the plant cannot serve design flow or half of it"
		return c
	}
	c.DesignKW, c.HalfKW = float64(d.Power)/curves.KW, float64(h.Power)/curves.KW
	c.Ratio = c.HalfKW / c.DesignKW
	c.Pass = c.Ratio <= c.Limit
	c.Note = "per the user's code edition (ASHRAE 90.1 §6.5.4.2 or local equivalent); verify locally"
	return c
}

// UnitOutCheck says what the group can still do with its largest unit out.
type UnitOutCheck struct {
	Removed      string      // model of the unit taken out
	ServesDesign bool        // the rest serve design flow at the design head
	Design       Result      // the state at design flow (Unmet with shortfall if not)
	MaxFlow      curves.Flow // the largest load flow the rest serve on the system curve
	AtMax        Result      // the state at MaxFlow
}

// CheckUnitOut removes one unit of the largest model (by BEP hydraulic
// power) and finds what the others deliver along the system curve.
func CheckUnitOut(p *plant.Plant, opt Options) (UnitOutCheck, error) {
	big, bp := -1, 0.0
	total := 0
	for i, m := range p.Models {
		total += m.Count
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
	q.Models[big].Count--
	if q.Models[big].Count == 0 {
		q.Models = append(q.Models[:big], q.Models[big+1:]...)
	}
	s := New(&q, opt)
	c := UnitOutCheck{Removed: p.Models[big].Name}
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
