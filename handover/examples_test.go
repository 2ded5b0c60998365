package handover_test

import (
	"fmt"
	"math"
	"path/filepath"
	"sync"
	"testing"

	"wattstage/handover"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/profile"
	"wattstage/workbook"
)

// The shipped example plants (invented data, see examples/), each run the
// way `wattstage plan` runs it.
var exampleFiles = []string{
	"chilled-water.yaml",
	"condenser-water.yaml",
	"chilled-water-trend.yaml",
}

// example is one example plant, its annual plan and its workbook report.
type example struct {
	name   string // file name under examples/
	path   string
	plant  *plant.Plant
	steps  []optimize.Step // the plan's steps: the bins, or every trend interval
	binned *profile.Binned // the trend binned at design flow / 20; nil for bins
	plan   *optimize.Plan
	input  handover.Input
	report *workbook.Report
}

var (
	examplesMu sync.Mutex
	examples   = map[string]*example{}
)

// loadExample loads, plans and maps an example once per test binary: the
// trend plan takes about a second.
func loadExample(t *testing.T, name string) *example {
	t.Helper()
	examplesMu.Lock()
	defer examplesMu.Unlock()
	if ex, ok := examples[name]; ok {
		return ex
	}
	ex, err := buildExample(name)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	examples[name] = ex
	return ex
}

// buildExample follows cmd/plan.go: bins become steps directly; a trend is
// read relative to the plant file and solved interval by interval, and its
// load points are the trend binned at 5 % of design flow.
func buildExample(name string) (*example, error) {
	path := filepath.Join("..", "examples", name)
	p, err := plant.Load(path)
	if err != nil {
		return nil, err
	}
	ex := &example{name: name, path: path, plant: p}
	if p.Profile.Trend == nil {
		ex.steps = optimize.StepsFromBins(p.Profile.Bins)
	} else {
		spec := *p.Profile.Trend
		if !filepath.IsAbs(spec.Path) {
			spec.Path = filepath.Join(filepath.Dir(p.Source), spec.Path)
		}
		tr, err := profile.ReadTrendFile(spec, spec.Path)
		if err != nil {
			return nil, err
		}
		ex.steps = optimize.StepsFromTrend(tr.Points)
		if ex.binned, err = tr.Bin(p.DesignFlow / 20); err != nil {
			return nil, err
		}
	}
	if ex.plan, err = optimize.NewPlan(p, ex.steps, optimize.PlanOptions{}); err != nil {
		return nil, err
	}
	ex.input = handover.Input{Plant: p, Plan: ex.plan, Strategies: ex.plan.Strategies, LoadSteps: ex.plan.Steps,
		Staging: staging(p)}
	if ex.binned != nil {
		ex.input.LoadSteps = optimize.StepsFromBinned(ex.binned)
		ex.input.LoadNote = fmt.Sprintf("Load points show the trend binned into %d bins.", len(ex.binned.Bins))
	}
	if ex.report, err = handover.Build(ex.input); err != nil {
		return nil, err
	}
	return ex, nil
}

// staging is the Staging sheet's content, as the CLI gives it.
func staging(p *plant.Plant) workbook.Staging { return handover.Staging(p) }

func near(got, want, tol float64) bool {
	if math.IsNaN(got) || math.IsNaN(want) {
		return math.IsNaN(got) && math.IsNaN(want)
	}
	d := math.Abs(got - want)
	return d <= tol*math.Abs(want) || want == 0 && d <= tol
}
