package study

import (
	"wattstage/optimize"
)

// rangeCase re-runs the lowest-power staging and the baseline on the plant
// varied by one sensitivity, priced and brought to a year as the expected
// case is. Both strategies are built on the same varied plant, so the
// losses of across-the-line motors in a fixed-speed baseline move with the
// drives' (curves.Rewire).
func (r *Result) rangeCase(s Sensitivity, base string) (RangeCase, error) {
	v := Vary(r.Plant, s)
	var lowest, baseline optimize.Strategy
	var sp *optimize.Setpoints
	if base == KeyDerived {
		// The setpoints a study of the varied plant would derive.
		sp, _ = optimize.DeriveSetpoints(v, optimize.SetpointOptions{})
	}
	for _, k := range Strategies(v, sp) {
		switch k.Key {
		case KeyLowest:
			lowest = k.Strategy
		case base:
			baseline = k.Strategy
		}
	}
	_, la, err := r.streamAnnual(lowest, r.Steps, r.tick)
	if err != nil {
		return RangeCase{}, err
	}
	_, ba, err := r.streamAnnual(baseline, r.Steps, r.tick)
	if err != nil {
		return RangeCase{}, err
	}
	return RangeCase{Sensitivity: s, BaselineKWh: ba.Energy, LowestKWh: la.Energy, SavedKWh: ba.Energy - la.Energy,
		SavedCost: ba.Total - la.Total}, nil
}

// addRangeCase adds a case and widens the range to hold it. The range
// starts at the expected case, so it always brackets it.
func (r *Result) addRangeCase(rc RangeCase) {
	lo := r.Strategy(KeyLowest)
	if r.Range == nil {
		sv := lo.Savings
		r.Range = &Range{Low: sv.Energy, High: sv.Energy, LowCost: sv.Cost, HighCost: sv.Cost, LowBy: "as given", HighBy: "as given"}
	}
	g := r.Range
	g.Cases = append(g.Cases, rc)
	if rc.SavedKWh < g.Low {
		g.Low, g.LowCost, g.LowBy = rc.SavedKWh, rc.SavedCost, rc.Sensitivity.Label
	}
	if rc.SavedKWh > g.High {
		g.High, g.HighCost, g.HighBy = rc.SavedKWh, rc.SavedCost, rc.Sensitivity.Label
	}
}
