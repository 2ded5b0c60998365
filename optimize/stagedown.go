package optimize

import (
	"fmt"
	"math"

	"wattstage/curves"
)

// stageDown places the stage-down value of transition k: a deadband below
// the stage-up flow, raised for the upper stage's lowest flow, the plant
// minimum flow and the band of the stage below. The speed form is the
// upper stage's speed at that flow, lowered where needed so that the units
// running just after a stage-up turn at least SpeedMargin faster than it
// (under differential-pressure control the speed changes little with flow
// at low load, so the speed form often needs a wider band than the flow
// form).
func (d *deriver) stageDown(ts []Transition, k int, lowest curves.Flow) {
	t := &ts[k]
	a, b := t.Lower, t.Upper
	up := t.Up.Flow
	down, lim := up*curves.Flow(1-d.opt.Deadband), LimitDeadband
	if bot, bl := d.comboBottom(b, up, lowest); down < bot {
		down, lim = bot, bl
		t.Notes = append(t.Notes, fmt.Sprintf("%s cannot run below %s (%s)", d.describe(b), d.fmtQ(bot), bl))
	}
	if mf := d.p.MinFlow; mf > 0 && down < mf*1.03 {
		// The bypass holds the pumped flow at the plant minimum: a stage-down
		// value at or below it would never be reached (3 % offset, docs/sources.md §7).
		down, lim = mf*1.03, LimitPlantBypass
	}
	if k > 0 && down < ts[k-1].Up.Flow {
		down, lim = ts[k-1].Up.Flow, LimitBand
		t.Notes = append(t.Notes, "stage-down raised to the stage-up flow of the stage below so that the bands do not overlap")
	}
	if down >= up {
		d.warnf("stage %d → %d: no room for a deadband (stage-down %s at or above stage-up %s); hunting likely, review the stages",
			t.From, t.To, d.fmtQ(down), d.fmtQ(up))
	}
	t.Down = d.threshold(b, a, down, lim, d.opt.DownDelay)
	d.speedDown(ts, k, lowest)
	t.DownOptions, t.DownOthers = d.options(down, sum(a))
}

// speedDown sets the speed form of a stage-down value (Down.Speed, its flow
// Down.SpeedFlow and Down.SpeedLimit): the highest flow at or below the
// stage-down flow where the upper stage runs at least SpeedMargin slower than
// just after the stage-up, and the lower stage, once back, at least
// SpeedMargin slower than its own stage-up speed.
func (d *deriver) speedDown(ts []Transition, k int, lowest curves.Flow) {
	t := &ts[k]
	if math.IsNaN(t.Up.After) || math.IsNaN(t.Down.Speed) {
		return
	}
	upper, lower := t.Up.After-d.opt.SpeedMargin, t.Up.Speed-d.opt.SpeedMargin
	fits := func(q curves.Flow) bool {
		sb, sa := d.speedAt(t.Upper, q), d.speedAt(t.Lower, q)
		if math.IsNaN(sb) {
			return false
		}
		return sb <= upper && (math.IsNaN(sa) || sa <= lower)
	}
	if fits(t.Down.Flow) {
		return
	}
	floor := lowest
	if k > 0 {
		floor = max(floor, ts[k-1].Up.Flow)
	}
	if !fits(floor) {
		t.Down.Speed, t.Down.SpeedAfter, t.Down.SpeedFlow, t.Down.SpeedLimit = math.NaN(), math.NaN(), 0, LimitHunting
		t.Notes = append(t.Notes, fmt.Sprintf("the speeds stay within %.0f %% of the speeds at stage-up down to %s: stage down on flow, not on speed",
			100*d.opt.SpeedMargin, d.fmtQ(floor)))
		return
	}
	lo, hi := floor, t.Down.Flow
	for it := 0; it < 60 && hi-lo > 1e-10*hi; it++ {
		m := (lo + hi) / 2
		if fits(m) {
			lo = m
		} else {
			hi = m
		}
	}
	t.Down.Speed, t.Down.SpeedAfter = d.speedAt(t.Upper, lo), d.speedAt(t.Lower, lo)
	t.Down.SpeedFlow, t.Down.SpeedLimit = lo, LimitHunting
	t.Notes = append(t.Notes, fmt.Sprintf("speed form of the stage-down lowered to %.1f %% (reached at %s) for a %.0f %% speed margin each way",
		100*t.Down.Speed, d.fmtQ(lo), 100*d.opt.SpeedMargin))
}
