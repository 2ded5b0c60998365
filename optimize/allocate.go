package optimize

import "math"

// atHead allocates the pumped flow Q among the running units at header head
// h: fixed-speed units give what their curves give; the variable ones share
// the rest at equal marginal power (or at one common speed), a local
// optimum of the split (the head search's many trial heads use it; the
// states it keeps get the global split of splitGlobal).
func (s *Solver) atHead(cnt []int, Q, h float64) (*state, side) {
	return s.atHeadMode(cnt, Q, h, splitLocal)
}

// splitMode says how atHeadMode shares the flow among variable models.
type splitMode uint8

const (
	splitProportional splitMode = iota // in proportion to their allowed ranges
	splitLocal                         // at equal marginal power (newtonSplit)
	splitGlobal                        // the best of every local minimum (acrossModels)
)

// atHeadMode is atHead with the split chosen by mode.
func (s *Solver) atHeadMode(cnt []int, Q, h float64, mode splitMode) (*state, side) {
	spans := s.scratch(&s.allocSpans, len(cnt))
	qvar, vars, sd := s.sides(cnt, Q, h, spans)
	if sd != fits {
		return nil, sd
	}
	st := newState(cnt, h)
	for i, n := range cnt {
		if n > 0 && !s.units[i].variable {
			st.q[i] = spans[i].lo
		}
	}
	if len(vars) > 0 {
		switch {
		case s.opt.CommonSpeed:
			if !s.commonSpeed(st, vars, spans, qvar) {
				return nil, tooLittle
			}
		case mode == splitLocal:
			s.equalMarginal(st, vars, spans, qvar, false)
		case mode == splitGlobal:
			s.equalMarginal(st, vars, spans, qvar, true)
		default:
			proportional(st, vars, spans, qvar)
		}
	}
	st.power = s.power(st)
	if math.IsInf(st.power, 0) || math.IsNaN(st.power) {
		return nil, tooLittle
	}
	return st, fits
}

// proportional splits qvar among the variable models at one common
// fraction of each model's allowed range.
func proportional(st *state, vars []int, spans []span, qvar float64) {
	lo, hi := 0.0, 0.0
	for _, i := range vars {
		n := float64(st.counts[i])
		lo += n * spans[i].lo
		hi += n * spans[i].hi
	}
	t := 0.0
	if hi > lo {
		t = (qvar - lo) / (hi - lo)
	}
	for _, i := range vars {
		st.q[i] = spans[i].lo + t*(spans[i].hi-spans[i].lo)
	}
}
