package optimize

import (
	"wattstage/curves"
	"wattstage/plant"
)

// Options choose how the solver may run the units.
type Options struct {
	// CommonSpeed forces one speed signal for every running variable-speed
	// unit, as many automation systems do. Off in the zero value.
	CommonSpeed bool
}

// Solver finds the lowest-power way to serve a load on one plant.
type Solver struct {
	plant *plant.Plant
	opt   Options
}

// New returns a solver for the plant.
func New(p *plant.Plant, opt Options) *Solver {
	return &Solver{plant: p, opt: opt}
}

// Solve returns the lowest-power state that serves the load flow, or an
// Unmet result with the reason.
func (s *Solver) Solve(load curves.Flow) Result {
	panic("optimize: Solve not written yet")
}
