package optimize

import (
	"sort"

	"wattstage/curves"
)

// Energy sums a strategy's run over the profile.
type Energy struct {
	Name       string
	KWh        float64           // energy over the profile's hours
	PeakKW     float64           // highest step input
	Hours      float64           // hours of the profile
	HoursUnmet float64           // hours the strategy could not serve
	UnmetBy    map[Limit]float64 // unmet hours by reason
	Changes    int               // stage changes (time-ordered profiles)
	Drives     int
	KW         []float64 // input per step, kW (0 for unmet steps)
}

// Sum totals a run over its steps. Unmet steps add no energy: their hours
// are reported instead.
func Sum(run Run, steps []Step) Energy {
	e := Energy{Name: run.Name, Changes: run.Changes, Drives: run.Drives, UnmetBy: map[Limit]float64{},
		KW: make([]float64, len(steps))}
	for i, st := range steps {
		r := run.Points[i]
		e.Hours += st.Hours
		if r.Status != Served {
			e.HoursUnmet += st.Hours
			e.UnmetBy[r.Limit] += st.Hours
			continue
		}
		kw := float64(r.Power) / curves.KW
		e.KW[i] = kw
		e.KWh += kw * st.Hours
		if kw > e.PeakKW {
			e.PeakKW = kw
		}
	}
	return e
}

// UnmetReasons lists the unmet reasons in a stable order.
func (e Energy) UnmetReasons() []Limit {
	var out []Limit
	for l := range e.UnmetBy {
		out = append(out, l)
	}
	sort.Slice(out, func(i, j int) bool { return out[i] < out[j] })
	return out
}
