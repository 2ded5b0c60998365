package optimize

import "math"

// acrossModels searches the split of qvar between variable models globally
// where the equal-marginal split may be only a local optimum. Where a
// model's power is not convex in its flow at the state's head (a slowly
// rising pump efficiency, the floor of the Sârbu–Borza step-down, the
// kinks of a drive's efficiency table), the power along the split can have
// two or more minima, and the better one often has a unit at a bound (its
// minimum flow or runout). The sum of convex functions is convex, so the
// search runs only for a model whose power fails the convexity test
// (convexOn, 9 points), or whose bounds beat the Newton split: each model
// at each end of its range, the others sharing the rest in proportion to
// their ranges (an upper bound on their best share; exact for two models),
// which catches a kink narrower than the test's spacing.
//
// For each such model i the per-unit flow q_i is scanned over every value
// the other models can balance, [max(lo_i, (Q − Σ_j n_j hi_j)/n_i),
// min(hi_i, (Q − Σ_j n_j lo_j)/n_i)], with the others at their own best
// split (one other model: the rest of the flow; more: newtonSplit); both
// ends (a unit at a bound) and every local minimum of the scan are refined
// by golden section (Kiefer 1953), as the unequal split of identical units
// is searched within one model (trySplits). The best split found replaces
// st.q only where it saves power. Two models need one scan: q_j follows
// from q_i.
func (s *Solver) acrossModels(st *state, vars []int, spans []span, qvar float64) {
	n := func(i int) float64 { return float64(st.counts[i]) }
	var bentBuf [8]int
	bent := bentBuf[:0]
	for _, i := range vars {
		if !s.convex(i, st.h, spans[i]) || s.boundBeats(st, vars, spans, qvar, i) {
			bent = append(bent, i)
			if len(vars) == 2 {
				break
			}
		}
	}
	if len(bent) == 0 {
		return
	}
	cost := func() float64 {
		sum := 0.0
		for _, i := range vars {
			sum += n(i) * s.units[i].powerAt(st.q[i], st.h)
		}
		return sum
	}
	best := append([]float64(nil), st.q...)
	bestP := cost()
	if math.IsNaN(bestP) {
		bestP = math.Inf(1)
	}
	others := make([]int, 0, len(vars))
	for _, i := range bent {
		others = others[:0]
		loRest, hiRest := 0.0, 0.0
		for _, j := range vars {
			if j != i {
				others = append(others, j)
				loRest += n(j) * spans[j].lo
				hiRest += n(j) * spans[j].hi
			}
		}
		a := math.Max(spans[i].lo, (qvar-hiRest)/n(i))
		b := math.Min(spans[i].hi, (qvar-loRest)/n(i))
		if !(b > a) {
			continue
		}
		// f sets model i to qi, the others to their best split of the rest,
		// and returns the power.
		f := func(qi float64) float64 {
			st.q[i] = qi
			rest := qvar - n(i)*qi
			if len(others) == 1 {
				j := others[0]
				st.q[j] = rest / n(j)
			} else {
				s.newtonSplit(st, others, spans, rest)
			}
			p := cost()
			if math.IsNaN(p) {
				return math.Inf(1)
			}
			if p < bestP {
				bestP = p
				copy(best, st.q)
			}
			return p
		}
		const m = 16
		var fs [m + 1]float64
		for k := 0; k <= m; k++ {
			fs[k] = f(a + (b-a)*float64(k)/m)
		}
		iters := 40
		if len(others) > 1 {
			iters = 24 // each evaluation is a Newton split of its own
		}
		for k := 0; k <= m; k++ {
			if (k > 0 && fs[k] > fs[k-1]) || (k < m && fs[k] > fs[k+1]) {
				continue // not a local minimum of the scan
			}
			lo := a + (b-a)*float64(max(k-1, 0))/m
			hi := a + (b-a)*float64(min(k+1, m))/m
			const g = 0.6180339887498949
			x1, x2 := hi-g*(hi-lo), lo+g*(hi-lo)
			f1, f2 := f(x1), f(x2)
			for it := 0; it < iters && hi-lo > 1e-10*b; it++ {
				if f1 < f2 {
					hi, x2, f2 = x2, x1, f1
					x1 = hi - g*(hi-lo)
					f1 = f(x1)
				} else {
					lo, x1, f1 = x1, x2, f2
					x2 = lo + g*(hi-lo)
					f2 = f(x2)
				}
			}
			f((lo + hi) / 2)
		}
	}
	copy(st.q, best)
}

// boundBeats reports whether model i at either end of the flows the others
// can balance, the others sharing the rest in proportion to their ranges,
// draws less power than the current split st.q.
func (s *Solver) boundBeats(st *state, vars []int, spans []span, qvar float64, i int) bool {
	n := func(k int) float64 { return float64(st.counts[k]) }
	cur := 0.0
	loRest, hiRest := 0.0, 0.0
	for _, k := range vars {
		cur += n(k) * s.units[k].powerAt(st.q[k], st.h)
		if k != i {
			loRest += n(k) * spans[k].lo
			hiRest += n(k) * spans[k].hi
		}
	}
	a := math.Max(spans[i].lo, (qvar-hiRest)/n(i))
	b := math.Min(spans[i].hi, (qvar-loRest)/n(i))
	if !(b > a) {
		return false
	}
	for _, qi := range [2]float64{a, b} {
		rest := qvar - n(i)*qi
		t := 0.0
		if hiRest > loRest {
			t = clamp((rest-loRest)/(hiRest-loRest), 0, 1)
		}
		p := n(i) * s.units[i].powerAt(qi, st.h)
		for _, k := range vars {
			if k != i {
				p += n(k) * s.units[k].powerAt(spans[k].lo+t*(spans[k].hi-spans[k].lo), st.h)
			}
		}
		if p < cur*(1-1e-12) {
			return true
		}
	}
	return false
}

// convexAt reports whether every running variable model of a state has a
// power convex in its flow over its span at the state's head.
func (s *Solver) convexAt(st *state) bool {
	for i, n := range st.counts {
		u := s.units[i]
		if n == 0 || !u.variable {
			continue
		}
		if sp := u.bounds(st.h); sp.ok && !s.convex(i, st.h, sp) {
			return false
		}
	}
	return true
}

// convex is model i's convexOn at head h over its span sp there,
// remembered for the last head asked.
func (s *Solver) convex(i int, h float64, sp span) bool {
	if s.cvxH[i] != h {
		s.cvxH[i], s.cvxOK[i] = h, s.units[i].convexOn(sp, h)
	}
	return s.cvxOK[i]
}
