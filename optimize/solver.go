package optimize

import (
	"fmt"
	"math"
	"sort"

	"wattstage/curves"
	"wattstage/plant"
)

// Options choose how the solver may run the units.
type Options struct {
	// CommonSpeed forces one speed signal (as a fraction of rated speed) for
	// every running variable-speed unit, as many automation systems do. Off
	// in the zero value: each model may run at its own speed.
	CommonSpeed bool
}

// Constraint narrows the search of one solve.
type Constraint struct {
	Total  int   // exact number of running units; 0 = any
	Counts []int // exact running units per model; nil = any
}

// Solver finds the lowest-power way to serve a load on one plant. It is not
// safe for concurrent use; make one per goroutine.
type Solver struct {
	plant  *plant.Plant
	opt    Options
	units  []*unitModel
	combos [][]int
	rho    float64
	spans  []span // scratch
	varBuf []int  // scratch for sidesAt's list of variable models

	allocSpans, scanSpans []span    // scratch of atHeadMode and the head scan
	floatBuf              []float64 // scratch of equalMarginal

	// Per solve: the head grid of lowestFeasibleHeadValue's scan, shared by
	// every combo, and each model's span at each grid head (computed once).
	grid      []float64
	gridSpan  [][]span
	gridKnown [][]bool
}

// gridPoints is the number of steps of the head scan.
const gridPoints = 48

// resetGrid sets the scan grid for a solve from the required head up to the
// highest head any unit can make.
func (s *Solver) resetGrid(hr float64) {
	top := hr
	for _, u := range s.units {
		top = math.Max(top, u.c[0]*u.smax*u.smax)
	}
	if s.grid == nil {
		s.grid = make([]float64, gridPoints+1)
		s.gridSpan = make([][]span, len(s.units))
		s.gridKnown = make([][]bool, len(s.units))
		for i := range s.units {
			s.gridSpan[i] = make([]span, gridPoints+1)
			s.gridKnown[i] = make([]bool, gridPoints+1)
		}
	}
	for k := range s.grid {
		s.grid[k] = hr + (top-hr)*float64(k)/gridPoints
	}
	for i := range s.gridKnown {
		clear(s.gridKnown[i])
	}
}

// spanAt returns model i's span at grid head k, computing it once per solve.
func (s *Solver) spanAt(i, k int) span {
	if !s.gridKnown[i][k] {
		s.gridSpan[i][k] = s.units[i].bounds(s.grid[k])
		s.gridKnown[i][k] = true
	}
	return s.gridSpan[i][k]
}

// New returns a solver for the plant.
func New(p *plant.Plant, opt Options) *Solver {
	s := &Solver{plant: p, opt: opt, rho: p.Fluid.Density}
	for i := range p.Models {
		s.units = append(s.units, newUnitModel(i, &p.Models[i], s.rho))
	}
	s.combos = enumerate(p.Models)
	s.varBuf = make([]int, 0, len(p.Models))
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

// state is one candidate: counts, header head, per-model flows.
type state struct {
	counts []int
	h      float64
	q      []float64 // per-unit flow of each model (equal split)
	split  []split   // per model: Units of the model run at a different flow
	power  float64
}

// split records j units of a model running at flow qb while the others run
// at the model's q.
type split struct {
	j  int
	qb float64
}

// side says why an allocation failed.
type side int

const (
	fits      side = iota
	tooMuch        // even at their lowest allowed flows the units move more than needed
	tooLittle      // even at their highest allowed flows the units move less than needed
)

// SolveWith is Solve limited by a constraint.
func (s *Solver) SolveWith(load curves.Flow, c Constraint) Result {
	pumped := load
	if s.plant.MinFlow > pumped {
		pumped = s.plant.MinFlow
	}
	hr := float64(s.plant.System.Required(load))
	res := Result{LoadFlow: load, PumpedFlow: pumped, BypassFlow: pumped - load,
		RequiredHead: curves.Head(hr), Counts: make([]int, len(s.units))}
	if pumped <= 0 {
		res.Reason = "no flow asked: every unit off"
		return res
	}
	Q := float64(pumped)
	s.resetGrid(hr)
	// First pass: every allowed combo at its lowest feasible head, with the
	// variable units' flow split in proportion to their ranges — exact for a
	// combo with one variable model, an upper bound on the others' power.
	type cand struct {
		st    *state
		exact bool
	}
	var cands []cand
	quickBest := math.Inf(1)
	add := func(cnt []int, h float64) {
		if st, sd := s.atHeadMode(cnt, Q, h, false); sd == fits {
			cands = append(cands, cand{st, s.variableModels(cnt) <= 1})
			quickBest = math.Min(quickBest, st.power)
		}
	}
	var rising [][]int
	for _, cnt := range s.combos {
		if !c.allows(cnt) {
			continue
		}
		if _, _, sd := s.sidesAt(cnt, Q, hr, 0, s.spanBuf(len(cnt))); sd == fits {
			add(cnt, hr)
		} else if s.mayRise(cnt, Q, hr) {
			rising = append(rising, cnt)
		}
	}
	// Combos that need a higher head: no unit converts more than its best
	// pump efficiency of ρ g Q H into shaft power, so a combo whose lowest
	// feasible head already costs more than the best found cannot win.
	for _, cnt := range rising {
		h := s.lowestFeasibleHeadBound(cnt, Q, hr, quickBest)
		if h > 0 {
			add(cnt, h)
		}
	}
	// Second pass, cheapest proportional split first: the full equal-marginal
	// split for multi-model combos whose proportional split is within
	// quickMargin of the best state found so far. Across the optimality
	// suite a proportional split was never more than 1.1 % above its
	// combo's own optimum.
	sort.Slice(cands, func(i, j int) bool { return cands[i].st.power < cands[j].st.power })
	var best *state
	var near []*state
	for _, cd := range cands {
		st := cd.st
		if best != nil && st.power > quickMargin*best.power {
			break // sorted: every later combo is further off
		}
		if !cd.exact {
			if full, sd := s.atHeadMode(st.counts, Q, st.h, true); sd == fits {
				st = full
			}
		}
		near = append(near, st)
		if best == nil || st.power < best.power {
			best = st
		}
	}
	if best == nil {
		return s.unmet(res, Q, hr, c)
	}
	// A header head above the control curve can be cheaper where a speed or
	// flow floor binds (DOMAIN §10): search it for the combos near the best.
	for _, st := range near {
		if st.power > best.power*1.02 {
			continue
		}
		if better := s.searchHead(st, Q, hr); better != nil && better.power < best.power {
			best = better
		} else if better != nil && better.power < st.power {
			*st = *better
		}
	}
	if !s.opt.CommonSpeed {
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

// atHead allocates the pumped flow Q among the running units at header head
// h: fixed-speed units give what their curves give; the variable ones share
// the rest at equal marginal power (or at one common speed).
func (s *Solver) atHead(cnt []int, Q, h float64) (*state, side) {
	return s.atHeadMode(cnt, Q, h, true)
}

// atHeadMode is atHead; with full false the variable units' flow is split in
// proportion to their allowed ranges instead of at equal marginal power.
func (s *Solver) atHeadMode(cnt []int, Q, h float64, full bool) (*state, side) {
	spans := s.scratch(&s.allocSpans, len(cnt))
	qvar, vars, sd := s.sides(cnt, Q, h, spans)
	if sd != fits {
		return nil, sd
	}
	st := newState(cnt, h)
	for i, n := range cnt {
		if n > 0 && !s.units[i].variable {
			st.q[i] = spans[i].lo
		}
	}
	if len(vars) > 0 {
		switch {
		case s.opt.CommonSpeed:
			if !s.commonSpeed(st, vars, spans, qvar) {
				return nil, tooLittle
			}
		case full:
			s.equalMarginal(st, vars, spans, qvar)
		default:
			proportional(st, vars, spans, qvar)
		}
	}
	st.power = s.power(st)
	if math.IsInf(st.power, 0) || math.IsNaN(st.power) {
		return nil, tooLittle
	}
	return st, fits
}

// sides checks, without allocating, whether a combo can move Q at header
// head h: it fills each running model's allowed span and returns the flow
// left for the variable units, their models, and whether the combo fits,
// moves too much or too little.
func (s *Solver) sides(cnt []int, Q, h float64, spans []span) (float64, []int, side) {
	return s.sidesAt(cnt, Q, h, -1, spans)
}

// sidesAt is sides at head h, which is grid head k when k ≥ 0 (its spans
// then come from the per-solve cache).
func (s *Solver) sidesAt(cnt []int, Q, h float64, k int, spans []span) (float64, []int, side) {
	qvar := Q
	vars := s.varBuf[:0]
	loSum, hiSum := 0.0, 0.0
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		u := s.units[i]
		var sp span
		if k >= 0 {
			sp = s.spanAt(i, k)
		} else {
			sp = u.bounds(h)
		}
		if !sp.ok {
			// A fixed-speed unit past its runout or overloaded at this head
			// moves less flow at a higher head; anything else gets worse.
			if !u.variable && (sp.why == limRunout || sp.why == limOverload) {
				return 0, nil, tooMuch
			}
			return 0, nil, tooLittle
		}
		spans[i] = sp
		if !u.variable {
			qvar -= float64(n) * sp.lo
			continue
		}
		vars = append(vars, i)
		loSum += float64(n) * sp.lo
		hiSum += float64(n) * sp.hi
	}
	tol := 1e-10 * Q
	if len(vars) == 0 {
		loSum, hiSum = 0, 0
	}
	switch {
	case loSum > qvar+tol:
		return 0, nil, tooMuch
	case hiSum < qvar-tol:
		return 0, nil, tooLittle
	}
	return qvar, vars, fits
}

// quickMargin bounds how far above the best state a combo's proportional
// split may be and still get the full allocation (about three times the
// largest gap between a proportional split and its combo's optimum seen in
// the optimality suite, 1.1 %).
const quickMargin = 1.03

// proportional splits qvar among the variable models at one common
// fraction of each model's allowed range.
func proportional(st *state, vars []int, spans []span, qvar float64) {
	lo, hi := 0.0, 0.0
	for _, i := range vars {
		n := float64(st.counts[i])
		lo += n * spans[i].lo
		hi += n * spans[i].hi
	}
	t := 0.0
	if hi > lo {
		t = (qvar - lo) / (hi - lo)
	}
	for _, i := range vars {
		st.q[i] = spans[i].lo + t*(spans[i].hi-spans[i].lo)
	}
}

// variableModels counts the running variable-speed models of a combo.
func (s *Solver) variableModels(cnt []int) int {
	k := 0
	for i, n := range cnt {
		if n > 0 && s.units[i].variable {
			k++
		}
	}
	return k
}

// scratch returns a zeroed scratch slice of spans held in *buf.
func (s *Solver) scratch(buf *[]span, n int) []span {
	if cap(*buf) < n {
		*buf = make([]span, n)
	}
	b := (*buf)[:n]
	clear(b)
	return b
}

// floats returns a zeroed scratch slice of n floats.
func (s *Solver) floats(n int) []float64 {
	if cap(s.floatBuf) < n {
		s.floatBuf = make([]float64, n)
	}
	b := s.floatBuf[:n]
	clear(b)
	return b
}

// newState makes a state whose per-model slices share one allocation.
func newState(cnt []int, h float64) *state {
	n := len(cnt)
	type block struct {
		st state
		q  [8]float64
		sp [8]split
	}
	if n <= 8 {
		b := &block{}
		b.st = state{counts: cnt, h: h, q: b.q[:n], split: b.sp[:n]}
		return &b.st
	}
	return &state{counts: cnt, h: h, q: make([]float64, n), split: make([]split, n)}
}

// spanBuf returns a scratch slice of spans.
func (s *Solver) spanBuf(n int) []span {
	if cap(s.spans) < n {
		s.spans = make([]span, n)
	}
	return s.spans[:n]
}

// equalMarginal splits qvar among the variable models so that their
// marginal powers dP/dQ are equal where no bound binds (the optimality
// condition for a convex separable cost). It takes projected Newton steps on
// a local quadratic model, with a backtracking line search on the true
// power.
func (s *Solver) equalMarginal(st *state, vars []int, spans []span, qvar float64) {
	n := func(i int) float64 { return float64(st.counts[i]) }
	if len(vars) == 1 {
		i := vars[0]
		st.q[i] = clamp(qvar/n(i), spans[i].lo, spans[i].hi)
		return
	}
	lo, hi := 0.0, 0.0
	for _, i := range vars {
		lo += n(i) * spans[i].lo
		hi += n(i) * spans[i].hi
	}
	t := 0.0
	if hi > lo {
		t = (qvar - lo) / (hi - lo)
	}
	for _, i := range vars {
		st.q[i] = spans[i].lo + t*(spans[i].hi-spans[i].lo)
	}
	cost := func(q []float64) float64 {
		sum := 0.0
		for _, i := range vars {
			sum += n(i) * s.units[i].powerAt(q[i], st.h)
		}
		return sum
	}
	buf := s.floats(4 * len(st.q))
	g, hh, d, trial := buf[:len(st.q)], buf[len(st.q):2*len(st.q)], buf[2*len(st.q):3*len(st.q)], buf[3*len(st.q):]
	_ = d
	cur := cost(st.q)
	for it := 0; it < 40; it++ {
		for _, i := range vars {
			g[i], hh[i] = s.units[i].derivs(st.q[i], st.h, spans[i])
		}
		// Find λ with Σ n_i clamp((λ − g_i)/h_i) = 0 (flows stay summed):
		// the sum is piecewise linear and rising in λ, so solve it exactly
		// between its breakpoints.
		solveLambda(vars, st.q, spans, g, hh, d, n)
		// Restore the exact sum on the models with room to move.
		resid := qvar
		for _, i := range vars {
			resid -= n(i) * (st.q[i] + d[i])
		}
		for _, i := range vars {
			if resid == 0 {
				break
			}
			room := spans[i].hi - st.q[i] - d[i]
			if resid < 0 {
				room = spans[i].lo - st.q[i] - d[i]
			}
			step := resid / n(i)
			if math.Abs(step) > math.Abs(room) {
				step = room
			}
			d[i] += step
			resid -= n(i) * step
		}
		step := 1.0
		moved := false
		for ls := 0; ls < 30; ls++ {
			for _, i := range vars {
				trial[i] = st.q[i] + step*d[i]
			}
			if c := cost(trial); c < cur {
				cur = c
				for _, i := range vars {
					st.q[i] = trial[i] // only the variable models move
				}
				moved = true
				break
			}
			step /= 2
		}
		maxd := 0.0
		for _, i := range vars {
			maxd = math.Max(maxd, math.Abs(step*d[i])/math.Max(spans[i].hi, 1e-12))
		}
		if !moved || maxd < 1e-9 {
			break
		}
	}
}

// derivs returns the first and a positive second derivative of one unit's
// power in flow at header head h, by central differences inside the span.
func (u *unitModel) derivs(q, h float64, sp span) (float64, float64) {
	w := sp.hi - sp.lo
	step := 1e-4 * math.Max(w, 1e-6*sp.hi)
	a, b := q-step, q+step
	if a < sp.lo {
		a, b = sp.lo, sp.lo+2*step
	}
	if b > sp.hi {
		a, b = sp.hi-2*step, sp.hi
	}
	if a < 0 {
		a = 0
	}
	m := (a + b) / 2
	pa, pm, pb := u.powerAt(a, h), u.powerAt(m, h), u.powerAt(b, h)
	hs := (b - a) / 2
	d1 := (pb - pa) / (2 * hs)
	d2 := (pb - 2*pm + pa) / (hs * hs)
	floor := 1e-6 * math.Abs(d1) / math.Max(sp.hi, 1e-12)
	if !(d2 > floor) {
		d2 = math.Max(floor, 1e-30)
	}
	return d1, d2
}

// commonSpeed sets one speed for every running variable unit so that their
// flows make up qvar, and checks each unit's limits at that speed.
func (s *Solver) commonSpeed(st *state, vars []int, spans []span, qvar float64) bool {
	slo, shi := 0.0, math.Inf(1)
	for _, i := range vars {
		slo = math.Max(slo, s.units[i].smin)
		shi = math.Min(shi, s.units[i].smax)
	}
	if slo > shi {
		return false
	}
	flows := func(sp float64) float64 {
		sum := 0.0
		for _, i := range vars {
			q, ok := s.units[i].flowAt(sp, st.h)
			if !ok {
				q = 0
			}
			st.q[i] = q
			sum += float64(st.counts[i]) * q
		}
		return sum
	}
	if flows(shi) < qvar*(1-1e-12) {
		return false
	}
	a, b := slo, shi
	if fa := flows(a); fa > qvar*(1+1e-9) {
		// At the common floor the units move too much: the head must rise.
		return false
	} else if fa >= qvar {
		b = a // on the floor (within rounding of the head that put it there)
	}
	for it := 0; it < 100 && b-a > 1e-14; it++ {
		m := (a + b) / 2
		if flows(m) < qvar {
			a = m
		} else {
			b = m
		}
	}
	flows((a + b) / 2)
	// Put the rounding remainder on the first model so that flows sum
	// exactly — only a rounding remainder: where the flows jump with speed
	// (a unit that only just reaches the head) there is no common speed.
	sum := 0.0
	for _, i := range vars {
		sum += float64(st.counts[i]) * st.q[i]
	}
	if math.Abs(qvar-sum) > 1e-9*math.Max(qvar, 1e-12) {
		return false
	}
	st.q[vars[0]] += (qvar - sum) / float64(st.counts[vars[0]])
	for _, i := range vars {
		tol := 1e-9 * spans[i].hi
		if st.q[i] < spans[i].lo-tol || st.q[i] > spans[i].hi+tol {
			return false
		}
	}
	return true
}

// power returns the total electrical input of a state.
func (s *Solver) power(st *state) float64 {
	sum := 0.0
	for i, n := range st.counts {
		if n == 0 {
			continue
		}
		u := s.units[i]
		j := st.split[i].j
		sum += float64(n-j) * s.unitPower(u, st.q[i], st.h)
		if j > 0 {
			sum += float64(j) * s.unitPower(u, st.split[i].qb, st.h)
		}
	}
	return sum
}

func (s *Solver) unitPower(u *unitModel, q, h float64) float64 {
	if !u.variable {
		return float64(u.m.Drive.Electrical(u.m.Motor, u.pump.ShaftPower(curves.Flow(q), 1, u.rho), 1))
	}
	return u.powerAt(q, h)
}

// headCap is the highest header head any running unit of the combo can
// make (its shutoff head at maximum speed).
func (s *Solver) headCap(cnt []int) float64 {
	hc := math.Inf(1)
	for i, n := range cnt {
		if n > 0 {
			u := s.units[i]
			hc = math.Min(hc, u.c[0]*u.smax*u.smax)
		}
	}
	return hc
}

// mayRise reports whether a combo that fails at the required head could
// serve the flow at a higher header head: the flows its units give at their
// top speeds only fall as the head rises, so if they are short at the
// required head no higher head helps. (Runout and the minimum-speed floor,
// by contrast, move in the helpful direction as the head rises.)
func (s *Solver) mayRise(cnt []int, Q, hr float64) bool {
	sum := 0.0
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		u := s.units[i]
		q, ok := u.flowAt(u.smax, hr)
		if !ok {
			return false
		}
		sum += float64(n) * q
	}
	return sum >= Q*(1-1e-9)
}

// lowestFeasibleHeadBound returns the lowest header head above the
// required one at which a combo serves the flow, or 0: a scan over the
// solve's head grid, then bisection at the first step that fits (or, for
// fixed-speed units alone, whose feasible head is a single point, at the
// step where their flow turns from too much to too little). It gives up as
// soon as the head reached makes ρ g Q H / η_BEP, a lower bound on the
// combo's input, exceed bound.
func (s *Solver) lowestFeasibleHeadBound(cnt []int, Q, hr, bound float64) float64 {
	etaMax := 0.0
	for i, n := range cnt {
		if n > 0 {
			etaMax = math.Max(etaMax, s.units[i].pump.BEPEff)
		}
	}
	hc := s.headCap(cnt)
	if hc <= hr {
		return 0
	}
	spans := s.scratch(&s.scanSpans, len(cnt))
	side := func(h float64) side { _, _, sd := s.sides(cnt, Q, h, spans); return sd }
	prev := hr
	_, _, prevSide := s.sidesAt(cnt, Q, hr, 0, spans)
	for k := 1; k <= gridPoints && s.grid[k-1] < hc; k++ {
		if s.rho*curves.Gravity*Q*s.grid[k-1]/etaMax > bound {
			return 0 // every head from here on costs more than the bound
		}
		h := s.grid[k]
		_, _, sd := s.sidesAt(cnt, Q, h, k, spans)
		crossing := prevSide == tooMuch && sd == tooLittle
		if sd != fits && !crossing {
			prev, prevSide = h, sd
			continue
		}
		if s.rho*curves.Gravity*Q*prev/etaMax > bound {
			return 0
		}
		a, b := prev, h
		// Fixed-speed units alone (a crossing) cannot share out a mismatch,
		// so their head is found to the last digits.
		prec := 1e-12
		if crossing {
			prec = 1e-15
		}
		for it := 0; it < 80 && b-a > prec*b; it++ {
			m := (a + b) / 2
			switch sm := side(m); {
			case sm == fits, crossing && sm == tooLittle:
				b = m
			default:
				a = m
			}
		}
		if _, _, sb := s.sides(cnt, Q, b, spans); sb == fits {
			return b
		}
		prev, prevSide = h, sd
	}
	return 0
}

// searchHead looks for a cheaper header head above st.h for the same combo:
// a scan of the feasible heads refined by golden section.
func (s *Solver) searchHead(st *state, Q, hr float64) *state {
	h0 := st.h
	h1 := h0*(1+1e-4) + 1e-9
	if s.interior(st) {
		// With every unit inside its limits, the optimum's slope in the head
		// is the slope at fixed flows (envelope theorem): if holding the
		// flows and raising the head costs more, no higher head helps.
		raised := *st
		raised.h = h1
		if s.power(&raised) >= st.power {
			return nil
		}
	}
	up, _ := s.atHead(st.counts, Q, h1)
	if up == nil || up.power >= st.power {
		return nil
	}
	hc := s.headCap(st.counts)
	const n = 24
	best := st
	bi := 0
	hs := make([]float64, n+1)
	for k := 0; k <= n; k++ {
		hs[k] = h0 + (hc-h0)*float64(k)/n
		if k == 0 {
			continue
		}
		if t, sd := s.atHead(st.counts, Q, hs[k]); sd == fits && t.power < best.power {
			best, bi = t, k
		}
	}
	a, b := hs[max(bi-1, 0)], hs[min(bi+1, n)]
	const g = 0.6180339887498949
	for it := 0; it < 60 && b-a > 1e-10*b; it++ {
		m1, m2 := b-g*(b-a), a+g*(b-a)
		t1, _ := s.atHead(st.counts, Q, m1)
		t2, _ := s.atHead(st.counts, Q, m2)
		p1, p2 := math.Inf(1), math.Inf(1)
		if t1 != nil {
			p1 = t1.power
		}
		if t2 != nil {
			p2 = t2.power
		}
		if p1 < p2 {
			b = m2
			if t1 != nil && p1 < best.power {
				best = t1
			}
		} else {
			a = m1
			if t2 != nil && p2 < best.power {
				best = t2
			}
		}
	}
	return best
}

// trySplits checks whether identical units of one model are cheaper at
// unequal flows (possible where a flat efficiency curve leaves the drive
// losses' concavity in charge, DOMAIN §10): j units at qb, the rest at qa,
// with the model's total held. A split is kept only if it saves power.
func (s *Solver) trySplits(st *state, Q float64) {
	for i, n := range st.counts {
		u := s.units[i]
		if n < 2 || !u.variable {
			continue
		}
		sp := u.bounds(st.h)
		if u.convexOn(sp, st.h) {
			continue // the equal split is optimal for a convex power curve
		}
		total := float64(n) * st.q[i]
		base := float64(n) * u.powerAt(st.q[i], st.h)
		bestP, bestJ, bestB := base, 0, 0.0
		for j := 1; j < n; j++ {
			// qb in [lo, hi] with qa = (total − j qb)/(n − j) in [lo, hi].
			bl := math.Max(sp.lo, (total-float64(n-j)*sp.hi)/float64(j))
			bh := math.Min(sp.hi, (total-float64(n-j)*sp.lo)/float64(j))
			if bh <= bl {
				continue
			}
			f := func(qb float64) float64 {
				qa := (total - float64(j)*qb) / float64(n-j)
				return float64(j)*u.powerAt(qb, st.h) + float64(n-j)*u.powerAt(qa, st.h)
			}
			const m = 16
			bk, bv := 0, math.Inf(1)
			for k := 0; k <= m; k++ {
				if v := f(bl + (bh-bl)*float64(k)/m); v < bv {
					bk, bv = k, v
				}
			}
			a := bl + (bh-bl)*float64(max(bk-1, 0))/m
			b := bl + (bh-bl)*float64(min(bk+1, m))/m
			const g = 0.6180339887498949
			for it := 0; it < 40 && b-a > 1e-9*bh; it++ {
				m1, m2 := b-g*(b-a), a+g*(b-a)
				if f(m1) < f(m2) {
					b = m2
				} else {
					a = m1
				}
			}
			qb := (a + b) / 2
			if v := f(qb); v < bestP*(1-1e-7) {
				bestP, bestJ, bestB = v, j, qb
			}
		}
		if bestJ > 0 {
			st.q[i] = (total - float64(bestJ)*bestB) / float64(n-bestJ)
			st.split[i] = split{j: bestJ, qb: bestB}
			st.power = s.power(st)
		}
	}
}

// unmet explains why no combination serves the flow.
func (s *Solver) unmet(res Result, Q, hr float64, c Constraint) Result {
	res.Status = Unmet
	u := s.plant.Units
	// Capacity at the required head with every allowed unit at its highest
	// allowed flow.
	capacity := 0.0
	for _, cnt := range s.combos {
		if !c.allows(cnt) {
			continue
		}
		hc := math.Max(hr, s.headCap(cnt))
		for k := 0; k <= 16; k++ {
			h := hr + (hc-hr)*float64(k)/16
			sum := 0.0
			for i, n := range cnt {
				if n > 0 {
					if sp := s.units[i].bounds(h); sp.ok {
						sum += float64(n) * sp.hi
					}
				}
			}
			capacity = math.Max(capacity, sum)
		}
	}
	if capacity < Q {
		res.Limit = LimitCapacity
		res.Shortfall = curves.Flow(Q - capacity)
		if capacity == 0 {
			res.Reason = fmt.Sprintf("no unit can make the required head of %s", u.FormatHead(curves.Head(hr)))
		} else {
			res.Reason = fmt.Sprintf("the units can deliver at most %s at the required head of %s; short by %s",
				u.FormatFlow(curves.Flow(capacity)), u.FormatHead(curves.Head(hr)), u.FormatFlow(res.Shortfall))
		}
		return res
	}
	res.Limit = LimitGap
	res.Reason = fmt.Sprintf("no combination of running units delivers %s at %s or more without breaking a unit's minimum flow, speed or motor limit",
		u.FormatFlow(curves.Flow(Q)), u.FormatHead(curves.Head(hr)))
	return res
}

func clamp(v, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, v)) }

// solveLambda sets d_i = clamp((λ − g_i)/h_i, lo_i − q_i, hi_i − q_i) for
// the λ at which Σ n_i d_i = 0. Each d_i(λ) is flat, then rises with slope
// 1/h_i between λ = g_i + h_i(lo_i − q_i) and g_i + h_i(hi_i − q_i), then
// is flat again; the sum's root lies between two adjacent breakpoints,
// where it is linear.
func solveLambda(vars []int, q []float64, spans []span, g, h, d []float64, n func(int) float64) {
	var bp [16]float64
	pts := bp[:0]
	for _, i := range vars {
		pts = append(pts, g[i]+h[i]*(spans[i].lo-q[i]), g[i]+h[i]*(spans[i].hi-q[i]))
	}
	sort.Float64s(pts)
	total := func(lam float64) float64 {
		sum := 0.0
		for _, i := range vars {
			d[i] = clamp((lam-g[i])/h[i], spans[i].lo-q[i], spans[i].hi-q[i])
			sum += n(i) * d[i]
		}
		return sum
	}
	lo, flo := pts[0], total(pts[0])
	lam := lo
	for _, b := range pts[1:] {
		fb := total(b)
		if fb >= 0 {
			if fb > flo {
				lam = lo + (b-lo)*(-flo)/(fb-flo)
			} else {
				lam = b
			}
			break
		}
		lo, flo, lam = b, fb, b
	}
	total(lam)
}

// convexOn reports whether a unit's power is convex in flow at header head
// h across its allowed span, judged by second differences on 9 points
// (with a tolerance for rounding).
func (u *unitModel) convexOn(sp span, h float64) bool {
	const n = 8
	var p [n + 1]float64
	for k := 0; k <= n; k++ {
		p[k] = u.powerAt(sp.lo+(sp.hi-sp.lo)*float64(k)/n, h)
	}
	for k := 1; k < n; k++ {
		if p[k+1]-2*p[k]+p[k-1] < -1e-9*p[k] {
			return false
		}
	}
	return true
}

// interior reports whether every running unit of a state is variable-speed
// and strictly inside its allowed flow range at the state's head.
func (s *Solver) interior(st *state) bool {
	for i, n := range st.counts {
		if n == 0 {
			continue
		}
		u := s.units[i]
		if !u.variable || st.split[i].j > 0 {
			return false
		}
		sp := u.bounds(st.h)
		tol := 1e-6 * sp.hi
		if !sp.ok || st.q[i] <= sp.lo+tol || st.q[i] >= sp.hi-tol {
			return false
		}
	}
	return true
}
