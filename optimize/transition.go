package optimize

import (
	"fmt"
	"math"
	"time"

	"wattstage/curves"
)

// transition places the stage-up value between two successive segments.
func (d *deriver) transition(a, b segment, grid []curves.Flow, from int) Transition {
	t := Transition{From: from, To: from + 1, Lower: a.counts, Upper: b.counts,
		Start: make([]int, len(a.counts)), Stop: make([]int, len(a.counts))}
	for i := range a.counts {
		if dlt := b.counts[i] - a.counts[i]; dlt > 0 {
			t.Start[i] = dlt
		} else {
			t.Stop[i] = -dlt
		}
	}
	qa, qb := grid[a.i1], grid[b.i0]
	aTop, aLim := d.comboTop(a.counts, qa)
	bBot, bLim := d.comboBottom(b.counts, qb, qa)
	diff := func(q curves.Flow) float64 {
		return float64(d.at(a.counts, q).Power - d.at(b.counts, q).Power)
	}
	lo, hi := bBot, math.Min(float64(aTop), float64(qb))
	var up curves.Flow
	var lim Limit
	switch {
	case float64(lo) >= hi:
		// Nothing in common: the lower stage runs out before the upper can run.
		up, lim = aTop, aLim
		t.Notes = append(t.Notes, fmt.Sprintf("%s cannot run below %s (%s) and %s runs out at %s (%s): flows between are unreachable without bypass",
			d.describe(b.counts), d.fmtQ(bBot), bLim, d.describe(a.counts), d.fmtQ(aTop), aLim))
	default:
		fl, fh := diff(lo), diff(curves.Flow(hi))
		switch {
		case fl > 0:
			up, lim = bBot, LimitNextLow
			t.Notes = append(t.Notes, fmt.Sprintf("%s draws less as soon as it can run (from %s, its %s)",
				d.describe(b.counts), d.fmtQ(bBot), bLim))
		case fh < 0:
			up, lim = aTop, aLim
		default:
			x := brentRoot(func(q float64) float64 { return diff(curves.Flow(q)) },
				float64(lo), hi, fl, fh, 1e-10*float64(d.p.DesignFlow))
			t.Crossover = curves.Flow(x)
			t.CrossoverPower = d.at(a.counts, t.Crossover).Power
			up, lim = t.Crossover, LimitCrossover
		}
	}
	// Stage up ahead of the lower stage's capacity so that the delay does not
	// leave the load short.
	if early := aTop * curves.Flow(1-d.opt.CapacityMargin); up > early && aLim != LimitNone {
		t.Notes = append(t.Notes, fmt.Sprintf("%s reaches its %s at %s: stage up %.0f %% below it",
			d.describe(a.counts), aLim, d.fmtQ(aTop), 100*d.opt.CapacityMargin))
		up, lim = early, aLim
	}
	delay := d.opt.UpDelay
	if lim != LimitCrossover && lim != LimitNextLow {
		delay = d.opt.CapacityDelay
	}
	t.Up = d.threshold(a.counts, b.counts, up, lim, delay)
	t.UpOptions, t.UpOthers = d.options(up, sum(b.counts))
	return t
}

// narrowStage returns the index of the first interior stage whose band, from
// the stage-up flow into it to its own stage-up flow, is narrower than half
// a deadband (a stage that cannot hold its deadband), or -1.
func (d *deriver) narrowStage(ts []Transition) int {
	for k := 1; k < len(ts); k++ {
		if ts[k].Up.Flow-ts[k-1].Up.Flow < curves.Flow(0.5*d.opt.Deadband)*ts[k].Up.Flow {
			return k
		}
	}
	return -1
}

// threshold describes a change from combination before to after at flow q.
func (d *deriver) threshold(before, after []int, q curves.Flow, lim Limit, delay time.Duration) Threshold {
	rb, ra := d.at(before, q), d.at(after, q)
	th := Threshold{Flow: q, PerUnit: q / curves.Flow(max(sum(before), 1)), Design: float64(q / d.p.DesignFlow),
		Speed: d.speedOf(rb), After: d.speedOf(ra), Head: rb.HeaderHead,
		Power: rb.Power, PowerAfter: ra.Power, Delay: delay, Limit: lim}
	th.SpeedFlow, th.SpeedAfter, th.SpeedLimit = q, th.After, lim
	return th
}

// maxOptions is how many combinations of a count of units a change lists
// (its reasoning for which unit comes on or goes off): every one where
// there are no more, else the cheapest of those the branch and bound
// evaluates.
const maxOptions = 8

// optionsKeep is how far above the cheapest combination the branch and
// bound looks for the others listed on a plant of many combinations, and
// optionsLooked how many it evaluates at most, lowest bound first.
const (
	optionsKeep   = 0.10
	optionsLooked = 64
)

// options lists the combinations of n running units at flow q by input
// (every one, or the maxOptions cheapest where there are more), and how
// many combinations of n units it leaves out.
func (d *deriver) options(q curves.Flow, n int) ([]Option, int) {
	all := d.s.byTotal[n]
	list := all
	if len(all) > maxOptions {
		list = d.s.closeVectors(q, n, optionsKeep, optionsLooked)
	}
	var out []Option
	for _, c := range list {
		r := d.at(c, q)
		out = append(out, Option{Counts: append([]int(nil), c...), Power: r.Power, Served: r.Status == Served, Reason: r.Reason})
	}
	// Served first, then by input.
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && optionLess(out[j], out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	if len(out) > maxOptions {
		out = out[:maxOptions]
	}
	return out, len(all) - len(out)
}

func optionLess(a, b Option) bool {
	if a.Served != b.Served {
		return a.Served
	}
	return a.Power < b.Power
}
