package optimize_test

// The optimality suite: the solver against the brute-force reference
// (reference_test.go) on plants of many shapes, plus the known cases with a
// source outside the project.
//
// The plants are invented for the test (the check is the reference, not
// the plant data); they are built from shape parameters so that every
// curve is known exactly: a quadratic head curve H₀ = H_b (r − (r−1) x²) or
// a humped cubic, and an efficiency η₀ = η_b (a x + b x² + c x³) through the
// origin with its peak η_b at x = Q/Q_BEP = 1.

import (
	"fmt"
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// suitePump is an invented rated-speed datasheet, given by shape.
type suitePump struct {
	bepFlow curves.Flow // m³/s
	bepHead curves.Head // m
	bepEff  float64     // 0–1
	shutoff float64     // shutoff head over BEP head, quadratic curves; 0 means 1.25
	// effK is −η''(1)/η_b in x = Q/Q_BEP: 2 is the usual parabola through the
	// origin, smaller is a flatter top. 0 means 2.
	effK   float64
	lastX  float64 // last datasheet flow over BEP flow; 0 means 1.3
	humped bool    // cubic head H₀/H_b = 1.1 + 0.4x − 0.4x² − 0.1x³, peak 1.19 at x ≈ 0.43
	// cubic, when set, is a falling cubic head H₀/H_b = Σ cubic[k] xᵏ
	// (x = Q/Q_BEP), fitted with head_fit cubic.
	cubic           []float64
	speedCorrection bool // Sârbu–Borza step-down below rated speed
}

func (s suitePump) headAt(x float64) float64 {
	if s.humped {
		return 1.1 + 0.4*x - 0.4*x*x - 0.1*x*x*x
	}
	if s.cubic != nil {
		return s.cubic[0] + x*(s.cubic[1]+x*(s.cubic[2]+x*s.cubic[3]))
	}
	r := s.shutoff
	if r == 0 {
		r = 1.25
	}
	return r - (r-1)*x*x
}

// effAt is η₀/η_b: with a = 3 − k/2, b = −(3 − k), c = 1 − k/2 it passes
// through 0 at x = 0 and 1 at x = 1 with zero slope there and curvature −k.
func (s suitePump) effAt(x float64) float64 {
	k := s.effK
	if k == 0 {
		k = 2
	}
	a, b, c := 3-k/2, -(3 - k), 1-k/2
	return x * (a + x*(b+x*c))
}

func (s suitePump) build(t testing.TB) *curves.Pump {
	t.Helper()
	var pts []curves.PumpPoint
	last := s.lastX
	if last == 0 {
		last = 1.3
	}
	for _, x := range []float64{0, 0.25, 0.5, 0.75, 1, 1.15, last} {
		pts = append(pts, curves.PumpPoint{
			Flow: curves.Flow(x) * s.bepFlow,
			Head: curves.Head(s.headAt(x)) * s.bepHead,
			Eff:  s.bepEff * s.effAt(x),
		})
	}
	opt := curves.PumpOptions{SpeedCorrection: s.speedCorrection}
	if s.humped {
		opt.HeadDegree, opt.AllowRising = 3, true
	}
	if s.cubic != nil {
		opt.HeadDegree = 3
	}
	p, err := curves.NewPump(pts, opt)
	if err != nil {
		t.Fatalf("suite pump: %v", err)
	}
	return p
}

// suiteModel is one pump model of a suite plant.
type suiteModel struct {
	name     string
	count    int
	pump     suitePump
	motorHP  float64 // rated output, hp
	poles    int     // 2 or 4; 0 means 4
	drive    curves.Drive
	minSpeed float64 // 0 means 0.3
	maxSpeed float64 // 0 means 1
	minFlowX float64 // minimum flow over BEP flow at rated speed; 0 means 0.3, <0 means none
	runoutX  float64 // runout over BEP flow; 0 means 1.25
	// branchFrac is the branch loss at BEP flow as a fraction of BEP head.
	branchFrac float64
	motorTable []curves.LoadEff
}

func (m suiteModel) build(t testing.TB) plant.Model {
	t.Helper()
	poles := m.poles
	if poles == 0 {
		poles = 4
	}
	rated := curves.Power(m.motorHP * curves.Horsepower)
	// Full-load efficiency from the 10 CFR 431.25 Table 5 values in curves:
	// plant data here, not a check value.
	eff, err := curves.PremiumEfficiency(rated, poles)
	if err != nil {
		t.Fatalf("suite motor %g hp %d-pole: %v", m.motorHP, poles, err)
	}
	rpm := 1780.0
	if poles == 2 {
		rpm = 3560
	}
	def := func(v, d float64) float64 {
		if v == 0 {
			return d
		}
		return v
	}
	minX := def(m.minFlowX, 0.3)
	if minX < 0 {
		minX = 0
	}
	drive := m.drive
	if drive == nil {
		drive = curves.DOEDrive{}
	}
	qb, hb := float64(m.pump.bepFlow), float64(m.pump.bepHead)
	return plant.Model{
		Name: m.name, Count: m.count, RatedSpeed: rpm, Pump: m.pump.build(t),
		MinSpeed: def(m.minSpeed, 0.3), MaxSpeed: def(m.maxSpeed, 1),
		MinFlow: curves.Flow(minX * qb), Runout: curves.Flow(def(m.runoutX, 1.25) * qb),
		Motor:   curves.Motor{Rated: rated, FullLoadEff: eff, Table: m.motorTable},
		Drive:   drive,
		BranchK: m.branchFrac * hb / (qb * qb),
	}
}

// The suite's pump sizes (invented).
var (
	pumpL  = suitePump{bepFlow: 0.10, bepHead: 32, bepEff: 0.84} // ≈ 50 hp shaft at BEP
	pumpM  = suitePump{bepFlow: 0.05, bepHead: 30, bepEff: 0.80} // ≈ 25 hp
	pumpS  = suitePump{bepFlow: 0.02, bepHead: 30, bepEff: 0.74} // ≈ 11 hp
	pumpP2 = suitePump{bepFlow: 0.03, bepHead: 45, bepEff: 0.78} // ≈ 23 hp, 2-pole
	pumpHm = suitePump{bepFlow: 0.10, bepHead: 30, bepEff: 0.83, humped: true}
	// Falling cubics through the BEP point (H₀/H_b = 1 at x = 1). With a
	// positive x³ term the curve flattens at high flow (an S-shaped curve,
	// its minimum 0.8 at x = 2, past the last point); with a negative one it
	// steepens.
	pumpCubicPos = suitePump{bepFlow: 0.10, bepHead: 32, bepEff: 0.84, cubic: []float64{1.2, 0, -0.3, 0.1}}
	pumpCubicNeg = suitePump{bepFlow: 0.10, bepHead: 32, bepEff: 0.84, cubic: []float64{1.25, -0.1, -0.1, -0.05}}
	// Efficiency rising slowly from zero flow: η₀/η_b = 1.85x + 1.3x² − 2.15x³.
	slowRiseA = suitePump{bepFlow: 0.10, bepHead: 37, bepEff: 0.72, shutoff: 1.14, effK: 4.3, speedCorrection: true}
	slowRiseB = suitePump{bepFlow: 0.058, bepHead: 26, bepEff: 0.72, shutoff: 1.32, effK: 4.3, speedCorrection: true}
)

func dp(q curves.Flow, h curves.Head, ctlFrac float64) curves.System {
	return curves.DPControl{DesignFlow: q, DesignHead: h, ControlHead: h * curves.Head(ctlFrac)}
}

func fixedCurve(q curves.Flow, h curves.Head, staticFrac float64) curves.System {
	return curves.FixedCurve{DesignFlow: q, DesignHead: h, Static: h * curves.Head(staticFrac)}
}

// suitePlant is a named plant of the suite.
type suitePlant struct {
	name    string
	system  curves.System
	minFlow curves.Flow
	loopEnd bool    // the plant-minimum bypass at the loop's far end
	tempC   float64 // fluid temperature, °C; 0 means 7 (chilled water)
	models  []suiteModel
}

func (s suitePlant) build(t testing.TB) *plant.Plant {
	t.Helper()
	temp := s.tempC
	if temp == 0 {
		temp = 7
	}
	rho, err := curves.WaterDensity(temp)
	if err != nil {
		t.Fatal(err)
	}
	p := &plant.Plant{Name: s.name, Fluid: curves.Fluid{Density: rho, Temperature: temp, SG: rho / 999.972},
		System: s.system, MinFlow: s.minFlow, BypassAtLoopEnd: s.loopEnd}
	for _, m := range s.models {
		pm := m.build(t)
		if err := refCheckModel(&pm); err != nil {
			t.Fatalf("plant %s: %v", s.name, err)
		}
		p.Models = append(p.Models, pm)
	}
	switch sys := s.system.(type) {
	case curves.DPControl:
		p.DesignFlow, p.DesignHead = sys.DesignFlow, sys.DesignHead
	case curves.FixedCurve:
		p.DesignFlow, p.DesignHead = sys.DesignFlow, sys.DesignHead
	}
	return p
}

// Drive efficiency of a 100 hp VFD at 1.6/12.5/25/42/50/75/100 % load, US DOE
// Motor Systems Tip Sheet #11 (docs/sources.md §5, [C]); plant data here.
var tipSheet100hp = curves.TableDrive{Table: []curves.LoadEff{
	{Load: 0.016, Eff: 0.55}, {Load: 0.125, Eff: 0.89}, {Load: 0.25, Eff: 0.94}, {Load: 0.42, Eff: 0.95},
	{Load: 0.50, Eff: 0.96}, {Load: 0.75, Eff: 0.97}, {Load: 1.00, Eff: 0.97}}}

// An invented IEC 61800-9-2 style loss table (% of rated power).
func iecDrive(t testing.TB) curves.Drive {
	d, err := curves.NewIECDrive([]curves.IECPoint{
		{Speed: 0, Torque: 25, LossPct: 1.0}, {Speed: 0, Torque: 50, LossPct: 1.3}, {Speed: 0, Torque: 100, LossPct: 2.2},
		{Speed: 50, Torque: 25, LossPct: 1.2}, {Speed: 50, Torque: 50, LossPct: 1.6}, {Speed: 50, Torque: 100, LossPct: 2.6},
		{Speed: 90, Torque: 50, LossPct: 2.0}, {Speed: 90, Torque: 100, LossPct: 3.1},
	})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// constantChain is a motor table and a drive table of constant efficiency:
// the power chain then scales exactly as the shaft power.
var (
	constantMotor = []curves.LoadEff{{Load: 0, Eff: 0.95}, {Load: 2, Eff: 0.95}}
	constantDrive = curves.TableDrive{Table: []curves.LoadEff{{Load: 0, Eff: 0.97}, {Load: 2, Eff: 0.97}}}
)

// suitePlants returns the suite, built deterministically.
func suitePlants(t testing.TB) []*plant.Plant {
	t.Helper()
	L := suiteModel{name: "L", count: 3, pump: pumpL, motorHP: 60}
	M := suiteModel{name: "M", count: 1, pump: pumpM, motorHP: 30}
	S := suiteModel{name: "S", count: 1, pump: pumpS, motorHP: 15}
	n := func(m suiteModel, count int) suiteModel { m.count = count; return m }
	mod := func(m suiteModel, f func(*suiteModel)) suiteModel { f(&m); return m }
	specs := []suitePlant{
		{name: "identical-3", system: dp(0.25, 30, 0.4), models: []suiteModel{L}},
		{name: "identical-4-zero-control", system: dp(0.30, 30, 0), models: []suiteModel{n(L, 4)}},
		{name: "identical-2-high-control", system: dp(0.09, 30, 0.8), models: []suiteModel{n(M, 2)}},
		{name: "two-sizes", system: dp(0.25, 30, 0.4), models: []suiteModel{n(L, 2), M}},
		{name: "small-beside-large", system: dp(0.20, 30, 0.3), models: []suiteModel{n(L, 2), S}},
		{name: "fixed-among-variable", system: dp(0.25, 30, 0.5), models: []suiteModel{n(L, 2),
			mod(L, func(m *suiteModel) { m.name, m.count, m.drive = "L-fixed", 1, curves.FixedSpeed{} })}},
		{name: "fixed-small-with-large", system: dp(0.22, 30, 0.6), models: []suiteModel{n(L, 2),
			mod(S, func(m *suiteModel) { m.name, m.drive = "S-fixed", curves.FixedSpeed{} })}},
		{name: "steep-curves", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump.shutoff = 1.5; m.motorHP = 75 })}},
		{name: "flat-curves", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump.shutoff = 1.1 })}},
		{name: "flat-efficiency", system: dp(0.25, 30, 0.3), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump.effK = 1.2 })}},
		{name: "fixed-system-static-50", system: fixedCurve(0.25, 30, 0.5), models: []suiteModel{L}},
		{name: "fixed-system-static-80-two-sizes", system: fixedCurve(0.22, 30, 0.8), models: []suiteModel{n(L, 2), M}},
		{name: "plant-minimum-flow", system: dp(0.25, 30, 0.4), minFlow: 0.06, models: []suiteModel{L}},
		{name: "plant-minimum-flow-loop-end", system: dp(0.25, 30, 0.4), minFlow: 0.06, loopEnd: true, models: []suiteModel{L}},
		{name: "branch-losses", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.branchFrac = 0.05 })}},
		{name: "branch-losses-mixed", system: dp(0.22, 28, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.count, m.branchFrac = 2, 0.08 }),
			mod(M, func(m *suiteModel) { m.branchFrac = 0.02 })}},
		{name: "two-pole", system: dp(0.08, 42, 0.4), models: []suiteModel{
			{name: "P2", count: 3, pump: pumpP2, motorHP: 30, poles: 2}}},
		{name: "two-pole-beside-four-pole", system: dp(0.22, 30, 0.4), models: []suiteModel{n(L, 2),
			{name: "P2", count: 1, pump: pumpP2, motorHP: 30, poles: 2}}},
		{name: "humped", system: dp(0.25, 28, 0.5), models: []suiteModel{
			{name: "H", count: 3, pump: pumpHm, motorHP: 60, minFlowX: 0.45}}},
		// Fixed-speed units on a humped curve serve flows on its falling
		// branch at heads above the shutoff head (issue: heads were capped
		// at shutoff), beside a variable-speed unit of the same curve.
		{name: "humped-fixed", system: dp(0.25, 28, 0.5), models: []suiteModel{
			{name: "H-fixed", count: 2, pump: pumpHm, motorHP: 60, minFlowX: 0.45, drive: curves.FixedSpeed{}},
			{name: "H", count: 1, pump: pumpHm, motorHP: 60, minFlowX: 0.45}}},
		// Two models whose efficiency rises slowly from zero flow (effK
		// 4.3), with the Sârbu–Borza step-down: the power along the split
		// between them can have two minima, the better one with a unit at
		// its minimum flow.
		{name: "slow-rise-two-models", system: dp(0.16, 28, 0.34), models: []suiteModel{
			{name: "A", count: 2, pump: slowRiseA, motorHP: 100, minFlowX: 0.10},
			{name: "B", count: 1, pump: slowRiseB, motorHP: 40, minFlowX: 0.19}}},
		// More than 16 count vectors (35), so the solver bounds them and
		// answers from its staging table (bound.go, flowtable.go) rather
		// than evaluating each; at most three variable units run, which
		// keeps the reference's search within reach.
		{name: "many-vectors-mixed", system: dp(0.40, 30, 0.4), models: []suiteModel{n(L, 2), M,
			mod(S, func(m *suiteModel) { m.name, m.count, m.drive = "S-fixed", 2, curves.FixedSpeed{} }),
			mod(L, func(m *suiteModel) { m.name, m.count, m.drive = "L-fixed", 1, curves.FixedSpeed{} })}},
		{name: "speed-correction", system: dp(0.25, 30, 0.3), tempC: 60, models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump.speedCorrection = true })}},
		{name: "setpoint-reset", models: []suiteModel{L}, system: curves.DPControl{DesignFlow: 0.25, DesignHead: 30, ControlHead: 12,
			Reset: &curves.Reset{LowFlow: 0.06, LowHead: 6, HighFlow: 0.2}}},
		{name: "motor-overload", system: dp(0.20, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.count, m.maxSpeed = 2, 1.1 })}},
		{name: "tip-sheet-drive", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.drive = tipSheet100hp })}},
		{name: "iec-drive", system: dp(0.09, 28, 0.5), models: []suiteModel{
			mod(M, func(m *suiteModel) { m.count, m.drive = 2, iecDrive(t) })}},
		{name: "all-fixed-speed", system: fixedCurve(0.25, 30, 0.6), minFlow: 0.03, models: []suiteModel{
			mod(L, func(m *suiteModel) { m.drive = curves.FixedSpeed{} })}},
		{name: "wide-runout", system: dp(0.30, 30, 0.3), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump.lastX, m.runoutX, m.minFlowX, m.motorHP = 1.5, 1.45, 0.2, 75 })}},
		{name: "three-models", system: dp(0.17, 30, 0.4), models: []suiteModel{n(L, 1), M, S}},
		// Cubic head fits of both signs of the x³ term. The positive one
		// runs from half speed: the reference's speed search needs
		// H₀(X)/X² to fall up to runout × top/bottom speed, and
		// 1.2/x² − 0.3 + 0.1x turns up at x = 24^(1/3) ≈ 2.9.
		{name: "cubic-positive", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump, m.minSpeed = pumpCubicPos, 0.5 })}},
		{name: "cubic-negative", system: dp(0.25, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.pump, m.motorHP = pumpCubicNeg, 75 })}},
		{name: "cubic-positive-branch-beside-quadratic", system: dp(0.22, 30, 0.4), models: []suiteModel{
			mod(L, func(m *suiteModel) { m.count, m.pump, m.minSpeed, m.branchFrac = 2, pumpCubicPos, 0.5, 0.05 }), M}},
		{name: "cubic-fixed-beside-variable", system: dp(0.25, 30, 0.5), models: []suiteModel{
			mod(L, func(m *suiteModel) {
				m.name, m.count, m.pump, m.drive = "C-fixed", 1, pumpCubicPos, curves.FixedSpeed{}
			}),
			mod(L, func(m *suiteModel) { m.count, m.pump = 2, pumpCubicNeg })}},
		{name: "constant-chain-zero-control", system: dp(0.25, 30, 0), models: []suiteModel{
			mod(L, func(m *suiteModel) {
				m.drive, m.motorTable, m.minSpeed, m.minFlowX = constantDrive, constantMotor, 0.1, -1
			})}},
	}
	var out []*plant.Plant
	for _, s := range specs {
		out = append(out, s.build(t))
	}
	return out
}

// suiteCapacity is an upper bound on what the plant can pump: every unit at
// runout and maximum speed.
func suiteCapacity(p *plant.Plant) curves.Flow {
	var c curves.Flow
	for _, m := range p.Models {
		s := 1.0
		if m.Variable() {
			s = m.MaxSpeed
		}
		c += curves.Flow(float64(m.Count) * float64(m.Runout) * s)
	}
	return c
}

// suiteFlows spreads n load flows from 1 % to 110 % of the capacity bound,
// so that every plant is tried below its smallest deliverable flow, across
// every staging, and beyond what it can serve.
func suiteFlows(p *plant.Plant, n int) []curves.Flow {
	c := suiteCapacity(p)
	out := make([]curves.Flow, n)
	for k := range out {
		out[k] = c * curves.Flow(0.01+1.09*float64(k)/float64(n-1))
	}
	return out
}

// suiteTol is the tolerance on power against the reference: 0.05 %.
const suiteTol = 5e-4

func suiteNumFlows() int {
	if testing.Short() {
		return 3 // the quick loop: 1 %, 55 % and 110 % of capacity
	}
	return 25
}

// TestOptimiserMatchesReference runs the solver and the brute-force
// reference on every suite plant at many flows, with each unit at its own
// speed and with one common speed, and checks power (within 0.05 %),
// feasibility and the invariants of every served result.
func TestOptimiserMatchesReference(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	for _, p := range suitePlants(t) {
		for _, common := range []bool{false, true} {
			mode := "individual"
			if common {
				mode = "common-speed"
			}
			t.Run(p.Name+"/"+mode, func(t *testing.T) {
				t.Parallel()
				s := optimize.New(p, optimize.Options{CommonSpeed: common})
				var worst, sum float64
				var served, misses int
				for _, q := range suiteFlows(p, suiteNumFlows()) {
					res := s.Solve(q)
					ref := refSolve(p, q, common)
					for _, msg := range suiteInvariants(p, q, common, &res) {
						t.Errorf("plant %s, load %.5g m³/s: invariant: %s", p.Name, float64(q), msg)
					}
					d, miss, msg := suiteCompare(p, q, &res, &ref)
					if msg != "" {
						t.Errorf("plant %s, load %.5g m³/s (%.1f m³/h): %s", p.Name, float64(q), float64(q)/curves.M3PerH, msg)
					}
					if miss {
						misses++
						t.Logf("plant %s, load %.5g m³/s: reference grid missed the optimiser's (verified) state: optimiser %.6g kW %v, reference %v %.6g kW %v",
							p.Name, float64(q), float64(res.Power)/1e3, res.Counts, ref.Feasible, float64(ref.Power)/1e3, ref.Counts)
					}
					if res.Status == optimize.Served && ref.Feasible {
						served++
						worst = math.Max(worst, d)
						sum += d
					}
				}
				if served > 0 {
					t.Logf("plant %s (%s): %d served points, power vs reference mean %+.2e worst %+.2e relative; %d reference misses",
						p.Name, mode, served, sum/float64(served), worst, misses)
				}
			})
		}
	}
}

// suiteCompare compares one solver result with the reference. It returns the
// relative excess of the solver's power over the reference, whether the
// reference missed a state the solver found (checked with the reference's
// own physics), and a mismatch message ("" when they agree).
func suiteCompare(p *plant.Plant, q curves.Flow, res *optimize.Result, ref *refResult) (float64, bool, string) {
	served := res.Status == optimize.Served
	refPower, refFeasible := ref.Power, ref.Feasible
	miss := false
	var recheck string
	if served && (!refFeasible || float64(res.Power) < float64(refPower)*(1-suiteTol)) {
		// The solver claims better than the reference: rebuild its state from
		// its running models and speeds alone with the reference's physics.
		models := make([]int, len(res.Units))
		speeds := make([]float64, len(res.Units))
		for i, u := range res.Units {
			models[i], speeds[i] = u.Model, u.Speed
		}
		pw, h, ok := refRecheck(p, q, models, speeds)
		switch {
		case ok && math.Abs(float64(pw-res.Power)) <= 1e-6*float64(res.Power):
			miss = true
			refPower, refFeasible = pw, true
		case ok:
			recheck = fmt.Sprintf("; its speeds rebuilt by the reference give %.6g kW at header %.4f m", float64(pw)/1e3, float64(h))
		default:
			recheck = "; its speeds rebuilt by the reference give no state inside every limit"
		}
	}
	refDesc := "unmet"
	if refFeasible {
		refDesc = fmt.Sprintf("%.6g kW counts %v", float64(refPower)/1e3, ref.Counts)
		if miss {
			refDesc = fmt.Sprintf("%.6g kW (its own best %s %.6g kW %v)", float64(refPower)/1e3, feasibleWord(ref.Feasible), float64(ref.Power)/1e3, ref.Counts)
		}
	}
	optDesc := "unmet (" + string(res.Limit) + ": " + res.Reason + ")"
	if served {
		optDesc = fmt.Sprintf("%.6g kW counts %v", float64(res.Power)/1e3, res.Counts)
		if pw, ok := ref.ByCounts[fmt.Sprint(res.Counts)]; ok {
			optDesc += fmt.Sprintf(" (reference for those counts %.6g kW)", float64(pw)/1e3)
		}
	}
	switch {
	case served && !refFeasible:
		return 0, false, fmt.Sprintf("optimiser serves what the reference finds infeasible: optimiser %s, reference unmet%s", optDesc, recheck)
	case !served && refFeasible:
		return 0, false, fmt.Sprintf("optimiser reports unmet what the reference serves: optimiser %s, reference %s", optDesc, refDesc)
	case !served:
		return 0, false, ""
	}
	d := float64(res.Power)/float64(refPower) - 1
	if math.Abs(d) > suiteTol {
		return d, miss, fmt.Sprintf("power off by %+.4f %%: optimiser %s, reference %s%s", 100*d, optDesc, refDesc, recheck)
	}
	return d, miss, ""
}

func feasibleWord(ok bool) string {
	if ok {
		return "feasible"
	}
	return "none"
}

// suiteInvariants checks a result against the physics by recomputing every
// reported number from the reported speeds and flows.
func suiteInvariants(p *plant.Plant, load curves.Flow, common bool, r *optimize.Result) []string {
	var bad []string
	fail := func(format string, a ...any) { bad = append(bad, fmt.Sprintf(format, a...)) }
	rel := func(a, b float64) float64 { return math.Abs(a-b) / math.Max(math.Abs(b), 1e-300) }
	pumped := load
	if p.MinFlow > pumped {
		pumped = p.MinFlow
	}
	if r.LoadFlow != load {
		fail("LoadFlow %g, asked %g", float64(r.LoadFlow), float64(load))
	}
	if r.Status != optimize.Served {
		if r.Reason == "" {
			fail("unmet result without a reason")
		}
		if r.Shortfall < 0 {
			fail("negative shortfall %g", float64(r.Shortfall))
		}
		return bad
	}
	if rel(float64(r.PumpedFlow), float64(pumped)) > 1e-12 {
		fail("PumpedFlow %g, want max(load, plant minimum) = %g", float64(r.PumpedFlow), float64(pumped))
	}
	if rel(float64(r.BypassFlow), float64(pumped-load)) > 1e-9 && math.Abs(float64(r.BypassFlow-(pumped-load))) > 1e-12 {
		fail("BypassFlow %g, want %g", float64(r.BypassFlow), float64(pumped-load))
	}
	loopFlow := load // the flow through the loop: the load's, or the pumped flow with the bypass at its end
	if p.BypassAtLoopEnd {
		loopFlow = pumped
	}
	if rel(float64(r.RequiredHead), float64(p.System.Required(loopFlow))) > 1e-12 {
		fail("RequiredHead %g, system gives %g", float64(r.RequiredHead), float64(p.System.Required(loopFlow)))
	}
	if r.HeaderHead < r.RequiredHead*(1-1e-9) {
		fail("HeaderHead %.9g below RequiredHead %.9g", float64(r.HeaderHead), float64(r.RequiredHead))
	}
	counts := make([]int, len(p.Models))
	var sumQ curves.Flow
	var sumP curves.Power
	commonSpeed := math.NaN()
	for i, u := range r.Units {
		if u.Model < 0 || u.Model >= len(p.Models) {
			fail("unit %d: model %d out of range", i, u.Model)
			continue
		}
		m := &p.Models[u.Model]
		counts[u.Model]++
		sumQ += u.Flow
		sumP += u.Electrical
		if m.Variable() {
			if u.Speed < m.MinSpeed*(1-1e-9) || u.Speed > m.MaxSpeed*(1+1e-9) {
				fail("unit %d (%s): speed %.9g outside %g–%g", i, m.Name, u.Speed, m.MinSpeed, m.MaxSpeed)
			}
			if common {
				if math.IsNaN(commonSpeed) {
					commonSpeed = u.Speed
				} else if math.Abs(u.Speed-commonSpeed) > 1e-9 {
					fail("unit %d (%s): speed %.9g differs from the common speed %.9g", i, m.Name, u.Speed, commonSpeed)
				}
			}
		} else if u.Speed != 1 {
			fail("unit %d (%s): fixed-speed unit at speed %g", i, m.Name, u.Speed)
		}
		if u.Flow < curves.Flow(float64(m.MinFlow)*u.Speed*(1-1e-9)) {
			fail("unit %d (%s): flow %.6g below minimum flow %.6g at its speed", i, m.Name, float64(u.Flow), float64(m.MinFlow)*u.Speed)
		}
		if u.Flow > curves.Flow(float64(m.Runout)*u.Speed*(1+1e-9)) {
			fail("unit %d (%s): flow %.6g past runout %.6g at its speed", i, m.Name, float64(u.Flow), float64(m.Runout)*u.Speed)
		}
		// The unit's own head equals the header head plus its branch loss, on
		// its curve at its reported speed.
		own := m.Pump.Head(u.Flow, u.Speed)
		if rel(float64(own), float64(u.Head)) > 1e-7 {
			fail("unit %d (%s): reported head %.9g m, its curve gives %.9g m at %.6g m³/s and speed %.6g",
				i, m.Name, float64(u.Head), float64(own), float64(u.Flow), u.Speed)
		}
		branch := curves.Head(m.BranchK * float64(u.Flow) * float64(u.Flow))
		if rel(float64(own-branch), float64(r.HeaderHead)) > 1e-7 {
			fail("unit %d (%s): curve head %.9g m less branch loss %.6g m differs from the header head %.9g m",
				i, m.Name, float64(own), float64(branch), float64(r.HeaderHead))
		}
		shaft := m.Pump.ShaftPower(u.Flow, u.Speed, p.Fluid.Density)
		if rel(float64(u.Shaft), float64(shaft)) > 1e-9 {
			fail("unit %d (%s): shaft %.9g W, recomputed %.9g W", i, m.Name, float64(u.Shaft), float64(shaft))
		}
		if float64(shaft) > float64(m.Motor.Rated)*m.Motor.SF()*(1+1e-9) {
			fail("unit %d (%s): shaft %.6g W above rated × service factor %.6g W", i, m.Name, float64(shaft), float64(m.Motor.Rated)*m.Motor.SF())
		}
		c := m.Drive.Input(m.Motor, shaft, u.Speed)
		if rel(float64(u.Electrical), float64(c.Electrical)) > 1e-9 {
			fail("unit %d (%s): electrical %.9g W, recomputed %.9g W", i, m.Name, float64(u.Electrical), float64(c.Electrical))
		}
		if rel(u.PumpEff, m.Pump.Eff(u.Flow, u.Speed)) > 1e-9 || rel(u.MotorEff, c.MotorEff) > 1e-9 ||
			rel(u.DriveEff, c.DriveEff) > 1e-9 || rel(u.Load, c.Load) > 1e-9 {
			fail("unit %d (%s): efficiencies/load (%.6g, %.6g, %.6g, %.6g), recomputed (%.6g, %.6g, %.6g, %.6g)", i, m.Name,
				u.PumpEff, u.MotorEff, u.DriveEff, u.Load, m.Pump.Eff(u.Flow, u.Speed), c.MotorEff, c.DriveEff, c.Load)
		}
		hyd := curves.HydraulicPower(p.Fluid.Density, u.Flow, own)
		if u.Electrical < u.Shaft || u.Shaft < hyd*(1-1e-9) {
			fail("unit %d (%s): electrical %.6g W, shaft %.6g W, hydraulic %.6g W out of order", i, m.Name,
				float64(u.Electrical), float64(u.Shaft), float64(hyd))
		}
	}
	for i, c := range counts {
		if i >= len(r.Counts) || r.Counts[i] != c {
			fail("Counts %v do not match the units listed (%v)", r.Counts, counts)
			break
		}
		if c > p.Models[i].Count {
			fail("model %s: %d running of %d installed", p.Models[i].Name, c, p.Models[i].Count)
		}
	}
	if len(r.Units) == 0 {
		fail("served without a running unit")
	}
	if rel(float64(sumQ), float64(r.PumpedFlow)) > 1e-7 {
		fail("unit flows sum to %.9g m³/s, pumped flow %.9g m³/s", float64(sumQ), float64(r.PumpedFlow))
	}
	if rel(float64(sumP), float64(r.Power)) > 1e-9 {
		fail("unit powers sum to %.9g W, reported total %.9g W", float64(sumP), float64(r.Power))
	}
	hyd := curves.HydraulicPower(p.Fluid.Density, r.PumpedFlow, r.HeaderHead)
	if rel(float64(r.Hydraulic), float64(hyd)) > 1e-7 {
		fail("Hydraulic %.9g W, ρgQH gives %.9g W", float64(r.Hydraulic), float64(hyd))
	}
	if r.Power < r.Hydraulic {
		fail("electrical %.6g W below hydraulic %.6g W", float64(r.Power), float64(r.Hydraulic))
	}
	return bad
}

// With zero control head the control curve is H ∝ Q², the affinity
// parabola; with constant motor and drive efficiencies and no limit
// binding, the best state at λQ is the best at Q with speeds and flows ×λ,
// so total power follows the cube law exactly (affinity laws, every pump
// handbook [P]; docs/sources.md §3), and so does the best count.
func TestCubeLawZeroControlHead(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	p := suitePlantNamed(t, "constant-chain-zero-control")
	for _, common := range []bool{false, true} {
		s := optimize.New(p, optimize.Options{CommonSpeed: common})
		base := curves.Flow(0.20)
		r0 := s.Solve(base)
		if r0.Status != optimize.Served {
			t.Fatalf("common=%v: base point unmet: %s", common, r0.Reason)
		}
		for _, lam := range []float64{0.3, 0.5, 0.7, 0.9, 1.1, 1.2} {
			r := s.Solve(base * curves.Flow(lam))
			want := float64(r0.Power) * lam * lam * lam
			if r.Status != optimize.Served || math.Abs(float64(r.Power)/want-1) > 1e-7 {
				t.Errorf("common=%v λ = %g: %v %.9g W, cube law from %.9g W gives %.9g W", common, lam, r.Status, float64(r.Power), float64(r0.Power), want)
				continue
			}
			if fmt.Sprint(r.Counts) != fmt.Sprint(r0.Counts) {
				t.Errorf("common=%v λ = %g: counts %v, at the base point %v", common, lam, r.Counts, r0.Counts)
			}
			for _, u := range r.Units {
				if math.Abs(float64(u.Head)/float64(r.RequiredHead)-1) > 1e-7 {
					t.Errorf("common=%v λ = %g: unit head %.9g m off the control curve %.9g m", common, lam, float64(u.Head), float64(r.RequiredHead))
				}
			}
		}
	}
}

// For n identical units on equal speeds the switch from n to n+1 running is
// best where their total input powers are equal at the same flow and head
// (Viholainen et al., Energy Efficiency 6 (2013) 495–509, docs/sources.md §7 [M]).
// The equal-power flow is found here by bisection on the two fixed-count
// power curves computed directly (one speed root per point, no search); the
// optimiser's switch is found by bisection on its running count, and the two
// must coincide. The premise (equal split optimal near the switch) is
// checked against the brute-force reference first.
func TestSwitchAtEqualPower(t *testing.T) {
	t.Parallel() // independent of every other test: the suite runs in parallel
	found := 0
	for _, name := range []string{"identical-3", "two-pole", "branch-losses", "steep-curves", "wide-runout", "flat-curves"} {
		p := suitePlantNamed(t, name)
		s := optimize.New(p, optimize.Options{})
		powerN := func(n int, q curves.Flow) (curves.Power, bool) {
			pw, _, ok := refEqualSplit(p, 0, n, q, p.System.Required(q))
			return pw, ok
		}
		for n := 1; n < p.Models[0].Count; n++ {
			// Bracket the crossing on a scan where both counts run on the curve.
			var lo, hi curves.Flow
			cap := suiteCapacity(p)
			prevQ, prevSign := curves.Flow(0), 0
			for k := 1; k <= 400 && hi == 0; k++ {
				q := cap * curves.Flow(k) / 400
				a, okA := powerN(n, q)
				b, okB := powerN(n+1, q)
				if !okA || !okB {
					prevSign = 0
					continue
				}
				sign := 1
				if b < a {
					sign = -1
				}
				if prevSign == 1 && sign == -1 {
					lo, hi = prevQ, q
				}
				prevQ, prevSign = q, sign
			}
			if hi == 0 {
				// A limit (runout, overload, maximum speed) forces the switch
				// before the powers cross; nothing to compare here.
				t.Logf("%s: %d and %d units on the curve do not cross in power while both are feasible", name, n, n+1)
				continue
			}
			found++
			diff := func(q float64) float64 {
				a, _ := powerN(n, curves.Flow(q))
				b, _ := powerN(n+1, curves.Flow(q))
				return float64(b - a)
			}
			qStar := curves.Flow(refBisect(diff, float64(lo), float64(hi)))
			pStar, _ := powerN(n, qStar)
			// Premise: at the crossing nothing beats the equal split.
			ref := refSolve(p, qStar, false)
			if !ref.Feasible || float64(ref.Power) < float64(pStar)*(1-1e-6) {
				t.Errorf("%s n=%d: at the equal-power flow %.6g m³/s the reference finds %.9g W below the equal split %.9g W %v",
					name, n, float64(qStar), float64(ref.Power), float64(pStar), ref.Counts)
				continue
			}
			// The optimiser's own switch, by bisection on its running count.
			below, above := s.Solve(qStar*(1-1e-3)), s.Solve(qStar*(1+1e-3))
			if below.Running() != n || above.Running() != n+1 {
				t.Errorf("%s: around the equal-power flow %.6g m³/s the optimiser runs %d then %d units, want %d then %d",
					name, float64(qStar), below.Running(), above.Running(), n, n+1)
				continue
			}
			a, b := float64(qStar)*(1-1e-3), float64(qStar)*(1+1e-3)
			for i := 0; i < 60; i++ {
				m := 0.5 * (a + b)
				if r := s.Solve(curves.Flow(m)); r.Running() <= n {
					a = m
				} else {
					b = m
				}
			}
			qOpt := 0.5 * (a + b)
			if math.Abs(qOpt/float64(qStar)-1) > 1e-5 {
				t.Errorf("%s: optimiser switches %d→%d at %.8g m³/s, equal total power at %.8g m³/s", name, n, n+1, qOpt, float64(qStar))
			} else {
				t.Logf("%s: %d→%d switch at %.6g m³/s (%.1f m³/h), equal-power flow %.6g m³/s", name, n, n+1, qOpt, qOpt/curves.M3PerH, float64(qStar))
			}
		}
	}
	if found < 5 {
		t.Errorf("only %d equal-power crossings found; the check needs plants where the powers cross", found)
	}
}
