package optimize

// scratch returns a zeroed scratch slice of spans held in *buf.
func (s *Solver) scratch(buf *[]span, n int) []span {
	if cap(*buf) < n {
		*buf = make([]span, n)
	}
	b := (*buf)[:n]
	clear(b)
	return b
}

// floats returns a zeroed scratch slice of n floats.
func (s *Solver) floats(n int) []float64 {
	if cap(s.floatBuf) < n {
		s.floatBuf = make([]float64, n)
	}
	b := s.floatBuf[:n]
	clear(b)
	return b
}

// spanBuf returns a scratch slice of spans.
func (s *Solver) spanBuf(n int) []span {
	if cap(s.spans) < n {
		s.spans = make([]span, n)
	}
	return s.spans[:n]
}
