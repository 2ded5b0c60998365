package curves

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// PumpPoint is one datasheet point at rated speed. Give Eff (0–1) or Shaft
// (W); when both are given Eff is used.
type PumpPoint struct {
	Flow  Flow    // m³/s, ≥ 0
	Head  Head    // m, > 0
	Eff   float64 // pump efficiency 0–1; 0 when not given
	Shaft Power   // shaft input W at ReferenceDensity; 0 when not given
}

// PumpOptions choose how a pump curve is fitted and scaled.
type PumpOptions struct {
	// HeadDegree is the degree of the head polynomial: 2 (default when 0) or 3.
	HeadDegree int
	// SpeedCorrection applies the Sârbu–Borza step-down of efficiency at
	// reduced speed. Off in the zero value.
	SpeedCorrection bool
	// AllowRising accepts a head curve that rises with flow somewhere in the
	// datasheet range (a "drooping" or humped curve). Off in the zero value.
	AllowRising bool
}

// PointError is a problem with one datasheet point; Index counts from 0.
type PointError struct {
	Index int
	Field string // "flow", "head", "efficiency" or "shaft_power"; empty for the whole point
	Err   error
}

func (e *PointError) Error() string {
	if e.Field == "" {
		return fmt.Sprintf("point %d: %v", e.Index+1, e.Err)
	}
	return fmt.Sprintf("point %d %s: %v", e.Index+1, e.Field, e.Err)
}

func (e *PointError) Unwrap() error { return e.Err }

// Errors of pump point validation.
var (
	ErrNegative       = errors.New("must not be negative")
	ErrNotPositive    = errors.New("must be greater than zero")
	ErrEffRange       = errors.New("efficiency must be above 0 and at most 100 %")
	ErrUnsorted       = errors.New("curve points must be listed in order of rising flow")
	ErrNoEfficiency   = errors.New("point needs an efficiency or a shaft power")
	ErrShutoffHead    = errors.New("curves: fitted shutoff head is not positive")
	ErrEfficiencyFit  = errors.New("curves: fitted efficiency leaves 0–100 % inside the datasheet range")
	ErrEfficiencyMiss = errors.New("curves: the fitted efficiency curve misses a datasheet point")
)

// EffMissTolerance is the largest gap, in efficiency (0–1), allowed between
// the fitted efficiency curve and a given point: 10 points of efficiency.
// A datasheet efficiency read off a published curve is good to a point or
// two, and a polynomial through the origin follows a real pump's efficiency
// curve to a few points (common practice; a quadratic through four points
// of an invented datasheet here misses one by 5.2 points); a miss of more
// than 10 means the points do not describe a pump efficiency curve — most
// often one constant efficiency given at every point, which no curve that
// starts from zero efficiency at zero flow can follow (a flat 78 % is
// missed by up to 39 points).
const EffMissTolerance = 0.10

// EffMissError is a fitted efficiency curve that misses a given point by
// more than EffMissTolerance: the worst point, with the fitted and given
// efficiencies and how many points miss.
type EffMissError struct {
	Fitted, Given float64 // efficiency 0–1 at the point
	Misses        int     // points beyond the tolerance, this one included
}

func (e *EffMissError) Error() string {
	return fmt.Sprintf("%v: the fit gives %.1f %% where %.1f %% is given", ErrEfficiencyMiss, 100*e.Fitted, 100*e.Given)
}

func (e *EffMissError) Unwrap() error { return ErrEfficiencyMiss }

// Pump is a fitted pump curve at rated speed, scaled to any speed by the
// affinity laws. Build one with NewPump.
type Pump struct {
	head, eff       Poly
	HeadFit, EffFit FitStats
	Points          []PumpPoint // as given, with Eff filled in from Shaft where needed
	FirstFlow       Flow        // smallest datasheet flow
	LastFlow        Flow        // largest datasheet flow
	BEPFlow         Flow        // best efficiency flow at rated speed
	BEPHead         Head        // head at BEP, rated speed
	BEPEff          float64     // efficiency at BEP
	SpeedCorrection bool        // Sârbu–Borza applied below rated speed
	bepAtEdge       bool        // the fitted efficiency peaks at an end of the datasheet range
	curve           HeadCurve   // the head fit with its inverses and falling branch
}

// NewPump fits head and efficiency curves to datasheet points (at least 3,
// sorted by rising flow, no duplicates). The head is fitted as a polynomial
// in Q of HeadDegree; the efficiency through the origin, η₀(Q) = Σ c_k Q^k for
// k = 1..2 with three or four points with flow and k = 1..3 with more.
// Point errors are returned joined, every one at once.
func NewPump(points []PumpPoint, opt PumpOptions) (*Pump, error) {
	deg := opt.HeadDegree
	if deg == 0 {
		deg = 2
	}
	if deg != 2 && deg != 3 {
		panic("curves: HeadDegree must be 2 or 3")
	}
	if len(points) < 3 || len(points) < deg+1 {
		return nil, fmt.Errorf("%w: %d points, need at least %d", ErrTooFewPoints, len(points), max(3, deg+1))
	}
	pts := append([]PumpPoint(nil), points...)
	var errs []error
	for i, p := range pts {
		switch {
		case !finite(float64(p.Flow)):
			errs = append(errs, &PointError{i, "flow", ErrNotFinite})
		case p.Flow < 0:
			errs = append(errs, &PointError{i, "flow", ErrNegative})
		}
		switch {
		case !finite(float64(p.Head)):
			errs = append(errs, &PointError{i, "head", ErrNotFinite})
		case p.Head <= 0:
			errs = append(errs, &PointError{i, "head", ErrNotPositive})
		}
		switch {
		case !finite(p.Eff) || !finite(float64(p.Shaft)):
			errs = append(errs, &PointError{i, "efficiency", ErrNotFinite})
		case p.Eff != 0 && (p.Eff < 0 || p.Eff > 1):
			errs = append(errs, &PointError{i, "efficiency", ErrEffRange})
		case p.Eff == 0 && p.Shaft < 0:
			errs = append(errs, &PointError{i, "shaft_power", ErrNegative})
		case p.Eff == 0 && p.Shaft == 0 && p.Flow > 0:
			errs = append(errs, &PointError{i, "", ErrNoEfficiency})
		case p.Eff == 0 && p.Shaft > 0 && p.Flow > 0:
			pts[i].Eff = float64(HydraulicPower(ReferenceDensity, p.Flow, p.Head)) / float64(p.Shaft)
			if pts[i].Eff > 1 {
				errs = append(errs, &PointError{i, "shaft_power", fmt.Errorf("gives an efficiency of %.1f %% (above 100 %%)", 100*pts[i].Eff)})
			}
		}
		if i > 0 {
			switch {
			case p.Flow == pts[i-1].Flow:
				errs = append(errs, &PointError{i, "flow", ErrDuplicateFlow})
			case p.Flow < pts[i-1].Flow:
				errs = append(errs, &PointError{i, "flow", ErrUnsorted})
			}
		}
	}
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	q := make([]float64, len(pts))
	h := make([]float64, len(pts))
	e := make([]float64, len(pts))
	npos := 0
	for i, p := range pts {
		q[i], h[i], e[i] = float64(p.Flow), float64(p.Head), p.Eff
		if p.Flow > 0 {
			npos++
		}
	}
	hp, hst, err := FitPoly(q, h, 0, deg)
	if err != nil {
		return nil, fmt.Errorf("head curve: %w", err)
	}
	effDeg := 2
	if npos >= 5 {
		effDeg = 3
	}
	if npos < effDeg {
		return nil, fmt.Errorf("efficiency curve: %w: %d points with flow", ErrTooFewPoints, npos)
	}
	ep, est, err := FitPoly(q, e, 1, effDeg)
	if err != nil {
		return nil, fmt.Errorf("efficiency curve: %w", err)
	}
	p := &Pump{
		head: hp, eff: ep, HeadFit: hst, EffFit: est, Points: pts,
		FirstFlow: pts[0].Flow, LastFlow: pts[len(pts)-1].Flow,
		SpeedCorrection: opt.SpeedCorrection,
	}
	if hp.Eval(0) <= 0 {
		return nil, ErrShutoffHead
	}
	if err := p.checkShape(opt.AllowRising); err != nil {
		return nil, err
	}
	if err := p.checkEffFit(); err != nil {
		return nil, err
	}
	p.findBEP()
	p.curve = newHeadCurve(hp, float64(p.LastFlow))
	if p.bepAtEdge {
		return nil, fmt.Errorf("%w (fitted BEP at %.4g m³/s, points %.4g–%.4g m³/s)",
			ErrBEPOutsidePoint, float64(p.BEPFlow), float64(p.FirstFlow), float64(p.LastFlow))
	}
	return p, nil
}

// checkShape rejects a fitted head curve that rises with flow, or any fit
// that leaves its physical range, inside the datasheet range.
func (p *Pump) checkShape(allowRising bool) error {
	a, b := float64(p.FirstFlow), float64(p.LastFlow)
	const n = 100
	if !allowRising {
		for i := 1; i < len(p.Points); i++ {
			if p.Points[i].Head > p.Points[i-1].Head {
				return &PointError{Index: i, Field: "head", Err: fmt.Errorf("%w (set allow_rising if the datasheet really shows it)", ErrRisingHead)}
			}
		}
	}
	h0 := p.head.Eval(0)
	for i := 0; i <= n; i++ {
		q := a + (b-a)*float64(i)/n
		// A quadratic through a curve that is flat near shutoff may rise a
		// little at low flow; more than 2 % of shutoff head is a real hump.
		if !allowRising && p.head.Eval(q) > 1.02*h0 {
			return fmt.Errorf("%w: the fitted curve peaks %.1f %% above shutoff near %.4g m³/s (check the points, or set allow_rising)",
				ErrRisingHead, 100*(p.head.Eval(q)/h0-1), q)
		}
		if p.head.Eval(q) <= 0 {
			return fmt.Errorf("head curve: %w", ErrNegativeFit)
		}
		if q > 0 {
			if ev := p.eff.Eval(q); ev <= 0 || ev > 1 {
				return ErrEfficiencyFit
			}
		}
	}
	return nil
}

// checkEffFit refuses an efficiency fit that misses a given point (with
// flow) by more than EffMissTolerance, naming the worst point.
func (p *Pump) checkEffFit() error {
	worst, gap, misses := -1, 0.0, 0
	for i, pt := range p.Points {
		if pt.Flow <= 0 {
			continue
		}
		d := math.Abs(p.eff.Eval(float64(pt.Flow)) - pt.Eff)
		if d > EffMissTolerance {
			misses++
			if d > gap {
				worst, gap = i, d
			}
		}
	}
	if worst < 0 {
		return nil
	}
	field := "efficiency"
	if p.Points[worst].Shaft > 0 {
		field = "shaft_power"
	}
	return &PointError{Index: worst, Field: field, Err: &EffMissError{
		Fitted: p.eff.Eval(float64(p.Points[worst].Flow)), Given: p.Points[worst].Eff, Misses: misses}}
}

// findBEP locates the maximum of the fitted efficiency on [0, 1.5·LastFlow]
// by a dense scan refined with golden-section search.
func (p *Pump) findBEP() {
	// Only the datasheet range counts: a cubic fit may turn up again past the
	// last point, which says nothing about the pump.
	a, b := float64(p.FirstFlow), float64(p.LastFlow)
	const n = 300
	best, bi := -1.0, 0
	for i := 0; i <= n; i++ {
		q := a + (b-a)*float64(i)/n
		if q <= 0 {
			continue
		}
		if v := p.eff.Eval(q); v > best {
			best, bi = v, i
		}
	}
	step := (b - a) / n
	lo, up := math.Max(a, a+step*float64(bi-1)), math.Min(b, a+step*float64(bi+1))
	const g = 0.6180339887498949
	for it := 0; it < 80; it++ {
		m1, m2 := up-g*(up-lo), lo+g*(up-lo)
		if p.eff.Eval(m1) < p.eff.Eval(m2) {
			lo = m1
		} else {
			up = m2
		}
	}
	q := (lo + up) / 2
	if bi == n {
		q = b
	}
	p.BEPFlow, p.BEPEff, p.BEPHead = Flow(q), p.eff.Eval(q), Head(p.head.Eval(q))
	// The maximum sits on an end of the points with the curve still rising
	// out of the range: the datasheet does not show the BEP.
	p.bepAtEdge = (bi == n && p.eff.Deriv(b) > 0) || (bi == 0 && a > 0 && p.eff.Deriv(a) < 0)
}

// HeadPoly returns the fitted head polynomial at rated speed.
func (p *Pump) HeadPoly() Poly { return p.head }

// EffPoly returns the fitted efficiency polynomial at rated speed.
func (p *Pump) EffPoly() Poly { return p.eff }

// ShutoffHead is the fitted head at zero flow and rated speed.
func (p *Pump) ShutoffHead() Head { return Head(p.head.Eval(0)) }

// MaxHead is the highest head of the fitted curve at rated speed: the
// shutoff head for a curve that falls from zero flow, the peak for a humped
// (rising, then falling) one, which lies above its shutoff head. At speed s
// the highest head is s²·MaxHead (affinity laws).
func (p *Pump) MaxHead() Head { return p.curve.MaxHead() }

// Head returns the head at flow q and speed ratio s: s²·H₀(q/s).
func (p *Pump) Head(q Flow, s float64) Head {
	if s <= 0 {
		return 0
	}
	return Head(s * s * p.head.Eval(float64(q)/s))
}

// Eff returns the pump efficiency at flow q and speed ratio s: η₀(q/s),
// stepped down by Sârbu–Borza below rated speed when enabled:
// η = 1 − (1 − η₀)(1/s)^0.1, but never below stepDownFloor·η₀.
//
// The floor is a guard, not physics: applied point by point the step-down
// turns negative where η₀ < 1 − s^0.1 (near shutoff at low speed), which
// would make shaft power negative. Halving η₀ at most binds only where
// η₀ < (k − 1)/(k − ½), k = s^−0.1: below 13 % efficiency at half speed,
// 26 % at 20 % speed, far below any minimum continuous flow.
func (p *Pump) Eff(q Flow, s float64) float64 {
	if s <= 0 {
		return 0
	}
	e := p.eff.Eval(float64(q) / s)
	if p.SpeedCorrection && s < 1 && e > 0 {
		e = math.Max(SarbuBorza(e, s), stepDownFloor*e)
	}
	return e
}

// stepDownFloor is the smallest fraction of η₀ the Sârbu–Borza step-down
// may leave (see Eff).
const stepDownFloor = 0.5

// SarbuBorza returns the efficiency at speed ratio s of a pump whose
// efficiency at rated speed is eta: η₂ = 1 − (1 − η₁)(n₁/n₂)^0.1
// (Sârbu & Borza 1998). (1/s)^0.1 is written exp(0.1·ln(1/s)), which is
// what math.Pow computes for a fractional exponent below one, bit for bit,
// without its special cases and exponent splitting (the hot path of every
// variable-speed solve with the step-down on).
func SarbuBorza(eta, s float64) float64 {
	return 1 - (1-eta)*math.Exp(0.1*math.Log(1/s))
}

// ShaftPower returns the shaft input ρ g q H / η at flow q, speed s for a
// fluid of the given density. At zero flow it is the limit of that ratio.
func (p *Pump) ShaftPower(q Flow, s, density float64) Power {
	h := p.Head(q, s)
	x := float64(q) / s
	var qOverEta float64
	if x < 1e-12*p.eff.Scale {
		// η₀(x) ≈ c₁ x/scale near zero, so q/η → s·scale/c₁; with the
		// step-down on below rated speed the floor η₀/2 holds there.
		qOverEta = s * p.eff.Scale / p.eff.C[0]
		if p.SpeedCorrection && s < 1 {
			qOverEta /= stepDownFloor
		}
	} else {
		qOverEta = float64(q) / p.Eff(q, s)
	}
	return Power(density * Gravity * float64(h) * qOverEta)
}

// SpeedFor returns the speed ratio at which the pump delivers flow q at
// head h: HeadCurve.SpeedFor on its own curve.
func (p *Pump) SpeedFor(q Flow, h Head) (s float64, ok bool) { return p.curve.SpeedFor(q, h) }

// FlowAt returns the flow the pump gives at speed s against head h, on the
// falling branch of its curve: HeadCurve.FlowAt on its own curve.
func (p *Pump) FlowAt(s float64, h Head) (q Flow, ok bool) { return p.curve.FlowAt(s, h) }

// bisect finds a root of f on [lo, hi] where f(lo) ≤ 0 ≤ f(hi).
func bisect(f func(float64) float64, lo, hi float64) float64 {
	for it := 0; it < 200 && hi-lo > 1e-15*math.Max(1, math.Abs(hi)); it++ {
		m := (lo + hi) / 2
		if f(m) < 0 {
			lo = m
		} else {
			hi = m
		}
	}
	return (lo + hi) / 2
}

// SortPoints orders datasheet points by rising flow (for callers that accept
// unsorted input deliberately).
func SortPoints(pts []PumpPoint) {
	sort.SliceStable(pts, func(i, j int) bool { return pts[i].Flow < pts[j].Flow })
}
