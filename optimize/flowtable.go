package optimize

import (
	"math"
	"slices"

	"wattstage/curves"
)

// A staging table over the load flow, so that the cost of a point no
// longer grows with the number of count vectors.
//
// With no constraint a solve is a function of the load flow alone (the
// required head follows the system curve). The table divides the flows
// into steps of tableStep of the design flow and, at each step's ends,
// keeps the vectors whose input comes within tableKeep of the best there
// (a branch and bound that keeps rather than prunes them, bestvector.go).
// A load between two ends is then solved exactly, as any vector is, but
// among the vectors kept at either end only. A vector that wins between
// two ends but is more than tableKeep worse at both would need its input,
// relative to the others', to swing by more than that within one step;
// the inputs are smooth in the flow within a step and a vector's feasible
// flows are an interval wider than a step, so this is not expected, and
// the optimality suite and the large plants' check (TestTableKeepsTheBest)
// compare every point with the vectors evaluated one by one.
//
// An end is computed when a load first needs it, from its own flow alone:
// the answer for a load does not depend on which loads came before, so a
// strategy solved in any order, or in parallel, gives the same bytes. Where
// no kept vector serves a load (near the plant's capacity, say) the solve
// falls back to the full branch and bound.

// The table's ends are the flows tableBase·D·(1+tableStep)^j for design
// flow D: a step is a fixed share of the flow, so the inputs of two vectors,
// which vary about as a power of the flow, move by about as much relative
// to each other over any step, at 10 % of design as at 100 %.
const tableStep = 0.005

const tableBase = 0.01

// tableKeep is how far above the best input at a step's end (each vector
// at its best head) a vector may be and still be kept there. Measured on
// the large plants (DEVELOPERS.md): 0.2 % already missed no point at steps
// of 1 %; 0.5 % at steps of 0.5 % leaves a margin at about two vectors an
// end.
const tableKeep = 0.005

// tableMaxSteps bounds the table: flows above tableBase·D·(1+tableStep)^
// tableMaxSteps (about 5.4 times the design flow at the default step) are
// solved without it, as are flows below tableBase·D.
const tableMaxSteps = 1260

// flowTable holds the ends computed so far.
type flowTable struct {
	ends []tableEnd
}

// tableEnd is the vectors kept at one step's end, their counts laid end to
// end.
type tableEnd struct {
	done   bool
	counts []int
}

// tableFor reports whether a solve may use the table: a plant with more
// vectors than everyVector takes, and no constraint.
func (s *Solver) tableFor(c Constraint) bool {
	return !s.noTable && !s.exhaustive && len(s.combos) > fewVectors &&
		c.Counts == nil && c.Total == 0 && c.Head == 0
}

// fromTable solves a load among the vectors kept at the ends of its step,
// or returns nil when the table does not apply or none of them serves it.
func (s *Solver) fromTable(load, Q, hr float64, c Constraint) (*state, []*state) {
	if !s.tableFor(c) || s.plant.DesignFlow <= 0 {
		return nil, nil
	}
	base := tableBase * float64(s.plant.DesignFlow)
	if load < base {
		return nil, nil
	}
	j := int(math.Log(load/base) / math.Log1p(tableStep))
	if j+1 >= tableMaxSteps {
		return nil, nil
	}
	a, b := s.tableEnd(j, base), s.tableEnd(j+1, base)
	s.resetGrid(hr)
	s.bounded = false
	s.near = s.near[:0]
	n := len(s.units)
	cands := s.tableBuf[:0]
	for _, e := range [2][]int{a, b} {
		for off := 0; off < len(e); off += n {
			if cnt := e[off : off+n]; !hasVector(cands, cnt) {
				cands = append(cands, cnt...)
			}
		}
	}
	s.tableBuf = cands
	var best *state
	for off := 0; off < len(cands); off += n {
		cnt := cands[off : off+n : off+n]
		_, _, sd := s.sidesAt(cnt, Q, hr, 0, s.spanBuf(n))
		if sd != fits && !s.mayRise(cnt, Q, hr) {
			continue
		}
		best = s.evaluate(Q, hr, cnt, sd == fits, best, 0)
	}
	return best, s.near
}

// hasVector reports whether the vectors laid end to end in list include cnt.
func hasVector(list, cnt []int) bool {
	n := len(cnt)
	for o := 0; o < len(list); o += n {
		if slices.Equal(list[o:o+n], cnt) {
			return true
		}
	}
	return false
}

// tableEnd returns the vectors kept at step end j (flow base·(1+tableStep)^j),
// computing them the first time.
func (s *Solver) tableEnd(j int, base float64) []int {
	t := &s.table
	if j >= len(t.ends) {
		t.ends = slices.Grow(t.ends, j+1-len(t.ends))[:j+1]
	}
	e := &t.ends[j]
	if e.done {
		return e.counts
	}
	e.done = true
	load := base * math.Pow(1+tableStep, float64(j))
	Q := max(load, float64(s.plant.MinFlow))
	if Q <= 0 {
		return nil
	}
	hr := float64(s.plant.RequiredHead(curves.Flow(load)))
	s.resetGrid(hr)
	best, near := s.branchAndBound(Q, hr, Constraint{}, tableKeep)
	if best == nil {
		return nil
	}
	// Each vector at its best head, as a solve gives it: the head search
	// for those within headSearchMargin of the best (solver.go).
	least := math.Inf(1)
	powers := make([]float64, len(near))
	for i, st := range near {
		powers[i] = st.power
		if st.power <= best.power*headSearchMargin {
			if h := s.searchHead(st, Q, hr); h != nil && h.power < st.power {
				powers[i] = h.power
			}
		}
		least = math.Min(least, powers[i])
	}
	for i, st := range near {
		if powers[i] <= least*(1+tableKeep) {
			e.counts = append(e.counts, st.counts...)
		}
	}
	return e.counts
}
