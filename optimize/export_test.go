package optimize

import (
	"wattstage/curves"
	"wattstage/plant"
)

// SetEveryVector makes the solver evaluate every count vector, without the
// bounds of bound.go, so that tests can compare the two.
func SetEveryVector(s *Solver, on bool) { s.exhaustive = on }

// SetTable turns the staging table over the load flow (flowtable.go) on or
// off, so that tests can compare a solve with and without it.
func SetTable(s *Solver, on bool) { s.noTable = !on }

// TableEnds returns how many ends of the staging table a solver has
// computed and how many vectors they keep in all.
func TableEnds(s *Solver) (ends, vectors int) {
	for _, e := range s.table.ends {
		ends++
		vectors += len(e.counts) / len(s.units)
	}
	return ends, vectors
}

// TableMisses returns how many solves the staging table left to the branch
// and bound.
func TableMisses(s *Solver) int { return s.tableMisses }

// ChangeOptions lists the combinations of n running units at a flow as a
// staging change does (transition.go), and how many it leaves out.
func ChangeOptions(p *plant.Plant, q curves.Flow, n int) ([]Option, int) {
	d := &deriver{p: p, s: New(p, Options{CommonSpeed: true})}
	return d.options(q, n)
}

// CountsAt solves one vector of counts with one common speed, as a staging
// change prices its options.
func CountsAt(p *plant.Plant, q curves.Flow, cnt []int) Result {
	return New(p, Options{CommonSpeed: true}).SolveWith(q, Constraint{Counts: cnt})
}
