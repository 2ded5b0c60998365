package optimize

import (
	"math"
	"sync/atomic"

	"wattstage/curves"
	"wattstage/plant"
)

// solves counts the points solved by every Solver in the process.
var solves atomic.Int64

// Solves returns how many points every Solver in the process has solved
// so far: tests use it to show that a rendering solves nothing, benchmarks
// to count the work of a study.
func Solves() int64 { return solves.Load() }

// Options choose how the solver may run the units.
type Options struct {
	// CommonSpeed forces one speed signal (as a fraction of rated speed) for
	// every running variable-speed unit, as many automation systems do. Off
	// in the zero value: each model may run at its own speed.
	CommonSpeed bool
	// PreferredOnly keeps every unit inside its preferred operating region,
	// 70–120 % of BEP flow at its speed (ANSI/HI 9.6.3), as further minimum
	// and maximum flows. Off in the zero value (the allowable region, from
	// the minimum continuous flow to runout).
	PreferredOnly bool
}

// Constraint narrows the search of one solve.
type Constraint struct {
	Total  int   // exact number of running units; 0 = any
	Counts []int // exact running units per model; nil = any
	// Head is the head the system needs at the load, m, in place of the
	// system curve's (a logged setpoint, say); 0 = the system curve.
	Head curves.Head
}

// Solver finds the lowest-power way to serve a load on one plant. It is not
// safe for concurrent use; make one per goroutine.
type Solver struct {
	plant  *plant.Plant
	opt    Options
	units  []*unitModel
	combos [][]int
	// exhaustive evaluates every count vector, without the bounds (tests).
	exhaustive bool
	// fixedModels: fixed-speed models run beside variable-speed ones.
	// Raising the header head lowers a fixed-speed unit's flow and its draw
	// while the variable units make up the rest (the optimality suite's
	// many-vectors-mixed plant had a vector 9 % below its bound at the
	// required head), so the branch and bound widens its bounds for such
	// vectors by the head search's margin (branch.relax).
	fixedModels bool
	// byTotal lists the vectors by their number of running units.
	byTotal map[int][][]int
	rho     float64
	spans   []span // scratch
	varBuf  []int  // scratch for sidesAt's list of variable models

	allocSpans, scanSpans []span    // scratch of atHeadMode and the head scan
	floatBuf              []float64 // scratch of equalMarginal

	// Per solve: the head grid of lowestFeasibleHeadValue's scan, shared by
	// every combo, and each model's span at each grid head (computed once).
	grid      []float64
	gridSpan  [][]span
	gridKnown [][]bool

	// Per solve: each model's bounds at the required head, the branch and
	// bound over the counts, and the vectors it lists (bound.go, branch.go).
	mb       []modelBound
	scans    []powerScan
	br       branch
	items    []item  // the frontier's items, in push order
	heap     []int32 // the frontier: indices into items, a binary heap
	leafCnt  []int
	deferred []int32 // items of vectors that need a higher head (branchAndBound)
	corners  []*tableEnd
	topBuf   []float64 // scratch: fewestMayServe
	bounded  bool      // s.mb holds the bounds of the solve in progress
	// evalLimit stops a branch and bound after that many vectors evaluated
	// (0: no limit); closeVectors sets it.
	evalLimit   int
	table       flowTable
	noTable     bool  // solve without the table (tests)
	tableMisses int   // solves the table left to the branch and bound
	tableBuf    []int // scratch: a solve's candidates from the table
	near        []*state

	// Per model: whether its power is convex on its span at head cvxH
	// (most states of a solve share the required head).
	cvxH  []float64
	cvxOK []bool
}

// New returns a solver for the plant.
func New(p *plant.Plant, opt Options) *Solver {
	s := &Solver{plant: p, opt: opt, rho: p.Fluid.Density, byTotal: map[int][][]int{}}
	for i := range p.Models {
		u := newUnitModel(i, &p.Models[i], s.rho)
		if opt.PreferredOnly {
			bep := float64(p.Models[i].Pump.BEPFlow)
			u.qmin, u.qrun = math.Max(u.qmin, 0.7*bep), math.Min(u.qrun, 1.2*bep)
		}
		s.units = append(s.units, u)
		s.scans = append(s.scans, scanPower(u))
	}
	s.combos = enumerate(p.Models)
	s.fixedModels = mixesDrives(s.units)
	for _, cnt := range s.combos {
		n := 0
		for _, v := range cnt {
			n += v
		}
		s.byTotal[n] = append(s.byTotal[n], cnt)
	}
	s.varBuf = make([]int, 0, len(p.Models))
	s.cvxH = make([]float64, len(p.Models))
	s.cvxOK = make([]bool, len(p.Models))
	for i := range s.cvxH {
		s.cvxH[i] = math.NaN()
	}
	return s
}

// enumerate lists every vector of running counts except all-zero.
func enumerate(ms []plant.Model) [][]int {
	out := [][]int{}
	cur := make([]int, len(ms))
	var rec func(i int)
	rec = func(i int) {
		if i == len(ms) {
			for _, c := range cur {
				if c > 0 {
					out = append(out, append([]int(nil), cur...))
					return
				}
			}
			return
		}
		for n := 0; n <= ms[i].Count; n++ {
			cur[i] = n
			rec(i + 1)
		}
	}
	rec(0)
	return out
}

// Solve returns the lowest-power state that serves the load flow, or an
// Unmet result with the reason.
func (s *Solver) Solve(load curves.Flow) Result {
	return s.SolveWith(load, Constraint{})
}

// ByCount returns, for each total number of running units from 1 to the
// installed count, the best state with exactly that many running (Unmet
// where none serves the load).
func (s *Solver) ByCount(load curves.Flow) []Result {
	total := 0
	for _, m := range s.plant.Models {
		total += m.Count
	}
	out := make([]Result, total)
	for n := 1; n <= total; n++ {
		out[n-1] = s.SolveWith(load, Constraint{Total: n})
	}
	return out
}

// SolveWith is Solve limited by a constraint.
func (s *Solver) SolveWith(load curves.Flow, c Constraint) Result {
	solves.Add(1)
	pumped := load
	if s.plant.MinFlow > pumped {
		pumped = s.plant.MinFlow
	}
	hr := float64(s.plant.RequiredHead(load))
	if c.Head > 0 {
		hr = float64(c.Head)
	}
	res := Result{LoadFlow: load, PumpedFlow: pumped, BypassFlow: pumped - load,
		RequiredHead: curves.Head(hr), Counts: make([]int, len(s.units))}
	if pumped <= 0 {
		res.Reason = "no flow asked: every unit off"
		return res
	}
	Q := float64(pumped)
	s.resetGrid(hr)
	s.bounded = false
	best, near := s.fromTable(float64(load), Q, hr, c)
	if best == nil {
		s.resetGrid(hr) // the table's ends may have set it to theirs
		best, near = s.branchAndBound(Q, hr, c, 0)
	}
	if best == nil {
		return s.unmetOnly(res, Q, hr, c)
	}
	// A header head above the control curve can be cheaper where a speed or
	// flow floor binds (docs/sources.md §10): search it for the combos near the best.
	searched := false // best comes from the head search
	for _, st := range near {
		if st.power > best.power*headSearchMargin {
			continue
		}
		if better := s.searchHead(st, Q, hr); better != nil && better.power < best.power {
			best, searched = better, true
		} else if better != nil && better.power < st.power {
			*st = *better
		}
	}
	if !s.opt.CommonSpeed {
		if searched {
			// The head search splits by Newton alone: settle the split at
			// the head it chose globally.
			if g, sd := s.atHeadMode(best.counts, Q, best.h, splitGlobal); sd == fits && g.power < best.power {
				best = g
			}
		}
		s.trySplits(best, Q)
	}
	return s.build(res, best)
}

func (c Constraint) allows(cnt []int) bool {
	if c.Counts != nil {
		for i := range cnt {
			if cnt[i] != c.Counts[i] {
				return false
			}
		}
		return true
	}
	if c.Total > 0 {
		n := 0
		for _, v := range cnt {
			n += v
		}
		return n == c.Total
	}
	return true
}

// headSearchMargin is how far above the best state at the required head a
// vector's state may be and still have the higher heads searched.
const headSearchMargin = 1.02

// quickMargin bounds how far above the best state a combo's proportional
// split may be and still get the full allocation (about three times the
// largest gap between a proportional split and its combo's optimum seen in
// the optimality suite, 1.1 %).
const quickMargin = 1.03

// bentMargin is quickMargin for a combo with a model whose power is not
// convex in its flow, where the proportional split can sit further above
// the combo's optimum (up to 7.8 % seen, on two-model plants whose pump
// efficiency rises slowly from zero flow, at 10 % of design flow).
const bentMargin = 1.10

// unmetOnly is unmet with the solver's list of vectors narrowed to those
// the constraint allows (a given vector alone, or those of a given total),
// so that explaining an unserved point of a fixed staging does not walk
// every vector of a large plant.
func (s *Solver) unmetOnly(res Result, Q, hr float64, c Constraint) Result {
	all := s.combos
	defer func() { s.combos = all }()
	switch {
	case c.Counts != nil:
		s.combos = [][]int{c.Counts}
	case c.Total > 0:
		s.combos = s.byTotal[c.Total]
	}
	return s.unmet(res, Q, hr, c)
}

// mixesDrives reports whether some units run at fixed speed and others on
// drives.
func mixesDrives(units []*unitModel) bool {
	fixed, variable := false, false
	for _, u := range units {
		fixed, variable = fixed || !u.variable, variable || u.variable
	}
	return fixed && variable
}
