package optimize

import "math"

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
