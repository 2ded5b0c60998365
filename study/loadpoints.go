package study

import (
	"math"
	"sort"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
)

// loadPoints builds a strategy's load points from its run: each step its
// own point for bins, and for a trend solved interval by interval the
// intervals gathered into flow groups LoadBinWidth wide (a zero flow a group
// of its own). Hours, kWh and cost add up, so the points' sums are the
// period's totals: the cost of a point is the tariff's energy cost of its
// hours (bill.SampleCost), not a flat price.
func loadPoints(r *Result, run optimize.Run, e Energy, bill *econ.Bill) []LoadPoint {
	w := float64(r.LoadBinWidth)
	if w <= 0 {
		out := make([]LoadPoint, len(r.Steps))
		for i, st := range r.Steps {
			lp := LoadPoint{Low: st.Load, High: st.Load, Flow: st.Load, Steps: 1, Hours: st.Hours,
				KWh: e.KW[i] * st.Hours, KW: e.KW[i], Cost: bill.SampleCost[i], State: run.Points[i]}
			if run.Points[i].Status != optimize.Served {
				lp.HoursUnmet = st.Hours
			}
			out[i] = lp
		}
		return out
	}
	groups := map[int]*LoadPoint{}
	members := map[int][]int{}
	for i, st := range r.Steps {
		k := -1
		if st.Load > 0 {
			k = int(math.Floor(float64(st.Load) / w))
		}
		lp := groups[k]
		if lp == nil {
			lp = &LoadPoint{Grouped: true}
			if k >= 0 {
				lp.Low, lp.High = r.LoadBinWidth*toFlow(k), r.LoadBinWidth*toFlow(k+1)
			}
			groups[k] = lp
		}
		members[k] = append(members[k], i)
		lp.Steps++
		lp.Hours += st.Hours
		lp.Flow += st.Load * toFlow(st.Hours)
		lp.KWh += e.KW[i] * st.Hours
		lp.Cost += bill.SampleCost[i]
		if run.Points[i].Status != optimize.Served {
			lp.HoursUnmet += st.Hours
		}
	}
	keys := make([]int, 0, len(groups))
	for k := range groups {
		keys = append(keys, k)
	}
	sort.Ints(keys)
	out := make([]LoadPoint, 0, len(keys))
	for _, k := range keys {
		lp := groups[k]
		if lp.Hours > 0 {
			lp.Flow /= toFlow(lp.Hours)
		}
		if served := lp.Hours - lp.HoursUnmet; served > 0 {
			lp.KW = lp.KWh / served
		}
		lp.State = typicalState(r, run, members[k], lp)
		out = append(out, *lp)
	}
	return out
}

// typicalState picks the served interval of a group nearest its mean flow
// (the first unserved one when none is served).
func typicalState(r *Result, run optimize.Run, idx []int, lp *LoadPoint) optimize.Result {
	best, bestD := -1, math.Inf(1)
	for _, i := range idx {
		if run.Points[i].Status != optimize.Served {
			continue
		}
		if d := math.Abs(float64(r.Steps[i].Load - lp.Flow)); d < bestD {
			best, bestD = i, d
		}
	}
	if best < 0 {
		best = idx[0]
	}
	return run.Points[best]
}

func toFlow[T int | float64](v T) curves.Flow { return curves.Flow(v) }
