package optimize

import "math"

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
	fhi := flows(shi)
	if fhi < qvar*(1-1e-12) {
		return false
	}
	sp := slo
	if fa := flows(slo); fa > qvar*(1+1e-9) {
		// At the common floor the units move too much: the head must rise.
		return false
	} else if fa < qvar && slo < shi {
		// The flows rise with the speed: Brent's method finds the speed
		// that makes qvar (it brackets, so a jump where a unit only just
		// reaches the head ends at the jump and fails the check below).
		sp = brentRoot(func(v float64) float64 { return flows(v) - qvar }, slo, shi, fa-qvar, fhi-qvar, 1e-14)
	}
	// Otherwise on the floor (within rounding of the head that put it there).
	flows(sp)
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
