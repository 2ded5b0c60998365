package curves

import (
	"errors"
	"math"
)

// ErrVapourRange is returned for a temperature outside the saturation line
// of IAPWS-IF97 region 4 (273.15 K to the critical point, 647.096 K).
var ErrVapourRange = errors.New("curves: temperature outside the IAPWS-IF97 saturation line (0–373.946 °C)")

// if97n are the coefficients n₁…n₁₀ of the IAPWS-IF97 saturation-pressure
// equation (IAPWS R7-97(2012), Table 34).
var if97n = [10]float64{
	0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
	0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
	-0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
	0.65017534844798e3,
}

// WaterVapourPressure returns the saturation (vapour) pressure of water in
// Pa at temperature t in °C, by equation 30 of the IAPWS Industrial
// Formulation 1997, region 4 (IAPWS R7-97(2012)), valid from 273.15 K to
// 647.096 K. With T in K, T* = 1 K and p* = 1 MPa:
//
//	ϑ = T/T* + n₉ / (T/T* − n₁₀)
//	A = ϑ² + n₁ϑ + n₂    B = n₃ϑ² + n₄ϑ + n₅    C = n₆ϑ² + n₇ϑ + n₈
//	p_s / p* = [2C / (−B + (B² − 4AC)^½)]⁴
func WaterVapourPressure(t float64) (float64, error) {
	T := t + 273.15
	if math.IsNaN(T) || T < 273.15 || T > 647.096 {
		return 0, ErrVapourRange
	}
	n := if97n
	th := T + n[8]/(T-n[9])
	a := th*th + n[0]*th + n[1]
	b := n[2]*th*th + n[3]*th + n[4]
	c := n[5]*th*th + n[6]*th + n[7]
	x := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	return 1e6 * x * x * x * x, nil
}
