package optimize

import (
	"math"
	"sort"
)

// equalMarginal splits qvar among the variable models at the lowest power:
// at equal marginal powers dP/dQ where no bound binds (the optimality
// condition for a convex separable cost, found by newtonSplit), and, where
// a model's power is not convex in its flow, at the best of every local
// minimum along the split (acrossModels) when global is set.
func (s *Solver) equalMarginal(st *state, vars []int, spans []span, qvar float64, global bool) {
	if len(vars) == 1 {
		i := vars[0]
		st.q[i] = clamp(qvar/float64(st.counts[i]), spans[i].lo, spans[i].hi)
		return
	}
	s.newtonSplit(st, vars, spans, qvar)
	if global {
		s.acrossModels(st, vars, spans, qvar)
	}
}

// newtonSplit splits qvar among two or more variable models so that their
// marginal powers are equal where no bound binds. It takes projected Newton
// steps on a local quadratic model, with a backtracking line search on the
// true power, from the split in proportion to the models' ranges; on a
// power that is not convex it stops at a local minimum.
func (s *Solver) newtonSplit(st *state, vars []int, spans []span, qvar float64) {
	n := func(i int) float64 { return float64(st.counts[i]) }
	lo, hi := 0.0, 0.0
	for _, i := range vars {
		lo += n(i) * spans[i].lo
		hi += n(i) * spans[i].hi
	}
	t := 0.0
	if hi > lo {
		t = (qvar - lo) / (hi - lo)
	}
	for _, i := range vars {
		st.q[i] = spans[i].lo + t*(spans[i].hi-spans[i].lo)
	}
	cost := func(q []float64) float64 {
		sum := 0.0
		for _, i := range vars {
			sum += n(i) * s.units[i].powerAt(q[i], st.h)
		}
		return sum
	}
	buf := s.floats(4 * len(st.q))
	g, hh, d, trial := buf[:len(st.q)], buf[len(st.q):2*len(st.q)], buf[2*len(st.q):3*len(st.q)], buf[3*len(st.q):]
	_ = d
	cur := cost(st.q)
	for it := 0; it < 40; it++ {
		for _, i := range vars {
			g[i], hh[i] = s.units[i].derivs(st.q[i], st.h, spans[i])
		}
		// Find λ with Σ n_i clamp((λ − g_i)/h_i) = 0 (flows stay summed):
		// the sum is piecewise linear and rising in λ, so solve it exactly
		// between its breakpoints.
		solveLambda(vars, st.q, spans, g, hh, d, n)
		// Restore the exact sum on the models with room to move.
		resid := qvar
		for _, i := range vars {
			resid -= n(i) * (st.q[i] + d[i])
		}
		for _, i := range vars {
			if resid == 0 {
				break
			}
			room := spans[i].hi - st.q[i] - d[i]
			if resid < 0 {
				room = spans[i].lo - st.q[i] - d[i]
			}
			step := resid / n(i)
			if math.Abs(step) > math.Abs(room) {
				step = room
			}
			d[i] += step
			resid -= n(i) * step
		}
		step := 1.0
		moved := false
		for ls := 0; ls < 30; ls++ {
			for _, i := range vars {
				trial[i] = st.q[i] + step*d[i]
			}
			if c := cost(trial); c < cur {
				cur = c
				for _, i := range vars {
					st.q[i] = trial[i] // only the variable models move
				}
				moved = true
				break
			}
			step /= 2
		}
		maxd := 0.0
		for _, i := range vars {
			maxd = math.Max(maxd, math.Abs(step*d[i])/math.Max(spans[i].hi, 1e-12))
		}
		if !moved || maxd < 1e-9 {
			break
		}
	}
}

// derivs returns the first and a positive second derivative of one unit's
// power in flow at header head h, by central differences inside the span.
func (u *unitModel) derivs(q, h float64, sp span) (float64, float64) {
	w := sp.hi - sp.lo
	step := 1e-4 * math.Max(w, 1e-6*sp.hi)
	a, b := q-step, q+step
	if a < sp.lo {
		a, b = sp.lo, sp.lo+2*step
	}
	if b > sp.hi {
		a, b = sp.hi-2*step, sp.hi
	}
	if a < 0 {
		a = 0
	}
	m := (a + b) / 2
	pa, pm, pb := u.powerAt(a, h), u.powerAt(m, h), u.powerAt(b, h)
	hs := (b - a) / 2
	d1 := (pb - pa) / (2 * hs)
	d2 := (pb - 2*pm + pa) / (hs * hs)
	floor := 1e-6 * math.Abs(d1) / math.Max(sp.hi, 1e-12)
	if !(d2 > floor) {
		d2 = math.Max(floor, 1e-30)
	}
	return d1, d2
}

func clamp(v, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, v)) }

// solveLambda sets d_i = clamp((λ − g_i)/h_i, lo_i − q_i, hi_i − q_i) for
// the λ at which Σ n_i d_i = 0. Each d_i(λ) is flat, then rises with slope
// 1/h_i between λ = g_i + h_i(lo_i − q_i) and g_i + h_i(hi_i − q_i), then
// is flat again; the sum's root lies between two adjacent breakpoints,
// where it is linear.
func solveLambda(vars []int, q []float64, spans []span, g, h, d []float64, n func(int) float64) {
	var bp [16]float64
	pts := bp[:0]
	for _, i := range vars {
		pts = append(pts, g[i]+h[i]*(spans[i].lo-q[i]), g[i]+h[i]*(spans[i].hi-q[i]))
	}
	sort.Float64s(pts)
	total := func(lam float64) float64 {
		sum := 0.0
		for _, i := range vars {
			d[i] = clamp((lam-g[i])/h[i], spans[i].lo-q[i], spans[i].hi-q[i])
			sum += n(i) * d[i]
		}
		return sum
	}
	lo, flo := pts[0], total(pts[0])
	lam := lo
	for _, b := range pts[1:] {
		fb := total(b)
		if fb >= 0 {
			if fb > flo {
				lam = lo + (b-lo)*(-flo)/(fb-flo)
			} else {
				lam = b
			}
			break
		}
		lo, flo, lam = b, fb, b
	}
	total(lam)
}
