package curves

import (
	"math"
	"testing"
)

// Exact definitions of NIST SP 811 Appendix B from which the derived units
// are rebuilt independently of the constants in units.go [V].
const (
	inch   = 0.0254     // m, exact [V] NIST SP 811
	pound  = 0.45359237 // kg (avoirdupois), exact [V] NIST SP 811
	lbf    = pound * Gravity
	ftLbfS = 0.3048 * lbf // W per ft·lbf/s
)

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func TestConversionConstants(t *testing.T) {
	cases := []struct {
		name string
		got  float64
		want float64
		tol  float64 // relative
	}{
		// [V] NIST SP 811 App. B: US gallon = 231 in³ = 3.785 411 784 E-03 m³ (exact).
		{"gallon value", Gallon, 3.785411784e-3, 1e-15},
		// [D] rebuilt from the exact inch: 231 × 0.0254³.
		{"gallon is 231 cubic inches", Gallon, 231 * inch * inch * inch, 1e-15},
		// [V] NIST SP 811: foot = 0.3048 m (exact).
		{"foot value", Foot, 0.3048, 0},
		// [D] 12 exact inches.
		{"foot is 12 inches", Foot, 12 * inch, 1e-15},
		// [V] NIST SP 811 App. B: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W.
		{"horsepower to NIST digits", Horsepower, 745.6999, 1e-7},
		// [D] 550 ft·lbf/s from the exact foot, pound and standard gravity.
		{"horsepower is 550 ft·lbf/s", Horsepower, 550 * ftLbfS, 1e-11},
		// [V] NIST SP 811 App. B: psi = 6.894 757 E+03 Pa.
		{"psi to NIST digits", PSI, 6894.757, 1e-7},
		// [D] lbf per square inch from the exact definitions.
		{"psi is lbf per square inch", PSI, lbf / (inch * inch), 1e-10},
		// [V] CGPM 1901 / NIST: standard gravity 9.806 65 m/s² (exact).
		{"standard gravity", Gravity, 9.80665, 0},
		// [D] 1 gpm = 3.785411784e-3 m³ / 60 s.
		{"gpm", GPM, 3.785411784e-3 / 60, 1e-15},
		// [P] 8760 h in a non-leap year (365 × 24).
		{"hours per year", HoursPY, 365 * 24, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if e := relErr(c.got, c.want); e > c.tol {
				t.Errorf("got %.12g, want %.12g (relative error %.3g > %.3g)", c.got, c.want, e, c.tol)
			}
		})
	}
}

func TestUnitSystemRoundTrip(t *testing.T) {
	const tol = 1e-13 // relative; a round trip loses only a few ulps
	values := []float64{0.5, 1, 37.25, 1200, 98765.4321}
	for _, u := range []UnitSystem{SI, US} {
		for _, v := range values {
			checks := []struct {
				name string
				back float64
			}{
				{"flow", u.FlowOut(u.FlowIn(v))},
				{"head", u.HeadOut(u.HeadIn(v))},
				{"rating", u.RatingOut(u.RatingIn(v))},
				{"temperature", u.TempOut(u.TempIn(v))},
			}
			for _, c := range checks {
				t.Run(u.String()+"/"+c.name, func(t *testing.T) {
					if e := relErr(c.back, v); e > tol {
						t.Errorf("%g → %g (relative error %.3g)", v, c.back, e)
					}
				})
			}
		}
	}
}

func TestUnitSystemIn(t *testing.T) {
	cases := []struct {
		name string
		got  float64
		want float64 // SI value
		tol  float64 // relative
	}{
		// [D] from NIST SP 811 gallon: 1000 gpm = 1000 × 3.785411784e-3 / 60 m³/s.
		{"US flow 1000 gpm", float64(US.FlowIn(1000)), 0.0630901964, 1e-12},
		// [D] 1 m³/h = 1/3600 m³/s.
		{"SI flow 36 m³/h", float64(SI.FlowIn(36)), 0.01, 1e-14},
		// [D] 100 ft × 0.3048 m exact.
		{"US head 100 ft", float64(US.HeadIn(100)), 30.48, 1e-14},
		{"SI head 12.5 m", float64(SI.HeadIn(12.5)), 12.5, 0},
		// [D] 10 hp × 745.69987158 W (NIST SP 811).
		{"US rating 10 hp", float64(US.RatingIn(10)), 7456.9987158, 1e-12},
		{"SI rating 7.5 kW", float64(SI.RatingIn(7.5)), 7500, 1e-15},
		// [V] °C = (°F − 32)/1.8, NIST SP 811 §B.8: 212 °F = 100 °C, 32 °F = 0 °C, −40 = −40.
		{"US 212 °F", US.TempIn(212), 100, 1e-14},
		{"US 32 °F", US.TempIn(32), 0, 1e-14},
		{"US −40 °F", US.TempIn(-40), -40, 1e-14},
		{"US 44 °F chilled water", US.TempIn(44), 6.666666666666667, 1e-14},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if e := relErr(c.got, c.want); e > c.tol && math.Abs(c.got-c.want) > 1e-14 {
				t.Errorf("got %.12g, want %.12g", c.got, c.want)
			}
		})
	}
}

// TestWaterHorsepowerConstant checks ρ g Q H against the handbook form
// WHP = Q[gpm]·H[ft]·SG / K at the densities of docs/sources.md §1.
func TestWaterHorsepowerConstant(t *testing.T) {
	cases := []struct {
		name    string
		density float64 // kg/m³
		k       float64 // gpm·ft/hp
	}{
		// [D] docs/sources.md §1: 3954.3 at 1000 kg/m³, 3958.2 at 999.0, 3961.4 at 998.2.
		{"1000 kg/m³", 1000, 3954.3},
		{"999.0 kg/m³", 999.0, 3958.2},
		{"998.2 kg/m³", 998.2, 3961.4},
	}
	const q, h = 1500.0, 120.0 // gpm, ft: any point will do, the relation is linear
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			whp := float64(HydraulicPower(c.density, US.FlowIn(q), US.HeadIn(h))) / Horsepower
			// The constant is given to 0.1: half a unit in the last place is
			// 1.3e-5 relative.
			if e := relErr(whp, q*h/c.k); e > 1.5e-5 {
				t.Errorf("ρgQH = %.6f hp, Q·H/%.1f = %.6f hp (relative error %.3g)", whp, c.k, q*h/c.k, e)
			}
			// [P] handbook WHP = Q·H·SG/3960 holds to 0.2 % for water near 4–20 °C
			// (SG = 1 for the handbook form).
			if e := relErr(whp, q*h/3960); e > 2e-3 {
				t.Errorf("ρgQH = %.6f hp differs from Q·H/3960 = %.6f hp by %.3g", whp, q*h/3960, e)
			}
		})
	}
}

func TestPressureToHead(t *testing.T) {
	cases := []struct {
		name    string
		density float64
		ftPsi   float64 // ft of fluid per psi
		tol     float64 // absolute, ft/psi
	}{
		// [P], [D] docs/sources.md §1: 2.311 ft/psi for water at 20 °C (998.2 kg/m³).
		{"water 20 °C", 998.2, 2.311, 5e-4},
		// [P], [D] docs/sources.md §1: 2.309 ft/psi at 60 °F (Kell: 999.01 kg/m³).
		{"water 60 °F", 999.01, 2.309, 5e-4},
		// [P] 2.31/SG: a glycol of SG 1.06 (USERS.md: ~2.18 ft/psi).
		{"glycol SG 1.06", 1.06 * 999.0, 2.31 / 1.06, 2e-3},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := float64(PressureToHead(PSI, c.density)) / Foot
			if math.Abs(got-c.ftPsi) > c.tol {
				t.Errorf("1 psi = %.5f ft, want %.4f ± %g", got, c.ftPsi, c.tol)
			}
			back := HeadToPressure(PressureToHead(PSI, c.density), c.density)
			if e := relErr(back, PSI); e > 1e-14 {
				t.Errorf("HeadToPressure(PressureToHead(1 psi)) = %.10g Pa", back)
			}
		})
	}
}
