package optimize

import (
	"math"
	"reflect"
	"testing"
	"time"

	"wattstage/curves"
	"wattstage/plant"
)

// stagedTrend is an invented one-minute trend over two days with a gap of
// eight hours (a restart): a daily swing read to a 10 gpm resolution, so
// flows repeat, and wide enough that the sequence stages up and down.
func stagedTrend() []Step {
	start := time.Date(2025, 3, 1, 0, 0, 0, 0, time.UTC)
	var steps []Step
	for i := 0; i < 2*24*60; i++ {
		if i >= 1800 && i < 1800+8*60 {
			continue
		}
		h := float64(i) / 60
		gpm := 1400 - 1000*math.Cos(2*math.Pi*h/24) + 60*math.Sin(float64(i)*0.9)
		q := curves.Flow(math.Round(gpm/10) * 10 * curves.GPM)
		steps = append(steps, Step{Time: start.Add(time.Duration(i) * time.Minute), Load: q, Hours: 1.0 / 60, MeasuredKW: math.NaN()})
	}
	return steps
}

// collectStaged streams s over steps with the cache c (nil: none) and
// keeps every state, and the most results the cache held at any step.
func collectStaged(s *Staged, steps []Step, c *SolveCache[stagedKey]) (Run, []Result, int) {
	var out []Result
	most := 0
	run := s.stream(steps, func(_ int, r *Result) {
		out = append(out, cloneResult(*r))
		if c != nil {
			most = max(most, c.Len())
		}
	}, c)
	return run, out, most
}

// The cache of the common-speed sequence changes no result: the states and
// the count of stage changes are those of solving every step, with the
// default bound and with a bound small enough that the cache starts over
// many times; the cache holds no more than its bound, and it answers
// repeats (it holds fewer results than it was asked for).
func TestStagedCacheChangesNothing(t *testing.T) {
	p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	s := NewStaged("staged", p, plant.Sequence{StageUpSpeed: 0.95, StageDownSpeed: 0.6, StageUpDelayMin: 5, StageDownDelayMin: 10})
	timed := stagedTrend()
	var bins []Step
	for _, st := range timed[:400] {
		bins = append(bins, Step{Load: st.Load, Hours: 10, MeasuredKW: math.NaN()})
	}
	for _, tc := range []struct {
		name  string
		steps []Step
	}{{"trend", timed}, {"bins", bins}} {
		t.Run(tc.name, func(t *testing.T) {
			wantRun, want, _ := collectStaged(s, tc.steps, nil)
			if tc.name == "trend" && wantRun.Changes < 4 {
				t.Fatalf("only %d stage changes: the trend should stage up and down", wantRun.Changes)
			}
			for _, limit := range []int{0, 16} {
				c := &SolveCache[stagedKey]{limit: limit}
				run, got, most := collectStaged(s, tc.steps, c)
				bound := limit
				if bound == 0 {
					bound = SolveCacheSize
				}
				if most > bound {
					t.Errorf("bound %d: the cache held %d results", bound, most)
				}
				if limit == 0 && (most == 0 || most >= len(tc.steps)) {
					t.Errorf("the cache held at most %d results over %d steps: repeats should be answered from it", most, len(tc.steps))
				}
				if run.Changes != wantRun.Changes || !reflect.DeepEqual(got, want) {
					t.Errorf("bound %d: cached run differs (%d changes, want %d)", bound, run.Changes, wantRun.Changes)
				}
			}
		})
	}
}

// The derived sequence's cache changes no result either: states, stage
// changes and starts are those of solving every step, with the default
// bound and with a bound of 16.
func TestSequencedCacheChangesNothing(t *testing.T) {
	p := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}))
	sp, err := DeriveSetpoints(p, SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	q := NewSequenced("derived", sp, FlowBasis)
	steps := stagedTrend()
	collect := func(c *SolveCache[stageKey]) (Run, Cycling, []Result) {
		var out []Result
		run, cy := q.streamCycling(steps, func(_ int, r *Result) { out = append(out, cloneResult(*r)) }, c)
		return run, cy, out
	}
	wantRun, wantCy, want := collect(nil)
	if wantRun.Changes < 4 {
		t.Fatalf("only %d stage changes: the trend should stage up and down", wantRun.Changes)
	}
	for _, limit := range []int{0, 16} {
		c := &SolveCache[stageKey]{limit: limit}
		run, cy, got := collect(c)
		if limit == 0 && (c.Len() == 0 || c.Len() >= len(steps)) {
			t.Errorf("the cache holds %d results over %d steps: repeats should be answered from it", c.Len(), len(steps))
		}
		if run.Changes != wantRun.Changes || !reflect.DeepEqual(cy, wantCy) || !reflect.DeepEqual(got, want) {
			t.Errorf("bound %d: cached run differs (%d changes, want %d)", limit, run.Changes, wantRun.Changes)
		}
	}
}

// The solves by running-unit count start at fewestMayServe: no smaller
// count serves the load (so starting there changes no result), and where
// it says none can, no count does. Checked with every unit on a drive and
// all across the line (the throttled strategy's variant), two sizes.
func TestFewestMayServeSkipsOnlyShortCounts(t *testing.T) {
	base := testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}), testModel(t, "small", 2, 0.6, curves.DOEDrive{}))
	for _, p := range []*plant.Plant{base, FixedVariant(base)} {
		s := New(p, Options{})
		skipped := 0
		for k := range 60 {
			q := p.DesignFlow * curves.Flow(0.02+2.0*float64(k)/59)
			n0 := s.fewestMayServe(q)
			top := 5
			if n0 > 0 {
				top = n0 - 1
			}
			for n := 1; n <= top; n++ {
				skipped++
				if r := s.SolveWith(q, Constraint{Total: n}); r.Status == Served {
					t.Errorf("%s, load %.4g m³/s: %d units serve it, below the %d fewestMayServe gives", p.Models[0].Drive, float64(q), n, n0)
				}
			}
		}
		if skipped == 0 {
			t.Errorf("no count was skipped: the check says nothing")
		}
	}
}
