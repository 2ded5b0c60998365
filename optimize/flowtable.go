package optimize

import (
	"cmp"
	"math"
	"slices"

	"wattstage/curves"
)

// A staging table over the load flow, so that the cost of a point no
// longer grows with the number of count vectors.
//
// With no constraint a solve is a function of the load flow alone (the
// required head follows the system curve), and with a given number of
// running units a function of the flow and that number. The table's ends
// are flows a step of tableStep apart (relative to the flow); at each end
// a branch and bound that keeps rather than prunes lists the vectors within
// tableKeep of the best input there, each at its best head, with their
// inputs. A load between two ends is then solved exactly, as any vector
// is, but only among the vectors that can win inside the step:
//
//   - The inputs are smooth in the flow within a step, so the difference
//     between two vectors' inputs moves about linearly across it. A vector
//     C that wins inside the step but neither at its start a (won by A) nor
//     at its end b (won by B) must then lie between A and B at both ends:
//     C − A at a is at most B − A at a, the gap between the two winners.
//   - So the candidates are the vectors within that gap of the best at
//     either end, plus tableFloor for the curvature the linear picture
//     leaves out. Where one vector wins at both ends (most steps) only
//     those within tableFloor of it compete.
//   - Where that margin exceeds tableKeep (the winners are far apart at an
//     end, or one of them cannot serve the other end: a unit's limit lies
//     in the step, and with it a kink the linear picture does not see) the
//     load is left to the full branch and bound.
//
// The large plants' check (TestTableKeepsTheBest) compares the table with
// the branch and bound alone at random flows, and that with every vector
// evaluated (TestBoundsKeepTheBest).
//
// An end is computed when a load first needs it, from its own flow alone:
// the answer for a load does not depend on which loads came before, so a
// strategy solved in any order, or in parallel, gives the same bytes. Where
// no kept vector serves a load (near the plant's capacity, say) the solve
// falls back to the full branch and bound.

// The table's ends are the flows tableBase·D·(1+tableStep)^j for design
// flow D: a step is a fixed share of the flow, so the inputs of two vectors,
// which vary about as a power of the flow, move by about as much relative
// to each other over any step, at 10 % of design as at 100 %.
const (
	tableStep = 0.005
	tableBase = 0.01
)

// tableKeep is how far above the best input at a step's end (each vector
// at its best head) a vector may be and still be kept there: the most a
// step's candidates may lie above its ends' best. Measured on a generated
// 24-unit plant of six similar models over an hourly year: 0.2 % keeps
// 12 vectors an end and leaves 68 of 8,760 loads to the branch and bound;
// 0.5 % keeps 65 an end (each costs a full split at every load of the
// step) and leaves none.
const tableKeep = 0.002

// tableFloor is the least margin of a step's candidates over its ends'
// best, for the curvature of the inputs within a step.
const tableFloor = 5e-4

// tableTop bounds the table: flows above tableTop times the design flow
// are solved without it, as are flows below tableBase times it.
const tableTop = 5.0

// A solve at a given head (Constraint.Head: a logged DP, say) is a
// function of the flow and that head: its table's ends lie on a grid of
// both, heads tableStep apart as flows are, and a load is solved among the
// vectors that can win inside its cell. The argument above holds corner by
// corner: a vector C that wins inside the cell beats the winner A of one
// corner there, so (the differences moving about linearly) at some corner
// k as well, where C is then within A's gap over that corner's best.
// The margin is thus the largest gap of any corner's winner at any other
// corner.

// headBase is the head at index 0 of the grid of given heads, m; any
// positive value serves (the grid is geometric).
const headBase = 1.0

// flowTable holds the ends computed so far, by endKey.
type flowTable struct {
	ends map[endKey]*tableEnd
}

// endKey names one end: solves with exactly total running units
// (Constraint.Total; 0: any), at flow index j, at head index m of the grid
// of given heads (noHead: the system's required head).
type endKey struct {
	total, j, m int
}

// noHead marks an end at the system's required head.
const noHead = math.MinInt32

// tableEnd is the vectors kept at one step's end, cheapest first: their
// counts laid end to end and their inputs, W.
type tableEnd struct {
	counts []int
	power  []float64
}

// vector returns the counts of kept vector k.
func (e *tableEnd) vector(k, n int) []int { return e.counts[k*n : (k+1)*n : (k+1)*n] }

// powerOf returns the input kept for a vector, or +Inf where it is not kept.
func (e *tableEnd) powerOf(cnt []int) float64 {
	for k := range e.power {
		if slices.Equal(e.vector(k, len(cnt)), cnt) {
			return e.power[k]
		}
	}
	return math.Inf(1)
}

// gap is how far above this end's best input the other end's best vector
// lies here: 0 where it is the same vector, +Inf where it is not kept.
func (e *tableEnd) gap(other *tableEnd, n int) float64 {
	if len(e.power) == 0 || len(other.power) == 0 {
		return math.Inf(1)
	}
	return e.powerOf(other.vector(0, n))/e.power[0] - 1
}

// tableFor reports whether a solve may use the table: a plant with more
// vectors than everyVector takes, and no constraint but a number of
// running units (a staged sequence's) or a head, which have tables of
// their own.
func (s *Solver) tableFor(c Constraint) bool {
	return !s.noTable && !s.exhaustive && len(s.combos) > fewVectors &&
		c.Counts == nil && c.Head >= 0 && c.Total >= 0
}

// gridIndex is the index of the step of a geometric grid from base with
// ratio 1+tableStep that holds v.
func gridIndex(v, base float64) int {
	return int(math.Floor(math.Log(v/base) / math.Log1p(tableStep)))
}

// fromTable solves a load among the vectors that can win in its step of
// the table, or returns nil when the table does not apply or none of them
// serves it.
func (s *Solver) fromTable(load, Q, hr float64, c Constraint) (*state, []*state) {
	if !s.tableFor(c) || s.plant.DesignFlow <= 0 {
		return nil, nil
	}
	base := tableBase * float64(s.plant.DesignFlow)
	if load < base || load > tableTop*float64(s.plant.DesignFlow) {
		return nil, nil
	}
	j := gridIndex(load, base)
	corners := s.corners[:0]
	if c.Head > 0 {
		m := gridIndex(float64(c.Head), headBase)
		for _, d := range [4][2]int{{0, 0}, {1, 0}, {0, 1}, {1, 1}} {
			corners = append(corners, s.tableEnd(endKey{c.Total, j + d[0], m + d[1]}, base))
		}
	} else {
		corners = append(corners, s.tableEnd(endKey{c.Total, j, noHead}, base), s.tableEnd(endKey{c.Total, j + 1, noHead}, base))
	}
	s.corners = corners
	n := len(s.units)
	margin := 0.0
	for _, a := range corners {
		for _, b := range corners {
			if a != b {
				margin = math.Max(margin, a.gap(b, n))
			}
		}
	}
	if margin += tableFloor; margin > tableKeep {
		// The ends' winners are far apart (or one cannot serve another
		// end): the step holds a limit the linear picture does not see.
		// Leave the load to the branch and bound.
		s.tableMisses++
		return nil, nil
	}
	cands := s.tableBuf[:0]
	for _, e := range corners {
		for k, p := range e.power {
			if p > e.power[0]*(1+margin) {
				break
			}
			if cnt := e.vector(k, n); !hasVector(cands, cnt) {
				cands = append(cands, cnt...)
			}
		}
	}
	s.tableBuf = cands
	s.resetGrid(hr)
	s.bounded = false
	s.near = s.near[:0]
	var best *state
	for off := 0; off < len(cands); off += n {
		cnt := cands[off : off+n : off+n]
		_, _, sd := s.sidesAt(cnt, Q, hr, 0, s.spanBuf(n))
		if sd != fits && !s.mayRise(cnt, Q, hr) {
			continue
		}
		best = s.evaluate(Q, hr, cnt, sd == fits, best, 0)
	}
	return best, s.near
}

// hasVector reports whether the vectors laid end to end in list include cnt.
func hasVector(list, cnt []int) bool {
	n := len(cnt)
	for o := 0; o < len(list); o += n {
		if slices.Equal(list[o:o+n], cnt) {
			return true
		}
	}
	return false
}

// tableEnd returns the vectors kept at an end (flow base·(1+tableStep)^j,
// head headBase·(1+tableStep)^m or the required head, total running units
// or any), computing them the first time.
func (s *Solver) tableEnd(k endKey, base float64) *tableEnd {
	if s.table.ends == nil {
		s.table.ends = map[endKey]*tableEnd{}
	}
	if e := s.table.ends[k]; e != nil {
		return e
	}
	e := &tableEnd{}
	s.table.ends[k] = e
	load := base * math.Pow(1+tableStep, float64(k.j))
	Q := max(load, float64(s.plant.MinFlow))
	if Q <= 0 {
		return e
	}
	hr := float64(s.plant.RequiredHead(curves.Flow(load)))
	if k.m != noHead {
		hr = headBase * math.Pow(1+tableStep, float64(k.m))
	}
	s.resetGrid(hr)
	best, near := s.branchAndBound(Q, hr, Constraint{Total: k.total}, tableKeep)
	if best == nil {
		return e
	}
	// Each vector at its best head, as a solve gives it: the head search
	// for those within headSearchMargin of the best (solver.go).
	type kept struct {
		st    *state
		power float64
	}
	ks := make([]kept, 0, len(near))
	least := math.Inf(1)
	for _, st := range near {
		k := kept{st, st.power}
		if st.power <= best.power*headSearchMargin {
			if h := s.searchHead(st, Q, hr); h != nil && h.power < st.power {
				k.power = h.power
			}
		}
		least = math.Min(least, k.power)
		ks = append(ks, k)
	}
	slices.SortStableFunc(ks, func(x, y kept) int { return cmp.Compare(x.power, y.power) })
	for _, k := range ks {
		if k.power > least*(1+tableKeep) {
			break
		}
		e.counts = append(e.counts, k.st.counts...)
		e.power = append(e.power, k.power)
	}
	return e
}
