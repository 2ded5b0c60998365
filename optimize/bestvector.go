package optimize

import (
	"math"
	"slices"
)

// branchAndBound finds the cheapest vector of running counts at flow Q
// (required head hr) under a constraint, and the states it evaluated
// (candidates for the head search). Vectors are listed by a branch and
// bound over the models (branch.go) with lower bounds on their input
// (bound.go) and evaluated from the lowest bound up; evaluation stops at
// the first vector whose bound exceeds the best input found (with the
// allowance boundSlack), since no later vector can beat it. The first
// listing goes only firstRatio above the least bound; a second one lists
// what lies between that and the best found when the best is above it.
//
// Each vector is evaluated as before the bounds: at the required head
// with the variable units' flow split in proportion to their ranges (exact
// for one variable model), or at its lowest feasible head; then, for
// multi-model vectors whose proportional split is within quickMargin of
// the best (bentMargin where a model's power is not convex), with the full
// equal-marginal split.
func (s *Solver) branchAndBound(Q, hr float64, c Constraint) (*state, []*state) {
	s.leaves, s.leafCnt, s.near = s.leaves[:0], s.leafCnt[:0], s.near[:0]
	if c.Counts != nil {
		return s.oneVector(Q, hr, c.Counts), s.near
	}
	if s.exhaustive || len(s.combos) <= fewVectors {
		return s.everyVector(Q, hr, c)
	}
	s.prepareBounds(Q, hr)
	b := s.prepareBranch(Q, hr, c)
	b.thr, b.floor, b.ratio = math.Inf(1), math.Inf(-1), firstRatio
	thr := b.list()
	var best *state
	best = s.evaluate(Q, hr, thr, best)
	if best == nil || best.power*(1+boundSlack) > thr {
		b.floor, b.ratio = thr, 0
		b.thr = math.Inf(1)
		if best != nil {
			b.thr = best.power * (1 + boundSlack)
		}
		s.leaves = s.leaves[:0]
		b.list()
		best = s.evaluate(Q, hr, b.thr, best)
	}
	return best, s.near
}

// oneVector solves a given vector of counts: nothing to bound.
func (s *Solver) oneVector(Q, hr float64, cnt []int) *state {
	_, _, sd := s.sidesAt(cnt, Q, hr, 0, s.spanBuf(len(cnt)))
	if sd != fits && !s.mayRise(cnt, Q, hr) {
		return nil
	}
	s.leaves = append(s.leaves, leaf{off: 0, fits: sd == fits})
	s.leafCnt = append(s.leafCnt, cnt...)
	return s.evaluate(Q, hr, math.Inf(1), nil)
}

// evaluate solves the listed vectors bounded at or below thr, lowest bound
// first, and returns the best state (best on entry, if none beats it).
func (s *Solver) evaluate(Q, hr, thr float64, best *state) *state {
	slices.SortStableFunc(s.leaves, func(a, b leaf) int {
		switch {
		case a.bound < b.bound:
			return -1
		case a.bound > b.bound:
			return 1
		}
		return 0
	})
	n := len(s.units)
	for _, lf := range s.leaves {
		if lf.bound > thr || (best != nil && lf.bound > best.power*(1+boundSlack)) {
			break
		}
		cnt := s.leafCnt[lf.off : lf.off+n : lf.off+n]
		if lf.fits && best != nil && len(s.mb) == n &&
			s.refine(cnt, Q, s.br.rgq) > best.power*(1+boundSlack) {
			continue // its own multiplier's bound puts it out of reach
		}
		st := s.proportionalAt(cnt, Q, hr, lf.fits, best)
		if st == nil {
			continue
		}
		if s.variableModels(cnt) > 1 {
			if best != nil && st.power > quickMargin*best.power &&
				(st.power > bentMargin*best.power || s.convexAt(st)) {
				// Its proportional split says it is far off (for a model
				// whose power is not convex the best split may lie far from
				// the proportional one: bentMargin).
				continue
			}
			if full, sd := s.atHeadMode(st.counts, Q, st.h, splitGlobal); sd == fits {
				st = full
			}
		}
		s.near = append(s.near, st)
		if best == nil || st.power < best.power {
			best = st
		}
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
	if sd != fits {
		return nil
	}
	return st
}
