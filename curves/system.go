package curves

// System gives the head the pumps must deliver at a flow through the load.
type System interface {
	// Required returns the head needed to move flow q through the system.
	Required(q Flow) Head
	// Describe names the system model for reports.
	Describe() string
}

var (
	_ System = DPControl{}
	_ System = FixedCurve{}
)

// DPControl is a closed loop whose pumps hold a differential pressure at a
// remote sensor. The control curve is
//
//	H(Q) = H_ctl(Q) + (H_design − H_ctl,design)(Q/Q_design)²
//
// where H_ctl is the control head (the setpoint at the sensor as head).
// Without reset H_ctl is constant; with reset it moves linearly from
// ResetLowHead at or below ResetLowFlow to the design control head at or
// above ResetHighFlow.
type DPControl struct {
	DesignFlow  Flow // m³/s
	DesignHead  Head // m, at the pumps at design flow
	ControlHead Head // m, setpoint at the sensor at design flow
	Reset       *Reset
}

// Reset is a linear setpoint reset of the control head between two flows.
type Reset struct {
	LowFlow  Flow // at and below: LowHead
	LowHead  Head
	HighFlow Flow // at and above: the design control head
}

// ControlAt returns the control head in force at flow q.
func (d DPControl) ControlAt(q Flow) Head {
	if d.Reset == nil || d.Reset.HighFlow <= d.Reset.LowFlow {
		return d.ControlHead
	}
	r := d.Reset
	switch {
	case q <= r.LowFlow:
		return r.LowHead
	case q >= r.HighFlow:
		return d.ControlHead
	}
	f := float64(q-r.LowFlow) / float64(r.HighFlow-r.LowFlow)
	return r.LowHead + Head(f)*(d.ControlHead-r.LowHead)
}

func (d DPControl) Required(q Flow) Head {
	x := float64(q) / float64(d.DesignFlow)
	return d.ControlAt(q) + (d.DesignHead-d.ControlHead)*Head(x*x)
}

func (d DPControl) Describe() string {
	if d.Reset != nil {
		return "differential-pressure control with setpoint reset"
	}
	return "differential-pressure control"
}

// FixedCurve is an open or fixed system: H(Q) = H_static + k Q², with k set
// so that the curve passes through the design point.
type FixedCurve struct {
	DesignFlow Flow
	DesignHead Head
	Static     Head
}

func (f FixedCurve) Required(q Flow) Head {
	x := float64(q) / float64(f.DesignFlow)
	return f.Static + (f.DesignHead-f.Static)*Head(x*x)
}

func (FixedCurve) Describe() string { return "fixed system curve (static + friction)" }
