package optimize

import (
	"math"
	"time"

	"wattstage/curves"
	"wattstage/plant"
)

// Step is one interval of a trend or one bin of a load profile.
type Step struct {
	Time       time.Time   // start of the interval; zero for a bin
	Load       curves.Flow // flow through the load, m³/s
	Hours      float64     // hours the step stands for
	MeasuredKW float64     // measured total pump power, kW; NaN when not logged
	DP         curves.Head // logged differential pressure at the sensor, as head, m; 0 when not logged
}

// Timed reports whether the step comes from a time-stamped trend.
func (s Step) Timed() bool { return !s.Time.IsZero() }

// Strategy is one named way of running the plant over a load profile.
type Strategy interface {
	// Name is the strategy's label in reports.
	Name() string
	// Run evaluates the steps, in order (time order for a trend), and
	// keeps every state in Run.Points.
	Run(steps []Step) Run
	// Stream evaluates the steps in order and calls visit with each
	// step's state as it is solved (the pointer is valid only during the
	// call); the Run it returns has no Points, so a long profile needs
	// memory for one state at a time.
	Stream(steps []Step, visit func(i int, r *Result)) Run
}

// Collect runs a streaming strategy and keeps every state: the Run of
// every strategy.
func Collect(s Strategy, steps []Step) Run {
	pts := make([]Result, 0, len(steps))
	r := s.Stream(steps, func(_ int, res *Result) { pts = append(pts, *res) })
	r.Points = pts
	return r
}

func (l *Lowest) Run(steps []Step) Run         { return Collect(l, steps) }
func (s *Staged) Run(steps []Step) Run         { return Collect(s, steps) }
func (t *Throttled) Run(steps []Step) Run      { return Collect(t, steps) }
func (c *ConstantBypass) Run(steps []Step) Run { return Collect(c, steps) }
func (b *Banded) Run(steps []Step) Run         { return Collect(b, steps) }
func (b *DriveBypass) Run(steps []Step) Run    { return Collect(b, steps) }

// Run is a strategy's result over a profile.
type Run struct {
	Name    string
	Points  []Result // one per step
	Changes int      // stage changes (counted in time order; 0 for bins)
	Drives  int      // units on variable-speed drives in this strategy
	Note    string   // how the strategy runs the plant, in plain words
	// Plant is the plant the points' model indices refer to: a strategy may
	// run a variant (fixed-speed, partial retrofit) of the given plant.
	Plant *plant.Plant
}

var (
	_ Strategy = (*Lowest)(nil)
	_ Strategy = (*Staged)(nil)
	_ Strategy = (*Throttled)(nil)
	_ Strategy = (*ConstantBypass)(nil)
)

// Lowest runs the lowest-power staging at every step.
type Lowest struct {
	Label  string
	Note   string // how it runs the plant, in plain words; empty = the default
	Plant  *plant.Plant
	Solver *Solver
}

// NewLowest returns the optimiser as a strategy.
func NewLowest(label string, p *plant.Plant, opt Options) *Lowest {
	return &Lowest{Label: label, Plant: p, Solver: New(p, opt)}
}

func (l *Lowest) Name() string { return l.Label }
func (l *Lowest) Stream(steps []Step, visit func(int, *Result)) Run {
	r := Run{Name: l.Label, Drives: drives(l.Plant), Plant: l.Plant, Note: l.Note}
	if r.Note == "" {
		r.Note = "the lowest-power count of running units and their speeds at every step"
	}
	prev := -1
	var cache flowCache
	for i, st := range steps {
		res := cache.Solve(st.Load, l.Solver.Solve)
		visit(i, &res)
		prev = countChange(&r, st, res, prev)
	}
	return r
}

// countChange counts a change of running units between time-ordered steps.
func countChange(r *Run, st Step, res Result, prev int) int {
	if !st.Timed() || res.Status != Served {
		return prev
	}
	n := res.Running()
	if prev >= 0 && n != prev {
		r.Changes += abs(n - prev)
	}
	return n
}

func abs(v int) int {
	if v < 0 {
		return -v
	}
	return v
}

// Drives counts the installed units on variable-speed drives, standby
// units included.
func Drives(p *plant.Plant) int { return drives(p) }

func drives(p *plant.Plant) int {
	n := 0
	for _, m := range p.Models {
		if m.Drive.Variable() {
			n += m.Installed() // a standby unit needs its drive too
		}
	}
	return n
}

// Staged is common-speed staging with speed thresholds, as a plant's
// automation system runs it: every running variable-speed unit gets one speed
// signal; a unit is added when the speed rises above StageUp and dropped when
// it falls below StageDown. On a trend it runs in time order with the
// delays: a condition must hold for the delay before the change. On bins
// (no time order) each bin takes the fewest units that serve it at or below
// StageUp.
type Staged struct {
	Label     string
	Plant     *plant.Plant
	StageUp   float64       // fraction of rated speed
	StageDown float64       // fraction of rated speed
	UpDelay   time.Duration // the stage-up condition must hold this long
	DownDelay time.Duration
	solver    *Solver
	total     int
}

// NewStaged returns a common-speed threshold sequence.
func NewStaged(label string, p *plant.Plant, seq plant.Sequence) *Staged {
	s := &Staged{Label: label, Plant: p, StageUp: seq.StageUpSpeed, StageDown: seq.StageDownSpeed,
		UpDelay:   time.Duration(seq.StageUpDelayMin * float64(time.Minute)),
		DownDelay: time.Duration(seq.StageDownDelayMin * float64(time.Minute)),
		solver:    New(p, Options{CommonSpeed: true})}
	for _, m := range p.Models {
		s.total += m.Count
	}
	return s
}

func (s *Staged) Name() string { return s.Label }

// commonSpeed returns the speed signal of a result (the speed of its
// variable-speed units; 1 where none runs).
func commonSpeed(r Result, p *plant.Plant) float64 {
	sp := 1.0
	for _, u := range r.Units {
		if p.Models[u.Model].Drive.Variable() {
			return u.Speed
		}
	}
	return sp
}

// stagedKey fixes a solve of the sequence: the load flow and the count of
// running units.
type stagedKey struct {
	load curves.Flow
	n    int
}

// solveN solves the load with n units running, from the cache when the
// same flow was solved with n before (a long trend repeats its flows; the
// sequence re-solves each row with the count it holds, and checks n−1
// before staging down). A nil cache solves every time (tests compare).
func (s *Staged) solveN(c *SolveCache[stagedKey], load curves.Flow, n int) Result {
	return c.Solve(stagedKey{load, n}, s.solveKey)
}

func (s *Staged) solveKey(k stagedKey) Result {
	if k.n == 0 {
		return s.solver.Solve(k.load) // no count serves it: the reason why
	}
	return s.solver.SolveWith(k.load, Constraint{Total: k.n})
}

// fewest returns the result with the fewest units that serve the load at a
// speed at or below StageUp, else the fewest that serve it at all.
func (s *Staged) fewest(c *SolveCache[stagedKey], load curves.Flow) (Result, int) {
	var first *Result
	firstN := 0
	n0 := s.solver.fewestMayServe(load)
	if n0 == 0 {
		n0 = s.total + 1 // none serves it
	}
	for n := n0; n <= s.total; n++ {
		r := s.solveN(c, load, n)
		if r.Status != Served {
			continue
		}
		if commonSpeed(r, s.Plant) <= s.StageUp+1e-12 {
			return r, n
		}
		if first == nil {
			first, firstN = &r, n
		}
	}
	if first != nil {
		return *first, firstN
	}
	return s.solveN(c, load, 0), 0
}

func (s *Staged) Stream(steps []Step, visit func(int, *Result)) Run {
	return s.stream(steps, visit, &SolveCache[stagedKey]{})
}

// stream runs the sequence with the cache c (nil: none).
func (s *Staged) stream(steps []Step, visit func(int, *Result), c *SolveCache[stagedKey]) Run {
	r := Run{Name: s.Label, Drives: drives(s.Plant), Plant: s.Plant,
		Note: "one common speed for the running units; stage up above the stage-up speed, down below the stage-down speed"}
	n := 0 // running units; 0 = not started
	var upSince, downSince time.Time
	var last time.Time
	for i, st := range steps {
		if !st.Timed() {
			res, _ := s.fewest(c, st.Load)
			visit(i, &res)
			continue
		}
		if n == 0 || (!last.IsZero() && st.Time.Sub(last) > 6*time.Hour) {
			// Start (or restart after a long gap) the way an operator would:
			// the fewest units that serve the load below stage-up.
			_, n = s.fewest(c, st.Load)
			upSince, downSince = time.Time{}, time.Time{}
		}
		last = st.Time
		res := s.solveN(c, st.Load, n)
		// Cannot serve with n: stage up at once (a capacity alarm), as far as needed.
		for res.Status != Served && n < s.total {
			n++
			r.Changes++
			res = s.solveN(c, st.Load, n)
			upSince, downSince = time.Time{}, time.Time{}
		}
		visit(i, &res)
		if res.Status != Served {
			continue
		}
		sp := commonSpeed(res, s.Plant)
		end := st.Time.Add(time.Duration(st.Hours * float64(time.Hour)))
		switch {
		case sp > s.StageUp && n < s.total:
			if upSince.IsZero() {
				upSince = st.Time
			}
			downSince = time.Time{}
			if end.Sub(upSince) >= s.UpDelay {
				n++
				r.Changes++
				upSince = time.Time{}
			}
		case sp < s.StageDown && n > 1:
			if downSince.IsZero() {
				downSince = st.Time
			}
			upSince = time.Time{}
			if end.Sub(downSince) >= s.DownDelay {
				// Drop a unit only if the rest can serve this load.
				if t := s.solveN(c, st.Load, n-1); t.Status == Served {
					n--
					r.Changes++
				}
				downSince = time.Time{}
			}
		default:
			upSince, downSince = time.Time{}, time.Time{}
		}
	}
	return r
}

// FixedVariant returns a copy of the plant with every unit across the line
// (no drives), for the throttled and bypass strategies.
func FixedVariant(p *plant.Plant) *plant.Plant {
	q := *p
	q.Models = append([]plant.Model(nil), p.Models...)
	for i := range q.Models {
		q.Models[i].Drive = curves.Rewire(q.Models[i].Drive, curves.FixedSpeed{})
	}
	return &q
}

// PartialVariant returns a copy of the plant where only withDrive[i] units
// of model i keep a variable-speed drive (the others run across the line).
// Models are split into a driven and a fixed model where needed.
func PartialVariant(p *plant.Plant, withDrive []int, drive curves.Drive) *plant.Plant {
	q := *p
	q.Models = nil
	for i, m := range p.Models {
		d := min(withDrive[i], m.Count)
		if d > 0 {
			v := m
			v.Count = d
			if drive != nil {
				v.Drive = curves.Rewire(m.Drive, drive)
			}
			if d < m.Count {
				v.Name, v.Tags = m.Name+" (drive)", nil
			}
			q.Models = append(q.Models, v)
		}
		if m.Count-d > 0 {
			f := m
			f.Count, f.Drive = m.Count-d, curves.Rewire(m.Drive, curves.FixedSpeed{})
			if d > 0 {
				// The standby unit stays with the driven part.
				f.Name, f.Tags, f.Standby = m.Name+" (fixed)", nil, 0
			}
			q.Models = append(q.Models, f)
		}
	}
	return &q
}

// Throttled runs every unit at fixed speed on its curve with a throttling
// valve burning the head above the system's need; the count is the fewest
// units that serve the flow (lowest power among combinations of that count).
type Throttled struct {
	Label  string
	Plant  *plant.Plant // the fixed-speed variant
	solver *Solver
	total  int
}

// NewThrottled returns the fixed-speed throttled strategy for the plant.
func NewThrottled(label string, p *plant.Plant) *Throttled {
	f := FixedVariant(p)
	t := &Throttled{Label: label, Plant: f, solver: New(f, Options{})}
	for _, m := range f.Models {
		t.total += m.Count
	}
	return t
}

func (t *Throttled) Name() string { return t.Label }

func (t *Throttled) solve(load curves.Flow) Result {
	n0 := t.solver.fewestMayServe(load)
	if n0 == 0 {
		return t.solver.Solve(load) // none serves it: the reason why
	}
	for n := n0; n <= t.total; n++ {
		if r := t.solver.SolveWith(load, Constraint{Total: n}); r.Status == Served {
			return r
		}
	}
	return t.solver.Solve(load)
}

func (t *Throttled) Stream(steps []Step, visit func(int, *Result)) Run {
	r := Run{Name: t.Label, Plant: t.Plant, Note: "fixed speed; a valve throttles the extra head; the fewest units that serve the flow"}
	prev := -1
	var cache flowCache
	for i, st := range steps {
		res := cache.Solve(st.Load, t.solve)
		visit(i, &res)
		prev = countChange(&r, st, res, prev)
	}
	return r
}

// ConstantBypass runs the units at the design point all year; the flow the
// load does not take goes through bypasses (three-way valves).
type ConstantBypass struct {
	Label  string
	Plant  *plant.Plant
	design Result
}

// NewConstantBypass returns the constant-flow strategy: the throttled
// design-flow state held at every step.
func NewConstantBypass(label string, p *plant.Plant) *ConstantBypass {
	t := NewThrottled(label, p)
	return &ConstantBypass{Label: label, Plant: t.Plant, design: t.solve(p.DesignFlow)}
}

func (c *ConstantBypass) Name() string { return c.Label }

func (c *ConstantBypass) Stream(steps []Step, visit func(int, *Result)) Run {
	r := Run{Name: c.Label, Plant: c.Plant, Note: "constant flow at the design point all year; the load's unused flow bypasses it"}
	for i, st := range steps {
		res := c.design
		res.Units = append([]Unit(nil), c.design.Units...)
		res.Counts = append([]int(nil), c.design.Counts...)
		res.LoadFlow = st.Load
		if st.Load > c.design.PumpedFlow {
			res.Status = Unmet
			res.Limit = LimitCapacity
			res.Shortfall = st.Load - c.design.PumpedFlow
			res.Reason = "load above the design flow the constant-flow plant moves"
		}
		res.BypassFlow = curves.Flow(math.Max(0, float64(res.PumpedFlow-st.Load)))
		visit(i, &res)
	}
	return r
}
