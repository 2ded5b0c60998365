package curves

import (
	"fmt"
	"math"
	"testing"
)

// TestDPControlCurve: H(Q) = H_ctl + (H_design − H_ctl)(Q/Q_design)²
// (docs/sources.md §6) [D], with and without a linear setpoint reset.
func TestDPControlCurve(t *testing.T) {
	const qd, hd, hc = 0.12, 36.0, 12.0 // m³/s, m, m: test inputs
	plain := DPControl{DesignFlow: qd, DesignHead: hd, ControlHead: hc}
	reset := DPControl{DesignFlow: qd, DesignHead: hd, ControlHead: hc,
		Reset: &Reset{LowFlow: 0.03, LowHead: 6, HighFlow: 0.09}}
	friction := func(q float64) float64 { return (hd - hc) * (q / qd) * (q / qd) }
	cases := []struct {
		name string
		sys  DPControl
		q    float64
		want float64
	}{
		{"design point", plain, qd, hd},
		{"zero flow: control head", plain, 0, hc},
		{"half flow", plain, qd / 2, hc + (hd-hc)/4},
		{"above design flow", plain, 1.2 * qd, hc + (hd-hc)*1.44},
		{"reset: design point", reset, qd, hd},
		{"reset: at high end", reset, 0.09, hc + friction(0.09)},
		{"reset: at low end", reset, 0.03, 6 + friction(0.03)},
		{"reset: below low end", reset, 0.01, 6 + friction(0.01)},
		{"reset: midway", reset, 0.06, 9 + friction(0.06)},
		{"reset: a quarter of the way", reset, 0.045, 7.5 + friction(0.045)},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := float64(c.sys.Required(Flow(c.q))); math.Abs(got-c.want) > 1e-12 {
				t.Errorf("Required(%g) = %.12g m, want %.12g m", c.q, got, c.want)
			}
		})
	}
	// Linear in between: the control head at evenly spaced flows inside the
	// reset band has constant first differences.
	var prev, step float64
	for i := 0; i <= 10; i++ {
		q := 0.03 + 0.006*float64(i)
		c := float64(reset.ControlAt(Flow(q)))
		if i == 1 {
			step = c - prev
		}
		if i > 1 && math.Abs((c-prev)-step) > 1e-12 {
			t.Errorf("control head not linear at %g m³/s: step %.12g, first step %.12g", q, c-prev, step)
		}
		prev = c
	}
}

func TestFixedCurve(t *testing.T) {
	const qd, hd, hs = 0.2, 28.0, 10.0 // test inputs
	f := FixedCurve{DesignFlow: qd, DesignHead: hd, Static: hs}
	cases := []struct {
		name string
		q    float64
		want float64
	}{
		{"through the design point", qd, hd},
		{"static head at zero flow", 0, hs},
		// [D] k = (28 − 10)/0.2² = 450 s²/m⁵: H(0.1) = 10 + 450·0.01 = 14.5 m.
		{"half flow", 0.1, 14.5},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := float64(f.Required(Flow(c.q))); math.Abs(got-c.want) > 1e-12 {
				t.Errorf("Required(%g) = %.12g, want %g", c.q, got, c.want)
			}
		})
	}
}

// TestDOEReferenceCurve: the DOE pump energy index reference system curve
// H = 0.8 (Q/Q₁₀₀)² H₁₀₀ + 0.2 H₁₀₀ [C] is a DP control curve with control
// head 0.2 H₁₀₀ (and a fixed curve with static 0.2 H₁₀₀). At constant
// efficiency the power fractions at 25/50/75 % flow are 0.0625, 0.2,
// 0.4875 [D, docs/sources.md §8]; times the DOE worked case's BEP shaft input
// 52.07233 hp they are its reference-curve shaft inputs 3.25452, 10.41447,
// 25.38526 hp [C, docs/sources.md §5].
func TestDOEReferenceCurve(t *testing.T) {
	const q100, h100, eta = 0.05, 40.0, 0.78 // test inputs; the fractions do not depend on them
	systems := []System{
		DPControl{DesignFlow: q100, DesignHead: h100, ControlHead: 0.2 * h100},
		FixedCurve{DesignFlow: q100, DesignHead: h100, Static: 0.2 * h100},
	}
	cases := []struct {
		f, frac, shaftHP float64
	}{
		{0.25, 0.0625, 3.25452},
		{0.50, 0.2, 10.41447},
		{0.75, 0.4875, 25.38526},
		{1.00, 1, 52.07233},
	}
	for _, sys := range systems {
		pd := float64(HydraulicPower(998.2, q100, sys.Required(q100))) / eta
		for _, c := range cases {
			t.Run(fmt.Sprintf("%s/%.0f%%", sys.Describe(), 100*c.f), func(t *testing.T) {
				q := Flow(c.f * q100)
				got := float64(HydraulicPower(998.2, q, sys.Required(q))) / eta / pd
				if math.Abs(got-c.frac) > 1e-12 {
					t.Errorf("power fraction %.12g, want %g", got, c.frac)
				}
				// The DOE worked case's shaft inputs to their five decimals.
				if hp := got * 52.07233; math.Abs(hp-c.shaftHP) > 5e-6 {
					t.Errorf("shaft %.6f hp, DOE worked case %.5f hp", hp, c.shaftHP)
				}
			})
		}
	}
}

// TestPumpOnDOEReferenceCurve runs a fitted pump along the reference curve
// through its BEP (DP control, control head 0.2 H_BEP). The speed solve and
// the affinity laws must give power fractions above the constant-efficiency
// 0.0625/0.2/0.4875, since with a static-like term the pump moves left of
// BEP as speed falls [D]; and the power fraction recomputed from the
// reported speed, head and efficiency must agree.
func TestPumpOnDOEReferenceCurve(t *testing.T) {
	p := mustPump(t, quadHead, PumpOptions{})
	sys := DPControl{DesignFlow: p.BEPFlow, DesignHead: p.BEPHead, ControlHead: 0.2 * p.BEPHead}
	const rho = 998.2
	pd := float64(p.ShaftPower(p.BEPFlow, 1, rho))
	for _, c := range []struct{ f, frac float64 }{{0.25, 0.0625}, {0.5, 0.2}, {0.75, 0.4875}} {
		q := Flow(c.f) * p.BEPFlow
		h := sys.Required(q)
		s, ok := p.SpeedFor(q, h)
		if !ok {
			t.Fatalf("f=%g: no speed", c.f)
		}
		shaft := float64(p.ShaftPower(q, s, rho))
		if recomputed := rho * Gravity * float64(q) * float64(p.Head(q, s)) / p.Eff(q, s); relErr(shaft, recomputed) > 1e-12 {
			t.Errorf("f=%g: shaft %.9g W, ρgQH/η %.9g W", c.f, shaft, recomputed)
		}
		if got := shaft / pd; got <= c.frac {
			t.Errorf("f=%g: power fraction %.5f not above the constant-efficiency %g", c.f, got, c.frac)
		}
	}
}
