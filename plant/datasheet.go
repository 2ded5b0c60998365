package plant

import (
	"math"

	"wattstage/curves"
)

// Tolerances of the datasheet checks.
const (
	// ShutoffPowerTolerance is the largest difference between a shutoff
	// shaft power given in the file and the fitted one, as a fraction of the
	// given value, passed without a warning: about what can be read off a
	// printed power curve (common practice).
	ShutoffPowerTolerance = 0.05
	// BEPFlowTolerance is the largest distance in flow between the fitted
	// best efficiency point and the datasheet point of highest efficiency,
	// as a fraction of that point's flow, passed without a warning.
	BEPFlowTolerance = 0.10
)

// checkDatasheet warns where the fitted curve departs from what the
// datasheet says: a shutoff shaft power the efficiency fit cannot use,
// and a fitted best efficiency point away from the datasheet's best point.
func (d *decoder) checkDatasheet(s *pumpSpec) {
	p := s.model.Pump
	if i := p.ShutoffPoint(); i >= 0 && i < len(s.pointNodes) && s.pointNodes[i] != nil {
		given := p.Points[i].Shaft
		fitted := p.ShutoffPower(curves.ReferenceDensity)
		if diff := float64(fitted-given) / float64(given); math.Abs(diff) > ShutoffPowerTolerance {
			d.warnf(d.resolve(s.pointNodes[i].vals["shaft_power"]), join(index(join(s.path, "curve"), i), "shaft_power"),
				"the shutoff shaft power %s is not used by the efficiency fit (a point without flow has no efficiency to fit); the fit gives %s at zero flow, %+.0f %% off: shaft powers near shutoff are the fit's, not the datasheet's (check the point, or add points at low flow)",
				d.fmtPower(given), d.fmtPower(fitted), 100*diff)
		}
	}
	if b := p.DatasheetBest(); b >= 0 {
		best := p.Points[b]
		if off := float64(p.BEPFlow-best.Flow) / float64(best.Flow); math.Abs(off) > BEPFlowTolerance {
			side := "above"
			if off < 0 {
				side = "below"
			}
			d.warnf(s.curveNode, join(s.path, "curve"),
				"the fitted best efficiency point (%s, %s %%) is %.1f %% %s the datasheet's best point (%s, %s %%, curve[%d]): the efficiency fit misses the peak, and the preferred region and %% of BEP flows follow the fitted one (check the efficiencies, or add points around the peak)",
				d.fmtFlow(p.BEPFlow), fmtNum(100*p.BEPEff), 100*math.Abs(off), side, d.fmtFlow(best.Flow), fmtNum(100*best.Eff), b)
		}
	}
}
