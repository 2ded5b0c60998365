package optimize

import (
	"math"
	"slices"

	"wattstage/curves"
)

// branch is the state of one branch and bound over the models' counts.
type branch struct {
	s      *Solver
	Q, rgq float64 // flow, ρ g Q h_r
	c      Constraint
	cur    []int // the counts of the node being expanded, then of its child
	child  node  // scratch: the partial sums of the child being built
	// Suffix sums over the models from depth i on: the least Σ n_j g_j(λ_k)
	// (each n_j from 0 to its count), the most top-speed flow, the most
	// units, the best pump efficiency.
	sufG     [][lambdas]float64
	sufGx    [][lambdas]float64
	sufTop   []float64
	sufCount []int
	sufEta   []float64
	sufFixed []bool // a fixed-speed model may run
}

// boundSlack is the allowance on a leaf's bound for what the sampling of
// g_i (bound.go) may miss: a leaf is evaluated when its bound is within it
// of the best state found.
const boundSlack = 2e-3

// prepareBranch fills the suffix sums of a solve (after prepareBounds).
func (s *Solver) prepareBranch(Q, hr float64, c Constraint) *branch {
	n := len(s.units)
	b := &s.br
	*b = branch{s: s, Q: Q, rgq: s.rho * curves.Gravity * Q * hr, c: c,
		cur: slices.Grow(b.cur[:0], n)[:n], sufG: b.sufG[:0], sufGx: b.sufGx[:0], sufTop: b.sufTop[:0],
		sufCount: b.sufCount[:0], sufEta: b.sufEta[:0], sufFixed: b.sufFixed[:0]}
	b.sufG = slices.Grow(b.sufG, n+1)[:n+1]
	b.sufGx = slices.Grow(b.sufGx, n+1)[:n+1]
	b.sufGx[n] = [lambdas]float64{}
	b.sufTop = slices.Grow(b.sufTop, n+1)[:n+1]
	b.sufCount = slices.Grow(b.sufCount, n+1)[:n+1]
	b.sufEta = slices.Grow(b.sufEta, n+1)[:n+1]
	b.sufFixed = slices.Grow(b.sufFixed, n+1)[:n+1]
	b.sufFixed[n] = false
	b.sufG[n], b.sufTop[n], b.sufCount[n], b.sufEta[n] = [lambdas]float64{}, 0, 0, 0
	for i := n - 1; i >= 0; i-- {
		m, cnt := &s.mb[i], s.plant.Models[i].Count
		lo, hi := 0, cnt
		if c.Counts != nil {
			lo, hi = c.Counts[i], c.Counts[i]
		}
		for k := range lambdas {
			g := 0.0
			if m.spanOK {
				g = min(float64(lo)*m.g[k], float64(hi)*m.g[k])
			}
			b.sufG[i][k] = b.sufG[i+1][k] + g
			gx := 0.0
			if m.topOK {
				gx = min(float64(lo)*m.gx[k], float64(hi)*m.gx[k])
			}
			b.sufGx[i][k] = b.sufGx[i+1][k] + gx
		}
		b.sufTop[i], b.sufCount[i], b.sufEta[i] = b.sufTop[i+1], b.sufCount[i+1]+hi, b.sufEta[i+1]
		b.sufFixed[i] = b.sufFixed[i+1] || (hi > 0 && !s.units[i].variable)
		if m.topOK {
			b.sufTop[i] += float64(hi) * m.top
			b.sufEta[i] = max(b.sufEta[i], m.eta)
		}
	}
	return b
}

// node is the partial sums of the models assigned down to one depth.
type node struct {
	g, gx      [lambdas]float64
	lo, hi     float64
	top, pmin  float64
	eta        float64
	units      int
	fitsDead   bool // a model's span is empty at h_r, or lo already exceeds Q
	spanDead   bool // a model's span is empty at h_r
	fixedOn    bool // a fixed-speed model runs (riseBound)
	risingDead bool // a model cannot reach h_r at top speed
}

// item is one entry of the frontier of the best-first search: a node of
// the models' counts down to a depth (every model assigned: a leaf, one
// vector), with a lower bound on every vector below it.
type item struct {
	bound float64
	seq   int  // push order: of equal bounds, the first pushed pops first
	depth int  // models assigned; len(models) for a leaf
	off   int  // its counts are s.leafCnt[off : off+len(models)]
	fits  bool // a leaf that serves the flow at the required head
	nd    node
}

// push adds an item to the frontier (a binary heap on bound, then seq).
func (b *branch) push(it item) {
	s := b.s
	it.seq = len(s.items)
	it.off = len(s.leafCnt)
	s.leafCnt = append(s.leafCnt, b.cur...)
	s.items = append(s.items, it)
	h := append(s.heap, int32(it.seq))
	for j := len(h) - 1; j > 0; {
		p := (j - 1) / 2
		if !s.before(h[j], h[p]) {
			break
		}
		h[j], h[p] = h[p], h[j]
		j = p
	}
	s.heap = h
}

// pop takes the least-bound item off the frontier.
func (b *branch) pop() *item {
	s := b.s
	h := s.heap
	top := h[0]
	last := len(h) - 1
	h[0] = h[last]
	h = h[:last]
	for j := 0; ; {
		l, m := 2*j+1, j
		if l < len(h) && s.before(h[l], h[m]) {
			m = l
		}
		if r := l + 1; r < len(h) && s.before(h[r], h[m]) {
			m = r
		}
		if m == j {
			break
		}
		h[j], h[m] = h[m], h[j]
		j = m
	}
	s.heap = h
	return &s.items[top]
}

func (s *Solver) before(a, b int32) bool {
	x, y := &s.items[a], &s.items[b]
	return x.bound < y.bound || (x.bound == y.bound && x.seq < y.seq)
}

// expand pushes the children of a node at depth i (models 0..i-1
// assigned): one for each count of model i whose bound is within thr;
// a child at the last depth is a leaf.
func (b *branch) expand(it *item, thr float64) {
	s := b.s
	i, nd := it.depth, it.nd
	copy(b.cur, s.leafCnt[it.off:it.off+len(s.units)])
	m, cnt := &s.mb[i], s.plant.Models[i].Count
	lo, hi := 0, cnt
	if b.c.Counts != nil {
		lo, hi = b.c.Counts[i], b.c.Counts[i]
	}
	ch := &b.child
	for n := lo; n <= hi; n++ {
		b.cur[i] = n
		*ch = nd
		if n > 0 {
			fn := float64(n)
			ch.units += n
			if !m.spanOK {
				ch.fitsDead, ch.spanDead = true, true
			}
			if !s.units[i].variable {
				ch.fixedOn = true
			}
			if !m.topOK {
				ch.risingDead = true
			}
			if ch.fitsDead && ch.risingDead {
				break // more units of this model change nothing
			}
			for k := range lambdas {
				ch.g[k] += fn * m.g[k]
				ch.gx[k] += fn * m.gx[k]
			}
			ch.lo += fn * m.lo
			ch.hi += fn * m.hi
			ch.top += fn * m.top
			ch.pmin += fn * m.pmin
			ch.eta = max(ch.eta, m.eta)
		}
		if b.c.Counts == nil && b.c.Total > 0 && (ch.units > b.c.Total || ch.units+b.sufCount[i+1] < b.c.Total) {
			continue
		}
		if ch.top+b.sufTop[i+1] < b.Q*(1-1e-9) {
			continue // short of the flow even at top speed: more units of this model may help
		}
		if ch.lo > b.Q*(1+1e-10) {
			ch.fitsDead = true
		}
		if i+1 == len(s.units) {
			b.leafAt(ch, thr)
			continue
		}
		if bd := b.relax(i+1, ch, b.nodeBound(i+1, ch)); bd <= thr {
			b.push(item{bound: bd, depth: i + 1, nd: *ch})
		} else if ch.fitsDead && ch.pmin > thr {
			break // every further unit only adds to the floor
		}
	}
	b.cur[i] = 0
}

// nodeBound is the least bound of any leaf below a node whose models from
// depth i on are still open.
func (b *branch) nodeBound(i int, nd *node) float64 {
	rise := math.Inf(1)
	if !nd.risingDead {
		rise = b.riseBound(i, nd)
	}
	if nd.fitsDead {
		return rise
	}
	return min(b.fitBound(i, nd), rise)
}

// universal is the bound valid at every head: Σ n_i P_min,i and
// ρ g Q h_r / η_BEP with the best pump efficiency of the models.
func (b *branch) universal(i int, nd *node) float64 {
	return max(nd.pmin, b.rgq/max(nd.eta, b.sufEta[i]))
}

// fitBound bounds the vectors below a node at the required head.
func (b *branch) fitBound(i int, nd *node) float64 {
	fit := math.Inf(-1)
	for k := range lambdas {
		fit = max(fit, lambdaLadder[k]*b.rgq+nd.g[k]+b.sufG[i][k])
	}
	return max(fit, b.universal(i, nd))
}

// riseBound bounds the vectors below a node at any head from h_r up: the
// extended Lagrangian bound (bound.go), and riseMargin times the one at the
// required head's spans where every model has one and no fixed-speed unit
// runs or may run below the node (a fixed-speed unit moves less flow, and
// draws less, at a higher head than its span at h_r says).
func (b *branch) riseBound(i int, nd *node) float64 {
	rise, atHr := math.Inf(-1), math.Inf(-1)
	for k := range lambdas {
		rise = max(rise, lambdaLadder[k]*b.rgq+nd.gx[k]+b.sufGx[i][k])
		atHr = max(atHr, lambdaLadder[k]*b.rgq+nd.g[k]+b.sufG[i][k])
	}
	if !nd.spanDead && !nd.fixedOn && !b.sufFixed[i] {
		rise = max(rise, riseMargin*atHr)
	}
	return max(rise, b.universal(i, nd))
}

// relax lowers the bound of a node where a fixed-speed unit runs, or may
// run below it, beside variable-speed ones, by headSearchMargin. Beside fixed-speed units the head
// search (SolveWith) can take a vector far below its bound at the required
// head: a higher head lowers a fixed-speed unit's flow and draw (a vector
// 9 % below it seen in the optimality suite). The search starts from every
// state within headSearchMargin of the best, so every such vector whose
// bound lies within that of the best must be evaluated (branchAndBound
// evaluates it with that allowance).
func (b *branch) relax(i int, nd *node, bound float64) float64 {
	if b.s.fixedModels && (nd.fixedOn || b.sufFixed[i]) {
		return bound / headSearchMargin
	}
	return bound
}

// riseMargin is how far below the Lagrangian bound at the required head's
// spans a vector that needs a higher head may still come: a higher head
// moves its units below their floors at h_r, where that bound does not
// reach. Not a proven bound but an observed one, like quickMargin: across
// the optimality suite and the large generated plants such a vector came
// at most 1.2 % below it; the margin is 5 %.
const riseMargin = 0.95

// leafAt pushes a vector (every model assigned) that may serve the flow,
// with its bound: at the required head when it fits there, else over every
// head from h_r up.
func (b *branch) leafAt(nd *node, thr float64) {
	if nd.units == 0 {
		return
	}
	Q := b.Q
	tol := 1e-10 * Q
	fits := !nd.fitsDead && nd.lo <= Q+tol && nd.hi >= Q-tol
	var bound float64
	switch {
	case fits:
		bound = b.fitBound(len(b.s.units), nd)
	case !nd.risingDead && nd.top >= Q*(1-1e-9):
		bound = b.riseBound(len(b.s.units), nd)
	default:
		return
	}
	if bound = b.relax(len(b.s.units), nd, bound); bound > thr {
		return
	}
	b.push(item{bound: bound, depth: len(b.s.units), fits: fits})
}

// refine is a fitting vector's Lagrangian bound at its own best
// multiplier: the dual λQ + Σ n_i g_i(λ) is concave in λ, so a
// golden-section search between the ladder's neighbours of its best rung
// finds its peak. It is computed only for the vectors evaluation reaches
// (the ladder's bound orders them).
func (s *Solver) refine(cnt []int, Q, rgq float64) float64 {
	kb, best := 0, math.Inf(-1)
	for k := range lambdas {
		v := lambdaLadder[k] * rgq
		for i, n := range cnt {
			if n > 0 {
				v += float64(n) * s.mb[i].g[k]
			}
		}
		if v > best {
			kb, best = k, v
		}
	}
	rgh := rgq / Q
	a, c := lambdaLadder[max(kb-1, 0)]*rgh, lambdaLadder[min(kb+1, lambdas-1)]*rgh
	dual := func(lam float64) float64 {
		v := lam * Q
		for i, n := range cnt {
			if n > 0 {
				v += float64(n) * s.mb[i].at(lam)
			}
		}
		return v
	}
	const g = 0.6180339887498949
	for it := 0; it < 14; it++ {
		m1, m2 := c-g*(c-a), a+g*(c-a)
		if dual(m1) > dual(m2) {
			c = m2
		} else {
			a = m1
		}
	}
	return max(best, dual((a+c)/2))
}
