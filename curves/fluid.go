package curves

import (
	"errors"
	"math"
)

// ErrTemperatureRange is returned for a water temperature outside the range
// of the Kell (1975) correlation.
var ErrTemperatureRange = errors.New("curves: water temperature outside 0–150 °C (Kell 1975 range)")

// WaterDensity returns the density of liquid water at 1 atm in kg/m³ at
// temperature t in °C, by Kell (1975), J. Chem. Eng. Data 20(1):97–105:
//
//	ρ = (999.83952 + 16.945176 t − 7.9870401e-3 t² − 46.170461e-6 t³
//	     + 105.56302e-9 t⁴ − 280.54253e-12 t⁵) / (1 + 16.879850e-3 t)
func WaterDensity(t float64) (float64, error) {
	if math.IsNaN(t) || t < 0 || t > 150 {
		return 0, ErrTemperatureRange
	}
	num := 999.83952 + t*(16.945176+t*(-7.9870401e-3+t*(-46.170461e-6+t*(105.56302e-9+t*(-280.54253e-12)))))
	return num / (1 + 16.879850e-3*t), nil
}

// ReferenceDensity is the density (kg/m³) assumed for datasheet shaft powers:
// water at 20 °C (common practice; Kell 1975 gives 998.204).
const ReferenceDensity = 998.2

// Fluid is the pumped fluid.
type Fluid struct {
	Density     float64 // kg/m³
	Temperature float64 // °C, for the record; NaN when only a specific gravity was given
	SG          float64 // specific gravity relative to water at 4 °C (999.972 kg/m³)
}

// HydraulicPower returns ρ g Q H in watts.
func HydraulicPower(density float64, q Flow, h Head) Power {
	return Power(density * Gravity * float64(q) * float64(h))
}
