package optimize

import (
	"math"

	"wattstage/plant"
	"wattstage/profile"
)

// StepsFromBins turns a plant's load bins into steps.
func StepsFromBins(bins []plant.Bin) []Step {
	out := make([]Step, len(bins))
	for i, b := range bins {
		out[i] = Step{Load: b.Flow, Hours: b.Hours, MeasuredKW: math.NaN()}
	}
	return out
}

// StepsFromTrend turns a trend's points, in time order, into steps.
func StepsFromTrend(points []profile.Point) []Step {
	out := make([]Step, len(points))
	for i, p := range points {
		kw := math.NaN()
		if p.HasPower {
			kw = float64(p.Power) / 1000
		}
		out[i] = Step{Time: p.Time, Load: p.Flow, Hours: p.Hours, MeasuredKW: kw}
		if p.HasDP {
			out[i].DP = p.DP
		}
	}
	return out
}

// StepsFromBinned turns a binned trend into untimed steps at the bins' centres (where
// the binning error estimate of profile.Binned applies).
func StepsFromBinned(b *profile.Binned) []Step {
	out := make([]Step, 0, len(b.Bins))
	for _, fb := range b.Bins {
		kw := math.NaN()
		if fb.PowerHours > 0 {
			kw = float64(fb.Power) / 1000
		}
		out = append(out, Step{Load: fb.Centre, Hours: fb.Hours, MeasuredKW: kw})
	}
	return out
}
