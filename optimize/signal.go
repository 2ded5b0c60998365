package optimize

import (
	"math"

	"wattstage/curves"
)

func validSignal(s string) bool {
	_, err := ParseBasis(s)
	return err == nil
}

// chooseSignal picks the one signal the sequence stages on: the one asked
// for, else the most robust for the plant, with the reason in words.
//
//   - Flow where any unit runs across the line (a fixed-speed unit has no
//     speed to read), where a change has no usable speed value, or where
//     the system is a fixed curve (the speed loop already holds a flow).
//   - Otherwise flow-and-speed: stage up when either stays above its value,
//     down only when both stay below. Either signal alone protects capacity
//     on the way up if the other reads wrong (a drifting flow meter, a
//     setpoint reset that moves the speed at a given flow); requiring both
//     on the way down keeps one bad reading from dropping a unit.
func chooseSignal(sp *Setpoints, asked string) (Basis, string) {
	if asked != "" {
		b, _ := ParseBasis(asked)
		return b, "as asked"
	}
	p := sp.Plant
	for _, m := range p.Models {
		if !m.Drive.Variable() {
			return FlowBasis, "some units run across the line, so there is no common speed to stage on"
		}
	}
	if _, ok := p.System.(curves.DPControl); !ok {
		return FlowBasis, "the system is a fixed curve: the speed loop holds the flow the plant needs, so the flow itself is the steadier signal"
	}
	for _, t := range sp.Transitions {
		if math.IsNaN(t.Up.Speed) || math.IsNaN(t.Down.Speed) {
			return FlowBasis, "at some change the speed is not a usable signal (it does not tell the stages apart)"
		}
	}
	return FlowAndSpeedBasis, "stage up when either the flow or the speed stays above its value (either protects capacity if the other reads wrong), down only when both stay below theirs (one bad reading cannot drop a unit)"
}
