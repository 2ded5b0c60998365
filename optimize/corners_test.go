package optimize_test

// The corners of the search that an independent check found the solver
// missing: heads above a humped curve's shutoff head, and a split between
// two models whose best point has one unit at a bound.

import (
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// On the suite's humped curve H₀/H_b = 1.1 + 0.4x − 0.4x² − 0.1x³ the head
// at x = Q/Q_b = 0.6 is 1.1744·H_b [D: 1.1 + 0.24 − 0.144 − 0.0216], above
// the shutoff head 1.1·H_b and right of the peak at x ≈ 0.43 [D: root of
// 0.4 − 0.8x − 0.3x² = 0]. One fixed-speed unit asked for that flow has no
// freedom: it runs there, on the falling branch, with every limit met
// (minimum flow 0.45·Q_b, runout 1.25·Q_b, a 60 hp motor against about
// 45 hp of shaft power), whatever head the system needs below that.
func TestHumpedFixedServedAboveShutoff(t *testing.T) {
	p := suitePlant{name: "humped-fixed-one", system: dp(0.1, 28, 0.5), models: []suiteModel{
		{name: "H", count: 1, pump: pumpHm, motorHP: 60, minFlowX: 0.45, drive: curves.FixedSpeed{}}}}.build(t)
	hb := float64(pumpHm.bepHead)
	shutoff := 1.1 * hb // [D] the curve's value at x = 0
	for _, tc := range []struct {
		name string
		x    float64 // load over BEP flow
	}{
		{"just right of the peak", 0.46},
		{"middle of the rise", 0.6},
		{"near shutoff head again", 0.8},
	} {
		t.Run(tc.name, func(t *testing.T) {
			x := tc.x
			q := curves.Flow(x) * pumpHm.bepFlow
			wantH := hb * (1.1 + 0.4*x - 0.4*x*x - 0.1*x*x*x) // [D] the curve's definition
			res := optimize.New(p, optimize.Options{}).Solve(q)
			if res.Status != optimize.Served {
				t.Fatalf("x = %g: %v (%s: %s); the unit serves it at %.4f m, above the shutoff head %.4f m", x, res.Status, res.Limit, res.Reason, wantH, shutoff)
			}
			// 1e-7: the fixed-speed head is bisected to 1e-12 relative and the
			// cubic refit of exact points reproduces them to rounding.
			if math.Abs(float64(res.HeaderHead)/wantH-1) > 1e-7 {
				t.Errorf("x = %g: header head %.6f m, the curve gives %.6f m", x, float64(res.HeaderHead), wantH)
			}
			if float64(res.HeaderHead) <= shutoff && x < 0.82 {
				t.Errorf("x = %g: header head %.4f m not above the shutoff head %.4f m", x, float64(res.HeaderHead), shutoff)
			}
			for _, msg := range suiteInvariants(p, q, false, &res) {
				t.Errorf("x = %g: %s", x, msg)
			}
			ref := refSolve(p, q, false)
			if !ref.Feasible || math.Abs(float64(res.Power/ref.Power)-1) > suiteTol {
				t.Errorf("x = %g: %.6g W, reference %v %.6g W", x, float64(res.Power), ref.Feasible, float64(ref.Power))
			}
		})
	}
}

// The same curve in the throttled strategy: fixed-speed units on a humped
// curve serve every flow their falling branch reaches, none reported unmet.
func TestHumpedThrottledServesFallingBranch(t *testing.T) {
	p := suitePlant{name: "humped-throttled", system: dp(0.25, 28, 0.5), models: []suiteModel{
		{name: "H", count: 3, pump: pumpHm, motorHP: 60, minFlowX: 0.45}}}.build(t)
	th := optimize.NewThrottled("throttled", p)
	var steps []optimize.Step
	// From one unit just right of its peak to three at 0.8·Q_b each
	// (invented flows; each is inside [0.45, 1.25]·Q_b for some count).
	for _, x := range []float64{0.46, 0.55, 0.7, 0.9, 1.1, 1.4, 1.9, 2.4} {
		steps = append(steps, optimize.Step{Load: curves.Flow(x) * pumpHm.bepFlow, Hours: 1})
	}
	run := th.Run(steps)
	for i, pt := range run.Points {
		if pt.Status != optimize.Served {
			t.Errorf("load %.4g m³/s (x = %.2f): %v (%s)", float64(steps[i].Load), float64(steps[i].Load/pumpHm.bepFlow), pt.Status, pt.Reason)
		}
	}
}

var _ = plant.Plant{}

// slowRise is an invented pair of pump models whose efficiency rises slowly
// from zero flow (effK 4.3: η₀/η_b = 1.85x + 1.3x² − 2.15x³), with the
// Sârbu–Borza step-down: at low flow each unit's power is not convex in its
// flow, and with one unit of each running the power along the split has
// two minima.
func slowRise(t testing.TB) *plant.Plant {
	return suitePlant{name: "slow-rise-pair", system: dp(0.16, 28, 0.34), models: []suiteModel{
		{name: "A", count: 1, pump: slowRiseA, motorHP: 100, minFlowX: 0.10},
		{name: "B", count: 1, pump: slowRiseB, motorHP: 40, minFlowX: 0.19}}}.build(t)
}

// With one unit of each model made to run (as a staged sequence or the
// setpoint derivation asks for a running count), the best split at a low
// flow puts one unit at its minimum flow; the equal-marginal split is a
// worse local minimum there. The solver must agree with the brute-force
// reference (which never assumes an equal marginal power) within the
// suite's 0.05 %.
func TestSplitBetweenModelsAtBound(t *testing.T) {
	p := slowRise(t)
	s := optimize.New(p, optimize.Options{})
	atBound := 0
	for _, q := range []curves.Flow{0.0125, 0.015, 0.0166, 0.018} { // m³/s, 8–11 % of design (invented)
		res := s.SolveWith(q, optimize.Constraint{Counts: []int{1, 1}})
		ref := newRefProblem(p, q).searchIndividual([]int{1, 1})
		if !ref.Feasible {
			t.Fatalf("%.4g m³/s: the reference finds no state with one unit of each", float64(q))
		}
		if res.Status != optimize.Served {
			t.Fatalf("%.4g m³/s: %v (%s)", float64(q), res.Status, res.Reason)
		}
		for _, msg := range suiteInvariants(p, q, false, &res) {
			t.Errorf("%.4g m³/s: %s", float64(q), msg)
		}
		// suiteCompare also accepts a solver state below the reference's
		// when the reference's own physics rebuilds it (its grid missed a
		// thin basin).
		ref.ByCounts = map[string]curves.Power{}
		if d, miss, msg := suiteCompare(p, q, &res, &ref); msg != "" {
			t.Errorf("%.4g m³/s: %s; solver units %+v, reference %+v", float64(q), msg, res.Units, ref.Units)
		} else {
			t.Logf("%.4g m³/s: %.6g W, %+.2e relative to the reference (reference missed the solver's state: %v)", float64(q), float64(res.Power), d, miss)
		}
		// The reference's best state has a unit at a flow bound (to 0.1 %:
		// its compass search stops within 1e-10 of its box, the bound is
		// met to the refinement of the head).
		for _, u := range ref.Units {
			m := &p.Models[u.Model]
			lo, hi := float64(m.MinFlow)*u.Speed, float64(m.Runout)*u.Speed
			if math.Abs(float64(u.Flow)/lo-1) < 1e-3 || math.Abs(float64(u.Flow)/hi-1) < 1e-3 {
				atBound++
				break
			}
		}
	}
	if atBound == 0 {
		t.Error("no reference optimum with a unit at its bound: the plant no longer has the shape this test is about")
	}
}
