package optimize

import (
	"math"
	"sort"
)

// fewVectors is the number of count vectors up to which a solve evaluates
// every one of them (everyVector) rather than bounding them first: on a
// small plant the bounds cost more than they save (measured on the 3-unit
// trend example, DEVELOPERS.md).
const fewVectors = 16

// everyVector finds the cheapest vector by evaluating every allowed one:
// each at the required head with the proportional split (or at its lowest
// feasible head), then, cheapest first, the full split for those within
// quickMargin of the best (bentMargin where a model's power is not convex).
func (s *Solver) everyVector(Q, hr float64, c Constraint) (*state, []*state) {
	type cand struct {
		st    *state
		exact bool
	}
	var cands []cand
	quickBest := math.Inf(1)
	keep := func(st *state) {
		cands = append(cands, cand{st, s.variableModels(st.counts) <= 1})
		quickBest = math.Min(quickBest, st.power)
	}
	add := func(cnt []int, h float64) {
		if st, sd := s.atHeadMode(cnt, Q, h, splitProportional); sd == fits {
			keep(st)
		} else if s.opt.CommonSpeed {
			// No common speed at h though each unit could carry its share
			// there: the head must rise (proportionalAt).
			if st := s.commonAbove(cnt, Q, h); st != nil {
				keep(st)
			}
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
		if h := s.lowestFeasibleHeadBound(cnt, Q, hr, quickBest); h > 0 {
			add(cnt, h)
		}
	}
	sort.Slice(cands, func(i, j int) bool { return cands[i].st.power < cands[j].st.power })
	var best *state
	near := s.near[:0]
	for _, cd := range cands {
		st := cd.st
		if best != nil && st.power > quickMargin*best.power {
			if cd.exact || st.power > bentMargin*best.power || s.convexAt(st) {
				continue
			}
		}
		if !cd.exact {
			if full, sd := s.atHeadMode(st.counts, Q, st.h, splitGlobal); sd == fits {
				st = full
			}
		}
		near = append(near, st)
		if best == nil || st.power < best.power {
			best = st
		}
	}
	s.near = near
	return best, near
}
