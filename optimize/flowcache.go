package optimize

import (
	"slices"

	"wattstage/curves"
)

// flowCache remembers the solves of a strategy by load flow: a trend
// repeats flows (6,426 distinct flows in the 8,724 rows of the example
// trend, its meter's resolution), and a solve is a function of the flow
// alone, so a repeat is answered from the cache with the same bytes out.
// It holds at most flowCacheSize results and starts over when full, so its
// memory stays bounded whatever the trend's length.
type flowCache struct {
	m map[curves.Flow]Result
}

// flowCacheSize bounds a cache: about 2 kB a result on a 24-unit plant,
// a few hundred bytes on a 3-unit one. It holds every distinct flow of a
// long trend logged to a meter's resolution (22,202 in the 1,000,000-row
// generated trend of DEVELOPERS.md, where 8,192 entries kept starting
// over and re-solving).
const flowCacheSize = 1 << 15

// solve returns solve(load), from the cache when the flow was solved
// before. The result is a copy the caller may keep or change.
func (c *flowCache) solve(load curves.Flow, solve func(curves.Flow) Result) Result {
	if r, ok := c.m[load]; ok {
		return cloneResult(r)
	}
	r := solve(load)
	if c.m == nil || len(c.m) >= flowCacheSize {
		c.m = make(map[curves.Flow]Result, 256)
	}
	c.m[load] = cloneResult(r)
	return r
}

// cloneResult copies a result with its own slices.
func cloneResult(r Result) Result {
	r.Counts = slices.Clone(r.Counts)
	r.Units = slices.Clone(r.Units)
	r.Warnings = slices.Clone(r.Warnings)
	return r
}
