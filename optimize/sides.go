package optimize

// sides checks, without allocating, whether a combo can move Q at header
// head h: it fills each running model's allowed span and returns the flow
// left for the variable units, their models, and whether the combo fits,
// moves too much or too little.
func (s *Solver) sides(cnt []int, Q, h float64, spans []span) (float64, []int, side) {
	return s.sidesAt(cnt, Q, h, -1, spans)
}

// sidesAt is sides at head h, which is grid head k when k ≥ 0 (its spans
// then come from the per-solve cache).
func (s *Solver) sidesAt(cnt []int, Q, h float64, k int, spans []span) (float64, []int, side) {
	qvar := Q
	vars := s.varBuf[:0]
	loSum, hiSum := 0.0, 0.0
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		u := s.units[i]
		var sp span
		if k >= 0 {
			sp = s.spanAt(i, k)
		} else {
			sp = u.bounds(h)
		}
		if !sp.ok {
			// A fixed-speed unit past its runout or overloaded at this head
			// moves less flow at a higher head; anything else gets worse.
			if !u.variable && (sp.why == limRunout || sp.why == limOverload) {
				return 0, nil, tooMuch
			}
			return 0, nil, tooLittle
		}
		spans[i] = sp
		if !u.variable {
			qvar -= float64(n) * sp.lo
			continue
		}
		vars = append(vars, i)
		loSum += float64(n) * sp.lo
		hiSum += float64(n) * sp.hi
	}
	tol := 1e-10 * Q
	if len(vars) == 0 {
		loSum, hiSum = 0, 0
	}
	switch {
	case loSum > qvar+tol:
		return 0, nil, tooMuch
	case hiSum < qvar-tol:
		return 0, nil, tooLittle
	}
	return qvar, vars, fits
}

// variableModels counts the running variable-speed models of a combo.
func (s *Solver) variableModels(cnt []int) int {
	k := 0
	for i, n := range cnt {
		if n > 0 && s.units[i].variable {
			k++
		}
	}
	return k
}
