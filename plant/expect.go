package plant

import (
	"wattstage/curves"
	"wattstage/profile"
)

// TrendExpect is what the plant says its trend's flows should look like,
// for profile.Trend.Plausible: the design flow, the most every unit
// together can move (each model's runout at its maximum speed, by the
// affinity law Q ∝ n, times its count) and the plant minimum flow, with
// flows written in the plant file's unit.
func (p *Plant) TrendExpect() profile.Expect {
	var capacity curves.Flow
	for _, m := range p.Models {
		capacity += m.Runout * curves.Flow(m.MaxSpeed*float64(m.Count))
	}
	return profile.Expect{DesignFlow: p.DesignFlow, Capacity: capacity, MinFlow: p.MinFlow, Format: p.Units.FormatFlow}
}
