package optimize

import (
	"fmt"
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

// flowDecimals is the number of decimals that writes a flow at the
// sequence's resolution: 0 for steps of 1 and up, 1 for 0.5 or 0.2 …
func (sp *Setpoints) flowDecimals() int {
	return max(0, int(math.Ceil(-math.Log10(sp.Resolution())-1e-9)))
}

// FlowText writes a flow setpoint (display units, at the resolution) with
// as many decimals as the resolution needs: "2,480", or "12.4" on a plant
// whose steps are 0.2 L/s.
func (sp *Setpoints) FlowText(v float64) string { return thousands(v, sp.flowDecimals()) }

// BandWords writes a near-equal band at the sequence's resolution for a
// sentence: "from 2,200 to 2,560 gpm", or, where it rounds to one value,
// "only within one 20 gpm step of 840 gpm".
func (sp *Setpoints) BandWords(b NearEqual) string {
	lo, hi := sp.BandSetpoints(b)
	fu := sp.Plant.Units.FlowUnit()
	if lo == hi {
		return fmt.Sprintf("only within one %s %s step of %s %s", sp.FlowText(sp.Resolution()), fu, sp.FlowText(lo), fu)
	}
	return fmt.Sprintf("from %s to %s %s", sp.FlowText(lo), sp.FlowText(hi), fu)
}

// bandCell writes a near-equal band for a table cell: "2,200–2,560", or
// "840 only" where it rounds to one value.
func (sp *Setpoints) bandCell(lo, hi float64) string {
	if lo == hi {
		return sp.FlowText(lo) + " only"
	}
	return sp.FlowText(lo) + "–" + sp.FlowText(hi)
}
