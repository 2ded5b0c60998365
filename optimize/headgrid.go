package optimize

import "math"

// gridPoints is the number of steps of the head scan.
const gridPoints = 48

// resetGrid sets the scan grid for a solve from the required head up to the
// highest head any unit can make.
func (s *Solver) resetGrid(hr float64) {
	top := hr
	for _, u := range s.units {
		top = math.Max(top, u.topHead())
	}
	if s.grid == nil {
		s.grid = make([]float64, gridPoints+1)
		s.gridSpan = make([][]span, len(s.units))
		s.gridKnown = make([][]bool, len(s.units))
		for i := range s.units {
			s.gridSpan[i] = make([]span, gridPoints+1)
			s.gridKnown[i] = make([]bool, gridPoints+1)
		}
	}
	for k := range s.grid {
		s.grid[k] = hr + (top-hr)*float64(k)/gridPoints
	}
	for i := range s.gridKnown {
		clear(s.gridKnown[i])
	}
}

// spanAt returns model i's span at grid head k, computing it once per solve.
func (s *Solver) spanAt(i, k int) span {
	if !s.gridKnown[i][k] {
		s.gridSpan[i][k] = s.units[i].bounds(s.grid[k])
		s.gridKnown[i][k] = true
	}
	return s.gridSpan[i][k]
}
