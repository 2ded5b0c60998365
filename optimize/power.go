package optimize

import "wattstage/curves"

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
