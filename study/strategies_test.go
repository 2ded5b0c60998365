package study_test

import (
	"math"
	"path/filepath"
	"testing"

	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/profile"
	"wattstage/study"
)

// examplePlanSteps loads an example plant and its profile as steps.
func examplePlanSteps(t *testing.T, name string) (*plant.Plant, []optimize.Step) {
	t.Helper()
	p, err := plant.Load(filepath.Join("..", "examples", name))
	if err != nil {
		t.Fatal(err)
	}
	if p.Profile.Trend == nil {
		return p, optimize.StepsFromBins(p.Profile.Bins)
	}
	spec := *p.Profile.Trend
	spec.Path = filepath.Join(filepath.Dir(p.Source), spec.Path)
	tr, err := profile.ReadTrendFile(spec, spec.Path)
	if err != nil {
		t.Fatal(err)
	}
	return p, optimize.StepsFromTrend(tr.Points)
}

// TestLowestNeverBeaten: on the examples, no strategy that runs the same
// equipment (drives where the plant file has them) draws less than the
// lowest-power staging at any interval or bin. Strategies on other
// equipment — across-the-line units have no drive losses — are reported
// where they draw less, with the size of the difference, and must stay
// within the drive's own losses (5 % of the input).
func TestLowestNeverBeaten(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "chilled-water-trend.yaml"} {
		t.Run(name, func(t *testing.T) {
			p, steps := examplePlanSteps(t, name)
			if testing.Short() && len(steps) > 1000 {
				steps = steps[:1000]
			}
			ks := study.Strategies(p, nil)
			lowest := ks[0].Strategy.Run(steps)
			for _, k := range ks[1:] {
				run := k.Strategy.Run(steps)
				sameEquipment := k.Key == study.KeyCommon || k.Key == study.KeyCurrent
				worst := 0.0
				for i := range steps {
					lo, o := lowest.Points[i], run.Points[i]
					if lo.Status != optimize.Served || o.Status != optimize.Served {
						if o.Status == optimize.Served && lo.Status != optimize.Served {
							t.Errorf("%s serves step %d (%.4g m³/s) that the lowest-power staging calls unmet", run.Name, i, float64(steps[i].Load))
						}
						continue
					}
					gap := float64(lo.Power-o.Power) / float64(lo.Power)
					worst = math.Max(worst, gap)
					if sameEquipment && gap > 1e-9 {
						t.Errorf("%s beats the lowest-power staging at step %d (%.4g m³/s): %.4f kW against %.4f kW",
							run.Name, i, float64(steps[i].Load), float64(o.Power)/1000, float64(lo.Power)/1000)
					}
				}
				if !sameEquipment && worst > 0 {
					t.Logf("%s (other equipment) draws up to %.2f %% less than the lowest-power staging at some step", run.Name, 100*worst)
					if worst > 0.05 {
						t.Errorf("%s draws %.2f %% less at some step: more than a drive's losses explain", run.Name, 100*worst)
					}
				}
			}
		})
	}
}
