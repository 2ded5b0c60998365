package optimize

import (
	"math"

	"wattstage/curves"
)

// Resolution is the step, in the plant's display flow unit, to which the
// sequence writes its flow setpoints: the largest of 1, 2 or 5 × 10ⁿ not
// above 1 % of the design flow. The stages draw nearly the same power over
// a band much wider than that (see NearEqual), so more digits would only
// suggest a precision the data do not have.
func (sp *Setpoints) Resolution() float64 {
	one := 0.01 * sp.Plant.Units.FlowOut(sp.Plant.DesignFlow)
	if !(one > 0) {
		return 1
	}
	mag := math.Pow(10, math.Floor(math.Log10(one)))
	for _, f := range []float64{5, 2, 1} {
		if f*mag <= one {
			return f * mag
		}
	}
	return mag
}

// FlowSetpoint is a flow rounded to the sequence's resolution, in display
// units.
func (sp *Setpoints) FlowSetpoint(q curves.Flow) float64 {
	r := sp.Resolution()
	return math.Round(sp.Plant.Units.FlowOut(q)/r) * r
}

// BandSetpoints is a near-equal band at the sequence's resolution, rounded
// inward (the low end up, the high end down) so that the written band lies
// inside the computed one; the two meet where the band is narrower than a
// step.
func (sp *Setpoints) BandSetpoints(b NearEqual) (lo, hi float64) {
	r := sp.Resolution()
	u := sp.Plant.Units
	lo, hi = math.Ceil(u.FlowOut(b.Low)/r)*r, math.Floor(u.FlowOut(b.High)/r)*r
	if hi < lo {
		mid := math.Round(u.FlowOut((b.Low+b.High)/2)/r) * r
		lo, hi = mid, mid
	}
	return lo, hi
}
