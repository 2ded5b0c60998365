package handover_test

import (
	"math"
	"path/filepath"
	"sync"
	"testing"

	"wattstage/handover"
	"wattstage/plant"
	"wattstage/study"
	"wattstage/workbook"
)

// The shipped example plants (invented data, see examples/), each run the
// way `wattstage plan` runs it: study.Prepare then study.Run, the same
// calls cmd/plan.go makes, then handover.Build.
var exampleFiles = []string{
	"chilled-water.yaml",
	"condenser-water.yaml",
	"chilled-water-trend.yaml",
}

// example is one example plant, its study and its workbook report.
type example struct {
	name   string // file name under examples/
	path   string
	plant  *plant.Plant
	result *study.Result
	report *workbook.Report
}

var (
	examplesMu sync.Mutex
	examples   = map[string]*example{}
)

// loadExample loads, studies and maps an example once per test binary:
// the trend study takes a few seconds.
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

func buildExample(name string) (*example, error) {
	path := filepath.Join("..", "examples", name)
	p, err := plant.Load(path)
	if err != nil {
		return nil, err
	}
	in, err := study.Prepare(p, 0)
	if err != nil {
		return nil, err
	}
	ex := &example{name: name, path: path, plant: p}
	if ex.result, err = study.Run(in, study.Options{}); err != nil {
		return nil, err
	}
	if ex.report, err = handover.Build(ex.result); err != nil {
		return nil, err
	}
	return ex, nil
}

func near(got, want, tol float64) bool {
	if math.IsNaN(got) || math.IsNaN(want) {
		return math.IsNaN(got) && math.IsNaN(want)
	}
	d := math.Abs(got - want)
	return d <= tol*math.Abs(want) || want == 0 && d <= tol
}
