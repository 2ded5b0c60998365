package study_test

import (
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/study"
)

// TestCountPowerAgreesWithLowest: the lowest of the per-count curves at a
// flow is the lowest-power staging's input there (the same solver with and
// without the count fixed), and each derived crossover lies where the two
// counts' curves cross. An internal consistency check: the chart of why
// each count wins must tell the same story as the staging it explains.
func TestCountPowerAgreesWithLowest(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml"} {
		t.Run(name, func(t *testing.T) {
			r := runPlant(t, examplePlant(t, name), study.Options{})
			if len(r.CountPower) == 0 {
				t.Fatal("no per-count power curves")
			}
			var lowest *study.PowerCurve
			for i := range r.GroupPower {
				if r.GroupPower[i].Key == study.KeyLowest {
					lowest = &r.GroupPower[i]
				}
			}
			if lowest == nil {
				t.Fatal("no group power curve of the lowest-power staging")
			}
			compared := 0
			for i, q := range lowest.Flow {
				best, at := math.Inf(1), -1
				for _, cp := range r.CountPower {
					for k, f := range cp.Flow {
						// The per-count grid and the group power grid are
						// the same 30 flows.
						if math.Abs(float64(f-q)) < 1e-12 && cp.KW[k] < best {
							best, at = cp.KW[k], k
						}
					}
				}
				if at < 0 || math.IsNaN(lowest.KW[i]) {
					continue
				}
				compared++
				// 1e-9 relative: the same solve, only the constraint differs.
				if math.Abs(best-lowest.KW[i]) > 1e-9*lowest.KW[i] {
					t.Errorf("at %.4f m³/s the best count draws %.6f kW, the lowest-power staging %.6f kW", float64(q), best, lowest.KW[i])
				}
			}
			if compared < len(lowest.Flow)/2 {
				t.Errorf("compared %d of %d flows", compared, len(lowest.Flow))
			}
			for _, tr := range r.Setpoints.Transitions {
				if tr.Crossover <= 0 {
					continue
				}
				lo, hi := sum(tr.Lower), sum(tr.Upper)
				if hi != lo+1 {
					continue
				}
				// Either side of the crossover, one grid step away, the
				// lower count is cheaper below and the upper above.
				step := r.Plant.DesignFlow / 30
				below, above := tr.Crossover-step, tr.Crossover+step
				pl, ph := kwAt(r.CountPower[lo-1], below), kwAt(r.CountPower[hi-1], below)
				if !math.IsNaN(pl) && !math.IsNaN(ph) && pl > ph*(1+1e-6) {
					t.Errorf("transition %d→%d: below the crossover %.4f m³/s, %d units draw %.3f kW, more than %d (%.3f kW)",
						lo, hi, float64(tr.Crossover), lo, pl, hi, ph)
				}
				pl, ph = kwAt(r.CountPower[lo-1], above), kwAt(r.CountPower[hi-1], above)
				if !math.IsNaN(pl) && !math.IsNaN(ph) && ph > pl*(1+1e-6) {
					t.Errorf("transition %d→%d: above the crossover %.4f m³/s, %d units draw %.3f kW, more than %d (%.3f kW)",
						lo, hi, float64(tr.Crossover), hi, ph, lo, pl)
				}
			}
		})
	}
}

// kwAt interpolates a per-count curve linearly at q; NaN outside it or
// next to a gap.
func kwAt(cp study.CountPower, q curves.Flow) float64 {
	for k := 1; k < len(cp.Flow); k++ {
		if cp.Flow[k-1] <= q && q <= cp.Flow[k] {
			f := float64((q - cp.Flow[k-1]) / (cp.Flow[k] - cp.Flow[k-1]))
			return cp.KW[k-1] + f*(cp.KW[k]-cp.KW[k-1])
		}
	}
	return math.NaN()
}

func sum(v []int) int {
	n := 0
	for _, x := range v {
		n += x
	}
	return n
}

// TestStageCurvesAddInParallel: on the mixed condenser-water example, a
// stage of identical units makes, at each header head, n times the flow of
// one unit whose head less its branch loss is that header head (checked
// forward with the pump curve); every stage's flow falls as its head
// rises; a stage's flow is at least that of any stage it contains.
func TestStageCurvesAddInParallel(t *testing.T) {
	r := runPlant(t, examplePlant(t, "condenser-water.yaml"), study.Options{})
	if len(r.StageCurves) == 0 {
		t.Fatal("no stage curves for a plant of two models")
	}
	p := r.Plant
	for _, sc := range r.StageCurves {
		models := 0
		for _, c := range sc.Counts {
			if c > 0 {
				models++
			}
		}
		for k := range sc.Flow {
			if k > 0 && (sc.Flow[k] < sc.Flow[k-1] || sc.Head[k] > sc.Head[k-1]) {
				t.Errorf("stage %v: flow %.5f at head %.3f after %.5f at %.3f: not a falling curve", sc.Counts,
					float64(sc.Flow[k]), float64(sc.Head[k]), float64(sc.Flow[k-1]), float64(sc.Head[k-1]))
			}
			if models != 1 || sc.Flow[k] <= 0 {
				continue
			}
			for i, c := range sc.Counts {
				if c == 0 {
					continue
				}
				m := p.Models[i]
				q := sc.Flow[k] / curves.Flow(c)
				h := m.Pump.Head(q, m.MaxSpeed) - curves.Head(m.BranchK*float64(q)*float64(q))
				runout := m.Runout
				if runout <= 0 {
					runout = m.Pump.LastFlow
				}
				if q >= runout*curves.Flow(m.MaxSpeed)*(1-1e-9) {
					continue // held at runout: the curve ends there
				}
				// 1e-6 m: bisection to 60 halvings of the flow range.
				if math.Abs(float64(h-sc.Head[k])) > 1e-6 {
					t.Errorf("stage %v: at %.5f m³/s per unit the curve gives %.6f m, the stage curve says %.6f m",
						sc.Counts, float64(q), float64(h), float64(sc.Head[k]))
				}
			}
		}
	}
}
