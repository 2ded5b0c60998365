package curves

import "fmt"

// Flow is a volumetric flow rate in m³/s.
type Flow float64

// Head is a head in metres of the pumped fluid.
type Head float64

// Power is a power in watts.
type Power float64

// Exact conversion factors, NIST SP 811 Appendix B, and standard gravity
// (CGPM).
const (
	Gallon     = 3.785411784e-3 // m³ per US gallon (exact, 231 in³)
	Foot       = 0.3048         // m per foot (exact)
	Horsepower = 745.69987158   // W per horsepower (550 ft·lbf/s)
	PSI        = 6894.757293    // Pa per lbf/in²
	Gravity    = 9.80665        // m/s², standard gravity

	GPM     = Gallon / 60 // m³/s per US gallon per minute
	M3PerH  = 1.0 / 3600  // m³/s per m³/h
	LPerS   = 1e-3        // m³/s per L/s
	KPa     = 1e3         // Pa per kPa
	KW      = 1e3         // W per kW
	HoursPY = 8760        // hours in a non-leap year
)

// UnitSystem says how numbers are read from a plant file and written in
// reports. The zero value is SI.
type UnitSystem int

const (
	SI UnitSystem = iota // m³/h, m, kW, °C
	US                   // gpm, ft, hp, °F
)

func (u UnitSystem) String() string {
	if u == US {
		return "US"
	}
	return "SI"
}

// FlowUnit is the display unit of flow.
func (u UnitSystem) FlowUnit() string {
	if u == US {
		return "gpm"
	}
	return "m³/h"
}

// HeadUnit is the display unit of head.
func (u UnitSystem) HeadUnit() string {
	if u == US {
		return "ft"
	}
	return "m"
}

// PowerUnit is the display unit of motor ratings (electrical power is
// always reported in kW).
func (u UnitSystem) PowerUnit() string {
	if u == US {
		return "hp"
	}
	return "kW"
}

// Flow converts a flow from this system's display unit to m³/s.
func (u UnitSystem) FlowIn(v float64) Flow {
	if u == US {
		return Flow(v * GPM)
	}
	return Flow(v * M3PerH)
}

// FlowOut converts a flow in m³/s to this system's display unit.
func (u UnitSystem) FlowOut(q Flow) float64 {
	if u == US {
		return float64(q) / GPM
	}
	return float64(q) / M3PerH
}

// HeadIn converts a head from this system's display unit to metres.
func (u UnitSystem) HeadIn(v float64) Head {
	if u == US {
		return Head(v * Foot)
	}
	return Head(v)
}

// HeadOut converts a head in metres to this system's display unit.
func (u UnitSystem) HeadOut(h Head) float64 {
	if u == US {
		return float64(h) / Foot
	}
	return float64(h)
}

// RatingIn converts a motor rating from this system's unit (hp or kW) to W.
func (u UnitSystem) RatingIn(v float64) Power {
	if u == US {
		return Power(v * Horsepower)
	}
	return Power(v * KW)
}

// RatingOut converts a power in W to this system's rating unit (hp or kW).
func (u UnitSystem) RatingOut(p Power) float64 {
	if u == US {
		return float64(p) / Horsepower
	}
	return float64(p) / KW
}

// TempIn converts a temperature in this system's unit to °C.
func (u UnitSystem) TempIn(v float64) float64 {
	if u == US {
		return (v - 32) * 5 / 9
	}
	return v
}

// TempOut converts a temperature in °C to this system's unit.
func (u UnitSystem) TempOut(c float64) float64 {
	if u == US {
		return c*9/5 + 32
	}
	return c
}

// TempUnit is the display unit of temperature.
func (u UnitSystem) TempUnit() string {
	if u == US {
		return "°F"
	}
	return "°C"
}

// PressureToHead converts a pressure in Pa to head of a fluid of the given
// density: h = p / (ρ g).
func PressureToHead(pa, density float64) Head {
	return Head(pa / (density * Gravity))
}

// HeadToPressure is the inverse of PressureToHead.
func HeadToPressure(h Head, density float64) float64 {
	return float64(h) * density * Gravity
}

// FormatFlow writes a flow with its unit, e.g. "1200 gpm".
func (u UnitSystem) FormatFlow(q Flow) string {
	return fmt.Sprintf("%.1f %s", u.FlowOut(q), u.FlowUnit())
}

// FormatHead writes a head with its unit, e.g. "85.0 ft".
func (u UnitSystem) FormatHead(h Head) string {
	return fmt.Sprintf("%.1f %s", u.HeadOut(h), u.HeadUnit())
}

// PressureUnit is the unit a setpoint at a DP sensor is written in: psi
// for US units, kPa for SI.
func (u UnitSystem) PressureUnit() string {
	if u == SI {
		return "kPa"
	}
	return "psi"
}

// PressureOut writes a head of a fluid of the given density as a pressure
// in PressureUnit.
func (u UnitSystem) PressureOut(h Head, density float64) float64 {
	pa := HeadToPressure(h, density)
	if u == SI {
		return pa / KPa
	}
	return pa / PSI
}

// FormatPressure writes a head as a pressure and a head, e.g. "15.0 psi
// (34.7 ft)".
func (u UnitSystem) FormatPressure(h Head, density float64) string {
	return fmt.Sprintf("%.1f %s (%.1f %s)", u.PressureOut(h, density), u.PressureUnit(), u.HeadOut(h), u.HeadUnit())
}
