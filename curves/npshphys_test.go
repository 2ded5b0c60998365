package curves

import (
	"errors"
	"math"
	"testing"
)

// TestWaterVapourPressureIF97 checks IAPWS-IF97 equation 30 against the
// release's own check value and values derived from it.
func TestWaterVapourPressureIF97(t *testing.T) {
	cases := []struct {
		name string
		t    float64 // °C
		want float64 // Pa
		tol  float64 // Pa
	}{
		// [V] IAPWS R7-97(2012) Table 35: T = 300 K → p_s = 0.353658941e-2 MPa.
		{"300 K, IF97 check value", 300 - 273.15, 3536.58941, 5e-5},
		// [V] Table 35: T = 500 K → 0.263889776e1 MPa.
		{"500 K, IF97 check value", 500 - 273.15, 2.63889776e6, 5e-2},
		// [V] Table 35: T = 600 K → 0.123443146e2 MPa.
		{"600 K, IF97 check value", 600 - 273.15, 1.23443146e7, 5e-1},
		// [D] equation 30 evaluated: 20 °C → 2.3392 kPa, 60 °C → 19.946 kPa.
		{"20 °C", 20, 2339.2, 0.05},
		{"60 °C", 60, 19946, 0.5},
		// [P] steam tables: water boils at about 100 °C at 101.325 kPa
		// (99.97 °C on ITS-90), so p_s(100 °C) is a little above it.
		{"100 °C near one atmosphere", 100, 101418, 5},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := WaterVapourPressure(c.t)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(got-c.want) > c.tol {
				t.Errorf("WaterVapourPressure(%g °C) = %.6f Pa, want %.6f ± %g", c.t, got, c.want, c.tol)
			}
		})
	}
}

func TestWaterVapourPressureRange(t *testing.T) {
	for _, tc := range []float64{-1, 374, math.NaN()} {
		if _, err := WaterVapourPressure(tc); !errors.Is(err, ErrVapourRange) {
			t.Errorf("WaterVapourPressure(%g) error %v, want ErrVapourRange", tc, err)
		}
	}
}

// TestAtmosphericPressureISA checks the barometric formula against the
// standard atmosphere's tabulated pressures.
func TestAtmosphericPressureISA(t *testing.T) {
	cases := []struct {
		name string
		z    float64 // m
		want float64 // Pa
		tol  float64 // Pa
	}{
		// [V] ICAO Doc 7488 / ISO 2533: p₀ = 101325 Pa at sea level.
		{"sea level", 0, 101325, 1e-9},
		// ISA table values (ICAO Doc 7488), from memory: 1000 m 89875 Pa,
		// 2000 m 79495 Pa, 11000 m 22632 Pa (the tropopause).
		{"1000 m", 1000, 89875, 2},
		{"2000 m", 2000, 79495, 2},
		{"11000 m", 11000, 22632, 2},
		// [D] the formula below sea level: −500 m → 107478 Pa.
		{"−500 m", -500, 107478, 2},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := AtmosphericPressure(c.z)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(got-c.want) > c.tol {
				t.Errorf("AtmosphericPressure(%g m) = %.2f Pa, want %.2f ± %g", c.z, got, c.want, c.tol)
			}
		})
	}
	if _, err := AtmosphericPressure(12000); !errors.Is(err, ErrAltitudeRange) {
		t.Errorf("12000 m: error %v, want ErrAltitudeRange", err)
	}
}

// TestNPSHCurveAffinity checks the interpolation and the speed² scaling of
// NPSHr on a made-up three-point curve (the points are test inputs; the
// expected values are [D] by hand from them).
func TestNPSHCurveAffinity(t *testing.T) {
	c, err := NewNPSHCurve([]NPSHPoint{{0.05, 3}, {0.10, 5}, {0.15, 9}})
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name  string
		q     Flow
		s     float64
		want  Head
		extra bool
	}{
		{"on a point", 0.10, 1, 5, false},
		// Halfway between 0.05 (3 m) and 0.10 (5 m): 4 m.
		{"between points, linear", 0.075, 1, 4, false},
		// Affinity [P]: at half speed 0.05 m³/s maps to 0.10 at rated
		// speed (5 m), scaled by 0.5² = 1.25 m.
		{"half speed", 0.05, 0.5, 1.25, false},
		// Below the first point the first value holds: 3 m.
		{"below the first point", 0.01, 1, 3, false},
		// Past the last point the last segment (80 m per m³/s) continues:
		// 9 + 80 × 0.05 = 13 m.
		{"past the last point", 0.20, 1, 13, true},
		// At 80 % speed 0.16 m³/s maps to 0.20: 0.8² × 13 = 8.32 m.
		{"past the last point at 80 % speed", 0.16, 0.8, 8.32, true},
	}
	for _, k := range cases {
		t.Run(k.name, func(t *testing.T) {
			if got := c.Required(k.q, k.s); math.Abs(float64(got-k.want)) > 1e-12 {
				t.Errorf("Required(%g, %g) = %.15g m, want %g", k.q, k.s, got, k.want)
			}
			if got := c.Extrapolated(k.q, k.s); got != k.extra {
				t.Errorf("Extrapolated(%g, %g) = %v, want %v", k.q, k.s, got, k.extra)
			}
		})
	}
}

func TestNPSHCurveRejectsBadPoints(t *testing.T) {
	cases := []struct {
		name  string
		pts   []NPSHPoint
		field string
		want  error
	}{
		{"one point", []NPSHPoint{{0.1, 3}}, "", ErrNPSHPoints},
		{"falling flow", []NPSHPoint{{0.1, 3}, {0.05, 4}}, "flow", ErrUnsorted},
		{"repeated flow", []NPSHPoint{{0.1, 3}, {0.1, 4}}, "flow", ErrDuplicateFlow},
		{"zero NPSHr", []NPSHPoint{{0.1, 3}, {0.2, 0}}, "npshr", ErrNotPositive},
		{"NaN NPSHr", []NPSHPoint{{0.1, Head(math.NaN())}, {0.2, 4}}, "npshr", ErrNotFinite},
	}
	for _, k := range cases {
		t.Run(k.name, func(t *testing.T) {
			_, err := NewNPSHCurve(k.pts)
			if !errors.Is(err, k.want) {
				t.Fatalf("error %v, want %v", err, k.want)
			}
			var pe *PointError
			if k.field != "" && (!errors.As(err, &pe) || pe.Field != k.field) {
				t.Errorf("error %v is not a PointError on %q", err, k.field)
			}
		})
	}
}

// TestSuctionAvailable checks NPSH available = (p_abs − p_v)/(ρg) + z − h_f(q/q_f)².
func TestSuctionAvailable(t *testing.T) {
	pv20, _ := WaterVapourPressure(20)
	rho20, _ := WaterDensity(20)
	cases := []struct {
		name string
		s    Suction
		q    Flow
		want Head
		tol  Head
	}{
		// [D] open tank at sea level, water at 20 °C, 2 m above the eye, 1 m
		// of loss at 0.1 m³/s, half that flow: (101325 − 2339.2) /
		// (998.204 × 9.80665) + 2 − 1 × 0.5² = 10.1119 + 2 − 0.25 = 11.862 m.
		{"open tank at sea level", Suction{Pressure: StandardPressure, StaticHead: 2, Loss: 1, LossFlow: 0.1,
			VapourPressure: pv20, Density: rho20}, 0.05, 11.862, 5e-4},
		// [P] the zero value: standard atmosphere, reference density, no
		// vapour pressure, level with the eye: 101325 / (998.2 × 9.80665)
		// = 10.3510 m, the "about 34 ft of water" of the handbooks.
		{"zero value", Suction{}, 1, 10.3510, 5e-4},
		// [D] a 3 m suction lift, loss given at every flow: 10.3510 − 3 − 0.5.
		{"suction lift", Suction{StaticHead: -3, Loss: 0.5}, 7, 6.8510, 5e-4},
	}
	for _, k := range cases {
		t.Run(k.name, func(t *testing.T) {
			if got := k.s.Available(k.q); math.Abs(float64(got-k.want)) > float64(k.tol) {
				t.Errorf("Available(%g) = %.5f m, want %.4f ± %g", k.q, got, k.want, k.tol)
			}
		})
	}
}
