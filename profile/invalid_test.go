package profile

import (
	"encoding/json"
	"errors"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"wattstage/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the .golden files of the bad-trend corpus")

// corpusDir holds bad trend files, each with the exact expected message in
// NAME.golden and, where the file needs a spec other than corpusSpec, the
// fields to change in NAME.spec.json.
const corpusDir = "../testdata/invalid/trends"

var corpusSpec = TrendSpec{
	TimeColumn:  "timestamp",
	FlowColumn:  "plant_flow_gpm",
	DPColumn:    "loop_dp_psi",
	PowerColumn: "pump_kw",
	FlowUnit:    "gpm",
	DPUnit:      "psi",
}

func TestInvalidTrends(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(corpusDir, "*.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 15 {
		t.Fatalf("%d bad trend files, want at least 15", len(files))
	}
	for _, path := range files {
		name := strings.TrimSuffix(filepath.Base(path), ".csv")
		t.Run(name, func(t *testing.T) {
			spec := corpusSpec
			if b, err := os.ReadFile(strings.TrimSuffix(path, ".csv") + ".spec.json"); err == nil {
				if err := json.Unmarshal(b, &spec); err != nil {
					t.Fatal(err)
				}
			}
			f, err := os.Open(path)
			if err != nil {
				t.Fatal(err)
			}
			defer f.Close()
			shown := "testdata/invalid/trends/" + filepath.Base(path) // as the user would name it from the module root
			tr, err := ReadTrend(spec, f, shown)
			if err == nil {
				t.Fatalf("read %d points from a bad file; report %s", len(tr.Points), tr.Report.Summary())
			}
			var pe *ParseError
			if !errors.As(err, &pe) && !errors.Is(err, ErrSpec) {
				t.Errorf("error %T is neither a *ParseError nor a spec error", err)
			}
			if pe != nil && (pe.File != shown || !strings.HasPrefix(err.Error(), shown)) {
				t.Errorf("error does not name the file: %v", err)
			}
			got := err.Error() + "\n"
			golden.Check(t, strings.TrimSuffix(path, ".csv")+".golden", got, *update, "go test ./profile -run TestInvalidTrends -update")
		})
	}
}
