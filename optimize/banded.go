package optimize

import (
	"fmt"

	"wattstage/curves"
	"wattstage/plant"
)

var _ Strategy = (*Banded)(nil)

// Banded runs a plant the way its operators do today when the sequence
// gives a number of units by plant-flow band (or a fixed number always
// running): at each step the band's number of units, the best combination
// of that many, at fixed speed riding their curves with a valve burning the
// extra head (FixedSpeed) or on their drives at one common speed. Where
// the band's units cannot serve the flow, one more runs, as an operator
// would on a capacity alarm; the hours this happens are counted.
type Banded struct {
	Label  string
	Plant  *plant.Plant // the plant as run today (its fixed-speed variant when FixedSpeed)
	seq    plant.Sequence
	solver *Solver
	total  int
}

// NewBanded returns the plant's band sequence as a strategy.
func NewBanded(label string, p *plant.Plant, seq plant.Sequence) *Banded {
	run, opt := p, Options{CommonSpeed: true}
	if seq.FixedSpeed {
		run, opt = FixedVariant(p), Options{}
	}
	b := &Banded{Label: label, Plant: run, seq: seq, solver: New(run, opt)}
	for _, m := range run.Models {
		b.total += m.Count
	}
	return b
}

func (b *Banded) Name() string { return b.Label }

// solve serves a load with the band's units, or more where they cannot.
func (b *Banded) solve(load curves.Flow) (Result, bool) {
	n := min(b.seq.RunningAt(load), b.total)
	first := b.solver.SolveWith(load, Constraint{Total: n})
	if first.Status == Served {
		return first, false
	}
	for k := n + 1; k <= b.total; k++ {
		if r := b.solver.SolveWith(load, Constraint{Total: k}); r.Status == Served {
			r.Warnings = append(r.Warnings, fmt.Sprintf("the sequence's %d units cannot serve this flow: %d run (a capacity alarm)", n, k))
			return r, true
		}
	}
	return first, false
}

func (b *Banded) Stream(steps []Step, visit func(int, *Result)) Run {
	how := "on their drives at one common speed"
	if b.seq.FixedSpeed {
		how = "at fixed speed, a valve throttling the extra head"
	}
	r := Run{Name: b.Label, Plant: b.Plant, Drives: drives(b.Plant),
		Note: "the units the current sequence runs in each flow band, " + how}
	prev := -1
	for i, st := range steps {
		res, _ := b.solve(st.Load)
		visit(i, &res)
		prev = countChange(&r, st, res, prev)
	}
	return r
}
