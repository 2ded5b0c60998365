package optimize

import "math"

// check verifies the finished sequence: stage-up values rise, every
// stage-down value is below its stage-up value and at or above the stage-up
// value of the stage below (bands never overlap), and the speed margins hold.
func (d *deriver) check(out *Setpoints) {
	ts := out.Transitions
	for k := range ts {
		t := &ts[k]
		if k > 0 && t.Up.Flow <= ts[k-1].Up.Flow {
			d.warnf("stage-up %d → %d at %s is not above the stage-up %d → %d at %s",
				t.From, t.To, d.fmtQ(t.Up.Flow), ts[k-1].From, ts[k-1].To, d.fmtQ(ts[k-1].Up.Flow))
		}
		if k > 0 && t.Down.Flow < ts[k-1].Up.Flow {
			d.warnf("bands overlap: stage-down %d → %d at %s below stage-up %d → %d at %s",
				t.To, t.From, d.fmtQ(t.Down.Flow), ts[k-1].From, ts[k-1].To, d.fmtQ(ts[k-1].Up.Flow))
		}
		if t.Down.Flow >= t.Up.Flow {
			d.warnf("stage %d → %d: stage-down flow %s is not below the stage-up flow %s", t.To, t.From, d.fmtQ(t.Down.Flow), d.fmtQ(t.Up.Flow))
		}
		if math.IsNaN(t.Up.Speed) || math.IsNaN(t.Down.Speed) {
			continue
		}
		// No hunting in speed terms, both ways.
		if t.Down.Speed > t.Up.After-d.opt.SpeedMargin*(1-1e-6) {
			d.warnf("stage %d → %d: the speed just after stage-up (%.1f %%) is within %.0f %% of the stage-down speed (%.1f %%)",
				t.From, t.To, 100*t.Up.After, 100*d.opt.SpeedMargin, 100*t.Down.Speed)
		}
		if t.Down.SpeedAfter > t.Up.Speed-d.opt.SpeedMargin*(1-1e-6) {
			d.warnf("stage %d → %d: the speed just after stage-down (%.1f %%) is within %.0f %% of the stage-up speed (%.1f %%)",
				t.To, t.From, 100*t.Down.SpeedAfter, 100*d.opt.SpeedMargin, 100*t.Up.Speed)
		}
		// The stage between two transitions must stage down below where it stages up.
		if k+1 < len(ts) && !math.IsNaN(ts[k+1].Up.Speed) && t.Down.Speed >= ts[k+1].Up.Speed {
			d.warnf("stage %d: stage-down speed %.1f %% is not below its stage-up speed %.1f %%",
				t.To, 100*t.Down.Speed, 100*ts[k+1].Up.Speed)
		}
	}
}
