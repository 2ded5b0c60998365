package optimize

// state is one candidate: counts, header head, per-model flows.
type state struct {
	counts []int
	h      float64
	q      []float64 // per-unit flow of each model (equal split)
	split  []split   // per model: Units of the model run at a different flow
	power  float64
}

// split records j units of a model running at flow qb while the others run
// at the model's q.
type split struct {
	j  int
	qb float64
}

// side says why an allocation failed.
type side int

const (
	fits      side = iota
	tooMuch        // even at their lowest allowed flows the units move more than needed
	tooLittle      // even at their highest allowed flows the units move less than needed
)

// newState makes a state whose per-model slices share one allocation.
func newState(cnt []int, h float64) *state {
	n := len(cnt)
	type block struct {
		st state
		q  [8]float64
		sp [8]split
	}
	if n <= 8 {
		b := &block{}
		b.st = state{counts: cnt, h: h, q: b.q[:n], split: b.sp[:n]}
		return &b.st
	}
	return &state{counts: cnt, h: h, q: make([]float64, n), split: make([]split, n)}
}
