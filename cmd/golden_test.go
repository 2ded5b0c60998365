package cmd_test

import (
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden stdout files in testdata/golden")

// goldenCases are the shipped examples through every command. The
// expected stdout of each is in testdata/golden/NAME.out, written by
// `go test ./cmd -run TestGolden -update` and read in review: the goldens
// pin the reports; the numbers in them are checked against references in
// the library packages' own tests.
var goldenCases = []struct {
	name string
	args []string
}{
	{"check-chilled-water", []string{"check", "examples/chilled-water.yaml"}},
	{"check-condenser-water", []string{"check", "examples/condenser-water.yaml"}},
	{"check-chilled-water-trend", []string{"check", "examples/chilled-water-trend.yaml"}},
	{"point-chilled-water-1800", []string{"point", "examples/chilled-water.yaml", "--flow", "1800"}},
	{"point-chilled-water-60pct-units3", []string{"point", "examples/chilled-water.yaml", "--flow", "60%", "--units", "3"}},
	{"point-chilled-water-300-common", []string{"point", "examples/chilled-water.yaml", "--flow", "300", "--common-speed"}},
	{"point-condenser-water-450", []string{"point", "examples/condenser-water.yaml", "--flow", "450"}},
	{"point-condenser-water-60pct-units2", []string{"point", "examples/condenser-water.yaml", "--flow", "60%", "--units", "2"}},
	{"point-condenser-water-450-json", []string{"point", "examples/condenser-water.yaml", "--flow", "450", "--json"}},
	{"setpoints-chilled-water", []string{"setpoints", "examples/chilled-water.yaml"}},
	{"setpoints-condenser-water", []string{"setpoints", "examples/condenser-water.yaml"}},
	{"setpoints-chilled-water-trend-speed", []string{"setpoints", "examples/chilled-water-trend.yaml", "--signal", "speed"}},
	{"setpoints-chilled-water-csv", []string{"setpoints", "examples/chilled-water.yaml", "--format", "csv"}},
	{"plan-chilled-water", []string{"plan", "examples/chilled-water.yaml"}},
	{"plan-condenser-water", []string{"plan", "examples/condenser-water.yaml"}},
	{"plan-chilled-water-trend", []string{"plan", "examples/chilled-water-trend.yaml"}},
	{"plan-condenser-water-json", []string{"plan", "examples/condenser-water.yaml", "--json"}},
	{"plan-minimal-no-retrofit", []string{"plan", "testdata/plants/minimal-us.yaml"}},
	{"bins-chilled-water-trend", []string{"bins", "examples/chilled-water-trend.csv"}},
	{"bins-chilled-water-trend-width200", []string{"bins", "examples/chilled-water-trend.csv", "--width", "200"}},
}

// TestGolden runs each case from the module root (so reports name the
// files as a user types them) and compares stdout with its golden file.
// Nothing goes to stderr: it is not a terminal here, so no progress.
//
// The goldens hold printed floating-point results; a platform whose
// compiler fuses multiply-adds (arm64, ppc64, s390x) may differ in a last
// printed digit. They were written on amd64.
func TestGolden(t *testing.T) {
	dir, err := filepath.Abs(filepath.Join("testdata", "golden"))
	if err != nil {
		t.Fatal(err)
	}
	if *update {
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	t.Chdir(moduleRoot)
	for _, c := range goldenCases {
		t.Run(c.name, func(t *testing.T) {
			r := run(t, c.args...)
			if r.code != 0 || r.err != "" {
				t.Fatalf("%s", r.describe(c.args))
			}
			checkGolden(t, filepath.Join(dir, c.name+".out"), r.out)
		})
	}
}

// TestGoldenRepeatable runs the slowest case twice in one process: the
// reports must not depend on state left by an earlier run (map order,
// caches, scratch buffers).
func TestGoldenRepeatable(t *testing.T) {
	t.Chdir(moduleRoot)
	args := []string{"plan", "examples/condenser-water.yaml", "--json"}
	a, b := run(t, args...), run(t, args...)
	if a.code != 0 || a.out != b.out {
		t.Fatalf("two runs of %v differ (exit %d, %d)", args, a.code, b.code)
	}
}

func checkGolden(t *testing.T, path, got string) {
	t.Helper()
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd -run TestGolden -update)", err)
	}
	if got == string(want) {
		return
	}
	g, w := strings.Split(got, "\n"), strings.Split(string(want), "\n")
	for i := 0; i < max(len(g), len(w)); i++ {
		var gl, wl string
		if i < len(g) {
			gl = g[i]
		}
		if i < len(w) {
			wl = w[i]
		}
		if gl != wl {
			t.Fatalf("stdout differs from %s at line %d\n got: %q\nwant: %q\n(after an intended change: go test ./cmd -run TestGolden -update, then read the diff)",
				filepath.Base(path), i+1, gl, wl)
		}
	}
}
