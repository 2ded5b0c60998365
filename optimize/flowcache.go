package optimize

import (
	"slices"

	"wattstage/curves"
)

// SolveCache remembers a strategy's solves by a key that fixes the solve:
// the load flow (the lowest-power staging), the flow and the running-unit
// count (a common-speed sequence), the flow and the head held (a logged
// DP). A trend repeats its keys (6,426 distinct flows in the 8,724 rows of
// the example trend, its meter's resolution), and a solve is a function of
// its key alone, so a repeat is answered from the cache with the same
// bytes out. It holds at most SolveCacheSize results and starts over when
// full, so its memory stays bounded whatever the trend's length, and what
// it answers does not depend on what it holds. The zero value is ready;
// it is not safe for concurrent use (each Stream has its own).
type SolveCache[K comparable] struct {
	m     map[K]Result
	limit int // results held at most; 0 = SolveCacheSize (tests set fewer)
}

// flowCache is the cache of a strategy whose solve depends on the flow only.
type flowCache = SolveCache[curves.Flow]

// SolveCacheSize bounds a cache: about 2 kB a result on a 24-unit plant,
// a few hundred bytes on a 3-unit one. It holds every distinct flow of a
// long trend logged to a meter's resolution (22,202 in the 1,000,000-row
// generated trend of DEVELOPERS.md, where 8,192 entries kept starting
// over and re-solving).
const SolveCacheSize = 1 << 15

// Solve returns solve(key), from the cache when the key was solved before;
// a nil cache solves every time.
// A result from the cache shares its slices (units, counts, warnings) with
// it and with every other answer to the same key: the caller may keep it
// and read it, and append to its slices (they are full, so an append
// copies), but must copy a slice before changing an element. No one in
// the program changes a streamed state's elements; copying each answer
// instead took a quarter of the CPU of a 1,000,000-row trend.
func (c *SolveCache[K]) Solve(key K, solve func(K) Result) Result {
	if c == nil {
		return solve(key) // no cache: tests compare with it
	}
	if r, ok := c.m[key]; ok {
		return fullSlices(r)
	}
	r := solve(key)
	limit := c.limit
	if limit <= 0 {
		limit = SolveCacheSize
	}
	if c.m == nil || len(c.m) >= limit {
		c.m = make(map[K]Result, 256)
	}
	c.m[key] = cloneResult(r)
	return r
}

// Len is the number of results the cache holds.
func (c *SolveCache[K]) Len() int {
	if c == nil {
		return 0
	}
	return len(c.m)
}

// fullSlices caps a result's slices at their length, so that an append
// to one copies it rather than writing into the cache's array.
func fullSlices(r Result) Result {
	r.Counts = r.Counts[:len(r.Counts):len(r.Counts)]
	r.Units = r.Units[:len(r.Units):len(r.Units)]
	r.Warnings = r.Warnings[:len(r.Warnings):len(r.Warnings)]
	return r
}

// cloneResult copies a result with its own slices.
func cloneResult(r Result) Result {
	r.Counts = slices.Clone(r.Counts)
	r.Units = slices.Clone(r.Units)
	r.Warnings = slices.Clone(r.Warnings)
	return r
}
