package optimize

import (
	"cmp"
	"math"
	"slices"
)

// branchAndBound finds the cheapest vector of running counts at flow Q
// (required head hr) under a constraint, and the states it evaluated
// (candidates for the head search). It is a best-first branch and bound
// over the models (branch.go): the frontier holds partial vectors with a
// lower bound on every vector below them (bound.go), the least-bound item
// is expanded (a partial vector) or evaluated (a whole one) next, and the
// search stops when the least bound left exceeds the best input found
// (with the allowance boundSlack), since nothing left can beat it. Whole
// vectors are thus evaluated lowest bound first (those that need a higher
// head after the rest, see below), and only the nodes whose bound lies
// below the answer are ever expanded.
//
// Each vector is evaluated as before the bounds: at the required head
// with the variable units' flow split in proportion to their ranges (exact
// for one variable model), or at its lowest feasible head; then, for
// multi-model vectors whose proportional split is within quickMargin of
// the best (bentMargin where a model's power is not convex), with the full
// equal-marginal split.
func (s *Solver) branchAndBound(Q, hr float64, c Constraint, keep float64) (*state, []*state) {
	s.items, s.heap, s.leafCnt, s.near = s.items[:0], s.heap[:0], s.leafCnt[:0], s.near[:0]
	if c.Counts != nil {
		return s.oneVector(Q, hr, c.Counts), s.near
	}
	if s.exhaustive || len(s.combos) <= fewVectors {
		return s.everyVector(Q, hr, c)
	}
	s.prepareBounds(Q, hr)
	s.bounded = true
	b := s.prepareBranch(Q, hr, c)
	clear(b.cur)
	b.push(item{bound: b.nodeBound(0, &node{})})
	var best *state
	thr := math.Inf(1)
	evaluated := 0
	eval := func(it *item) bool {
		cnt := s.leafCnt[it.off : it.off+len(s.units) : it.off+len(s.units)]
		k := keep
		if s.fixedModels && s.runsFixed(cnt) {
			k = max(keep, headSearchMargin-1) // see branch.relax
		}
		if best = s.evaluate(Q, hr, cnt, it.fits, best, k); best != nil {
			thr = best.power * (1 + keep) * (1 + boundSlack)
		}
		evaluated++
		return s.evalLimit > 0 && evaluated >= s.evalLimit
	}
	// A vector that needs a higher head is set aside until the search is
	// done: its bound is looser (every head from h_r up), so it tends to
	// pop first, and its evaluation (a search for its lowest feasible head)
	// gives up early only once a best state is known. Every vector whose
	// bound is within the final threshold is still evaluated.
	deferred := s.deferred[:0]
	limited := false // evalLimit reached
	for len(s.heap) > 0 {
		it := b.pop()
		if it.bound > thr {
			break
		}
		if it.depth < len(s.units) {
			b.expand(it, thr)
			continue
		}
		if !it.fits {
			deferred = append(deferred, int32(it.seq))
			continue
		}
		if limited = eval(it); limited {
			break
		}
	}
	if limited {
		deferred = deferred[:0]
	}
	slices.SortFunc(deferred, func(x, y int32) int {
		return cmp.Or(cmp.Compare(s.items[x].bound, s.items[y].bound), cmp.Compare(x, y))
	})
	for _, k := range deferred {
		it := &s.items[k]
		if it.bound > thr || eval(it) {
			break
		}
	}
	s.deferred = deferred
	return best, s.near
}

// runsFixed reports whether a vector runs a fixed-speed unit.
func (s *Solver) runsFixed(cnt []int) bool {
	for i, n := range cnt {
		if n > 0 && !s.units[i].variable {
			return true
		}
	}
	return false
}

// oneVector solves a given vector of counts: nothing to bound.
func (s *Solver) oneVector(Q, hr float64, cnt []int) *state {
	_, _, sd := s.sidesAt(cnt, Q, hr, 0, s.spanBuf(len(cnt)))
	if sd != fits && !s.mayRise(cnt, Q, hr) {
		return nil
	}
	return s.evaluate(Q, hr, cnt, sd == fits, nil, 0)
}

// evaluate solves one vector (fitsAtHr: it serves the flow at the required
// head) and returns the better of its state and best; every state it
// solves in full is kept in s.near. A vector is given up where a bound or
// its proportional split shows it cannot come within keep of best (0: that
// it cannot beat best). The bounds of this solve (s.mb) are used only when
// s.bounded says they were prepared for it.
func (s *Solver) evaluate(Q, hr float64, cnt []int, fitsAtHr bool, best *state, keep float64) *state {
	if fitsAtHr && best != nil && s.bounded &&
		s.refine(cnt, Q, s.br.rgq) > best.power*(1+keep)*(1+boundSlack) {
		return best // its own multiplier's bound puts it out of reach
	}
	st := s.proportionalAt(cnt, Q, hr, fitsAtHr, best)
	if st == nil {
		return best
	}
	if s.variableModels(cnt) > 1 {
		if best != nil && st.power > (1+keep)*quickMargin*best.power &&
			(st.power > (1+keep)*bentMargin*best.power || s.convexAt(st)) {
			// Its proportional split says it is far off (for a model
			// whose power is not convex the best split may lie far from
			// the proportional one: bentMargin).
			return best
		}
		if full, sd := s.atHeadMode(st.counts, Q, st.h, splitGlobal); sd == fits {
			st = full
		}
	}
	s.near = append(s.near, st)
	if best == nil || st.power < best.power {
		best = st
	}
	return best
}

// proportionalAt is a vector's state with the proportional split: at the
// required head when it fits there, else at its lowest feasible head (given
// up once that head alone costs more than the best state).
func (s *Solver) proportionalAt(cnt []int, Q, hr float64, fitsAtHr bool, best *state) *state {
	h := hr
	if !fitsAtHr {
		bound := math.Inf(1)
		if best != nil {
			bound = best.power
		}
		if h = s.lowestFeasibleHeadBound(cnt, Q, hr, bound); h <= 0 {
			return nil
		}
	}
	st, sd := s.atHeadMode(cnt, Q, h, splitProportional)
	if sd != fits && s.opt.CommonSpeed {
		// Each unit could carry its share at h, but not at one common
		// speed (at the shared floor the units move too much): the header
		// head must rise until they can.
		st = s.commonAbove(cnt, Q, h)
	} else if sd != fits {
		return nil
	}
	return st
}

// commonAbove is a vector's state with one common speed at the lowest
// header head above from where it has one (a scan of the solve's head grid
// above it, then bisection), or nil.
func (s *Solver) commonAbove(cnt []int, Q, from float64) *state {
	at := func(h float64) *state {
		st, sd := s.atHeadMode(cnt, Q, h, splitProportional)
		if sd != fits {
			return nil
		}
		return st
	}
	hc := s.headCap(cnt)
	prev := from
	for k := 1; k <= gridPoints && s.grid[k-1] < hc; k++ {
		h := s.grid[k]
		if h <= from {
			continue
		}
		if at(h) == nil {
			prev = h
			continue
		}
		a, b := prev, h
		for it := 0; it < 80 && b-a > 1e-12*b; it++ {
			if m := (a + b) / 2; at(m) != nil {
				b = m
			} else {
				a = m
			}
		}
		return at(b)
	}
	return nil
}
