package curves

import (
	"errors"
	"math"
	"testing"
)

func TestWaterDensityKell(t *testing.T) {
	cases := []struct {
		name string
		t    float64 // °C
		want float64 // kg/m³
		tol  float64 // kg/m³
	}{
		// [D] docs/sources.md §2, Kell (1975) evaluated to three decimals.
		{"4 °C", 4, 999.972, 5e-4},
		// Kell's formula gives 999.901489 at 7 °C (re-computed [D] in
		// 40-digit decimal arithmetic), which rounds to 999.901; a copy
		// showing 999.902 rounds the wrong way (docs/sources.md §2), so the
		// check uses the re-computed value.
		{"7 °C", 7, 999.901489, 5e-6},
		{"20 °C", 20, 998.204, 5e-4},
		{"30 °C", 30, 995.647, 5e-4},
		// Also guards against the miscopied denominator 16.897850e-3, which is
		// ~0.5 kg/m³ off here (docs/sources.md §2).
		{"60 °C", 60, 983.199, 5e-4},
		// [V] IAPWS-95 at 20 °C, 101.325 kPa: 998.2071505 kg/m³. Kell and
		// IAPWS-95 agree within 0.003 kg/m³ here [D]; 0.01 allows for that.
		{"20 °C against IAPWS-95", 20, 998.2071505, 1e-2},
		// [D] Kell's formula re-computed in 40-digit decimal arithmetic,
		// to 1e-6 kg/m³: catches a miscopied coefficient that the
		// three-decimal values above would miss.
		{"4 °C, 40 digits", 4, 999.9719941, 1e-6},
		{"20 °C, 40 digits", 20, 998.2041322, 1e-6},
		{"60 °C, 40 digits", 60, 983.1988830, 1e-6},
		{"60 °F, 40 digits", 15.0 + 5.0/9.0, 999.0140571, 1e-6},
		// [V] Kell (1975) first coefficient is the density at 0 °C.
		{"0 °C", 0, 999.83952, 1e-9},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := WaterDensity(c.t)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(got-c.want) > c.tol {
				t.Errorf("WaterDensity(%g) = %.5f kg/m³, want %.5f ± %g", c.t, got, c.want, c.tol)
			}
		})
	}
}

// TestWaterDensityMaximum checks the density maximum near 4 °C [P: water is
// densest at about 3.98 °C].
func TestWaterDensityMaximum(t *testing.T) {
	r4, _ := WaterDensity(3.98)
	for _, tc := range []float64{0, 2, 3.5, 4.5, 6, 10} {
		r, _ := WaterDensity(tc)
		if r >= r4 {
			t.Errorf("density at %g °C (%.5f) not below that at 3.98 °C (%.5f)", tc, r, r4)
		}
	}
}

func TestWaterDensityRange(t *testing.T) {
	cases := []struct {
		name string
		t    float64
		ok   bool
	}{
		{"below 0 °C", -0.1, false},
		{"above 150 °C", 150.1, false},
		{"NaN", math.NaN(), false},
		{"+Inf", math.Inf(1), false},
		{"lower edge", 0, true},
		{"upper edge", 150, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := WaterDensity(c.t)
			if c.ok && err != nil {
				t.Errorf("unexpected error %v", err)
			}
			if !c.ok && !errors.Is(err, ErrTemperatureRange) {
				t.Errorf("got %v, want ErrTemperatureRange", err)
			}
		})
	}
}

func TestHydraulicPower(t *testing.T) {
	// Physics: P = ρ g Q H. 0.1 m³/s against 30 m of water at 1000 kg/m³ is
	// 1000 × 9.80665 × 0.1 × 30 = 29419.95 W [D].
	got := float64(HydraulicPower(1000, 0.1, 30))
	if math.Abs(got-29419.95) > 1e-9 {
		t.Errorf("HydraulicPower = %.6f W, want 29419.95 W", got)
	}
}
