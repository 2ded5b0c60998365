package optimize

import (
	"slices"

	"wattstage/curves"
)

// segment is a run of scan points with one optimal combination.
type segment struct {
	counts []int
	i0, i1 int // first and last grid index
}

// scan finds the optimal combination at every grid flow and groups the
// points into segments. A combination that comes back after another (a
// non-monotone optimum, docs/sources.md §10) absorbs the excursion: a sequence needs
// one order of stages.
func (d *deriver) scan(grid []curves.Flow) []segment {
	var segs []segment
	gapFrom := -1
	for i, q := range grid {
		r := d.s.Solve(q)
		if r.Status != Served {
			if gapFrom < 0 {
				gapFrom = i
			}
			continue
		}
		if gapFrom >= 0 {
			d.warnf("no combination of running units serves %s to %s: %s",
				d.fmtQ(grid[gapFrom]), d.fmtQ(grid[i-1]), d.s.Solve(grid[gapFrom]).Reason)
			gapFrom = -1
		}
		if n := len(segs); n > 0 && slices.Equal(segs[n-1].counts, r.Counts) {
			segs[n-1].i1 = i
			continue
		}
		segs = append(segs, segment{counts: append([]int(nil), r.Counts...), i0: i, i1: i})
	}
	for merged := true; merged; {
		merged = false
		for i := 0; i < len(segs) && !merged; i++ {
			for j := len(segs) - 1; j > i+1; j-- {
				if slices.Equal(segs[i].counts, segs[j].counts) {
					d.warnf("the lowest-power staging is not monotone in flow: %s is best again from %s; the sequence keeps it from %s to %s",
						d.describe(segs[i].counts), d.fmtQ(grid[segs[j].i0]), d.fmtQ(grid[segs[i].i0]), d.fmtQ(grid[segs[j].i1]))
					segs[i].i1 = segs[j].i1
					segs = append(segs[:i+1], segs[j+1:]...)
					merged = true
					break
				}
			}
		}
	}
	return segs
}
