package optimize

import "wattstage/curves"

// fillStages sets each stage's range and the limits at its ends.
func (d *deriver) fillStages(out *Setpoints, grid []curves.Flow) {
	for i := range out.Stages {
		st := &out.Stages[i]
		st.Low, st.High = out.Lowest, out.Capacity
		if i > 0 {
			st.Low = out.Transitions[i-1].Down.Flow
		} else {
			// The lowest flow the first stage serves (below it no
			// combination may serve without bypass: warned by the scan).
			for _, q := range grid {
				if d.served(st.Counts, q) {
					st.Low, _ = d.comboBottom(st.Counts, q, out.Lowest)
					break
				}
			}
		}
		if i < len(out.Transitions) {
			st.High = out.Transitions[i].Up.Flow
		}
		lo, hi := d.at(st.Counts, st.Low), d.at(st.Counts, st.High)
		st.LowLimit, st.HighLimit = pointLimit(&lo), pointLimit(&hi)
		if i == 0 && d.p.MinFlow > 0 && st.Low <= d.p.MinFlow {
			st.LowLimit = LimitPlantBypass
		}
		st.LowSpeed, st.HighSpeed = d.speedOf(lo), d.speedOf(hi)
		st.Served = lo.Status == Served && hi.Status == Served
		for _, q := range grid {
			if q > st.Low && q < st.High && !d.served(st.Counts, q) {
				st.Served = false
				break
			}
		}
		if !st.Served {
			d.warnf("stage %d (%s) does not serve every flow from %s to %s", st.Number, d.describe(st.Counts), d.fmtQ(st.Low), d.fmtQ(st.High))
		}
	}
}
