package optimize

import "wattstage/curves"

// closeVectors lists the vectors of exactly n running units whose input at
// the load comes within keep of the best such vector's (each at the
// required head or its lowest feasible head, with its split), found by the
// branch and bound rather than by evaluating every vector of n units, and
// evaluating at most limit of them, lowest bound first (identical models
// give many vectors of equal input: a list of them says nothing more).
func (s *Solver) closeVectors(load curves.Flow, n int, keep float64, limit int) [][]int {
	pumped := max(load, s.plant.MinFlow)
	if pumped <= 0 {
		return nil
	}
	hr := float64(s.plant.RequiredHead(load))
	Q := float64(pumped)
	s.resetGrid(hr)
	s.bounded = false
	s.evalLimit = limit
	best, near := s.branchAndBound(Q, hr, Constraint{Total: n}, keep)
	s.evalLimit = 0
	if best == nil {
		return nil
	}
	var out [][]int
	for _, st := range near {
		if st.power <= best.power*(1+keep) {
			out = append(out, append([]int(nil), st.counts...))
		}
	}
	return out
}
