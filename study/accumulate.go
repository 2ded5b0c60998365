package study

import (
	"math"
	"sort"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
)

// KeepStatesUpTo is the number of steps up to which a strategy's every
// state is kept in Strategy.Run.Points (for the load points of bins, the
// tests and the JSON detail); above it, a study keeps aggregates only, so a
// long trend runs in memory that does not grow with its length beyond the
// steps themselves and two power series (see keepSeries).
const KeepStatesUpTo = 10_000

// accumulator gathers what the study needs from a strategy's states as
// they are solved: the energy and its price, the unit-hours by region, the
// load-point groups with a typical state each, the NPSH check and the
// hours it draws less than the lowest-power staging. Per-step records
// (states, powers, costs) are kept only when asked.
type accumulator struct {
	r      *Result
	e      Energy
	reg    Regions
	keep   bool // every state (Run.Points)
	series bool // every step's input and whether it was served (Energy.KW, served)
	served []bool
	points []optimize.Result
	price  *pricer
	groups map[int]*group
	ref    *Strategy // the lowest-power staging, run before; nil for itself
	beaten beaten
	npsh   *npshRun // nil when the check is not made
}

// beaten is where a strategy draws less than the lowest-power staging
// (both serving the step): the hours and the largest shortfall, a fraction
// of the lowest-power staging's input.
type beaten struct {
	hours, worst float64
}

// group is a flow group of a trend solved interval by interval.
type group struct {
	lp      LoadPoint
	flowH   float64 // Σ load × hours
	best    float64 // distance of the typical state's load from the group's centre
	hasBest bool
	first   optimize.Result
}

func newAccumulator(r *Result, keep, series bool, ref *Strategy) (*accumulator, error) {
	n := len(r.Steps)
	series = series || keep
	pr, err := newPricer(r, r.Steps, keep)
	if err != nil {
		return nil, err
	}
	a := &accumulator{r: r, keep: keep, series: series, price: pr, groups: map[int]*group{}, ref: ref,
		e: Energy{UnmetBy: map[optimize.Limit]float64{}}}
	if keep {
		a.points = make([]optimize.Result, 0, n)
	}
	if series {
		a.served, a.e.KW = make([]bool, n), make([]float64, n)
	}
	return a, nil
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
	kw := 0.0
	if ok {
		kw = float64(res.Power) / curves.KW
		a.e.KWh += kw * st.Hours
		a.e.PeakKW = max(a.e.PeakKW, kw)
		for j := range res.Units {
			u := &res.Units[j] // not a copy: this runs for every unit of every step
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
		if ref := a.ref; ref != nil && ref.served[i] && kw < ref.Energy.KW[i] {
			lo := ref.Energy.KW[i]
			a.beaten.hours += st.Hours
			a.beaten.worst = math.Max(a.beaten.worst, (lo-kw)/lo)
		}
	} else {
		a.e.HoursUnmet += st.Hours
		a.e.UnmetBy[res.Limit] += st.Hours
	}
	if a.series {
		a.served[i], a.e.KW[i] = ok, kw
	}
	cost := a.price.add(i, kw)
	if a.npsh != nil {
		a.npsh.visit(i, res)
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
	g.lp.KWh += kw * st.Hours
	g.lp.Cost += cost
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
// cost of its hours (a group's was added as its intervals were priced).
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

// streamAnnual runs a strategy over steps without keeping its states or
// powers and returns its energy and its bill brought to a year (the
// savings range, the binning check).
func (r *Result) streamAnnual(s optimize.Strategy, steps []optimize.Step, t *ticker) (Energy, econ.Annual, error) {
	e := Energy{UnmetBy: map[optimize.Limit]float64{}}
	pr, err := newPricer(r, steps, false)
	if err != nil {
		return Energy{}, econ.Annual{}, err
	}
	run := s.Stream(steps, func(i int, res *optimize.Result) {
		t.tick()
		st := steps[i]
		e.Hours += st.Hours
		if res.Status != optimize.Served {
			e.HoursUnmet += st.Hours
			e.UnmetBy[res.Limit] += st.Hours
			pr.add(i, 0)
			return
		}
		kw := float64(res.Power) / curves.KW
		e.KWh += kw * st.Hours
		e.PeakKW = max(e.PeakKW, kw)
		pr.add(i, kw)
	})
	e.Name, e.Changes, e.Drives = run.Name, run.Changes, run.Drives
	b, err := pr.bill()
	if err != nil {
		return Energy{}, econ.Annual{}, err
	}
	return e, b.Annualise(r.Period.Factor), nil
}
