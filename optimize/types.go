package optimize

import (
	"wattstage/curves"
)

// Status says how a solved operating point ended.
type Status int

const (
	// Served: the plant delivers the flow at or above the required head.
	Served Status = iota
	// Unmet: no allowed combination of running units delivers the flow; the
	// Result carries the reason and the shortfall.
	Unmet
)

func (s Status) String() string {
	if s == Unmet {
		return "unmet"
	}
	return "served"
}

// Limit names what bounds an operating point or a unit.
type Limit string

// Limits, in the words the reports use.
const (
	LimitNone        Limit = ""
	LimitMinSpeed    Limit = "minimum speed"
	LimitMaxSpeed    Limit = "maximum speed"
	LimitMinFlow     Limit = "minimum flow"
	LimitRunout      Limit = "runout"
	LimitOverload    Limit = "motor overload"
	LimitPlantBypass Limit = "plant minimum flow (bypass)"
	LimitCapacity    Limit = "capacity"
	LimitFixedSpeed  Limit = "fixed speed"
	LimitGap         Limit = "unreachable between unit ranges"
)

// Unit is the state of one running unit.
type Unit struct {
	Model      int         // index into plant.Models
	Speed      float64     // fraction of rated speed
	Flow       curves.Flow // m³/s
	Head       curves.Head // m, the unit's own head (header + branch loss)
	PumpEff    float64     // 0–1
	MotorEff   float64     // 0–1
	DriveEff   float64     // 0–1 (1 for a fixed-speed unit)
	Load       float64     // motor load fraction
	Shaft      curves.Power
	Electrical curves.Power
	Limit      Limit // the limit the unit sits on, if any
	Preferred  bool  // inside 70–120 % of BEP flow at its speed (ANSI/HI 9.6.3)
}

// Result is one solved operating point of the plant.
type Result struct {
	LoadFlow     curves.Flow // flow through the load, m³/s
	PumpedFlow   curves.Flow // flow the pumps move (≥ plant minimum flow)
	BypassFlow   curves.Flow // PumpedFlow − LoadFlow
	RequiredHead curves.Head // the system's need at LoadFlow
	HeaderHead   curves.Head // what the running units deliver (≥ RequiredHead)
	Counts       []int       // running units per model
	Units        []Unit
	Power        curves.Power // total electrical input, W
	Hydraulic    curves.Power // ρ g Q H of the pumped flow at the header head
	Status       Status
	Limit        Limit       // the binding limit of the point, if any
	Reason       string      // why a point is unmet, or how it is bounded
	Shortfall    curves.Flow // flow short of the load for an unmet point
	Warnings     []string
}

// WireToWater returns useful hydraulic power at the required head over
// electrical input.
func (r *Result) WireToWater(density float64) float64 {
	if r.Power <= 0 {
		return 0
	}
	return float64(curves.HydraulicPower(density, r.LoadFlow, r.RequiredHead)) / float64(r.Power)
}

// Running returns the number of running units.
func (r *Result) Running() int {
	n := 0
	for _, c := range r.Counts {
		n += c
	}
	return n
}
