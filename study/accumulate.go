package study

import (
	"math"
	"sort"

	"wattstage/curves"
	"wattstage/optimize"
)

// KeepStatesUpTo is the number of steps up to which a strategy's every
// state is kept in Strategy.Run.Points (for the load points of bins, the
// tests and the JSON detail); above it, a study keeps aggregates only, so a
// long trend runs in memory that does not grow with its length beyond a
// few numbers a step.
const KeepStatesUpTo = 10_000

// accumulator gathers what the study needs from a strategy's states as
// they are solved: the energy, the unit-hours by region and the load-point
// groups with a typical state each.
type accumulator struct {
	r      *Result
	e      Energy
	served []bool
	reg    Regions
	keep   bool
	points []optimize.Result
	groups map[int]*group
}

// group is a flow group of a trend solved interval by interval.
type group struct {
	lp      LoadPoint
	flowH   float64 // Σ load × hours
	best    float64 // distance of the typical state's load from the group's centre
	hasBest bool
	first   optimize.Result
}

func newAccumulator(r *Result, keep bool) *accumulator {
	n := len(r.Steps)
	a := &accumulator{r: r, keep: keep, served: make([]bool, n), groups: map[int]*group{},
		e: Energy{UnmetBy: map[optimize.Limit]float64{}, KW: make([]float64, n)}}
	if keep {
		a.points = make([]optimize.Result, 0, n)
	}
	return a
}

// groupKey is the flow group of a load: k for [k·w, (k+1)·w), −1 for zero.
func (a *accumulator) groupKey(load curves.Flow) int {
	if load <= 0 {
		return -1
	}
	return int(math.Floor(float64(load) / float64(a.r.LoadBinWidth)))
}

func (a *accumulator) visit(i int, res *optimize.Result) {
	a.r.tick.tick()
	st := a.r.Steps[i]
	a.e.Hours += st.Hours
	if a.keep {
		a.points = append(a.points, *res)
	}
	ok := res.Status == optimize.Served
	a.served[i] = ok
	if ok {
		kw := float64(res.Power) / curves.KW
		a.e.KW[i] = kw
		a.e.KWh += kw * st.Hours
		a.e.PeakKW = max(a.e.PeakKW, kw)
		for _, u := range res.Units {
			a.reg.UnitHours += st.Hours
			if !u.Preferred {
				a.reg.OutsidePreferred += st.Hours
			}
			if u.Speed > 1+1e-9 {
				a.reg.Overspeed += st.Hours
			}
			if u.Load > 1+1e-9 {
				a.reg.Overload += st.Hours
			}
		}
	} else {
		a.e.HoursUnmet += st.Hours
		a.e.UnmetBy[res.Limit] += st.Hours
	}
	if a.r.LoadBinWidth <= 0 {
		return
	}
	k := a.groupKey(st.Load)
	g := a.groups[k]
	if g == nil {
		g = &group{lp: LoadPoint{Grouped: true}, first: *res}
		if k >= 0 {
			g.lp.Low, g.lp.High = a.r.LoadBinWidth*curves.Flow(k), a.r.LoadBinWidth*curves.Flow(k+1)
		}
		a.groups[k] = g
	}
	g.lp.Steps++
	g.lp.Hours += st.Hours
	g.flowH += float64(st.Load) * st.Hours
	g.lp.KWh += a.e.KW[i] * st.Hours
	if !ok {
		g.lp.HoursUnmet += st.Hours
		return
	}
	// The typical state: the served interval nearest the group's centre.
	if d := math.Abs(float64(st.Load - (g.lp.Low+g.lp.High)/2)); !g.hasBest || d < g.best {
		g.best, g.hasBest, g.lp.State = d, true, *res
	}
}

// loadPoints finishes the load points once the bill is known: each step
// its own point (bins, or a trend solved in bins), or the flow groups of a
// trend solved interval by interval. A point's cost is the tariff's energy
// cost of its hours.
func (a *accumulator) loadPoints(sampleCost []float64) []LoadPoint {
	if a.r.LoadBinWidth <= 0 {
		out := make([]LoadPoint, len(a.r.Steps))
		for i, st := range a.r.Steps {
			lp := LoadPoint{Low: st.Load, High: st.Load, Flow: st.Load, Steps: 1, Hours: st.Hours,
				KWh: a.e.KW[i] * st.Hours, KW: a.e.KW[i], Cost: sampleCost[i], State: a.points[i]}
			if !a.served[i] {
				lp.HoursUnmet = st.Hours
			}
			out[i] = lp
		}
		return out
	}
	for i, st := range a.r.Steps {
		a.groups[a.groupKey(st.Load)].lp.Cost += sampleCost[i]
	}
	keys := make([]int, 0, len(a.groups))
	for k := range a.groups {
		keys = append(keys, k)
	}
	sort.Ints(keys)
	out := make([]LoadPoint, 0, len(keys))
	for _, k := range keys {
		g := a.groups[k]
		lp := g.lp
		if lp.Hours > 0 {
			lp.Flow = curves.Flow(g.flowH / lp.Hours)
		}
		if served := lp.Hours - lp.HoursUnmet; served > 0 {
			lp.KW = lp.KWh / served
		}
		if !g.hasBest {
			lp.State = g.first
		}
		out = append(out, lp)
	}
	return out
}

// streamEnergy runs a strategy and totals its energy without keeping its
// states (the savings range, the binning check).
func streamEnergy(s optimize.Strategy, steps []optimize.Step, t *ticker) Energy {
	e := Energy{UnmetBy: map[optimize.Limit]float64{}, KW: make([]float64, len(steps))}
	run := s.Stream(steps, func(i int, res *optimize.Result) {
		t.tick()
		st := steps[i]
		e.Hours += st.Hours
		if res.Status != optimize.Served {
			e.HoursUnmet += st.Hours
			e.UnmetBy[res.Limit] += st.Hours
			return
		}
		kw := float64(res.Power) / curves.KW
		e.KW[i] = kw
		e.KWh += kw * st.Hours
		e.PeakKW = max(e.PeakKW, kw)
	})
	e.Name, e.Changes, e.Drives = run.Name, run.Changes, run.Drives
	return e
}
