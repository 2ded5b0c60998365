package optimize

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"wattstage/curves"
	"wattstage/plant"
)

// The plants below are built from the invented 1000 gpm datasheet of
// solver_test.go (testModel, testPlant); the checks compare the derived
// sequence with values computed here directly from the curves package by an
// independent route, or with published constants.

// mixedPlant is two large units beside one small one (40 % of the flow,
// same heads), with a low plant minimum flow so that the small unit has a
// range of its own.
func mixedPlant(t testing.TB, small plant.Model) *plant.Plant {
	p := testPlant(t, testModel(t, "big", 2, 1, curves.DOEDrive{}), small)
	p.MinFlow = curves.Flow(150 * curves.GPM)
	return p
}

// scaledEffModel is testModel with every datasheet efficiency multiplied by
// f: the same heads, a worse pump.
func scaledEffModel(t testing.TB, name string, count int, scale, f float64) plant.Model {
	t.Helper()
	m := testModel(t, name, count, scale, curves.DOEDrive{})
	pts := append([]curves.PumpPoint(nil), m.Pump.Points...)
	for i := range pts {
		pts[i].Eff *= f
	}
	pump, err := curves.NewPump(pts, curves.PumpOptions{})
	if err != nil {
		t.Fatal(err)
	}
	m.Pump = pump
	return m
}

// direct is one model's units computed from the curves package alone: n
// units sharing plant flow Q equally at the system's required head, with
// whether every unit limit holds.
type direct struct {
	kw, speed float64
	inLimits  bool
}

func directEqualSplit(p *plant.Plant, m plant.Model, n int, Q curves.Flow) direct {
	h := p.System.Required(Q)
	q := Q / curves.Flow(n)
	s, ok := m.Pump.SpeedFor(q, h)
	if !ok {
		return direct{kw: math.NaN()}
	}
	shaft := m.Pump.ShaftPower(q, s, p.Fluid.Density)
	ch := m.Drive.Input(m.Motor, shaft, s)
	x := float64(q) / s // rated-equivalent flow (affinity laws)
	in := s >= m.MinSpeed && s <= m.MaxSpeed && x >= float64(m.MinFlow) && x <= float64(m.Runout) &&
		float64(shaft) <= float64(m.Motor.Rated)*m.Motor.SF()
	return direct{kw: float64(n) * float64(ch.Electrical) / 1000, speed: s, inLimits: in}
}

// bisectRoot is plain bisection, kept apart from the Brent search under test.
func bisectRoot(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for it := 0; it < 200 && b-a > 1e-13*math.Abs(b); it++ {
		m := (a + b) / 2
		if fm := f(m); (fm > 0) == (fa > 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return (a + b) / 2
}

// Identical units with convex power curves: the best switch from n to n+1
// units is where their total inputs are equal at the same flow and head
// (docs/sources.md §7 [M]: Viholainen et al., Energy Efficiency 6 (2013) 495–509;
// Bortoni et al., Energy Efficiency 1 (2008)). The equal-power flow is found
// here by bisection on two fixed-count power curves computed from curves/
// directly, not through the solver.
func TestCrossoverEqualsEqualPowerPoint(t *testing.T) {
	cases := []struct {
		name string
		p    func(t testing.TB) *plant.Plant
	}{
		{"DP control, 3 × 1000 gpm", func(t testing.TB) *plant.Plant {
			return testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
		}},
		{"DP control, low control head, 4 × 800 gpm", func(t testing.TB) *plant.Plant {
			p := testPlant(t, testModel(t, "unit", 4, 0.8, curves.DOEDrive{}))
			p.System = curves.DPControl{DesignFlow: p.DesignFlow, DesignHead: p.DesignHead, ControlHead: curves.Head(15 * curves.Foot)}
			p.MinFlow = 0
			return p
		}},
		{"static plus friction, 3 × 1000 gpm", func(t testing.TB) *plant.Plant {
			p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
			p.System = curves.FixedCurve{DesignFlow: p.DesignFlow, DesignHead: p.DesignHead, Static: curves.Head(45 * curves.Foot)}
			p.MinFlow = 0
			return p
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := c.p(t)
			m := p.Models[0]
			sp, err := DeriveSetpoints(p, SetpointOptions{})
			if err != nil {
				t.Fatal(err)
			}
			compared := 0
			for _, tr := range sp.Transitions {
				if tr.Crossover == 0 {
					continue // capacity before crossover: checked elsewhere
				}
				n := sum(tr.Lower)
				diff := func(q float64) float64 {
					return directEqualSplit(p, m, n, curves.Flow(q)).kw - directEqualSplit(p, m, n+1, curves.Flow(q)).kw
				}
				// Bracket the sign change on a coarse scan where both counts
				// are inside every limit.
				lo, hi := math.NaN(), math.NaN()
				step := float64(p.DesignFlow) / 400
				for q := step; q < 1.5*float64(p.DesignFlow); q += step {
					a, b := directEqualSplit(p, m, n, curves.Flow(q)), directEqualSplit(p, m, n+1, curves.Flow(q))
					a2, b2 := directEqualSplit(p, m, n, curves.Flow(q+step)), directEqualSplit(p, m, n+1, curves.Flow(q+step))
					if a.inLimits && b.inLimits && a2.inLimits && b2.inLimits && diff(q) < 0 && diff(q+step) >= 0 {
						lo, hi = q, q+step
						break
					}
				}
				if math.IsNaN(lo) {
					t.Fatalf("%d → %d: no equal-power point inside the limits found directly, but the derivation reports %.2f gpm",
						n, n+1, float64(tr.Crossover)/curves.GPM)
				}
				want := bisectRoot(diff, lo, hi)
				checkConvex(t, p, m, curves.Flow(want), n+1)
				got := float64(tr.Crossover)
				// Tolerance: the solver's inner bisections (≈1e-12) and the
				// root searches (1e-10 of design flow).
				if rel := math.Abs(got-want) / want; rel > 1e-6 {
					t.Errorf("%d → %d: crossover %.4f gpm, equal-power point computed directly %.4f gpm (rel. error %.1e)",
						n, n+1, got/curves.GPM, want/curves.GPM, rel)
				}
				if tr.Up.Limit != LimitCrossover || tr.Up.Flow != tr.Crossover {
					t.Errorf("%d → %d: stage-up %.2f gpm set by %q, want the crossover", n, n+1, float64(tr.Up.Flow)/curves.GPM, tr.Up.Limit)
				}
				// At the crossover both stages draw the same input.
				if d := math.Abs(float64(tr.Up.Power-tr.Up.PowerAfter)) / float64(tr.Up.Power); d > 1e-6 {
					t.Errorf("%d → %d: input before %.4f kW and after %.4f kW differ at the crossover", n, n+1,
						float64(tr.Up.Power)/1000, float64(tr.Up.PowerAfter)/1000)
				}
				t.Logf("%d → %d: crossover %.2f gpm (direct %.2f gpm), %.2f kW", n, n+1, got/curves.GPM, want/curves.GPM, float64(tr.CrossoverPower)/1000)
				compared++
			}
			if compared == 0 {
				t.Fatal("no transition with a crossover to compare")
			}
		})
	}
}

// checkConvex checks the premise of the equal-power rule: one unit's input
// is convex in its flow at the crossover head, over the flows the stages
// use there (second differences not negative).
func checkConvex(t *testing.T, p *plant.Plant, m plant.Model, Q curves.Flow, nmax int) {
	t.Helper()
	h := p.System.Required(Q)
	pw := func(q curves.Flow) float64 {
		s, ok := m.Pump.SpeedFor(q, h)
		if !ok {
			t.Fatalf("no speed for %.1f gpm at %.1f ft", float64(q)/curves.GPM, float64(h)/curves.Foot)
		}
		return float64(m.Drive.Input(m.Motor, m.Pump.ShaftPower(q, s, p.Fluid.Density), s).Electrical)
	}
	a, b := Q/curves.Flow(nmax), Q/curves.Flow(nmax-1)
	const k = 40
	dq := (b - a) / k
	for i := 1; i < k; i++ {
		q := a + dq*curves.Flow(i)
		if d2 := pw(q-dq) - 2*pw(q) + pw(q+dq); d2 < -1e-9*pw(q) {
			t.Fatalf("premise broken: unit input not convex near %.1f gpm (second difference %.3g W)", float64(q)/curves.GPM, d2)
		}
	}
}

// The stage-up speed, put back through the affinity model (Pump.FlowAt at
// that speed against the header head), reproduces the stage-up flow; on the
// control curve the header head is the system's required head.
func TestStageUpSpeedReproducesFlow(t *testing.T) {
	plants := map[string]*plant.Plant{
		"identical": testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{})),
		"mixed":     mixedPlant(t, testModel(t, "small", 1, 0.4, curves.DOEDrive{})),
	}
	for name, p := range plants {
		t.Run(name, func(t *testing.T) {
			sp, err := DeriveSetpoints(p, SetpointOptions{})
			if err != nil {
				t.Fatal(err)
			}
			for _, tr := range sp.Transitions {
				if math.IsNaN(tr.Up.Speed) {
					t.Fatalf("%d → %d: no stage-up speed on an all-drive plant", tr.From, tr.To)
				}
				q := 0.0
				for i, n := range tr.Lower {
					if n == 0 {
						continue
					}
					qi, ok := p.Models[i].Pump.FlowAt(tr.Up.Speed, tr.Up.Head)
					if !ok {
						t.Fatalf("%d → %d: %s makes no flow at %.4f speed and %.2f ft", tr.From, tr.To, p.Models[i].Name, tr.Up.Speed, float64(tr.Up.Head)/curves.Foot)
					}
					q += float64(n) * float64(qi)
				}
				if rel := math.Abs(q-float64(tr.Up.Flow)) / float64(tr.Up.Flow); rel > 1e-7 {
					t.Errorf("%d → %d: affinity flow at %.2f %% speed is %.3f gpm, stage-up flow %.3f gpm", tr.From, tr.To,
						100*tr.Up.Speed, q/curves.GPM, float64(tr.Up.Flow)/curves.GPM)
				}
				if tr.Up.Limit == LimitCrossover {
					req := p.System.Required(tr.Up.Flow)
					if math.Abs(float64(tr.Up.Head-req)) > 1e-6*float64(req) {
						t.Errorf("%d → %d: header head %.3f ft at the crossover, control curve %.3f ft", tr.From, tr.To,
							float64(tr.Up.Head)/curves.Foot, float64(req)/curves.Foot)
					}
				}
			}
		})
	}
}

// A small pump beside large ones must be evaluated, not assumed good or bad
// (USERS point 8): with a good small pump it leads (runs alone at the
// lowest flows); with a poor one the large pump leads. Which single unit
// should run is decided here at each low flow from single-unit inputs
// computed directly from the curves.
func TestSmallUnitLeadsWhenItShould(t *testing.T) {
	cases := []struct {
		name      string
		small     func(t testing.TB) plant.Model
		wantSmall bool // stage 1 runs the small unit
	}{
		{"good small pump", func(t testing.TB) plant.Model { return testModel(t, "small", 1, 0.4, curves.DOEDrive{}) }, true},
		{"poor small pump", func(t testing.TB) plant.Model { return scaledEffModel(t, "small", 1, 0.4, 0.4) }, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := mixedPlant(t, c.small(t))
			sp, err := DeriveSetpoints(p, SetpointOptions{})
			if err != nil {
				t.Fatal(err)
			}
			seq := NewSequenced("seq", sp, FlowBasis)
			checked := 0
			for gpm := 150.0; gpm <= 600; gpm += 10 {
				q := curves.Flow(gpm * curves.GPM)
				big, small := directEqualSplit(p, p.Models[0], 1, q), directEqualSplit(p, p.Models[1], 1, q)
				if !big.inLimits || !small.inLimits || math.Abs(big.kw-small.kw) < 0.01*big.kw {
					continue // a limit binds or the two are too close to call
				}
				r := seq.Run([]Step{{Load: q, Hours: 1}}).Points[0]
				if r.Running() != 1 {
					continue
				}
				want := []int{1, 0}
				if small.kw < big.kw {
					want = []int{0, 1}
				}
				if !slices.Equal(r.Counts, want) {
					t.Errorf("%.0f gpm: the sequence runs %v, want %v (small %.3f kW, big %.3f kW alone)", gpm, r.Counts, want, small.kw, big.kw)
				}
				checked++
			}
			if checked < 5 {
				t.Fatalf("only %d flows checked", checked)
			}
			want := []int{1, 0}
			if c.wantSmall {
				want = []int{0, 1}
			}
			if got := sp.Stages[0].Counts; !slices.Equal(got, want) {
				t.Errorf("stage 1 runs %v, want %v", got, want)
			}
			// The reasoning: at each power crossover the upper stage is the
			// lowest-input combination with its count of units.
			for _, tr := range sp.Transitions {
				if tr.Up.Limit != LimitCrossover {
					continue
				}
				for _, o := range tr.UpOptions {
					if o.Served && float64(o.Power) < float64(tr.Up.PowerAfter)*(1-1e-6) {
						t.Errorf("%d → %d: %v draws %.3f kW, less than the chosen %v at %.3f kW", tr.From, tr.To,
							o.Counts, float64(o.Power)/1000, tr.Upper, float64(tr.Up.PowerAfter)/1000)
					}
				}
			}
			for _, s := range sp.Stages {
				t.Logf("stage %d %v %.0f–%.0f gpm", s.Number, s.Counts, float64(s.Low)/curves.GPM, float64(s.High)/curves.GPM)
			}
		})
	}
}

// The bands never overlap, each stage-down value lies below its stage-up
// value, the speed margins hold both ways, and every stage serves its range
// inside the unit and plant limits, whatever the deadband.
func TestBandsNeverOverlap(t *testing.T) {
	plants := map[string]func(t testing.TB) *plant.Plant{
		"identical": func(t testing.TB) *plant.Plant { return testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{})) },
		"mixed": func(t testing.TB) *plant.Plant {
			return mixedPlant(t, testModel(t, "small", 1, 0.4, curves.DOEDrive{}))
		},
		"mixed, one across the line": func(t testing.TB) *plant.Plant {
			return mixedPlant(t, testModel(t, "small", 1, 0.4, curves.FixedSpeed{}))
		},
	}
	for name, mk := range plants {
		for _, db := range []float64{0.02, 0.10, 0.25, 0.45} {
			p := mk(t)
			opt := SetpointOptions{Deadband: db}
			sp, err := DeriveSetpoints(p, opt)
			if err != nil {
				t.Fatalf("%s, deadband %.2f: %v", name, db, err)
			}
			margin := sp.Options.SpeedMargin
			for k, tr := range sp.Transitions {
				where := func() string { return fmt.Sprintf("%s, deadband %.2f", name, db) }
				if tr.Down.Flow >= tr.Up.Flow {
					t.Errorf("%s: %d → %d: stage-down %.1f gpm not below stage-up %.1f gpm", where(), tr.From, tr.To,
						float64(tr.Down.Flow)/curves.GPM, float64(tr.Up.Flow)/curves.GPM)
				}
				if k > 0 {
					prev := sp.Transitions[k-1]
					if tr.Up.Flow <= prev.Up.Flow {
						t.Errorf("%s: stage-up values do not rise: %.1f then %.1f gpm", where(), float64(prev.Up.Flow)/curves.GPM, float64(tr.Up.Flow)/curves.GPM)
					}
					if tr.Down.Flow < prev.Up.Flow {
						t.Errorf("%s: band %d ↔ %d [%.1f, %.1f] gpm overlaps band %d ↔ %d ending at %.1f gpm", where(), tr.From, tr.To,
							float64(tr.Down.Flow)/curves.GPM, float64(tr.Up.Flow)/curves.GPM, prev.From, prev.To, float64(prev.Up.Flow)/curves.GPM)
					}
				}
				if p.MinFlow > 0 && tr.Down.Flow <= p.MinFlow {
					t.Errorf("%s: stage-down %.1f gpm at or below the plant minimum flow", where(), float64(tr.Down.Flow)/curves.GPM)
				}
				if !math.IsNaN(tr.Down.Speed) && !math.IsNaN(tr.Up.After) && tr.Down.Speed > tr.Up.After-margin+1e-9 {
					t.Errorf("%s: %d → %d: after stage-up the units run at %.2f %%, stage-down speed %.2f %% (margin %.0f %%)",
						where(), tr.From, tr.To, 100*tr.Up.After, 100*tr.Down.Speed, 100*margin)
				}
				if !math.IsNaN(tr.Down.Speed) && !math.IsNaN(tr.Up.Speed) && tr.Down.SpeedAfter > tr.Up.Speed-margin+1e-9 {
					t.Errorf("%s: %d → %d: after stage-down the units run at %.2f %%, stage-up speed %.2f %%",
						where(), tr.From, tr.To, 100*tr.Down.SpeedAfter, 100*tr.Up.Speed)
				}
			}
			for _, st := range sp.Stages {
				if !st.Served {
					t.Errorf("%s, deadband %.2f: stage %d does not serve its range", name, db, st.Number)
				}
				checkStageLimits(t, sp, st)
			}
		}
	}
}

// checkStageLimits solves a stage at the ends of its range and checks every
// unit against its limits by the affinity laws: speed within the speed
// range, rated-equivalent flow q/s within minimum flow and runout, and the
// pumped flow at or above the plant minimum.
func checkStageLimits(t *testing.T, sp *Setpoints, st Stage) {
	t.Helper()
	p := sp.Plant
	s := New(p, Options{CommonSpeed: true})
	for _, q := range []curves.Flow{st.Low, st.High} {
		r := s.SolveWith(q, Constraint{Counts: st.Counts})
		if r.Status != Served {
			t.Errorf("stage %d unmet at %.1f gpm: %s", st.Number, float64(q)/curves.GPM, r.Reason)
			continue
		}
		if r.PumpedFlow < p.MinFlow*(1-1e-12) {
			t.Errorf("stage %d pumps %.1f gpm, below the plant minimum", st.Number, float64(r.PumpedFlow)/curves.GPM)
		}
		for _, u := range r.Units {
			m := p.Models[u.Model]
			x := float64(u.Flow) / u.Speed
			tol := 1e-7
			if u.Speed < m.MinSpeed-tol || u.Speed > m.MaxSpeed+tol {
				t.Errorf("stage %d at %.1f gpm: %s at %.3f speed outside %.2f–%.2f", st.Number, float64(q)/curves.GPM, m.Name, u.Speed, m.MinSpeed, m.MaxSpeed)
			}
			if x < float64(m.MinFlow)*(1-tol) || x > float64(m.Runout)*(1+tol) {
				t.Errorf("stage %d at %.1f gpm: %s at %.1f gpm rated-equivalent, outside %.1f–%.1f", st.Number, float64(q)/curves.GPM,
					m.Name, x/curves.GPM, float64(m.MinFlow)/curves.GPM, float64(m.Runout)/curves.GPM)
			}
		}
	}
}

// testBins is an invented load profile for tests (not a reference): plant
// flow as a fraction of design flow and hours a year, 8760 h in all.
var testBins = []struct{ frac, hours float64 }{
	{0.15, 500}, {0.2, 700}, {0.3, 1200}, {0.4, 1400}, {0.5, 1400},
	{0.6, 1200}, {0.7, 1000}, {0.8, 700}, {0.9, 500}, {1.0, 160},
}

func binSteps(p *plant.Plant) []Step {
	var out []Step
	for _, b := range testBins {
		out = append(out, Step{Load: p.DesignFlow * curves.Flow(b.frac), Hours: b.hours, MeasuredKW: math.NaN()})
	}
	return out
}

// The price of a programmable sequence: on a bin profile the derived
// sequence's energy is within 2 % of the unconstrained optimum (the bound the
// issue expects; docs/sources.md §10 saw 0.03 % mean, 0.5 % worst for common-speed
// staging of identical units), and never below it (the sequence is one of
// the states the optimum chooses from).
func TestSequenceEnergyNearOptimum(t *testing.T) {
	plants := map[string]*plant.Plant{
		"identical":                  testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{})),
		"mixed":                      mixedPlant(t, testModel(t, "small", 1, 0.4, curves.DOEDrive{})),
		"mixed, one across the line": mixedPlant(t, testModel(t, "small", 1, 0.4, curves.FixedSpeed{})),
	}
	for name, p := range plants {
		t.Run(name, func(t *testing.T) {
			sp, err := DeriveSetpoints(p, SetpointOptions{})
			if err != nil {
				t.Fatal(err)
			}
			steps := binSteps(p)
			for _, b := range []Basis{FlowBasis, SpeedBasis} {
				pr := PriceSequence(sp, steps, b)
				if pr.Optimum.HoursUnmet != pr.Sequence.HoursUnmet {
					t.Fatalf("%v: unmet hours differ: optimum %.0f h, sequence %.0f h", b, pr.Optimum.HoursUnmet, pr.Sequence.HoursUnmet)
				}
				if pr.ExtraPct > 2 {
					t.Errorf("%v: sequence %.0f kWh is %.2f %% above the optimum %.0f kWh (bound 2 %%)", b, pr.Sequence.KWh, pr.ExtraPct, pr.Optimum.KWh)
				}
				if pr.ExtraPct < -1e-6 {
					t.Errorf("%v: sequence %.0f kWh below the optimum %.0f kWh", b, pr.Sequence.KWh, pr.Optimum.KWh)
				}
				t.Logf("%v: optimum %.0f kWh, sequence %.0f kWh (+%.3f %%)", b, pr.Optimum.KWh, pr.Sequence.KWh, pr.ExtraPct)
			}
		})
	}
}

// minuteTrend builds a time-ordered trend of one-minute steps from flows
// given as fractions of a reference flow, each held for some minutes.
func minuteTrend(ref curves.Flow, spans ...[2]float64) []Step {
	t0 := time.Date(2026, 7, 1, 8, 0, 0, 0, time.UTC)
	var out []Step
	for _, sp := range spans {
		for i := 0; i < int(sp[1]); i++ {
			out = append(out, Step{Time: t0.Add(time.Duration(len(out)) * time.Minute), Load: ref * curves.Flow(sp[0]),
				Hours: 1.0 / 60, MeasuredKW: math.NaN()})
		}
	}
	return out
}

// The timers and the deadband: a condition must hold for its delay (5 min
// up, 10 min down by default, docs/sources.md §7 common practice), and a flow that
// dithers across the stage-up value inside the deadband stages up once and
// stays (no hunting).
func TestSequenceTimersAndDeadband(t *testing.T) {
	p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	tr := sp.Transitions[0]
	up := tr.Up.Flow
	if tr.Down.Flow > up*0.91 {
		t.Fatalf("premise: stage-down %.1f gpm should be at least the 10 %% deadband below %.1f gpm", float64(tr.Down.Flow)/curves.GPM, float64(up)/curves.GPM)
	}
	var dither [][2]float64
	dither = append(dither, [2]float64{0.95, 20})
	for i := 0; i < 36; i++ {
		dither = append(dither, [2]float64{1.02 - 0.04*float64(i%2), 10})
	}
	cases := []struct {
		name        string
		steps       []Step
		basis       Basis
		changes     int
		firstTwoIdx int // index of the first step with two units running; -1 = none
	}{
		{"spike shorter than the stage-up delay", minuteTrend(up, [2]float64{0.95, 30}, [2]float64{1.05, 4}, [2]float64{0.95, 30}), FlowBasis, 0, -1},
		// From minute 30 the flow is above; after the step ending at minute
		// 35 the 5 min delay has run: step 35 runs two units.
		{"sustained rise", minuteTrend(up, [2]float64{0.95, 30}, [2]float64{1.05, 30}), FlowBasis, 1, 35},
		{"dither inside the deadband, flow", minuteTrend(up, dither...), FlowBasis, 1, 25},
		{"dither inside the deadband, speed", minuteTrend(up, dither...), SpeedBasis, 1, 25},
		// Two units from the start (above stage-up), then 9 min below the
		// stage-down value: no change; then 11 min: one stage-down.
		{"dip shorter than the stage-down delay", minuteTrend(up, [2]float64{1.1, 20}, [2]float64{0.8, 9}, [2]float64{1.0, 20}), FlowBasis, 0, 0},
		{"dip longer than the stage-down delay", minuteTrend(up, [2]float64{1.1, 20}, [2]float64{0.8, 11}, [2]float64{1.0, 2}), FlowBasis, 1, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			run, cy := NewSequenced("seq", sp, c.basis).RunCycling(c.steps)
			if run.Changes != c.changes || cy.Changes != c.changes {
				t.Errorf("%d stage changes (cycling %d), want %d", run.Changes, cy.Changes, c.changes)
			}
			first := -1
			for i, r := range run.Points {
				if r.Running() == 2 {
					first = i
					break
				}
			}
			if first != c.firstTwoIdx {
				t.Errorf("first step with two units %d, want %d", first, c.firstTwoIdx)
			}
		})
	}
}

// On a day-long trend the derived sequence stays within 2 % of the optimum
// and changes stage far less often than the optimum does.
func TestSequenceOnTrend(t *testing.T) {
	p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	// Invented test trend: a daily swing between 20 % and 90 % of design
	// flow with a deterministic ripple of ±4 %, 5-minute steps, 7 days.
	t0 := time.Date(2026, 7, 1, 0, 0, 0, 0, time.UTC)
	var steps []Step
	for i := 0; i < 7*24*12; i++ {
		h := float64(i) / 12
		frac := 0.55 - 0.35*math.Cos(2*math.Pi*h/24) + 0.04*math.Sin(2*math.Pi*h*1.7)
		steps = append(steps, Step{Time: t0.Add(time.Duration(i) * 5 * time.Minute), Load: p.DesignFlow * curves.Flow(frac),
			Hours: 5.0 / 60, MeasuredKW: math.NaN()})
	}
	pr := PriceSequence(sp, steps, FlowBasis)
	if pr.ExtraPct > 2 || pr.ExtraPct < -1e-6 {
		t.Errorf("sequence %.3f %% above the optimum, want 0–2 %%", pr.ExtraPct)
	}
	if pr.Cycling.Changes >= pr.OptimumChanges {
		t.Errorf("sequence changes stage %d times, the optimum %d: the deadband should cut cycling", pr.Cycling.Changes, pr.OptimumChanges)
	}
	if math.Abs(pr.Cycling.Days-7) > 1e-9 {
		t.Errorf("trend spans %.3f days, want 7", pr.Cycling.Days)
	}
	starts := pr.Cycling.Models[0]
	if starts.Starts*2 != pr.Cycling.Changes {
		// Every change on this trend is one start (up) or one stop (down),
		// and the week starts and ends in the same stage.
		t.Logf("starts %d, changes %d", starts.Starts, pr.Cycling.Changes)
	}
	t.Logf("optimum %.0f kWh %d changes; sequence %.0f kWh (+%.3f %%), %d changes (%.1f/day, at most %d in an hour; %s allowed %.1f starts/h from memory)",
		pr.Optimum.KWh, pr.OptimumChanges, pr.Sequence.KWh, pr.ExtraPct, pr.Cycling.Changes, pr.Cycling.PerDay, pr.Cycling.MaxPerHour, starts.Name, starts.Allowed)
}

// With its largest unit out, an identical three-unit plant runs two units;
// at the most they deliver they run at maximum speed on the control curve:
// 2q with H(q, 1) = H_sys(2q), solved here directly by bisection.
func TestOneOutResponse(t *testing.T) {
	p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	m := p.Models[0]
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	q := bisectRoot(func(q float64) float64 {
		return float64(m.Pump.Head(curves.Flow(q), 1) - p.System.Required(curves.Flow(2*q)))
	}, float64(p.DesignFlow)/4, float64(p.DesignFlow))
	if x := curves.Flow(q); x > m.Runout || float64(m.Pump.ShaftPower(x, 1, p.Fluid.Density)) > float64(m.Motor.Rated)*m.Motor.SF() {
		t.Fatal("premise: maximum speed should be the binding limit")
	}
	if sp.OneOut == nil {
		t.Fatal("no one-unit-out response")
	}
	if rel := math.Abs(float64(sp.OneOut.MaxFlow)-2*q) / (2 * q); rel > 1e-5 {
		t.Errorf("one out: %.2f gpm, direct %.2f gpm", float64(sp.OneOut.MaxFlow)/curves.GPM, 2*q/curves.GPM)
	}
	if sp.OneOut.ServesDesign != (2*q >= float64(p.DesignFlow)) {
		t.Errorf("serves design %v with %.0f gpm against %.0f gpm design", sp.OneOut.ServesDesign, 2*q/curves.GPM, float64(p.DesignFlow)/curves.GPM)
	}
}

// The sequence text carries every stage value, the failure response and the
// cautions (docs/sources.md §9), in lines short enough to paste.
func TestSequenceOfOperationText(t *testing.T) {
	p := mixedPlant(t, testModel(t, "small", 1, 0.4, curves.DOEDrive{}))
	p.Units = curves.US
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	text := sp.SequenceOfOperation()
	for _, tr := range sp.Transitions {
		// Flows are written at the sequence's resolution (1 % of design
		// flow or finer), with thousands separators.
		for _, q := range []curves.Flow{tr.Up.Flow, tr.Down.Flow} {
			v := sp.FlowSetpoint(q)
			if math.Abs(v-p.Units.FlowOut(q)) > sp.Resolution()/2+1e-9 {
				t.Errorf("setpoint %v gpm is more than half a step from %v gpm", v, p.Units.FlowOut(q))
			}
			if s := thousands(v, 0) + " gpm"; !strings.Contains(strings.ReplaceAll(text, "\n", " "), s) {
				t.Errorf("text lacks %s", s)
			}
		}
	}
	for _, w := range []string{"manufacturer", "verify", "commissioning", "licensed engineer", "Failure response", "Lead/lag", "minimum flow"} {
		if !strings.Contains(strings.ReplaceAll(text, "\n", " "), w) {
			t.Errorf("text lacks %q", w)
		}
	}
	for i, line := range strings.Split(text, "\n") {
		if utf8.RuneCountInString(line) > 78 {
			t.Errorf("line %d is %d characters: %q", i+1, utf8.RuneCountInString(line), line)
		}
		if strings.Contains(line, "NaN") {
			t.Errorf("line %d shows NaN: %q", i+1, line)
		}
		if strings.HasPrefix(line, "% ") || strings.HasPrefix(line, "gpm") {
			t.Errorf("line %d starts with a unit cut from its number: %q", i+1, line)
		}
	}
	var b strings.Builder
	if err := sp.WriteTable(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "flow (gpm)") || strings.Contains(b.String(), "NaN") {
		t.Errorf("table:\n%s", b.String())
	}
	t.Logf("\n%s\n%s", b.String(), text)
}

// The setpoints encode as JSON, speeds that do not exist as null (NaN has
// no JSON form, RFC 8259 §6).
func TestSetpointsJSON(t *testing.T) {
	p := FixedVariant(testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{})))
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	data, err := json.Marshal(sp)
	if err != nil {
		t.Fatal(err)
	}
	var back struct {
		Transitions []struct {
			Up struct {
				Flow     float64
				Speed    *float64
				DelayMin float64
				Limit    string
			}
		}
	}
	if err := json.Unmarshal(data, &back); err != nil {
		t.Fatal(err)
	}
	if len(back.Transitions) != len(sp.Transitions) {
		t.Fatalf("%d transitions in JSON, want %d", len(back.Transitions), len(sp.Transitions))
	}
	for i, tr := range back.Transitions {
		want := sp.Transitions[i].Up
		if tr.Up.Speed != nil || tr.Up.Flow != float64(want.Flow) || tr.Up.DelayMin != want.Delay.Minutes() || tr.Up.Limit != string(want.Limit) {
			t.Errorf("transition %d: JSON %+v, want flow %g, no speed, delay %g min, limit %q", i, tr.Up, float64(want.Flow), want.Delay.Minutes(), want.Limit)
		}
	}
}

func TestDeriveSetpointsErrors(t *testing.T) {
	good := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	noFlow := *good
	noFlow.DesignFlow = 0
	cases := []struct {
		name string
		p    *plant.Plant
		opt  SetpointOptions
	}{
		{"nil plant", nil, SetpointOptions{}},
		{"no design flow", &noFlow, SetpointOptions{}},
		{"negative deadband", good, SetpointOptions{Deadband: -0.1}},
		{"deadband of half the flow", good, SetpointOptions{Deadband: 0.5}},
		{"negative delay", good, SetpointOptions{UpDelay: -time.Minute}},
		{"coarse scan", good, SetpointOptions{Points: 3}},
	}
	for _, c := range cases {
		if _, err := DeriveSetpoints(c.p, c.opt); !errors.Is(err, ErrSetpoints) {
			t.Errorf("%s: error %v, want ErrSetpoints", c.name, err)
		}
	}
	sp, err := DeriveSetpoints(good, SetpointOptions{Deadband: 0.2, UpDelay: 3 * time.Minute})
	if err != nil {
		t.Fatal(err)
	}
	if sp.Options.Deadband != 0.2 || sp.Options.UpDelay != 3*time.Minute || sp.Options.DownDelay != DefaultSetpointOptions.DownDelay {
		t.Errorf("options %+v: overrides not kept or defaults not filled", sp.Options)
	}
	if sp.Transitions[0].Up.Delay != 3*time.Minute {
		t.Errorf("stage-up delay %v, want the 3 min override", sp.Transitions[0].Up.Delay)
	}
}

func BenchmarkDeriveSetpoints(b *testing.B) {
	p := mixedPlant(b, testModel(b, "small", 1, 0.4, curves.DOEDrive{}))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := DeriveSetpoints(p, SetpointOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
