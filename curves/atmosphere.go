package curves

import (
	"errors"
	"math"
)

// ErrAltitudeRange is returned for an altitude outside the troposphere of
// the standard atmosphere.
var ErrAltitudeRange = errors.New("curves: altitude outside −500 to 11000 m (the standard atmosphere's troposphere)")

// Constants of the ICAO/ISO standard atmosphere at mean sea level (ICAO
// Doc 7488, ISO 2533:1975).
const (
	StandardPressure = 101325.0  // Pa, p₀
	isaT0            = 288.15    // K, T₀
	isaLapse         = 0.0065    // K/m, temperature gradient L of the troposphere
	isaR             = 287.05287 // J/(kg·K), specific gas constant of dry air
)

// AtmosphericPressure returns the pressure of the ICAO/ISO standard
// atmosphere in Pa at geopotential altitude z in m, by the barometric
// formula of the troposphere (ICAO Doc 7488; ISO 2533:1975):
//
//	p = p₀ (1 − L z / T₀)^(g₀ / (R L))
//
// with p₀ = 101325 Pa, T₀ = 288.15 K, L = 0.0065 K/m, g₀ = 9.80665 m/s²
// and R = 287.05287 J/(kg·K), an exponent of 5.25588. Valid from −500 m
// to 11000 m; a site's barometric pressure varies with the weather by a
// few per cent about this value.
func AtmosphericPressure(z float64) (float64, error) {
	if math.IsNaN(z) || z < -500 || z > 11000 {
		return 0, ErrAltitudeRange
	}
	return StandardPressure * math.Pow(1-isaLapse*z/isaT0, Gravity/(isaR*isaLapse)), nil
}
