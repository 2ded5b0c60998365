package study_test

import (
	"math"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/study"
)

// TestNPSHCondenserWaterHandChecked sets one operating point of the
// condenser-water example against its suction and checks NPSHa and NPSHr
// by hand. The plant's numbers are the example's (invented); the formulas
// and constants are published:
//
//	atmosphere at 15 m, ISO 2533 barometric formula:
//	  101325 × (1 − 0.0065 × 15 / 288.15)^5.25588 = 101144.93 Pa
//	vapour pressure of water at 29 °C, IAPWS-IF97 eq. 30: 4008.92 Pa
//	density at 29 °C, Kell (1975): 995.9448 kg/m³
//	NPSHa = (101144.93 − 4008.92) / (995.9448 × 9.80665)
//	        + 1.5 (basin above the eye) − 1.8 × (1100/1100)² (suction loss)
//	      = 9.94545 + 1.5 − 1.8 = 9.64545 m
//	CWP-S at 95 % speed and 220 m³/h: at rated speed 220/0.95 = 231.579 m³/h,
//	between the NPSHr points 180 m³/h (3.9 m) and 250 m³/h (5.0 m):
//	  NPSHr₀ = 3.9 + (231.579 − 180)/70 × 1.1 = 4.71053 m
//	  NPSHr  = 0.95² × 4.71053 = 4.25125 m (affinity laws, common practice)
//	NPSHa/NPSHr = 9.64545 / 4.25125 = 2.26885
func TestNPSHCondenserWaterHandChecked(t *testing.T) {
	p := examplePlant(t, "condenser-water.yaml")
	const cwpS = 1
	res := optimize.Result{Status: optimize.Served, PumpedFlow: 1100 * curves.M3PerH,
		Units: []optimize.Unit{{Model: cwpS, Speed: 0.95, Flow: 220 * curves.M3PerH}}}
	got := study.NPSHAt(p, p.Models, res)
	if len(got) != 1 {
		t.Fatalf("NPSHAt gave %d units, want 1", len(got))
	}
	u := got[0]
	for _, c := range []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"NPSHa (m)", float64(u.Available), 9.64545, 5e-5},
		{"NPSHr (m)", float64(u.Required), 4.25125, 5e-6},
		{"NPSHa/NPSHr", u.Ratio, 2.26885, 5e-5},
	} {
		if math.Abs(c.got-c.want) > c.tol {
			t.Errorf("%s = %.6f, want %.5f ± %g", c.name, c.got, c.want, c.tol)
		}
	}
	if u.Short || u.Extrapolated {
		t.Errorf("short %v, extrapolated %v; want neither (2.27 ≥ the default margin 1.3, and 231.6 m³/h is inside the points)", u.Short, u.Extrapolated)
	}
	r := runPlant(t, p, study.Options{})
	if c := r.NPSH; !c.Made || math.Abs(float64(c.DesignAvailable)-9.64545) > 5e-5 {
		t.Errorf("plan NPSH check made %v, NPSHa at design %.5f m; want made, 9.64545 m", c.Made, c.DesignAvailable)
	}
}

// TestNPSHShortPointsAreReported lowers the condenser-water example's basin
// to a 4 m suction lift: NPSHa at design becomes 9.94545 − 4 − 1.8 =
// 4.14545 m (the hand check above), below 1.3 × the CWP-S NPSHr near
// design, so the check must list points, each consistent with the formula.
func TestNPSHShortPointsAreReported(t *testing.T) {
	p := examplePlant(t, "condenser-water.yaml")
	p.Suction.StaticHead = -4
	r := runPlant(t, p, study.Options{})
	c := r.NPSH
	if !c.Made || len(c.Short) == 0 {
		t.Fatalf("made %v with %d short points; want short points at a 4 m lift", c.Made, len(c.Short))
	}
	lo := c.Strategies[0]
	if lo.Key != study.KeyLowest || lo.Short <= 0 || lo.Short > lo.UnitHours {
		t.Errorf("lowest-power staging: %+v; want short unit-hours within those checked", lo)
	}
	hours := 0.0
	for i, sp := range c.Short {
		if sp.Ratio >= c.Margin {
			t.Errorf("point %d ratio %.3f is not below the margin %.2f", i, sp.Ratio, c.Margin)
		}
		if i > 0 && sp.Ratio < c.Short[i-1].Ratio {
			t.Errorf("points not worst first at %d", i)
		}
		// NPSHa recomputed from the loader's numbers at the step's pumped
		// flow (no bypass at these flows: load = pumped).
		q := float64(sp.Flow) / float64(p.DesignFlow)
		want := (p.Suction.Pressure-p.Suction.VapourPressure)/(p.Fluid.Density*curves.Gravity) - 4 - 1.8*q*q
		if math.Abs(float64(sp.Available)-want) > 1e-9 {
			t.Errorf("point %d NPSHa %.6f m, want %.6f", i, sp.Available, want)
		}
		if r := float64(sp.Available / sp.Required); math.Abs(r-sp.Ratio) > 1e-12 {
			t.Errorf("point %d ratio %.6f is not NPSHa/NPSHr %.6f", i, sp.Ratio, r)
		}
		hours += sp.Hours
	}
	// Each short point counts its step's hours once; a step may have short
	// units of two models, so the points' hours bound the short unit-hours.
	if hours > lo.Short+1e-9 {
		t.Errorf("points' hours %.1f exceed the short unit-hours %.1f", hours, lo.Short)
	}
	found := false
	for _, w := range r.Warnings {
		found = found || strings.Contains(w.Message, "lowest-power staging runs units with NPSH available below 1.3 × NPSHr")
	}
	if !found {
		t.Errorf("no study warning of the shortfall in %v", r.Warnings)
	}
}

// TestNPSHNotMadeWithoutData: the chilled-water example gives no suction
// conditions and no NPSHr points, so the check says it was not made.
func TestNPSHNotMadeWithoutData(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water.yaml"), study.Options{})
	if c := r.NPSH; c == nil || c.Made || !strings.Contains(c.Note, "neither the suction conditions") {
		t.Errorf("NPSH check %+v; want not made, saying the data is missing", c)
	}
	j := r.Document().Checks.NPSH
	if j.Made || j.MarginRatio != nil || j.Note == "" {
		t.Errorf("JSON checks.npsh %+v; want made false, null margin, a note", j)
	}
}

// BenchmarkNPSHAt measures setting one three-unit state against the
// suction, the inner step of the NPSH check (run once per unit-step of
// every strategy).
func BenchmarkNPSHAt(b *testing.B) {
	p := examplePlant(b, "condenser-water.yaml")
	res := optimize.Result{Status: optimize.Served, PumpedFlow: 1100 * curves.M3PerH, Units: []optimize.Unit{
		{Model: 0, Speed: 0.974, Flow: 437 * curves.M3PerH}, {Model: 0, Speed: 0.974, Flow: 437 * curves.M3PerH},
		{Model: 1, Speed: 0.977, Flow: 226 * curves.M3PerH}}}
	b.ReportAllocs()
	for b.Loop() {
		study.NPSHAt(p, p.Models, res)
	}
}
