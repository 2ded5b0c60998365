package study_test

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"wattstage/plant"
	"wattstage/study"
)

// examplePlant loads a shipped example plant (invented data).
func examplePlant(t testing.TB, name string) *plant.Plant {
	t.Helper()
	p, err := plant.Load(filepath.Join("..", "examples", name))
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// runPlant prepares and runs a study of a loaded plant, as cmd/plan does.
func runPlant(t testing.TB, p *plant.Plant, opt study.Options) *study.Result {
	t.Helper()
	in, err := study.Prepare(p, 0)
	if err != nil {
		t.Fatal(err)
	}
	r, err := study.Run(in, opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// trendPlantYAML is the trend example's plant with the trend file, time
// format and zone replaced: a plant file for invented test trends.
func trendPlantYAML(t testing.TB, csv string) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "examples", "chilled-water-trend.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, line := range strings.Split(string(b), "\n") {
		switch k := strings.TrimSpace(line); {
		case strings.HasPrefix(k, "file:"):
			out = append(out, "    file: "+csv)
		case strings.HasPrefix(k, "time_zone:"), strings.HasPrefix(k, "dp_column:"), strings.HasPrefix(k, "dp_unit:"),
			strings.HasPrefix(k, "power_column:"):
			// UTC stamps; flow only.
		default:
			out = append(out, line)
		}
	}
	return strings.Join(out, "\n")
}

// writeTrendPlant writes an invented hourly trend (flow in gpm at each
// stamp) beside a copy of the trend example's plant file and loads it.
func writeTrendPlant(t testing.TB, stamps []time.Time, gpm []float64) *plant.Plant {
	t.Helper()
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("timestamp,plant_flow_gpm\n")
	for i, s := range stamps {
		fmt.Fprintf(&b, "%s,%.1f\n", s.Format("2006-01-02 15:04"), gpm[i])
	}
	if err := os.WriteFile(filepath.Join(dir, "trend.csv"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, "plant.yaml")
	if err := os.WriteFile(path, []byte(trendPlantYAML(t, "trend.csv")), 0o644); err != nil {
		t.Fatal(err)
	}
	p, err := plant.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// weekFlow is an invented weekly load in gpm for tests (not a reference):
// a daily swing between about 25 % and 85 % of the 3,000 gpm design flow,
// lower at weekends, with a deterministic ripple.
func weekFlow(hourOfWeek int) float64 {
	h := float64(hourOfWeek)
	day := hourOfWeek / 24
	level := 1.0
	if day >= 5 {
		level = 0.7
	}
	frac := level * (0.55 - 0.30*math.Cos(2*math.Pi*h/24) + 0.03*math.Sin(2*math.Pi*h*1.7))
	return 3000 * frac
}

// hourly returns n hourly stamps from start (UTC) and the weekly load at each.
func hourly(start time.Time, n int) ([]time.Time, []float64) {
	stamps := make([]time.Time, n)
	flows := make([]float64, n)
	for i := range stamps {
		stamps[i] = start.Add(time.Duration(i) * time.Hour)
		flows[i] = weekFlow(i % 168)
	}
	return stamps, flows
}

func relClose(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Max(math.Abs(want), 1e-12)
}
