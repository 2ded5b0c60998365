package optimize_test

// An independent brute-force reference for the staging optimiser.
//
// It shares nothing with the solver but the physical models in curves and
// plant, and it is written to be checked by reading rather than to be fast:
// every candidate state ends in refProblem.check, which recomputes the whole
// state from scratch against every limit.
//
// Physics (the same the solver follows, coded again here):
//
//	pumped flow       Q = max(load, plant minimum flow)      (bypass, docs/sources.md §6)
//	header head       H ≥ System.Required(load)              (a floor, docs/sources.md §10;
//	                  at the pumped flow Q with the bypass at the loop's end)
//	unit i            H + K_i q_i² = s_i² H₀(q_i/s_i)         (affinity laws, docs/sources.md §3)
//	flow balance      Σ q_i = Q
//	limits            MinSpeed ≤ s ≤ MaxSpeed (s = 1 for a fixed-speed unit),
//	                  MinFlow·s ≤ q ≤ Runout·s, shaft ≤ Rated·SF,
//	                  electrical ≥ shaft
//	objective         Σ Drive.Input(Motor, ShaftPower(q, s, ρ), s).Electrical
//
// Search, per vector of running counts:
//
//   - individual speeds: the coordinates are the header head H (a box
//     [Required, highest head every running unit can hold]) and the speeds of
//     all variable units but one; that last unit takes the remaining flow and
//     its speed follows from (q, H). Each variable model takes the "last" role
//     in turn. A dense grid (identical units enumerated as multisets) is
//     followed by a compass search on the full 3^d stencil from the best few
//     well-separated grid points, halving the steps until they are 1e-10 of
//     the box, by which time the power changes far less than 1e-7 relative.
//   - common speed: one coordinate, the speed of every variable unit; the
//     header head follows from the flow balance by bisection.
//   - only fixed-speed units running: no freedom; the header head follows
//     from the flow balance by bisection.
//
// The one assumption the search relies on is checked by refCheckModel: each
// rated-speed head curve falls strictly over [MinFlow, Runout], so that at a
// given speed a unit's flow is a monotone function of head there.

import (
	"fmt"
	"math"
	"sort"
	"testing"

	"wattstage/curves"
	"wattstage/plant"
)

// refUnit is one running unit of a reference state.
type refUnit struct {
	Model int
	Speed float64
	Flow  curves.Flow
	Power curves.Power
}

// refResult is the reference's answer at one load.
type refResult struct {
	Feasible bool
	Counts   []int
	Units    []refUnit
	Header   curves.Head
	Power    curves.Power
	// ByCounts holds the best power found for every count vector that has a
	// feasible state, keyed by fmt.Sprint(counts).
	ByCounts map[string]curves.Power
	Evals    int // states checked
}

// refProblem is one load on one plant.
type refProblem struct {
	p        *plant.Plant
	load     curves.Flow
	pumped   curves.Flow
	required curves.Head
	density  float64
	evals    int
	// gridScale multiplies the grid spacing (1 in normal use; the self-check
	// changes it to show the answer does not depend on the grid).
	gridScale float64
}

func newRefProblem(p *plant.Plant, load curves.Flow) *refProblem {
	pumped := load
	if p.MinFlow > pumped {
		pumped = p.MinFlow
	}
	// The bypass at the plant (the default): the loop carries the load flow
	// and needs its head; at the loop's far end it carries the pumped flow.
	required := p.System.Required(load)
	if p.BypassAtLoopEnd {
		required = p.System.Required(pumped)
	}
	return &refProblem{p: p, load: load, pumped: pumped, required: required, density: p.Fluid.Density, gridScale: 1}
}

// refSolve runs the brute-force reference for one load.
func refSolve(p *plant.Plant, load curves.Flow, common bool) refResult {
	return refSolveGrid(p, load, common, 1)
}

// refSolveGrid is refSolve with the grid spacing multiplied by gridScale.
func refSolveGrid(p *plant.Plant, load curves.Flow, common bool, gridScale float64) refResult {
	r := newRefProblem(p, load)
	r.gridScale = gridScale
	best := refResult{ByCounts: map[string]curves.Power{}}
	for _, counts := range refCountVectors(p) {
		var st refResult
		if common {
			st = r.searchCommon(counts)
		} else {
			st = r.searchIndividual(counts)
		}
		if !st.Feasible {
			continue
		}
		best.ByCounts[fmt.Sprint(counts)] = st.Power
		if !best.Feasible || st.Power < best.Power {
			st.ByCounts = best.ByCounts
			best = st
		}
	}
	best.Evals = r.evals
	return best
}

// refCountVectors lists every vector of running units per model except the
// all-stopped one.
func refCountVectors(p *plant.Plant) [][]int {
	out := [][]int{{}}
	for _, m := range p.Models {
		var next [][]int
		for _, v := range out {
			for n := 0; n <= m.Count; n++ {
				next = append(next, append(append([]int(nil), v...), n))
			}
		}
		out = next
	}
	return out[1:] // the first vector is all zeros
}

// ---- one unit ----------------------------------------------------------

// refNetHead is the head a unit hands to the header at flow q and speed s:
// its own head s²H₀(q/s) less its branch loss K q².
func refNetHead(m *plant.Model, q curves.Flow, s float64) curves.Head {
	return m.Pump.Head(q, s) - curves.Head(m.BranchK*float64(q)*float64(q))
}

// refBisect returns the root of f between lo and hi, where f(lo) and f(hi)
// have opposite signs (or one is zero).
func refBisect(f func(float64) float64, lo, hi float64) float64 {
	flo := f(lo)
	if flo == 0 {
		return lo
	}
	for i := 0; i < 200; i++ {
		mid := 0.5 * (lo + hi)
		if mid <= lo || mid >= hi || hi-lo < 1e-14*math.Abs(mid) {
			break
		}
		fm := f(mid)
		if fm == 0 {
			return mid
		}
		if (fm < 0) == (flo < 0) {
			lo, flo = mid, fm
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// refUnitFlow returns the flow of a unit at speed s against header head h,
// looked for only inside its limits [MinFlow·s, Runout·s] (widened by the
// relative slack). ok is false where the flow would leave that range.
func refUnitFlow(m *plant.Model, s float64, h curves.Head, slack float64) (curves.Flow, bool) {
	lo := float64(m.MinFlow) * s * (1 - slack)
	hi := float64(m.Runout) * s * (1 + slack)
	if refNetHead(m, curves.Flow(lo), s) < h || refNetHead(m, curves.Flow(hi), s) > h {
		return 0, false
	}
	f := func(q float64) float64 { return float64(refNetHead(m, curves.Flow(q), s) - h) }
	return curves.Flow(refBisect(f, lo, hi)), true
}

// refUnitSpeed returns the speed at which a variable unit delivers flow q at
// header head h, looked for only inside [MinSpeed, MaxSpeed]. At a fixed
// flow s²H₀(q/s) rises with s (for the curves of the suite), so the root is
// unique.
func refUnitSpeed(m *plant.Model, q curves.Flow, h curves.Head) (float64, bool) {
	lo, hi := m.MinSpeed, m.MaxSpeed
	if refNetHead(m, q, lo) > h || refNetHead(m, q, hi) < h {
		return 0, false
	}
	f := func(s float64) float64 { return float64(refNetHead(m, q, s) - h) }
	return refBisect(f, lo, hi), true
}

// refHighestHead is the largest header head a unit can hold at speed s
// inside its limits: its net head at minimum flow, where the falling curve
// peaks within [MinFlow, Runout].
func refHighestHead(m *plant.Model, s float64) curves.Head {
	return refNetHead(m, curves.Flow(float64(m.MinFlow)*s), s)
}

// refCheckModel reports whether the rated-speed head curve falls strictly
// over [MinFlow, Runout] (with and without the branch loss), the one
// property the reference's root searches rely on.
func refCheckModel(m *plant.Model) error {
	const n = 400
	prev := math.Inf(1)
	for i := 0; i <= n; i++ {
		q := curves.Flow(float64(m.MinFlow) + (float64(m.Runout)-float64(m.MinFlow))*float64(i)/n)
		h := float64(m.Pump.Head(q, 1))
		if h >= prev {
			return fmt.Errorf("model %s: head curve does not fall at %.5g m³/s", m.Name, float64(q))
		}
		prev = h
	}
	// refUnitSpeed needs s²H₀(q/s) to rise with s at fixed q, i.e.
	// H₀(X)/X² to fall with X = q/s, over every X its bracket can reach.
	if !m.Variable() {
		return nil
	}
	if m.MinSpeed <= 0 || m.MaxSpeed < m.MinSpeed {
		return fmt.Errorf("model %s: speed range %g–%g", m.Name, m.MinSpeed, m.MaxSpeed)
	}
	top := float64(m.Runout) * m.MaxSpeed / m.MinSpeed
	prev = math.Inf(1)
	for i := 1; i <= n; i++ {
		x := top * float64(i) / n
		g := float64(m.Pump.Head(curves.Flow(x), 1)) / (x * x)
		if g >= prev {
			return fmt.Errorf("model %s: H₀(X)/X² does not fall at %.5g m³/s", m.Name, x)
		}
		prev = g
	}
	return nil
}

// ---- checking a whole state ----------------------------------------------

// check validates a complete state from scratch and returns its electrical
// power. slack is the relative tolerance on every limit: 0 for the
// reference's own states, a little more when checking another solver's.
func (r *refProblem) check(units []refUnit, h curves.Head, slack float64) (curves.Power, bool) {
	r.evals++
	if h < r.required*curves.Head(1-slack) {
		return 0, false
	}
	var sum curves.Flow
	var total curves.Power
	for i := range units {
		u := &units[i]
		m := &r.p.Models[u.Model]
		if m.Variable() {
			if u.Speed < m.MinSpeed*(1-slack) || u.Speed > m.MaxSpeed*(1+slack) {
				return 0, false
			}
		} else if u.Speed != 1 {
			return 0, false
		}
		if u.Flow < curves.Flow(float64(m.MinFlow)*u.Speed*(1-slack)) ||
			u.Flow > curves.Flow(float64(m.Runout)*u.Speed*(1+slack)) {
			return 0, false
		}
		if math.Abs(float64(refNetHead(m, u.Flow, u.Speed)-h)) > 1e-9*float64(h)+1e-12 {
			return 0, false
		}
		shaft := m.Pump.ShaftPower(u.Flow, u.Speed, r.density)
		if float64(shaft) > float64(m.Motor.Rated)*m.Motor.SF()*(1+slack) {
			return 0, false
		}
		c := m.Drive.Input(m.Motor, shaft, u.Speed)
		if c.Electrical < shaft || math.IsNaN(float64(c.Electrical)) {
			return 0, false
		}
		u.Power = c.Electrical
		total += c.Electrical
		sum += u.Flow
	}
	if math.Abs(float64(sum-r.pumped)) > 1e-9*float64(r.pumped) {
		return 0, false
	}
	return total, true
}

// solveHeader finds the header head at which units running at the given
// speeds move the pumped flow, by bisection on Σ q_i(H) = Q, and returns the
// completed units. Only heads at which every unit stays inside its flow
// limits are considered.
func (r *refProblem) solveHeader(units []refUnit, slack float64) ([]refUnit, curves.Head, bool) {
	lo, hi := math.Inf(-1), math.Inf(1) // admissible header heads
	for _, u := range units {
		m := &r.p.Models[u.Model]
		lo = math.Max(lo, float64(refNetHead(m, curves.Flow(float64(m.Runout)*u.Speed*(1+slack)), u.Speed)))
		hi = math.Min(hi, float64(refNetHead(m, curves.Flow(float64(m.MinFlow)*u.Speed*(1-slack)), u.Speed)))
	}
	if lo > hi {
		return nil, 0, false
	}
	total := func(h float64) float64 {
		var sum float64
		for _, u := range units {
			q, ok := refUnitFlow(&r.p.Models[u.Model], u.Speed, curves.Head(h), slack)
			if !ok { // only at the ends of [lo, hi], by rounding
				m := &r.p.Models[u.Model]
				if h <= lo {
					q = curves.Flow(float64(m.Runout) * u.Speed * (1 + slack))
				} else {
					q = curves.Flow(float64(m.MinFlow) * u.Speed * (1 - slack))
				}
			}
			sum += float64(q)
		}
		return sum - float64(r.pumped)
	}
	if total(lo) < 0 || total(hi) > 0 {
		return nil, 0, false
	}
	h := curves.Head(refBisect(total, lo, hi))
	out := append([]refUnit(nil), units...)
	for i := range out {
		q, ok := refUnitFlow(&r.p.Models[out[i].Model], out[i].Speed, h, slack)
		if !ok {
			return nil, 0, false
		}
		out[i].Flow = q
	}
	return out, h, true
}

// ---- individual speeds -----------------------------------------------------

// refLayout is how the units of one count vector map onto search coordinates.
type refLayout struct {
	fixed []int // model of each running fixed-speed unit
	free  []int // model of each variable unit whose speed is a coordinate
	last  int   // model of the variable unit that takes the remaining flow
}

// evalIndividual builds and checks the state at header head x[0] and the
// free units' speeds x[1:].
func (r *refProblem) evalIndividual(lay refLayout, x []float64) ([]refUnit, curves.Power, bool) {
	h := curves.Head(x[0])
	units := make([]refUnit, 0, len(lay.fixed)+len(lay.free)+1)
	rest := r.pumped
	add := func(model int, s float64) bool {
		q, ok := refUnitFlow(&r.p.Models[model], s, h, 0)
		if !ok {
			return false
		}
		units = append(units, refUnit{Model: model, Speed: s, Flow: q})
		rest -= q
		return true
	}
	for _, m := range lay.fixed {
		if !add(m, 1) {
			return nil, 0, false
		}
	}
	for j, m := range lay.free {
		if !add(m, x[1+j]) {
			return nil, 0, false
		}
	}
	if rest <= 0 {
		return nil, 0, false
	}
	s, ok := refUnitSpeed(&r.p.Models[lay.last], rest, h)
	if !ok {
		return nil, 0, false
	}
	units = append(units, refUnit{Model: lay.last, Speed: s, Flow: rest})
	pw, ok := r.check(units, h, 0)
	return units, pw, ok
}

// searchIndividual finds the lowest-power state with these running counts,
// each variable unit at its own speed.
func (r *refProblem) searchIndividual(counts []int) refResult {
	var fixed, variable []int
	for i, n := range counts {
		for k := 0; k < n; k++ {
			if r.p.Models[i].Variable() {
				variable = append(variable, i)
			} else {
				fixed = append(fixed, i)
			}
		}
	}
	if len(variable) == 0 {
		return r.searchNoFreedom(counts, fixed, nil)
	}
	best := refResult{}
	tried := map[int]bool{}
	for k := len(variable) - 1; k >= 0; k-- {
		lastModel := variable[k]
		if tried[lastModel] {
			continue
		}
		tried[lastModel] = true
		free := append(append([]int(nil), variable[:k]...), variable[k+1:]...)
		st := r.searchLayout(counts, refLayout{fixed: fixed, free: free, last: lastModel})
		if st.Feasible && (!best.Feasible || st.Power < best.Power) {
			best = st
		}
	}
	return best
}

// refGridSize is the number of grid points per coordinate for a search in d
// coordinates: dense where cheap, coarser in more dimensions.
func refGridSize(d int) int {
	switch d {
	case 1:
		return 121
	case 2:
		return 41
	case 3:
		return 21
	case 4:
		return 13
	}
	return 9
}

// gridPoints is refGridSize with the spacing scaled by gridScale.
func (r *refProblem) gridPoints(d int) int {
	return max(3, int(math.Round(float64(refGridSize(d)-1)/r.gridScale))+1)
}

// refCandidate is a feasible grid point.
type refCandidate struct {
	idx   []int
	x     []float64
	power curves.Power
}

func (r *refProblem) searchLayout(counts []int, lay refLayout) refResult {
	d := 1 + len(lay.free)
	lo := make([]float64, d)
	hi := make([]float64, d)
	lo[0] = float64(r.required)
	hi[0] = math.Inf(1)
	for _, m := range lay.fixed {
		hi[0] = math.Min(hi[0], float64(refHighestHead(&r.p.Models[m], 1)))
	}
	for _, m := range append(append([]int(nil), lay.free...), lay.last) {
		mm := &r.p.Models[m]
		hi[0] = math.Min(hi[0], float64(refHighestHead(mm, mm.MaxSpeed)))
	}
	if hi[0] < lo[0] {
		return refResult{}
	}
	for j, m := range lay.free {
		lo[1+j], hi[1+j] = r.p.Models[m].MinSpeed, r.p.Models[m].MaxSpeed
	}
	f := func(x []float64) (curves.Power, bool) {
		_, pw, ok := r.evalIndividual(lay, x)
		return pw, ok
	}
	// sameAs[j] is true where free unit j is the same model as free unit
	// j−1: identical units are enumerated as multisets (non-decreasing
	// speed index), every other pair as a full product.
	sameAs := make([]bool, d)
	for j := 1; j < len(lay.free); j++ {
		sameAs[1+j] = lay.free[j] == lay.free[j-1]
	}
	cands, n := refGridDoubling(f, lo, hi, r.gridPoints(d), sameAs)
	if len(cands) == 0 {
		return refResult{}
	}
	step := make([]float64, d)
	for j := range step {
		step[j] = (hi[j] - lo[j]) / float64(n-1)
	}
	x, pw := refRefineFrom(f, cands, lo, hi, step)
	units, _, _ := r.evalIndividual(lay, x)
	return refResult{Feasible: true, Counts: append([]int(nil), counts...), Units: units, Header: curves.Head(x[0]), Power: pw}
}

// refGridDoubling runs refGrid, and where no grid point is feasible (a thin
// feasible region) runs it again twice, each time with the spacing halved.
// It returns the candidates and the grid size that found them.
func refGridDoubling(f func([]float64) (curves.Power, bool), lo, hi []float64, n int, sameAs []bool) ([]refCandidate, int) {
	for attempt := 0; ; attempt++ {
		cands := refGrid(f, lo, hi, n, sameAs)
		if len(cands) > 0 || attempt == 2 {
			return cands, n
		}
		n = 2*n - 1
	}
}

// refGrid evaluates f on a grid of n points per coordinate over the box
// [lo, hi] and returns the feasible points sorted by power. Where sameAs[j]
// is set, coordinate j's index never falls below coordinate j−1's.
func refGrid(f func([]float64) (curves.Power, bool), lo, hi []float64, n int, sameAs []bool) []refCandidate {
	d := len(lo)
	idx := make([]int, d)
	var out []refCandidate
	var rec func(j int)
	rec = func(j int) {
		if j == d {
			x := make([]float64, d)
			for k := range x {
				x[k] = refGridValue(lo[k], hi[k], idx[k], n)
			}
			if pw, ok := f(x); ok {
				out = append(out, refCandidate{idx: append([]int(nil), idx...), x: x, power: pw})
			}
			return
		}
		start := 0
		if sameAs[j] {
			start = idx[j-1]
		}
		for i := start; i < n; i++ {
			idx[j] = i
			rec(j + 1)
		}
	}
	rec(0)
	sort.SliceStable(out, func(a, b int) bool { return out[a].power < out[b].power })
	return out
}

func refGridValue(lo, hi float64, i, n int) float64 {
	if n == 1 || hi == lo {
		return lo
	}
	if i == n-1 {
		return hi
	}
	return lo + (hi-lo)*float64(i)/float64(n-1)
}

// refStarts is how many well-separated grid points are refined.
const refStarts = 4

// refRefineFrom refines the best few grid points that lie at least two grid
// steps apart (in some coordinate) and returns the best result.
func refRefineFrom(f func([]float64) (curves.Power, bool), cands []refCandidate, lo, hi, step []float64) ([]float64, curves.Power) {
	var picked []refCandidate
	for _, c := range cands {
		near := false
		for _, p := range picked {
			far := false
			for k := range c.idx {
				if abs(c.idx[k]-p.idx[k]) >= 2 {
					far = true
				}
			}
			if !far {
				near = true
				break
			}
		}
		if !near {
			picked = append(picked, c)
		}
		if len(picked) == refStarts {
			break
		}
	}
	var bx []float64
	var bp curves.Power
	for _, c := range picked {
		x, pw := refCompass(f, c.x, c.power, lo, hi, step)
		if bx == nil || pw < bp {
			bx, bp = x, pw
		}
	}
	return bx, bp
}

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// refCompass is a compass search on the full 3^d stencil (every combination
// of −step, 0, +step per coordinate, so diagonal moves along a curved
// constraint are possible), clamped to the box. It moves to the best
// improving neighbour and halves the steps when none improves, until every
// step is below 1e-10 of its box side.
func refCompass(f func([]float64) (curves.Power, bool), x0 []float64, p0 curves.Power, lo, hi, step0 []float64) ([]float64, curves.Power) {
	d := len(x0)
	x := append([]float64(nil), x0...)
	step := append([]float64(nil), step0...)
	p := p0
	trial := make([]float64, d)
	for {
		small := true
		for j := range step {
			if step[j] > 1e-10*(hi[j]-lo[j]) {
				small = false
			}
		}
		if small {
			return x, p
		}
		var bestX []float64
		bestP := p
		for code := 0; code < pow3(d); code++ {
			c := code
			moved := false
			for j := 0; j < d; j++ {
				dir := c%3 - 1
				c /= 3
				trial[j] = math.Max(lo[j], math.Min(hi[j], x[j]+float64(dir)*step[j]))
				if trial[j] != x[j] {
					moved = true
				}
			}
			if !moved {
				continue
			}
			if pw, ok := f(trial); ok && pw < bestP {
				bestP, bestX = pw, append([]float64(nil), trial...)
			}
		}
		if bestX != nil {
			x, p = bestX, bestP
			continue
		}
		for j := range step {
			step[j] /= 2
		}
	}
}

func pow3(d int) int {
	n := 1
	for i := 0; i < d; i++ {
		n *= 3
	}
	return n
}

// ---- no freedom, common speed ---------------------------------------------

// searchNoFreedom solves a state whose speeds are all given (fixed-speed
// units at 1, variable units at speeds): the flow balance fixes the head.
func (r *refProblem) searchNoFreedom(counts []int, fixed []int, variable []refUnit) refResult {
	units := append([]refUnit(nil), variable...)
	for _, m := range fixed {
		units = append(units, refUnit{Model: m, Speed: 1})
	}
	units, h, ok := r.solveHeader(units, 0)
	if !ok {
		return refResult{}
	}
	pw, ok := r.check(units, h, 0)
	if !ok {
		return refResult{}
	}
	return refResult{Feasible: true, Counts: append([]int(nil), counts...), Units: units, Header: h, Power: pw}
}

// searchCommon finds the lowest-power state with these running counts and
// one speed for every running variable unit.
func (r *refProblem) searchCommon(counts []int) refResult {
	var fixed, variable []int
	lo, hi := 0.0, math.Inf(1) // the speeds every running variable model allows
	for i, n := range counts {
		m := &r.p.Models[i]
		for k := 0; k < n; k++ {
			if m.Variable() {
				variable = append(variable, i)
				lo, hi = math.Max(lo, m.MinSpeed), math.Min(hi, m.MaxSpeed)
			} else {
				fixed = append(fixed, i)
			}
		}
	}
	if len(variable) == 0 {
		return r.searchNoFreedom(counts, fixed, nil)
	}
	if lo > hi {
		return refResult{}
	}
	at := func(s float64) []refUnit {
		v := make([]refUnit, len(variable))
		for j, m := range variable {
			v[j] = refUnit{Model: m, Speed: s}
		}
		return v
	}
	f := func(x []float64) (curves.Power, bool) {
		st := r.searchNoFreedom(counts, fixed, at(x[0]))
		return st.Power, st.Feasible
	}
	cands, n := refGridDoubling(f, []float64{lo}, []float64{hi}, r.gridPoints(1), []bool{false})
	if len(cands) == 0 {
		return refResult{}
	}
	x, _ := refRefineFrom(f, cands, []float64{lo}, []float64{hi}, []float64{(hi - lo) / float64(n-1)})
	return r.searchNoFreedom(counts, fixed, at(x[0]))
}

// ---- checking another solver's state --------------------------------------

// refRecheck rebuilds a state from nothing but its running models and
// speeds, re-solving the header head and the flows with the reference's own
// physics, and checks every limit with a relative slack of 1e-9. It returns
// the state's power as the reference computes it.
func refRecheck(p *plant.Plant, load curves.Flow, models []int, speeds []float64) (curves.Power, curves.Head, bool) {
	r := newRefProblem(p, load)
	units := make([]refUnit, len(models))
	for i := range models {
		units[i] = refUnit{Model: models[i], Speed: speeds[i]}
	}
	const slack = 1e-9
	units, h, ok := r.solveHeader(units, slack)
	if !ok {
		return 0, 0, false
	}
	pw, ok := r.check(units, h, slack)
	return pw, h, ok
}

// ---- known closed forms used by the checks --------------------------------

// refEqualSplit returns the power of n identical units of model m sharing
// flow q equally at header head h, each at the speed that gives q/n at h,
// computed without any search but one bisection on speed. ok is false where
// that speed or flow leaves the unit's limits.
func refEqualSplit(p *plant.Plant, model, n int, q curves.Flow, h curves.Head) (curves.Power, float64, bool) {
	m := &p.Models[model]
	qi := q / curves.Flow(n)
	var s float64
	if m.Variable() {
		var ok bool
		if s, ok = refUnitSpeed(m, qi, h); !ok {
			return 0, 0, false
		}
	} else {
		s = 1
		if math.Abs(float64(refNetHead(m, qi, 1)-h)) > 1e-9*float64(h) {
			return 0, 0, false
		}
	}
	if qi < curves.Flow(float64(m.MinFlow)*s) || qi > curves.Flow(float64(m.Runout)*s) {
		return 0, 0, false
	}
	shaft := m.Pump.ShaftPower(qi, s, p.Fluid.Density)
	if float64(shaft) > float64(m.Motor.Rated)*m.Motor.SF() {
		return 0, 0, false
	}
	return curves.Power(n) * m.Drive.Input(m.Motor, shaft, s).Electrical, s, true
}

// ---- self-checks of the reference -------------------------------------------

// suitePlantNamed returns the suite plant of that name.
func suitePlantNamed(t testing.TB, name string) *plant.Plant {
	t.Helper()
	for _, p := range suitePlants(t) {
		if p.Name == name {
			return p
		}
	}
	t.Fatalf("no suite plant %q", name)
	return nil
}

// With zero control head the system curve is H ∝ Q², the affinity parabola,
// and with constant motor and drive efficiencies (and no limit binding)
// every feasible state at Q maps onto one at λQ with speeds ×λ, flows ×λ,
// head ×λ² and power ×λ³: the optimum follows the cube law exactly
// (affinity laws, every pump handbook [P]; docs/sources.md §3).
func TestReferenceCubeLaw(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	p := suitePlantNamed(t, "constant-chain-zero-control")
	base := curves.Flow(0.20)
	ref0 := refSolve(p, base, false)
	if !ref0.Feasible {
		t.Fatal("reference finds the base point infeasible")
	}
	for _, lam := range []float64{0.4, 0.6, 0.8, 1.2} {
		r := refSolve(p, base*curves.Flow(lam), false)
		want := float64(ref0.Power) * lam * lam * lam
		if !r.Feasible || math.Abs(float64(r.Power)/want-1) > 1e-7 {
			t.Errorf("λ = %g: reference %v %.9g W, cube law %.9g W", lam, r.Feasible, float64(r.Power), want)
		}
	}
}

// For identical units with convex power curves the equal split is optimal
// (Viholainen et al. 2013, docs/sources.md §7 [M]); the reference, which never
// assumes it, must land on the best equal split to well within the suite
// tolerance, and can never be above it (an equal split is one of its
// states).
func TestReferenceFindsEqualSplit(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	for _, name := range []string{"identical-3", "two-pole", "branch-losses"} {
		p := suitePlantNamed(t, name)
		for _, frac := range []float64{0.2, 0.35, 0.5, 0.65, 0.8} {
			q := suiteCapacity(p) * curves.Flow(frac)
			h := p.System.Required(q)
			best := curves.Power(math.Inf(1))
			for n := 1; n <= p.Models[0].Count; n++ {
				if pw, _, ok := refEqualSplit(p, 0, n, q, h); ok && pw < best {
					best = pw
				}
			}
			if math.IsInf(float64(best), 1) {
				continue
			}
			r := refSolve(p, q, false)
			if !r.Feasible || float64(r.Power) > float64(best)*(1+1e-12) || float64(r.Power) < float64(best)*(1-1e-6) {
				t.Errorf("%s at %.4g m³/s: reference %v %.9g W, best equal split %.9g W", name, float64(q), r.Feasible, float64(r.Power), float64(best))
			}
		}
	}
}

// One fixed-speed unit has no freedom: its flow is the load and its head is
// read off its curve, H = H_b (r − (r−1)(Q/Q_b)²) with the suite's r = 1.25
// (computed check [D] from the curve's definition).
func TestReferenceSingleFixedUnit(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	m := suiteModel{name: "F", count: 1, pump: pumpL, motorHP: 60, drive: curves.FixedSpeed{}}.build(t)
	p := &plant.Plant{Name: "one-fixed", Fluid: curves.Fluid{Density: 999.9}, System: dp(0.1, 20, 0.5), Models: []plant.Model{m}}
	for _, x := range []float64{0.4, 0.8, 1.0, 1.2} {
		q := curves.Flow(x) * pumpL.bepFlow
		r := refSolve(p, q, false)
		wantH := float64(pumpL.bepHead) * (1.25 - 0.25*x*x)
		wantP := m.Drive.Input(m.Motor, m.Pump.ShaftPower(q, 1, 999.9), 1).Electrical
		if !r.Feasible || math.Abs(float64(r.Header)/wantH-1) > 1e-9 || math.Abs(float64(r.Power/wantP)-1) > 1e-9 {
			t.Errorf("x = %g: reference %v head %.9g m power %.9g W, want %.9g m %.9g W", x, r.Feasible, float64(r.Header), float64(r.Power), wantH, float64(wantP))
		}
	}
}

// The refined answer must not depend on the grid it started from.
func TestReferenceGridIndependent(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	if testing.Short() {
		t.Skip("slow")
	}
	for _, name := range []string{"two-sizes", "small-beside-large", "flat-efficiency", "fixed-among-variable"} {
		p := suitePlantNamed(t, name)
		for _, frac := range []float64{0.15, 0.45, 0.75} {
			q := suiteCapacity(p) * curves.Flow(frac)
			a := refSolveGrid(p, q, false, 1)
			b := refSolveGrid(p, q, false, 0.7)
			if a.Feasible != b.Feasible || (a.Feasible && math.Abs(float64(a.Power/b.Power)-1) > 1e-7) {
				t.Errorf("%s at %.4g m³/s: grid ×1 %v %.9g W %v, grid ×0.7 %v %.9g W %v", name, float64(q),
					a.Feasible, float64(a.Power), a.Counts, b.Feasible, float64(b.Power), b.Counts)
			}
		}
	}
}

// One common speed is a restriction of individual speeds: never cheaper.
func TestReferenceCommonNotCheaper(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	flows := 9
	if testing.Short() {
		flows = 3 // the quick loop: 1 %, 55 % and 110 % of capacity
	}
	for _, name := range []string{"two-sizes", "fixed-small-with-large", "three-models"} {
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			p := suitePlantNamed(t, name)
			for _, q := range suiteFlows(p, flows) {
				ind, com := refSolve(p, q, false), refSolve(p, q, true)
				if com.Feasible && (!ind.Feasible || float64(com.Power) < float64(ind.Power)*(1-1e-9)) {
					t.Errorf("%s at %.4g m³/s: common speed %.9g W below individual %v %.9g W", name, float64(q),
						float64(com.Power), ind.Feasible, float64(ind.Power))
				}
			}
		})
	}
}
