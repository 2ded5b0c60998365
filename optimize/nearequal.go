package optimize

import (
	"math"

	"wattstage/curves"
)

// NearEqualTolerance is the power difference within which two stages count
// as drawing the same: 0.5 %, well inside the uncertainty of part-load
// motor and drive data, so a setpoint may move anywhere in the band for
// stability at little cost (wattstage's starting value).
const NearEqualTolerance = 0.005

// NearEqual is the flow range around a crossover over which the stages on
// either side of a change draw within NearEqualTolerance of each other.
type NearEqual struct {
	Low, High curves.Flow // plant flow, m³/s
	// LowSpeed and HighSpeed are the lower stage's common speed at Low and
	// High: the speed form of the band; NaN where it has no drive unit or
	// does not serve the flow.
	LowSpeed, HighSpeed float64
	// LowLimit and HighLimit say what ends the band where it is not the
	// tolerance: a stage that stops serving (its capacity or minimum flow).
	LowLimit, HighLimit string
}

// Contains reports whether q lies in the band.
func (b NearEqual) Contains(q curves.Flow) bool { return q >= b.Low && q <= b.High }

// nearEqual finds the band around a transition's crossover: from the
// crossover down until the upper stage draws NearEqualTolerance more than
// the lower, and up until it draws that much less, each end bisected to
// 1e-4 of the design flow; a stage that stops serving ends the band there.
func (d *deriver) nearEqual(t Transition) *NearEqual {
	if t.Crossover <= 0 {
		return nil
	}
	gap := func(q curves.Flow) (float64, bool) {
		lo, up := d.at(t.Lower, q), d.at(t.Upper, q)
		if lo.Status != Served || up.Status != Served {
			return 0, false
		}
		return float64(up.Power)/float64(lo.Power) - 1, true
	}
	step := d.p.DesignFlow / 100
	tol := d.p.DesignFlow * 1e-4
	edge := func(dir float64) (curves.Flow, string) {
		in := t.Crossover
		for k := 1; k <= 200; k++ {
			q := t.Crossover + curves.Flow(dir*float64(k))*step
			g, ok := gap(q)
			if q <= 0 || !ok {
				// Bisect to where the stages stop serving.
				out := q
				for out-in > tol || in-out > tol {
					m := (in + out) / 2
					if _, ok := gap(m); ok && m > 0 {
						in = m
					} else {
						out = m
					}
				}
				return in, "a stage stops serving the flow"
			}
			if math.Abs(g) > NearEqualTolerance {
				out := q
				for out-in > tol || in-out > tol {
					m := (in + out) / 2
					if g, ok := gap(m); ok && math.Abs(g) <= NearEqualTolerance {
						in = m
					} else {
						out = m
					}
				}
				return in, ""
			}
			in = q
		}
		return in, "the scan's end"
	}
	b := &NearEqual{}
	b.Low, b.LowLimit = edge(-1)
	b.High, b.HighLimit = edge(1)
	b.LowSpeed, b.HighSpeed = d.speedAt(t.Lower, b.Low), d.speedAt(t.Lower, b.High)
	return b
}
