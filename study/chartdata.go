package study

import (
	"math"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// countPowerPoints is the number of plant flows on the chart of power by
// number of running units: fine enough that a crossover read off the chart
// lies within 1/30 of the design flow of the derived one, and few enough
// that its table prints on one page.
const countPowerPoints = 30

// CountPower is the group input of the lowest-power staging held at one
// number of running units, across plant flow: the picture of why each
// count wins where it does.
type CountPower struct {
	Running int           // units running
	Flow    []curves.Flow // plant (load) flow, m³/s
	KW      []float64     // group electrical input, kW; NaN where that many units cannot serve the flow
}

// StageCurve is the head the running units of one stage make together at
// full speed against plant flow: at each header head the flows of the
// stage's units add (parallel operation, each unit's branch loss taken off
// its own head).
type StageCurve struct {
	Counts  []int         // running units per model
	Running int           // units running
	Speed   []float64     // the speed of each model, fraction of rated (its maximum speed)
	Flow    []curves.Flow // plant flow, m³/s
	Head    []curves.Head // header head, m
}

// countPower solves the plant on a grid of plant flows up to the design
// flow once per number of running units, with optimize.Solver.SolveWith
// and Constraint{Total: n}: the best state with exactly n units running.
func countPower(p *plant.Plant) []CountPower {
	if p.DesignFlow <= 0 {
		return nil
	}
	total := 0
	for _, m := range p.Models {
		total += m.Count
	}
	s := optimize.New(p, optimize.Options{})
	out := make([]CountPower, total)
	for n := 1; n <= total; n++ {
		out[n-1].Running = n
	}
	for k := 1; k <= countPowerPoints; k++ {
		q := p.DesignFlow * curves.Flow(float64(k)/countPowerPoints)
		for n := 1; n <= total; n++ {
			res := s.SolveWith(q, optimize.Constraint{Total: n})
			kw := math.NaN()
			if res.Status == optimize.Served {
				kw = float64(res.Power) / curves.KW
			}
			out[n-1].Flow = append(out[n-1].Flow, q)
			out[n-1].KW = append(out[n-1].KW, kw)
		}
	}
	return out
}

// stageCurvePoints is the number of header heads each stage curve is
// sampled at.
const stageCurvePoints = 40

// stageCurves returns the full-speed parallel curve of every stage of the
// derived setpoints, for a plant of more than one pump model (with one
// model, the per-unit chart with the system curve shared by n units says
// the same). A unit at header head H delivers the flow q where
// s²·H₀(q/s) − k·q² = H on the falling branch of its curve (k its branch
// loss coefficient), up to its runout scaled by speed (affinity laws); a
// unit whose shutoff head is below H delivers nothing (its check valve
// holds).
func stageCurves(p *plant.Plant, sp *optimize.Setpoints) []StageCurve {
	if sp == nil || len(p.Models) < 2 {
		return nil
	}
	var out []StageCurve
	for _, st := range sp.Stages {
		c := StageCurve{Counts: append([]int(nil), st.Counts...), Running: st.Running}
		top, bottom := 0.0, math.Inf(1)
		for i, m := range p.Models {
			c.Speed = append(c.Speed, m.MaxSpeed)
			if st.Counts[i] == 0 {
				continue
			}
			top = math.Max(top, float64(peakHead(&p.Models[i], m.MaxSpeed)))
			bottom = math.Min(bottom, float64(unitHeaderHead(&p.Models[i], runoutAt(&p.Models[i], m.MaxSpeed), m.MaxSpeed)))
		}
		if top <= 0 || math.IsInf(bottom, 1) || bottom >= top {
			continue
		}
		for k := 0; k <= stageCurvePoints; k++ {
			h := curves.Head(top - (top-bottom)*float64(k)/stageCurvePoints)
			var q curves.Flow
			for i := range p.Models {
				if st.Counts[i] > 0 {
					q += curves.Flow(st.Counts[i]) * unitFlowAt(&p.Models[i], h, p.Models[i].MaxSpeed)
				}
			}
			c.Flow = append(c.Flow, q)
			c.Head = append(c.Head, h)
		}
		out = append(out, c)
	}
	return out
}

// peakHead is the highest header head a unit makes at speed s (its shutoff
// head unless the curve is humped).
func peakHead(m *plant.Model, s float64) curves.Head {
	hi, top := runoutAt(m, s), unitHeaderHead(m, 0, s)
	for k := 1; k <= 200; k++ {
		top = max(top, unitHeaderHead(m, hi*curves.Flow(float64(k)/200), s))
	}
	return top
}

// runoutAt is the model's runout flow at speed s (affinity: flow ∝ speed),
// or its last datasheet flow when no runout is given.
func runoutAt(m *plant.Model, s float64) curves.Flow {
	r := m.Runout
	if r <= 0 {
		r = m.Pump.LastFlow
	}
	return r * curves.Flow(s)
}

// unitHeaderHead is the header head a unit makes at flow q and speed s:
// its own head less its branch loss k·q².
func unitHeaderHead(m *plant.Model, q curves.Flow, s float64) curves.Head {
	return m.Pump.Head(q, s) - curves.Head(m.BranchK*float64(q)*float64(q))
}

// unitFlowAt is the flow a unit gives at header head h and speed s, on the
// falling branch of its curve: found by bisection between the flow of its
// highest head (zero flow unless the curve is humped, found on a scan of
// 200 flows) and its runout; 0 where h is above what it makes, the runout
// flow where h is below what it makes there.
func unitFlowAt(m *plant.Model, h curves.Head, s float64) curves.Flow {
	hi := runoutAt(m, s)
	lo, top := curves.Flow(0), unitHeaderHead(m, 0, s)
	for k := 1; k <= 200; k++ {
		q := hi * curves.Flow(float64(k)/200)
		if hh := unitHeaderHead(m, q, s); hh > top {
			lo, top = q, hh
		}
	}
	if top <= h {
		return 0
	}
	if unitHeaderHead(m, hi, s) >= h {
		return hi
	}
	for range 60 {
		mid := (lo + hi) / 2
		if unitHeaderHead(m, mid, s) > h {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}
