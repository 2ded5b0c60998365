package optimize

import (
	"math"

	"wattstage/curves"
)

// power returns the electrical input of one unit at flow q and speed s.
func (u *unitModel) chain(q, s float64) curves.Chain {
	shaft := u.pump.ShaftPower(curves.Flow(q), s, u.rho)
	return u.m.Drive.Input(u.m.Motor, shaft, s)
}

// powerAt returns the electrical input of one variable unit delivering q at
// header head h; +Inf where no speed does.
func (u *unitModel) powerAt(q, h float64) float64 {
	s, ok := u.speed(q, h)
	if !ok {
		return math.Inf(1)
	}
	shaft := u.pump.ShaftPower(curves.Flow(q), s, u.rho)
	return float64(u.m.Drive.Electrical(u.m.Motor, shaft, s))
}

func (u *unitModel) shaftAt(q, h float64) float64 {
	s, ok := u.speed(q, h)
	if !ok {
		return math.Inf(1)
	}
	return float64(u.pump.ShaftPower(curves.Flow(q), s, u.rho))
}
