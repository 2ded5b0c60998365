package optimize

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"wattstage/curves"
	"wattstage/plant"
)

// Staging setpoints: from the lowest-power staging to values a building
// automation system can run.
//
// The stages are the combinations of running units that the common-speed
// optimum picks as the plant flow rises (one speed signal for every running
// unit on a drive, as sequences are programmed). Between two stages A and B
// the stage-up flow is the crossover, the flow Q* where
//
//	P_A(Q*) = P_B(Q*)
//
// with P_X the lowest input of combination X at plant flow Q (found by
// Brent's root search on P_A − P_B; Viholainen et al. 2013 and Bortoni et al.
// 2008 state the equal-power rule for identical units, DOMAIN §7), unless A
// runs out of capacity first: then the stage-up flow sits a margin below the
// flow at which A reaches its limit. The stage-down flow lies a deadband below
// the stage-up flow, widened until the units running just after a stage-up
// turn at least a speed margin faster than their own stage-down speed (so
// that a stage-up never immediately calls for the stage-down), and raised
// where a unit's minimum flow or speed, the plant minimum flow or the band of
// the stage below would be broken.

// Limits that set a staging value, beside the operating limits in types.go.
const (
	LimitCrossover Limit = "power crossover"
	LimitDeadband  Limit = "deadband"
	LimitHunting   Limit = "speed margin (no hunting)"
	LimitBand      Limit = "band of the stage below"
	LimitNextLow   Limit = "lowest flow of the next stage"
)

// SetpointOptions tune the derivation. The zero value takes every default.
type SetpointOptions struct {
	// Deadband is how far the stage-down flow sits below the stage-up flow,
	// as a fraction of the stage-up flow. 0 = DefaultDeadband (0.10).
	Deadband float64
	// SpeedMargin is the least difference, as a fraction of rated speed,
	// between the speed the units run at just after a stage change and the
	// speed that would call the reverse change. 0 = 0.03.
	SpeedMargin float64
	// CapacityMargin: where a stage runs out of capacity before its
	// crossover, stage up at this fraction below the flow where it runs out,
	// so that the stage-up delay does not leave the load short. 0 = 0.03.
	CapacityMargin float64
	// UpDelay and DownDelay are how long a stage-up or stage-down condition
	// must hold before the change. 0 = 5 min and 10 min.
	UpDelay, DownDelay time.Duration
	// CapacityDelay is the stage-up delay where the lower stage runs out of
	// capacity (its units near maximum speed, runout or motor limit) rather
	// than crossing over. 0 = 1 min.
	CapacityDelay time.Duration
	// Points is the number of flow intervals of the staging scan. 0 = 240.
	Points int
}

// DefaultSetpointOptions are the starting values of a derived sequence. The
// delays are the trade's usual ones (stage up after about 5 min, or 1 min
// where the running units are at their limit, down after about 10 min), and
// the capacity margin is the usual offset of about 3 % below a stage
// boundary (common practice and ASHRAE Guideline 36-2021 as quoted in
// public implementation documentation, DOMAIN §7); the deadband and speed
// margin are wattstage's starting values. All are to be adjusted on
// commissioning.
var DefaultSetpointOptions = SetpointOptions{
	Deadband: 0.10, SpeedMargin: 0.03, CapacityMargin: 0.03,
	UpDelay: 5 * time.Minute, DownDelay: 10 * time.Minute, CapacityDelay: time.Minute, Points: 240,
}

// ErrSetpoints classes the errors of DeriveSetpoints.
var ErrSetpoints = errors.New("optimize: cannot derive setpoints")

// Stage is one combination of running units in the sequence.
type Stage struct {
	Number  int   // 1 for the stage that runs at the lowest flow
	Counts  []int // running units per model
	Running int
	// Low and High are the plant flows the stage runs over: from the
	// stage-down flow into the stage below (the lowest plant flow for stage
	// 1) to its own stage-up flow (the plant capacity for the last stage).
	Low, High curves.Flow
	// LowLimit and HighLimit are the operating limits the stage sits on at
	// the ends of its range (minimum speed, plant minimum flow, …), if any.
	LowLimit, HighLimit Limit
	// LowSpeed and HighSpeed are the common speed at the ends of the range;
	// NaN when the stage has no unit on a drive.
	LowSpeed, HighSpeed float64
	Served              bool // every scanned flow of the range is served by this stage
}

// Threshold is one stage-change value, written the ways sequences state it.
type Threshold struct {
	Flow              curves.Flow  // plant (pumped) flow, m³/s
	PerUnit           curves.Flow  // flow per running unit before the change
	Design            float64      // Flow over the plant design flow
	Head              curves.Head  // header head before the change
	Power, PowerAfter curves.Power // input before and after the change at Flow
	Delay             time.Duration
	Limit             Limit // what sets the flow value
	// Speed is the speed form of the value: the common speed of the running
	// drive units just before the change; After is their speed at Flow just
	// after it (fractions of rated). NaN where no running unit is on a drive,
	// or (stage-down) where speed cannot serve as the signal.
	Speed, After float64
	// SpeedFlow is the plant flow at which Speed is reached, SpeedAfter the
	// speed just after a change made there, and SpeedLimit what sets Speed:
	// the same as Flow, After and Limit unless the speed margin lowered a
	// stage-down speed.
	SpeedFlow  curves.Flow
	SpeedAfter float64
	SpeedLimit Limit
}

// Option is one combination of running units at a flow with its input.
type Option struct {
	Counts []int
	Power  curves.Power
	Served bool
	Reason string // why it does not serve, if it does not
}

// Transition is the change between stage From and stage From+1.
type Transition struct {
	From, To     int   // stage numbers
	Lower, Upper []int // running units per model in the two stages
	Start        []int // units to start per model on the way up (stopped on the way down)
	Stop         []int // units to stop per model on the way up (started on the way down)
	// Crossover is the flow where the two stages draw equal input; 0 where
	// the lower stage runs out (or the upper cannot run) before they do.
	Crossover      curves.Flow
	CrossoverPower curves.Power
	Up, Down       Threshold
	// UpOptions are the combinations with the upper stage's count of units
	// at the stage-up flow and DownOptions those with the lower stage's count
	// at the stage-down flow, lowest input first: the reasoning for which
	// model is brought on next and which unit is dropped first.
	UpOptions, DownOptions []Option
	Notes                  []string
}

// Setpoints is a derived staging sequence.
type Setpoints struct {
	Plant       *plant.Plant    `json:"-"`
	Options     SetpointOptions // with the defaults filled in
	Defaults    []string        // options left at their default, in plain words
	Stages      []Stage
	Transitions []Transition
	Lowest      curves.Flow // lowest plant flow scanned (the plant minimum flow, if any)
	Capacity    curves.Flow // most plant flow served on the system curve
	OneOut      *UnitOutCheck
	Warnings    []string
}

// MarshalJSON writes the speeds that do not exist (NaN) as null.
func (t Threshold) MarshalJSON() ([]byte, error) {
	type plain Threshold
	return json.Marshal(struct {
		plain
		Speed, After, SpeedAfter *float64
		DelayMin                 float64
	}{plain(t), finiteOrNil(t.Speed), finiteOrNil(t.After), finiteOrNil(t.SpeedAfter), t.Delay.Minutes()})
}

// MarshalJSON writes the speeds that do not exist (NaN) as null.
func (s Stage) MarshalJSON() ([]byte, error) {
	type plain Stage
	return json.Marshal(struct {
		plain
		LowSpeed, HighSpeed *float64
	}{plain(s), finiteOrNil(s.LowSpeed), finiteOrNil(s.HighSpeed)})
}

func finiteOrNil(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

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
	d.check(out)
	if d.total >= 2 {
		if c, err := CheckUnitOut(p, Options{CommonSpeed: true}); err == nil {
			out.OneOut = &c
		}
	}
	out.Warnings = d.warn
	return out, nil
}

func fillSetpointOptions(o SetpointOptions) (SetpointOptions, []string, error) {
	def := DefaultSetpointOptions
	var used []string
	pick := func(v *float64, dv float64, what string) {
		if *v == 0 {
			*v = dv
			used = append(used, what)
		}
	}
	pick(&o.Deadband, def.Deadband, fmt.Sprintf("deadband %.0f %% of the stage-up flow (wattstage starting value)", 100*def.Deadband))
	pick(&o.SpeedMargin, def.SpeedMargin, fmt.Sprintf("speed margin %.0f %% of rated speed (wattstage starting value)", 100*def.SpeedMargin))
	pick(&o.CapacityMargin, def.CapacityMargin, fmt.Sprintf("capacity margin %.0f %% below the flow where a stage runs out (common practice)", 100*def.CapacityMargin))
	if o.UpDelay == 0 {
		o.UpDelay = def.UpDelay
		used = append(used, "stage-up delay 5 min (common practice)")
	}
	if o.DownDelay == 0 {
		o.DownDelay = def.DownDelay
		used = append(used, "stage-down delay 10 min (common practice)")
	}
	if o.CapacityDelay == 0 {
		o.CapacityDelay = def.CapacityDelay
		used = append(used, "stage-up delay 1 min where the running units are at their limit (common practice)")
	}
	if o.Points == 0 {
		o.Points = def.Points
	}
	switch {
	case o.Deadband < 0 || o.Deadband >= 0.5 || math.IsNaN(o.Deadband):
		return o, nil, fmt.Errorf("%w: deadband %g must be above 0 and below 0.5 of the stage-up flow", ErrSetpoints, o.Deadband)
	case o.SpeedMargin < 0 || o.SpeedMargin >= 0.5 || math.IsNaN(o.SpeedMargin):
		return o, nil, fmt.Errorf("%w: speed margin %g must be above 0 and below 0.5", ErrSetpoints, o.SpeedMargin)
	case o.CapacityMargin < 0 || o.CapacityMargin >= 0.5 || math.IsNaN(o.CapacityMargin):
		return o, nil, fmt.Errorf("%w: capacity margin %g must be above 0 and below 0.5", ErrSetpoints, o.CapacityMargin)
	case o.UpDelay < 0 || o.DownDelay < 0 || o.CapacityDelay < 0:
		return o, nil, fmt.Errorf("%w: delays must not be negative", ErrSetpoints)
	case o.Points < 8:
		return o, nil, fmt.Errorf("%w: the scan needs at least 8 flow intervals", ErrSetpoints)
	}
	return o, used, nil
}

// segment is a run of scan points with one optimal combination.
type segment struct {
	counts []int
	i0, i1 int // first and last grid index
}

// scan finds the optimal combination at every grid flow and groups the
// points into segments. A combination that comes back after another (a
// non-monotone optimum, DOMAIN §10) absorbs the excursion: a sequence needs
// one order of stages.
func (d *deriver) scan(grid []curves.Flow) []segment {
	var segs []segment
	gapFrom := -1
	for i, q := range grid {
		r := d.s.Solve(q)
		if r.Status != Served {
			if gapFrom < 0 {
				gapFrom = i
			}
			continue
		}
		if gapFrom >= 0 {
			d.warnf("no combination of running units serves %s to %s: %s",
				d.fmtQ(grid[gapFrom]), d.fmtQ(grid[i-1]), d.s.Solve(grid[gapFrom]).Reason)
			gapFrom = -1
		}
		if n := len(segs); n > 0 && slices.Equal(segs[n-1].counts, r.Counts) {
			segs[n-1].i1 = i
			continue
		}
		segs = append(segs, segment{counts: append([]int(nil), r.Counts...), i0: i, i1: i})
	}
	for merged := true; merged; {
		merged = false
		for i := 0; i < len(segs) && !merged; i++ {
			for j := len(segs) - 1; j > i+1; j-- {
				if slices.Equal(segs[i].counts, segs[j].counts) {
					d.warnf("the lowest-power staging is not monotone in flow: %s is best again from %s; the sequence keeps it from %s to %s",
						d.describe(segs[i].counts), d.fmtQ(grid[segs[j].i0]), d.fmtQ(grid[segs[i].i0]), d.fmtQ(grid[segs[j].i1]))
					segs[i].i1 = segs[j].i1
					segs = append(segs[:i+1], segs[j+1:]...)
					merged = true
					break
				}
			}
		}
	}
	return segs
}

// at solves a fixed combination at a plant flow.
func (d *deriver) at(cnt []int, q curves.Flow) Result {
	return d.s.SolveWith(q, Constraint{Counts: cnt})
}

func (d *deriver) served(cnt []int, q curves.Flow) bool { return d.at(cnt, q).Status == Served }

// capacity returns the largest flow for which ok holds, searching up from
// the design flow (or down to a served flow) and bisecting the edge.
func (d *deriver) capacity(ok func(curves.Flow) bool) curves.Flow {
	qd := d.p.DesignFlow
	lo, hi := curves.Flow(0), qd
	if ok(qd) {
		lo = qd
		for hi = qd * 1.05; ok(hi); hi *= 1.05 {
			lo = hi
			if hi > 8*qd {
				return hi
			}
		}
	} else {
		found := false
		for q := qd * 0.95; q > qd*0.005; q *= 0.95 {
			if ok(q) {
				lo, hi, found = q, q/0.95, true
				break
			}
		}
		if !found {
			return 0
		}
	}
	return bisectEdge(ok, lo, hi)
}

// bisectEdge narrows [lo, hi] with ok(lo) true and ok(hi) false to the edge,
// returning the last flow where ok holds.
func bisectEdge(ok func(curves.Flow) bool, lo, hi curves.Flow) curves.Flow {
	for it := 0; it < 60 && hi-lo > 1e-10*hi; it++ {
		m := (lo + hi) / 2
		if ok(m) {
			lo = m
		} else {
			hi = m
		}
	}
	return lo
}

// comboTop returns the largest flow a combination serves above a flow where
// it serves, and the limit that stops it there.
func (d *deriver) comboTop(cnt []int, from curves.Flow) (curves.Flow, Limit) {
	ok := func(q curves.Flow) bool { return d.served(cnt, q) }
	lo, hi := from, from
	for hi = from * 1.02; ok(hi); hi *= 1.02 {
		lo = hi
		if hi > 8*d.p.DesignFlow {
			return hi, LimitNone
		}
	}
	top := bisectEdge(ok, lo, hi)
	lim := pointLimit(ptr(d.at(cnt, top)))
	if lim == LimitNone || lim == LimitPlantBypass {
		lim = LimitCapacity
	}
	return top, lim
}

// comboBottom returns the lowest flow, not below floor, a combination serves
// below a flow where it serves, and the limit it sits on there.
func (d *deriver) comboBottom(cnt []int, from, floor curves.Flow) (curves.Flow, Limit) {
	ok := func(q curves.Flow) bool { return d.served(cnt, q) }
	if ok(floor) {
		return floor, pointLimit(ptr(d.at(cnt, floor)))
	}
	// Bisect with the roles reversed: served at from, not at floor.
	lo, hi := floor, from
	for it := 0; it < 60 && hi-lo > 1e-10*hi; it++ {
		m := (lo + hi) / 2
		if ok(m) {
			hi = m
		} else {
			lo = m
		}
	}
	lim := pointLimit(ptr(d.at(cnt, hi)))
	if lim == LimitNone {
		lim = LimitMinFlow
	}
	return hi, lim
}

func ptr(r Result) *Result { return &r }

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
	t.UpOptions = d.options(up, sum(b.counts))
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
		// value at or below it would never be reached (3 % offset, DOMAIN §7).
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
	t.DownOptions = d.options(down, sum(a))
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

// threshold describes a change from combination before to after at flow q.
func (d *deriver) threshold(before, after []int, q curves.Flow, lim Limit, delay time.Duration) Threshold {
	rb, ra := d.at(before, q), d.at(after, q)
	th := Threshold{Flow: q, PerUnit: q / curves.Flow(max(sum(before), 1)), Design: float64(q / d.p.DesignFlow),
		Speed: d.speedOf(rb), After: d.speedOf(ra), Head: rb.HeaderHead,
		Power: rb.Power, PowerAfter: ra.Power, Delay: delay, Limit: lim}
	th.SpeedFlow, th.SpeedAfter, th.SpeedLimit = q, th.After, lim
	return th
}

// options lists every combination of n running units at flow q by input.
func (d *deriver) options(q curves.Flow, n int) []Option {
	var out []Option
	for _, c := range d.combos {
		if sum(c) != n {
			continue
		}
		r := d.at(c, q)
		out = append(out, Option{Counts: append([]int(nil), c...), Power: r.Power, Served: r.Status == Served, Reason: r.Reason})
	}
	// Served first, then by input.
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && optionLess(out[j], out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out
}

func optionLess(a, b Option) bool {
	if a.Served != b.Served {
		return a.Served
	}
	return a.Power < b.Power
}

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

func (d *deriver) warnf(format string, a ...any) { d.warn = append(d.warn, fmt.Sprintf(format, a...)) }

func (d *deriver) fmtQ(q curves.Flow) string { return d.p.Units.FormatFlow(q) }

func (d *deriver) describe(cnt []int) string { return DescribeCounts(d.p, cnt) }

// describeCounts writes a combination as "2 × CHWP-A + 1 × CHWP-B".
// DescribeCounts names a combination of running units, e.g. "2 × L + 1 × S".
func DescribeCounts(p *plant.Plant, cnt []int) string {
	s := ""
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		if s != "" {
			s += " + "
		}
		s += fmt.Sprintf("%d × %s", n, p.Models[i].Name)
	}
	if s == "" {
		return "no unit"
	}
	return s
}

func sum(v []int) int {
	n := 0
	for _, x := range v {
		n += x
	}
	return n
}

// brentRoot finds a root of f in [a, b] where f(a) and f(b) differ in sign,
// to within tol, by Brent's method: inverse quadratic interpolation and
// secant steps kept inside a shrinking bracket, with bisection when they
// stall (R. P. Brent, Algorithms for Minimization without Derivatives,
// Prentice-Hall 1973, ch. 4).
func brentRoot(f func(float64) float64, a, b, fa, fb, tol float64) float64 {
	if fa == 0 {
		return a
	}
	if fb == 0 {
		return b
	}
	const eps = 2.220446049250313e-16
	c, fc := a, fa
	dd := b - a
	e := dd
	for it := 0; it < 200; it++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			dd = b - a
			e = dd
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p, q = 2*xm*s, 1-s
			} else {
				qq, r := fa/fc, fb/fc
				p = s * (2*xm*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e, dd = dd, p/q
			} else {
				dd, e = xm, xm
			}
		} else {
			dd, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(dd) > tol1 {
			b += dd
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
	}
	return b
}
