package optimize

import (
	"errors"
	"fmt"
	"math"

	"wattstage/curves"
	"wattstage/plant"
)

// ErrSetpoints classes the errors of DeriveSetpoints.
var ErrSetpoints = errors.New("optimize: cannot derive setpoints")

// deriver holds the state of one derivation.
type deriver struct {
	p      *plant.Plant
	s      *Solver
	opt    SetpointOptions
	total  int
	combos [][]int
	warn   []string
}

// DeriveSetpoints derives a staging sequence from the plant's lowest-power
// common-speed staging: the stages, the stage-up and stage-down values in
// flow and speed terms with the limit that sets each, the delays, the order
// of units and the one-unit-out response.
func DeriveSetpoints(p *plant.Plant, opt SetpointOptions) (*Setpoints, error) {
	if p == nil || len(p.Models) == 0 {
		return nil, fmt.Errorf("%w: no pump models", ErrSetpoints)
	}
	if p.DesignFlow <= 0 || p.System == nil {
		return nil, fmt.Errorf("%w: the plant needs a design flow and a system curve", ErrSetpoints)
	}
	out := &Setpoints{Plant: p}
	var err error
	if out.Options, out.Defaults, err = fillSetpointOptions(opt); err != nil {
		return nil, err
	}
	d := &deriver{p: p, s: New(p, Options{CommonSpeed: true}), opt: out.Options}
	for _, m := range p.Models {
		d.total += m.Count
	}
	if d.total == 0 {
		return nil, fmt.Errorf("%w: no units installed", ErrSetpoints)
	}
	d.combos = enumerate(p.Models)

	capFlow := d.capacity(func(q curves.Flow) bool { return d.s.Solve(q).Status == Served })
	if capFlow <= 0 {
		return nil, fmt.Errorf("%w: the units serve no flow on the system curve", ErrSetpoints)
	}
	lo := p.MinFlow
	if lo <= 0 {
		lo = capFlow / curves.Flow(d.opt.Points)
	}
	if lo >= capFlow {
		return nil, fmt.Errorf("%w: the plant minimum flow %s is at or above the capacity %s",
			ErrSetpoints, p.Units.FormatFlow(p.MinFlow), p.Units.FormatFlow(capFlow))
	}
	out.Lowest, out.Capacity = lo, capFlow
	grid := make([]curves.Flow, d.opt.Points+1)
	for i := range grid {
		grid[i] = lo + (capFlow-lo)*curves.Flow(float64(i)/float64(d.opt.Points))
	}
	grid[len(grid)-1] = capFlow * (1 - 1e-9)
	segs := d.scan(grid)
	if len(segs) == 0 {
		return nil, fmt.Errorf("%w: no flow of the scan is served", ErrSetpoints)
	}
	for {
		out.Transitions = out.Transitions[:0]
		for i := 0; i+1 < len(segs); i++ {
			out.Transitions = append(out.Transitions, d.transition(segs[i], segs[i+1], grid, i+1))
		}
		k := d.narrowStage(out.Transitions)
		if k < 0 {
			break
		}
		d.warnf("%s would run only from %s to %s, too narrow a band to stage into and out of: the sequence skips it",
			d.describe(segs[k].counts), d.fmtQ(out.Transitions[k-1].Up.Flow), d.fmtQ(out.Transitions[k].Up.Flow))
		segs = append(segs[:k], segs[k+1:]...)
	}
	for i, sg := range segs {
		out.Stages = append(out.Stages, Stage{Number: i + 1, Counts: sg.counts, Running: sum(sg.counts)})
	}
	for i := range out.Transitions {
		d.stageDown(out.Transitions, i, lo)
	}
	d.fillStages(out, grid)
	for i := range out.Transitions {
		out.Transitions[i].Band = d.nearEqual(out.Transitions[i])
	}
	out.Signal, out.SignalWhy = chooseSignal(out, d.opt.Signal)
	d.check(out)
	if d.total >= 2 {
		if c, err := CheckUnitOut(p, Options{CommonSpeed: true}); err == nil {
			out.OneOut = &c
		}
	}
	out.Warnings = d.warn
	return out, nil
}

// at solves a fixed combination at a plant flow.
func (d *deriver) at(cnt []int, q curves.Flow) Result {
	return d.s.SolveWith(q, Constraint{Counts: cnt})
}

func (d *deriver) served(cnt []int, q curves.Flow) bool { return d.at(cnt, q).Status == Served }

func ptr(r Result) *Result { return &r }

func (d *deriver) speedAt(cnt []int, q curves.Flow) float64 {
	r := d.at(cnt, q)
	if r.Status != Served {
		return math.NaN()
	}
	return d.speedOf(r)
}

// speedOf returns the common speed of a result's drive units; NaN when none
// runs on a drive or the point is not served.
func (d *deriver) speedOf(r Result) float64 {
	if r.Status != Served {
		return math.NaN()
	}
	for _, u := range r.Units {
		if d.p.Models[u.Model].Drive.Variable() {
			return u.Speed
		}
	}
	return math.NaN()
}

func (d *deriver) warnf(format string, a ...any) { d.warn = append(d.warn, fmt.Sprintf(format, a...)) }

func (d *deriver) fmtQ(q curves.Flow) string { return d.p.Units.FormatFlow(q) }

func (d *deriver) describe(cnt []int) string { return DescribeCounts(d.p, cnt) }
