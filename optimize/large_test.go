package optimize_test

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// largePlants are invented plants of many units and models, where the
// solver bounds the count vectors instead of evaluating each (bound.go):
// six models of two units (728 vectors), four of four (624), and four of
// seven (4,095).
func largePlants(t testing.TB) []*plant.Plant {
	t.Helper()
	L := suiteModel{name: "L", pump: pumpL, motorHP: 60}
	M := suiteModel{name: "M", pump: pumpM, motorHP: 30}
	S := suiteModel{name: "S", pump: pumpS, motorHP: 15}
	n := func(m suiteModel, count int) suiteModel { m.count = count; return m }
	mod := func(m suiteModel, name string, f func(*suiteModel)) suiteModel { m.name = name; f(&m); return m }
	steep := func(m *suiteModel) { m.pump.shutoff, m.pump.bepEff = 1.4, m.pump.bepEff-0.03 }
	flat := func(m *suiteModel) { m.pump.shutoff, m.pump.bepEff = 1.12, m.pump.bepEff-0.02 }
	specs := []suitePlant{
		{name: "six-models-of-two", system: dp(0.45, 30, 0.4), models: []suiteModel{
			n(L, 2), n(M, 2), n(S, 2), n(mod(L, "L-steep", steep), 2), n(mod(M, "M-flat", flat), 2),
			n(mod(S, "S-steep", steep), 2)}},
		{name: "four-models-of-four", system: dp(0.55, 30, 0.35), minFlow: 0.05, models: []suiteModel{
			n(L, 4), n(M, 4), n(mod(L, "L-flat", flat), 4), n(mod(M, "M-steep-corrected", func(m *suiteModel) {
				steep(m)
				m.pump.speedCorrection = true
			}), 4)}},
		{name: "four-models-of-seven", system: dp(0.80, 30, 0.4), models: []suiteModel{
			n(L, 7), n(M, 7), n(mod(L, "L-steep", steep), 7), n(mod(M, "M-flat", flat), 7)}},
	}
	var out []*plant.Plant
	for _, s := range specs {
		out = append(out, s.build(t))
	}
	return out
}

// mixedOf is a plant with one unit of its first model left across the line
// (a partial drive retrofit, optimize.PartialVariant): fixed-speed units
// beside variable ones, where a higher head lowers the fixed units' flow
// and draw and the bounds at the required head do not hold (bestvector.go).
func mixedOf(p *plant.Plant) *plant.Plant {
	w := make([]int, len(p.Models))
	for i, m := range p.Models {
		w[i] = m.Count
	}
	w[0]--
	v := optimize.PartialVariant(p, w, p.Models[0].Drive)
	v.Name = p.Name + "-one-fixed"
	return v
}

// fixedOf is a plant with every unit across the line, as the throttled
// strategy runs it (optimize.FixedVariant).
func fixedOf(p *plant.Plant) *plant.Plant {
	v := optimize.FixedVariant(p)
	v.Name = p.Name + "-fixed"
	return v
}

// fewestUnits solves a flow with the fewest running units that serve it,
// as the throttled strategy does.
func fewestUnits(s *optimize.Solver, p *plant.Plant, q curves.Flow) optimize.Result {
	units := 0
	for _, m := range p.Models {
		units += m.Count
	}
	for n := 1; n <= units; n++ {
		if r := s.SolveWith(q, optimize.Constraint{Total: n}); r.Status == optimize.Served {
			return r
		}
	}
	return s.Solve(q)
}

// TestBoundsKeepTheBest checks the bounded search (bound.go, branch.go)
// against the same solver evaluating every count vector, on the large
// plants, at flows from 2 % to 105 % of design: the brute-force reference
// of the optimality suite searches each unit's speed on a grid, which is
// exponential in the running units and out of reach on these plants, and
// the exhaustive evaluation is the method the suite verified before the
// bounds. Power within the suite's 0.05 %, and served where it serves.
// The plants run as given, with one unit across the line (mixedOf), and
// all across the line (the throttled strategy's variant), where each flow
// is also solved as that strategy does: the fewest units that serve it.
func TestBoundsKeepTheBest(t *testing.T) {
	t.Parallel()
	plants := largePlants(t)
	plants = append(plants, mixedOf(plants[0]), mixedOf(plants[1]),
		fixedOf(plants[0]), fixedOf(plants[1]), fixedOf(plants[2]))
	flows := 40
	if testing.Short() {
		flows = 6
	} else {
		plants = append(plants, benchPlant24(t))
	}
	for _, p := range plants {
		t.Run(p.Name, func(t *testing.T) {
			t.Parallel()
			bounded := optimize.New(p, optimize.Options{})
			every := optimize.New(p, optimize.Options{})
			optimize.SetEveryVector(every, true)
			var worst float64
			served := 0
			for k := range flows {
				q := p.DesignFlow * curves.Flow(0.02+1.03*float64(k)/float64(flows-1))
				label := fmt.Sprintf("load %.4g m³/s", float64(q))
				if d, ok := samePlan(t, label, "bounded", "every vector", bounded.Solve(q), every.Solve(q)); ok {
					served++
					worst = math.Max(worst, d)
				}
				if !p.Models[0].Drive.Variable() {
					got, want := fewestUnits(bounded, p, q), fewestUnits(every, p, q)
					if d, ok := samePlan(t, label+", fewest units", "bounded", "every vector", got, want); ok {
						worst = math.Max(worst, d)
					}
				}
			}
			if served < flows/2 {
				t.Errorf("only %d of %d flows served: the check says little", served, flows)
			}
			t.Logf("%s: %d served flows, worst bounded vs every vector %+.2e", p.Name, served, worst)
		})
	}
}

// TestTableKeepsTheBest checks the staging table over the load flow
// (flowtable.go) against the branch and bound alone (itself checked against
// every vector above) at random flows from 2 % to 107 % of design, between
// the table's ends: with any number of running units, with a given number
// (a staged sequence's solves, which have tables of their own), at a given
// head from 85 % to 120 % of the need (a logged DP: ends on a grid of flow
// and head) and with one common speed. The same status everywhere and the same power within
// the suite's 0.05 % (measured: identical at 1,500 flows on each plant).
// It also checks that the table did the work: at most 8 vectors kept an
// end on average (0.9–4.8 measured), else the point's cost would grow with
// the plant again.
func TestTableKeepsTheBest(t *testing.T) {
	t.Parallel()
	large := largePlants(t)
	plants := append(large, benchPlant8Corrected(t), mixedOf(large[0]), mixedOf(large[1]))
	flows := 1500
	if testing.Short() {
		plants, flows = plants[:1], 150
	} else {
		plants = append(plants, benchPlant24(t))
	}
	for _, p := range plants {
		for _, opt := range []optimize.Options{{}, {CommonSpeed: true}} {
			name := p.Name
			if opt.CommonSpeed {
				name += "/common-speed"
			}
			t.Run(name, func(t *testing.T) {
				t.Parallel()
				checkTable(t, p, opt, flows)
			})
		}
	}
}

func checkTable(t *testing.T, p *plant.Plant, opt optimize.Options, flows int) {
	units := 0
	for _, m := range p.Models {
		units += m.Count
	}
	rng := rand.New(rand.NewPCG(7, uint64(len(p.Models))))
	table := optimize.New(p, opt)
	bounded := optimize.New(p, opt)
	optimize.SetTable(bounded, false)
	if opt.CommonSpeed {
		flows /= 5 // each vector needs its own speed search
	}
	var worst float64
	served := 0
	for k := range 3 * flows {
		q := p.DesignFlow * curves.Flow(0.02+1.05*rng.Float64())
		var c optimize.Constraint
		switch k % 3 {
		case 1:
			c.Total = 1 + rng.IntN(units)
		case 2:
			// A given head (a logged DP) from 85 % to 120 % of the need.
			c.Head = p.RequiredHead(q) * curves.Head(0.85+0.35*rng.Float64())
		}
		label := fmt.Sprintf("load %.6g m³/s, %d units, head %.6g m", float64(q), c.Total, float64(c.Head))
		if d, ok := samePlan(t, label, "table", "branch and bound", table.SolveWith(q, c), bounded.SolveWith(q, c)); ok {
			served++
			worst = math.Max(worst, d)
		}
	}
	ends, vectors := optimize.TableEnds(table)
	if ends == 0 || vectors > 8*ends {
		t.Errorf("%d table ends keep %d vectors: the table is not narrowing the search", ends, vectors)
	}
	if served < flows/2 {
		t.Errorf("only %d of %d solves served: the check says little", served, 3*flows)
	}
	t.Logf("%s: %d served solves, %d ends (%.1f vectors an end), worst table vs branch and bound %+.2e",
		p.Name, served, ends, float64(vectors)/float64(ends), worst)
}

// TestChangeOptionsCheapest checks the options a staging change lists on a
// plant of many combinations (the cheapest eight of a count, found by the
// branch and bound) against every combination of that count priced one by
// one: the same combinations in the same order, and the rest counted.
func TestChangeOptionsCheapest(t *testing.T) {
	t.Parallel()
	p := largePlants(t)[0] // six models of two: 728 vectors
	for _, c := range []struct {
		share float64
		n     int
	}{{0.3, 3}, {0.55, 5}, {0.8, 7}} {
		q := p.DesignFlow * curves.Flow(c.share)
		got, others := optimize.ChangeOptions(p, q, c.n)
		var all []optimize.Option
		for _, cnt := range everyCount(p, c.n) {
			r := optimize.CountsAt(p, q, cnt)
			if r.Status == optimize.Served {
				all = append(all, optimize.Option{Counts: cnt, Power: r.Power, Served: true})
			}
		}
		slices.SortStableFunc(all, func(a, b optimize.Option) int { return cmp.Compare(a.Power, b.Power) })
		if len(all) < 8 || len(got) != 8 {
			t.Fatalf("%d units at %.0f %%: %d served combinations, %d listed", c.n, 100*c.share, len(all), len(got))
		}
		for k := range got {
			if !got[k].Served || math.Abs(float64(got[k].Power/all[k].Power)-1) > 1e-9 {
				t.Errorf("%d units at %.0f %%, option %d: listed %v %.6g kW, cheapest %v %.6g kW",
					c.n, 100*c.share, k+1, got[k].Counts, float64(got[k].Power)/1e3, all[k].Counts, float64(all[k].Power)/1e3)
			}
		}
		if want := len(everyCount(p, c.n)) - 8; others != want {
			t.Errorf("%d units: %d left out, want %d", c.n, others, want)
		}
	}
}

// everyCount lists every vector of running counts with n units in all.
func everyCount(p *plant.Plant, n int) [][]int {
	var out [][]int
	cur := make([]int, len(p.Models))
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == len(cur) {
			if left == 0 {
				out = append(out, slices.Clone(cur))
			}
			return
		}
		for k := 0; k <= min(p.Models[i].Count, left); k++ {
			cur[i] = k
			rec(i+1, left-k)
		}
		cur[i] = 0
	}
	rec(0, n)
	return out
}

// samePlan checks a solve against a reference solve of the same load: the
// same status, and where served the power within the suite's 0.05 %. It
// returns the relative excess of got's power and whether both served.
func samePlan(t *testing.T, label, gotName, wantName string, got, want optimize.Result) (float64, bool) {
	t.Helper()
	if got.Status != want.Status {
		t.Errorf("%s: %s %v (%s), %s %v (%s)", label, gotName, got.Status, got.Reason, wantName, want.Status, want.Reason)
		return 0, false
	}
	if want.Status != optimize.Served {
		return 0, false
	}
	d := float64(got.Power/want.Power) - 1
	if d > suiteTol {
		t.Errorf("%s: %s %.6g kW %v, %s %.6g kW %v (%+.2e)",
			label, gotName, float64(got.Power)/1e3, got.Counts, wantName, float64(want.Power)/1e3, want.Counts, d)
	}
	return d, true
}
