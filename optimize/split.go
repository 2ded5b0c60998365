package optimize

import "math"

// trySplits checks whether identical units of one model are cheaper at
// unequal flows (possible where a flat efficiency curve leaves the drive
// losses' concavity in charge, docs/sources.md §10): j units at qb, the rest at qa,
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
