package optimize

import (
	"fmt"
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/plant"
)

// testPump is an invented datasheet: a 1000 gpm, 90 ft chilled-water pump.
func testPump(t testing.TB, scale float64) *curves.Pump {
	t.Helper()
	g := curves.GPM * scale
	ft := curves.Foot
	pts := []curves.PumpPoint{
		{Flow: 0, Head: curves.Head(115 * ft)},
		{Flow: curves.Flow(400 * g), Head: curves.Head(110 * ft), Eff: 0.55},
		{Flow: curves.Flow(800 * g), Head: curves.Head(98 * ft), Eff: 0.78},
		{Flow: curves.Flow(1100 * g), Head: curves.Head(84 * ft), Eff: 0.82},
		{Flow: curves.Flow(1400 * g), Head: curves.Head(62 * ft), Eff: 0.74},
	}
	p, err := curves.NewPump(pts, curves.PumpOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func testModel(t testing.TB, name string, count int, scale float64, drive curves.Drive) plant.Model {
	return plant.Model{
		Name: name, Count: count, RatedSpeed: 1780, Pump: testPump(t, scale),
		MinSpeed: 0.3, MaxSpeed: 1.0,
		MinFlow: curves.Flow(250 * curves.GPM * scale), Runout: curves.Flow(1500 * curves.GPM * scale),
		Motor: curves.Motor{Rated: curves.Power(30 * scale * curves.Horsepower), FullLoadEff: 0.936},
		Drive: drive,
	}
}

func testPlant(t testing.TB, models ...plant.Model) *plant.Plant {
	return &plant.Plant{
		Name: "test", Fluid: curves.Fluid{Density: 999.7}, Models: models,
		System: curves.DPControl{DesignFlow: curves.Flow(2700 * curves.GPM), DesignHead: curves.Head(88 * curves.Foot),
			ControlHead: curves.Head(30 * curves.Foot)},
		DesignFlow: curves.Flow(2700 * curves.GPM), DesignHead: curves.Head(88 * curves.Foot),
		MinFlow: curves.Flow(500 * curves.GPM),
	}
}

func TestSolveInvariants(t *testing.T) {
	for _, tc := range []struct {
		name string
		p    *plant.Plant
	}{
		{"two variable models", testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}), testModel(t, "small", 1, 0.4, curves.DOEDrive{}))},
		// A fixed unit beside two variable models: the allocation among the
		// variable ones must leave the fixed unit's curve flow alone (a bug
		// once zeroed it).
		{"fixed beside two variable models", testPlant(t, testModel(t, "big", 2, 1, curves.DOEDrive{}),
			testModel(t, "big fixed", 1, 1, curves.FixedSpeed{}), testModel(t, "small", 1, 0.4, curves.DOEDrive{}))},
	} {
		t.Run(tc.name, func(t *testing.T) { checkInvariants(t, tc.p) })
	}
}

func checkInvariants(t *testing.T, p *plant.Plant) {
	s := New(p, Options{})
	for gpm := 0.0; gpm <= 4000; gpm += 100 {
		r := s.Solve(curves.Flow(gpm * curves.GPM))
		if r.Status != Served {
			t.Logf("%6.0f gpm: %v %s", gpm, r.Status, r.Reason)
			continue
		}
		sum := 0.0
		for _, u := range r.Units {
			sum += float64(u.Flow)
			h := p.Models[u.Model].Pump.Head(u.Flow, u.Speed)
			if math.Abs(float64(h-u.Head)) > 1e-6 {
				t.Errorf("%v gpm: unit head %v, curve gives %v", gpm, u.Head, h)
			}
		}
		for _, u := range r.Units {
			if u.Flow <= 0 {
				t.Errorf("%v gpm: a running %s unit has no flow", gpm, p.Models[u.Model].Name)
			}
		}
		if math.Abs(sum-float64(r.PumpedFlow)) > 1e-9*float64(r.PumpedFlow) {
			t.Errorf("%v gpm: flows sum to %v, want %v", gpm, sum, r.PumpedFlow)
		}
		if r.Power < r.Hydraulic {
			t.Errorf("%v gpm: electrical %v below hydraulic %v", gpm, r.Power, r.Hydraulic)
		}
		_ = speeds
		if testing.Verbose() {
			t.Logf("%6.0f gpm: counts %v H %.1f ft (req %.1f) %.2f kW limit %q speeds %.3f", gpm, r.Counts,
				float64(r.HeaderHead)/curves.Foot, float64(r.RequiredHead)/curves.Foot, float64(r.Power)/1000, r.Limit, speeds(r))
		}
	}
}

func speeds(r Result) []float64 {
	var v []float64
	for _, u := range r.Units {
		v = append(v, math.Round(u.Speed*1000)/1000)
	}
	return v
}

// TestTwelveUnitsSixModels: the solver handles the largest group the brief
// asks for — 12 installed units in 6 models of different sizes, some fixed
// speed — and every served result keeps the invariants (flows sum, heads
// match, input above hydraulic power). Invented plant.
func TestTwelveUnitsSixModels(t *testing.T) {
	var ms []plant.Model
	for i, scale := range []float64{1, 0.9, 0.75, 0.6, 0.5, 0.4} {
		var d curves.Drive = curves.DOEDrive{}
		if i == 2 || i == 5 {
			d = curves.FixedSpeed{}
		}
		ms = append(ms, testModel(t, fmt.Sprintf("m%d", i+1), 2, scale, d))
	}
	p := testPlant(t, ms...)
	p.DesignFlow = curves.Flow(7000 * curves.GPM)
	p.System = curves.DPControl{DesignFlow: p.DesignFlow, DesignHead: curves.Head(88 * curves.Foot), ControlHead: curves.Head(30 * curves.Foot)}
	s := New(p, Options{})
	if got, want := len(s.combos), 3*3*3*3*3*3-1; got != want {
		t.Fatalf("%d combinations of running counts, want %d", got, want)
	}
	served := 0
	for gpm := 500.0; gpm <= 8000; gpm += 500 {
		r := s.Solve(curves.Flow(gpm * curves.GPM))
		if r.Status != Served {
			continue
		}
		served++
		sum := 0.0
		for _, u := range r.Units {
			sum += float64(u.Flow)
			if h := p.Models[u.Model].Pump.Head(u.Flow, u.Speed); math.Abs(float64(h-u.Head)) > 1e-6 {
				t.Errorf("%v gpm: unit head %v, curve gives %v", gpm, u.Head, h)
			}
		}
		if math.Abs(sum-float64(r.PumpedFlow)) > 1e-9*float64(r.PumpedFlow) || r.Power < r.Hydraulic {
			t.Errorf("%v gpm: flows %v of %v, power %v vs hydraulic %v", gpm, sum, r.PumpedFlow, r.Power, r.Hydraulic)
		}
	}
	if served < 10 {
		t.Errorf("only %d of 16 flows served", served)
	}
}
