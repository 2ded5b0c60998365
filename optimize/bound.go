package optimize

import (
	"math"

	"wattstage/curves"
)

// Lower bounds on the input of a vector of running counts, per solve.
//
// At the required head h_r every unit of model i runs at a flow q in its
// allowed span [lo_i, hi_i] and draws P_i(q). For any multiplier λ (W per
// m³/s) and any split with Σ n_i q_i = Q,
//
//	Σ n_i P_i(q_i) = λQ + Σ n_i (P_i(q_i) − λ q_i) ≥ λQ + Σ n_i g_i(λ),
//	g_i(λ) = min over q in [lo_i, hi_i] of P_i(q) − λ q,
//
// the Lagrangian (weak-duality) bound of the split (Boyd & Vandenberghe,
// Convex Optimization, 2004, §5.1–5.2): it needs no convexity, holds for
// unequal flows of identical units and for one common speed (a narrower
// choice), and is additive over models, so a branch and bound over the
// models' counts can use it (branch.go). It is taken at a ladder of
// multipliers, the marginal powers a state can have, ρ g h_r / η for
// wire-to-water efficiencies η from about 17 % to above 100 %, and the best
// of them kept.
//
// A vector that needs a header head above h_r (its units at their floors
// move too much flow there) is bounded by quantities valid at every head
// H ≥ h_r: no pump converts more than its best efficiency η_BEP of ρ g Q H
// into shaft power, and each running unit draws at least
//
//	P_min,i = min over rated-equivalent flows X of s(X)³ · P₀(X),
//	s(X) = max(s_min, √(h_r / H₀eff(X))),
//
// the affinity laws (P = s³ P₀(q/s), H = s² H₀(q/s)) with the speed that
// head needs at least; the motor and drive only add losses, and the
// Sârbu–Borza step-down only lowers the pump efficiency; the same
// reasoning gives a Lagrangian bound over every speed and flow a unit may
// run at from h_r up (extended).

// lambdas is the number of multipliers of the ladder.
const lambdas = 8

// lambdaLadder are the multipliers as fractions of ρ g h_r: 1/η for
// wire-to-water efficiencies from 105 % down to 17 %, geometric.
var lambdaLadder = func() [lambdas]float64 {
	var l [lambdas]float64
	lo, hi := 1/1.05, 1/0.17
	for k := range l {
		l[k] = lo * math.Pow(hi/lo, float64(k)/(lambdas-1))
	}
	return l
}()

// boundGrid is the number of flows at which g_i is sampled on a span.
const boundGrid = 24

// minScan is the number of steps of P_min's scan over X.
const minScan = 48

// modelBound is one model's share of the bounds at the required head.
type modelBound struct {
	spanOK bool    // the span at h_r is not empty
	lo, hi float64 // per-unit flow span at h_r, m³/s
	top    float64 // flow at top speed at h_r, m³/s (mayRise)
	topOK  bool
	g      [lambdas]float64       // g_i(λ_k), W; +Inf when !spanOK
	gx     [lambdas]float64       // g_i(λ_k) over every head from h_r up (rising vectors)
	pmin   float64                // W, at any head ≥ h_r
	qs, ps [boundGrid + 1]float64 // the samples of P_i on the span
	m      int                    // the last sample's index
	eta    float64                // best pump efficiency
}

// prepareBounds fills s.mb for a solve at flow Q and required head hr.
func (s *Solver) prepareBounds(Q, hr float64) {
	if len(s.mb) != len(s.units) {
		s.mb = make([]modelBound, len(s.units))
	}
	rgh := s.rho * curves.Gravity * hr
	for i, u := range s.units {
		b := &s.mb[i]
		*b = modelBound{eta: u.pump.BEPEff}
		b.top, b.topOK = u.flowAt(u.smax, hr)
		if b.top <= 0 {
			b.topOK = false
		}
		s.extended(i, b, hr, rgh)
		sp := s.spanAt(i, 0)
		if !sp.ok {
			for k := range b.g {
				b.g[k] = math.Inf(1)
			}
			continue
		}
		b.spanOK, b.lo, b.hi = true, sp.lo, sp.hi
		s.lagrangian(u, b, hr, rgh)
	}
}

// lagrangian fills b.g: P_i sampled on boundGrid flows of the span, the
// least of P − λq over the samples refined by the parabola through the
// best sample and its neighbours (the bound is then used with a small
// allowance, boundSlack, for what the sampling misses).
func (s *Solver) lagrangian(u *unitModel, b *modelBound, hr, rgh float64) {
	b.m = boundGrid
	if b.hi <= b.lo || !u.variable {
		b.m = 0
	}
	for j := 0; j <= b.m; j++ {
		b.qs[j] = b.lo
		if b.m > 0 {
			b.qs[j] = b.lo + (b.hi-b.lo)*float64(j)/float64(b.m)
		}
		b.ps[j] = s.unitPower(u, b.qs[j], hr)
	}
	for k := range b.g {
		b.g[k] = b.at(lambdaLadder[k] * rgh)
	}
}

// at is g_i(λ) from the samples.
func (b *modelBound) at(lam float64) float64 {
	best, bj := math.Inf(1), 0
	for j := 0; j <= b.m; j++ {
		if v := b.ps[j] - lam*b.qs[j]; v < best {
			best, bj = v, j
		}
	}
	if bj > 0 && bj < b.m {
		f0, f1, f2 := b.ps[bj-1]-lam*b.qs[bj-1], best, b.ps[bj+1]-lam*b.qs[bj+1]
		if den := f0 - 2*f1 + f2; den > 0 {
			best = math.Min(best, f1-(f2-f0)*(f2-f0)/(8*den))
		}
	}
	return best
}

// extended fills b.gx and b.pmin, the bounds valid at every head H ≥ h_r:
// with q = s·X and shaft power s³·P₀(X) (affinity laws), over the scanned
// rated-equivalent flows X_j and the speeds s in [s_j, s_max] that make at
// least h_r, s_j = max(s_min, √(h_r / H₀eff(X_j))),
//
//	g_i(λ) ≥ min over j, s of s³ P₀(X_j) − λ s X_j,
//
// convex in s, so its least is at s = √(λ X_j / (3 P₀(X_j))) clamped to the
// range; P_min is the same at λ = 0. The Sârbu–Borza step-down only raises
// the shaft power, and the motor and drive take at least lossRatio times
// it from the wire. A 5 % allowance covers the scan's step.
func (s *Solver) extended(i int, b *modelBound, hr, rgh float64) {
	u, sc := s.units[i], &s.scans[i]
	b.pmin = math.Inf(1)
	for k := range b.gx {
		b.gx[k] = math.Inf(1)
	}
	for j, X := range sc.x {
		he := float64(u.net.At(curves.Flow(X)))
		if he <= 0 || he*u.smax*u.smax < hr*(1-1e-9) {
			continue
		}
		sa := math.Max(u.smin, math.Sqrt(hr/he))
		p0 := scanAllowance * sc.p[j]
		b.pmin = math.Min(b.pmin, sa*sa*sa*p0)
		for k := range b.gx {
			lam := lambdaLadder[k] * rgh
			sp := sa
			if p0 > 0 {
				sp = math.Min(u.smax, math.Max(sa, math.Sqrt(lam*X/(3*p0))))
			}
			b.gx[k] = math.Min(b.gx[k], sp*sp*sp*p0-lam*sp*X)
		}
	}
	if math.IsInf(b.pmin, 1) {
		// The scan found no flow that makes h_r: no bound from it.
		b.pmin = 0
		for k := range b.gx {
			b.gx[k] = -lambdaLadder[k] * rgh * math.Max(b.top, 0)
		}
	}
}

// scanAllowance is the fraction of a scanned power the bounds count on.
const scanAllowance = 0.95

// powerScan is one model's rated-speed shaft power P₀ at minScan+1
// rated-equivalent flows X from its minimum flow to its runout, each
// already multiplied by the least ratio of wire input to shaft power the
// model's motor and drive give (lossRatio).
type powerScan struct{ x, p []float64 }

// scanPower samples P₀(X) for minInput over the allowed rated-equivalent
// flows of a unit.
func scanPower(u *unitModel) powerScan {
	var sc powerScan
	ratio := lossRatio(u)
	top := math.Min(u.qrun, 3*float64(u.pump.LastFlow))
	lo := math.Min(u.qmin, top)
	for j := range minScan + 1 {
		X := lo + (top-lo)*float64(j)/minScan
		p := float64(u.pump.ShaftPower(curves.Flow(X), 1, u.rho))
		if math.IsNaN(p) || p < 0 {
			p = 0
		}
		sc.x = append(sc.x, X)
		sc.p = append(sc.p, ratio*p)
	}
	return sc
}

// lossRatio is the least wire input over shaft power of a unit's motor and
// drive, scanned over shaft powers up to the motor's rating times its
// service factor and over its speeds, with a 1 % allowance for the scan's
// step; 1 where the scan finds nothing better (the losses are never
// negative).
func lossRatio(u *unitModel) float64 {
	best := math.Inf(1)
	for a := 1; a <= 8; a++ {
		sp := u.smin + (u.smax-u.smin)*float64(a)/8
		for j := 1; j <= 64; j++ {
			shaft := u.shaftMax * float64(j) / 64
			e := float64(u.m.Drive.Electrical(u.m.Motor, curves.Power(shaft), sp))
			if r := e / shaft; r < best {
				best = r
			}
		}
	}
	if math.IsNaN(best) || best < 1 {
		return 1
	}
	return math.Max(1, 0.99*best)
}
