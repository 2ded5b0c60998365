package optimize

import (
	"fmt"
	"math"
	"time"

	"wattstage/curves"
)

// Basis says which signal a derived sequence stages on.
type Basis int

const (
	// FlowBasis stages on the plant (pumped) flow.
	FlowBasis Basis = iota
	// SpeedBasis stages on the common speed signal of the running drive
	// units; a transition without a usable speed value falls back to flow.
	SpeedBasis
	// FlowAndSpeedBasis stages up when either the flow or the speed stays
	// above its stage-up value (whichever comes first protects capacity),
	// and down only when both stay below their stage-down values (so a
	// noisy flow meter alone cannot drop a unit); a transition without a
	// usable speed value uses flow alone.
	FlowAndSpeedBasis
)

// Bases lists the staging signals by their names.
var Bases = []Basis{FlowBasis, SpeedBasis, FlowAndSpeedBasis}

func (b Basis) String() string {
	switch b {
	case SpeedBasis:
		return "speed"
	case FlowAndSpeedBasis:
		return "flow-and-speed"
	}
	return "flow"
}

// ParseBasis reads a staging signal's name.
func ParseBasis(s string) (Basis, error) {
	for _, b := range Bases {
		if b.String() == s {
			return b, nil
		}
	}
	return FlowBasis, fmt.Errorf("optimize: staging signal %q: give flow, speed or flow-and-speed", s)
}

var _ Strategy = (*Sequenced)(nil)

// Sequenced runs a derived staging sequence as an automation system would:
// the stages in order, one common speed for the running drive units, a stage
// added when the signal stays above the stage-up value for the stage-up delay
// and dropped when it stays below the stage-down value for the stage-down
// delay. A stage that cannot serve the load stages up at once (a capacity
// alarm). On bins (no time order) each bin takes the stage its flow falls
// in going up.
type Sequenced struct {
	Label     string
	Setpoints *Setpoints
	Basis     Basis
	solver    *Solver
}

// NewSequenced returns the derived sequence as a strategy.
func NewSequenced(label string, sp *Setpoints, basis Basis) *Sequenced {
	return &Sequenced{Label: label, Setpoints: sp, Basis: basis, solver: New(sp.Plant, Options{CommonSpeed: true})}
}

func (q *Sequenced) Name() string { return q.Label }

func (q *Sequenced) Run(steps []Step) Run {
	r, _ := q.RunCycling(steps)
	return r
}

// StreamCycling runs the sequence, visiting each step's state as it is
// solved, and counts its stage changes and starts.
func (q *Sequenced) StreamCycling(steps []Step, visit func(int, *Result)) (Run, Cycling) {
	// A solve is a function of the flow and the stage: a trend's repeats
	// are answered from a bounded cache (flowcache.go).
	return q.streamCycling(steps, visit, &SolveCache[stageKey]{})
}

// streamCycling is StreamCycling with the cache c (nil: none).
func (q *Sequenced) streamCycling(steps []Step, visit func(int, *Result), c *SolveCache[stageKey]) (Run, Cycling) {
	sp := q.Setpoints
	p := sp.Plant
	r := Run{Name: q.Label, Drives: drives(p),
		Note: fmt.Sprintf("the derived staging sequence on %s, with its deadbands and delays; one common speed for the running units", q.Basis)}
	cc := newCycleCounter(p)
	last := len(sp.Stages) - 1
	k := -1 // current stage index; -1 = not started
	var upSince, downSince, prev time.Time
	hours := 0.0
	for i, st := range steps {
		hours += st.Hours
		pumped := max(st.Load, p.MinFlow)
		if !st.Timed() {
			res := q.serve(c, st.Load, q.goingUp(pumped))
			visit(i, &res)
			continue
		}
		if k < 0 || (!prev.IsZero() && st.Time.Sub(prev) > 6*time.Hour) {
			// Start, or restart after a long gap in the trend, in the stage the
			// flow falls in going up.
			k = q.goingUp(pumped)
			upSince, downSince = time.Time{}, time.Time{}
		}
		prev = st.Time
		res := q.at(c, st.Load, k)
		for res.Status != Served && k < last {
			cc.change(sp, k, k+1, st.Time)
			k++
			res = q.at(c, st.Load, k)
			upSince, downSince = time.Time{}, time.Time{}
		}
		visit(i, &res)
		if res.Status != Served {
			continue
		}
		end := st.Time.Add(time.Duration(st.Hours * float64(time.Hour)))
		switch {
		case k < last && q.above(res, pumped, k):
			if upSince.IsZero() {
				upSince = st.Time
			}
			downSince = time.Time{}
			if end.Sub(upSince) >= sp.Transitions[k].Up.Delay {
				cc.change(sp, k, k+1, end)
				k++
				upSince = time.Time{}
			}
		case k > 0 && q.below(res, pumped, k-1):
			if downSince.IsZero() {
				downSince = st.Time
			}
			upSince = time.Time{}
			if end.Sub(downSince) >= sp.Transitions[k-1].Down.Delay {
				if q.at(c, st.Load, k-1).Status == Served {
					cc.change(sp, k, k-1, end)
					k--
				}
				downSince = time.Time{}
			}
		default:
			upSince, downSince = time.Time{}, time.Time{}
		}
	}
	cy := cc.finish(hours)
	r.Changes = cy.Changes
	return r, cy
}

// RunCycling runs the sequence, keeping every state, and counts its stage
// changes and starts.
func (q *Sequenced) RunCycling(steps []Step) (Run, Cycling) {
	var pts []Result
	r, cy := q.StreamCycling(steps, func(_ int, res *Result) { pts = append(pts, *res) })
	r.Points = pts
	return r, cy
}

// Stream runs the sequence, visiting each step's state.
func (q *Sequenced) Stream(steps []Step, visit func(int, *Result)) Run {
	r, _ := q.StreamCycling(steps, visit)
	return r
}

// goingUp returns the stage a plant flow falls in as flow rises: the first
// whose stage-up flow lies above it.
func (q *Sequenced) goingUp(pumped curves.Flow) int {
	for k, t := range q.Setpoints.Transitions {
		if pumped < t.Up.Flow {
			return k
		}
	}
	return len(q.Setpoints.Stages) - 1
}

// stageKey fixes a solve of the sequence: the load flow and the stage.
type stageKey struct {
	load  curves.Flow
	stage int
}

// at solves a load in stage k, from the cache c (nil: none) when it was
// solved before.
func (q *Sequenced) at(c *SolveCache[stageKey], load curves.Flow, k int) Result {
	return c.Solve(stageKey{load, k}, q.solveStage)
}

func (q *Sequenced) solveStage(k stageKey) Result {
	return q.solver.SolveWith(k.load, Constraint{Counts: q.Setpoints.Stages[k.stage].Counts})
}

// serve solves a bin in stage k, or in the next stage up that serves it.
func (q *Sequenced) serve(c *SolveCache[stageKey], load curves.Flow, k int) Result {
	first := q.at(c, load, k)
	for j := k; j < len(q.Setpoints.Stages); j++ {
		if r := q.at(c, load, j); r.Status == Served {
			return r
		}
	}
	return first
}

// above reports whether the stage-up condition of transition k holds.
func (q *Sequenced) above(res Result, pumped curves.Flow, k int) bool {
	t := q.Setpoints.Transitions[k]
	flow := pumped > t.Up.Flow
	if q.Basis == FlowBasis || math.IsNaN(t.Up.Speed) {
		return flow
	}
	speed := commonSpeed(res, q.Setpoints.Plant) > t.Up.Speed
	if q.Basis == SpeedBasis {
		return speed
	}
	return flow || speed
}

// below reports whether the stage-down condition of transition k holds.
func (q *Sequenced) below(res Result, pumped curves.Flow, k int) bool {
	t := q.Setpoints.Transitions[k]
	flow := pumped < t.Down.Flow
	if q.Basis == FlowBasis || math.IsNaN(t.Down.Speed) {
		return flow
	}
	speed := commonSpeed(res, q.Setpoints.Plant) < t.Down.Speed
	if q.Basis == SpeedBasis {
		return speed
	}
	return flow && speed
}
