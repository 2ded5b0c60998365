package curves

// Suction is where a pump group draws from, for the net positive suction
// head available. Pressure and StaticHead refer to one level: the liquid
// surface of an open tank or basin, or the point of a closed system where
// the pressure is known (an expansion tank's connection).
type Suction struct {
	// Pressure is the absolute pressure at the reference level, Pa: the
	// atmospheric pressure at the site's altitude for an open tank, or the
	// closed system's pressure there. 0 = StandardPressure.
	Pressure float64
	// StaticHead is the height of the reference level above the impeller
	// eye, m: positive with the liquid above the pump (flooded suction),
	// negative for a suction lift. 0 = level with the eye.
	StaticHead Head
	// Loss is the friction head lost between the reference level and the
	// pump suction at LossFlow, m; it scales with the square of the flow
	// through the suction. 0 = none.
	Loss Head
	// LossFlow is the flow through the suction at which Loss is given,
	// m³/s; 0 means Loss holds at every flow.
	LossFlow Flow
	// VapourPressure is the liquid's vapour pressure at the pumping
	// temperature, Pa (WaterVapourPressure for water). 0 = none.
	VapourPressure float64
	// Density is the liquid's density, kg/m³. 0 = ReferenceDensity.
	Density float64
}

// Available returns the net positive suction head available at the pump
// suction with q flowing through the suction (ANSI/HI 9.6.1, from memory;
// every pump handbook):
//
//	NPSHa = (p_abs − p_v) / (ρ g) + z − h_f · (q / q_f)²
//
// with p_abs the absolute pressure at the reference level, p_v the vapour
// pressure, z the static head of that level above the impeller eye and h_f
// the suction loss at flow q_f.
func (s Suction) Available(q Flow) Head {
	p := s.Pressure
	if p == 0 {
		p = StandardPressure
	}
	rho := s.Density
	if rho == 0 {
		rho = ReferenceDensity
	}
	loss := float64(s.Loss)
	if s.LossFlow > 0 {
		r := float64(q / s.LossFlow)
		loss *= r * r
	}
	return Head((p-s.VapourPressure)/(rho*Gravity) + float64(s.StaticHead) - loss)
}
