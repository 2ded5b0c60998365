package study_test

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/handover"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
)

// longTrendPlant writes an invented one-minute trend of rows rows (flow in
// m³/h, logged pump kW) beside a copy of the condenser-water example,
// whose bins it replaces, and loads it. The plant has suction data and
// NPSHr points, so the NPSH check is made; the logged power makes the
// calibration. Flows are whole m³/h so the solves repeat (a meter's
// resolution), which keeps the test quick.
func longTrendPlant(t testing.TB, rows int) *plant.Plant {
	t.Helper()
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("timestamp,flow_m3h,pump_kw\n")
	start := time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC)
	for i := 0; i < rows; i++ {
		h := float64(i) / 60
		q := 1100 * (0.6 - 0.25*math.Cos(2*math.Pi*h/24) + 0.05*math.Sin(2*math.Pi*h/(24*7)) + 0.02*math.Sin(float64(i)*0.7))
		kw := 0.055*q + 3*math.Sin(float64(i)*0.3)
		fmt.Fprintf(&b, "%s,%.0f,%.2f\n", start.Add(time.Duration(i)*time.Minute).Format("2006-01-02 15:04"), q, kw)
	}
	if err := os.WriteFile(filepath.Join(dir, "trend.csv"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	src, err := os.ReadFile(filepath.Join("..", "examples", "condenser-water.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	skip := false
	for _, line := range strings.Split(string(src), "\n") {
		switch {
		case strings.HasPrefix(line, "profile:"):
			out = append(out, "profile:", "  trend:", "    file: trend.csv", "    time_column: timestamp",
				`    time_format: "YYYY-MM-DD hh:mm"`, "    flow_column: flow_m3h", "    flow_unit: m3/h", "    power_column: pump_kw", "")
			skip = true
		case skip && line != "" && line[0] != ' ' && line[0] != '#':
			skip = false
			out = append(out, line)
		case !skip:
			out = append(out, line)
		}
	}
	path := filepath.Join(dir, "plant.yaml")
	if err := os.WriteFile(path, []byte(strings.Join(out, "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
	p, err := plant.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// A trend longer than KeepStatesUpTo keeps no state of any strategy, a
// power series only for the lowest-power staging and the strategy the
// calibration compares, no cost per step, and at most one load point per
// flow group: what it keeps does not grow with the trend beyond those two
// series. The figures it reports must still be those computed over every
// row: the calibration (ASHRAE Guideline 14 NMBE and CV(RMSE), the
// formulas as recalled from memory, written out here independently of
// study.Calibrate), the bill (econ.Cost over the whole series) and the
// NPSH check (study.NPSHAt at every state).
func TestLongTrendBoundedAndComputedOverEveryRow(t *testing.T) {
	if testing.Short() {
		t.Skip("a 200,000-row trend: skipped with -short")
	}
	const rows = 200_000
	p := longTrendPlant(t, rows)
	in, err := study.Prepare(p, 0)
	if err != nil {
		t.Fatal(err)
	}
	if len(in.Steps) != rows {
		t.Fatalf("%d steps, want %d", len(in.Steps), rows)
	}
	r, err := study.Run(in, study.Options{})
	if err != nil {
		t.Fatal(err)
	}
	// The workbook's measured-against-predicted chart reads the kept series.
	if _, err := handover.Build(r); err != nil {
		t.Fatal(err)
	}
	c := r.Calibration
	if c == nil || r.NPSH == nil || !r.NPSH.Made {
		t.Fatalf("calibration %v, NPSH %+v: the plant should have both", c, r.NPSH)
	}
	maxGroups := int(math.Ceil(float64(p.DesignFlow)/float64(r.LoadBinWidth))) + 2
	for _, s := range r.Strategies {
		if len(s.Run.Points) != 0 {
			t.Errorf("%s kept %d states", s.Name, len(s.Run.Points))
		}
		wantSeries := s.Key == study.KeyLowest || s.Name == c.Strategy
		if s.SeriesKept() != wantSeries || (len(s.Energy.KW) > 0) != wantSeries {
			t.Errorf("%s: series kept %v (%d values), want %v", s.Name, s.SeriesKept(), len(s.Energy.KW), wantSeries)
		}
		if s.Bill.SampleCost != nil {
			t.Errorf("%s kept %d costs per step", s.Name, len(s.Bill.SampleCost))
		}
		if len(s.LoadPoints) > maxGroups {
			t.Errorf("%s: %d load points, more than the %d flow groups", s.Name, len(s.LoadPoints), maxGroups)
		}
	}

	// The calibration strategy re-run, every state kept.
	var strat optimize.Strategy
	for _, k := range study.Strategies(p, r.Setpoints) {
		if k.Strategy.Name() == c.Strategy {
			strat = k.Strategy
		}
	}
	if strat == nil {
		t.Fatalf("no strategy %q", c.Strategy)
	}
	run := optimize.Collect(strat, in.Steps)
	var n, sumM, sumE, sumE2, maxAbs float64
	series := make([]econ.Sample, len(in.Steps))
	for i, st := range in.Steps {
		res := run.Points[i]
		kw := 0.0
		if res.Status == optimize.Served {
			kw = float64(res.Power) / curves.KW
		}
		series[i] = econ.Sample{Start: st.Time, Hours: st.Hours, Power: curves.Power(kw * curves.KW)}
		if math.IsNaN(st.MeasuredKW) || res.Status != optimize.Served {
			continue
		}
		e := kw - st.MeasuredKW
		n++
		sumM += st.MeasuredKW
		sumE += e
		sumE2 += e * e
		maxAbs = math.Max(maxAbs, math.Abs(e))
	}
	mean := sumM / n
	nmbe := -sumE / ((n - 1) * mean)
	cvrmse := math.Sqrt(sumE2/(n-1)) / mean
	if float64(c.N) != n || n < rows/2 {
		t.Errorf("calibration over %d intervals, want %v (of %d rows)", c.N, n, rows)
	}
	for _, f := range []struct {
		name      string
		got, want float64
	}{{"mean logged kW", c.MeanKW, mean}, {"NMBE", c.NMBE, nmbe}, {"CV(RMSE)", c.CVRMSE, cvrmse}, {"largest error", c.MaxAbs, maxAbs}} {
		if !relClose(f.got, f.want, 1e-12) {
			t.Errorf("%s: study %v, over every row %v", f.name, f.got, f.want)
		}
	}
	want, err := econ.Cost(p.Tariff, series)
	if err != nil {
		t.Fatal(err)
	}
	want.SampleCost = nil
	var got *econ.Bill
	for _, s := range r.Strategies {
		if s.Name == c.Strategy {
			got = s.Bill
		}
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("%s bill\n%+v\nover every row\n%+v", c.Strategy, got, want)
	}

	// The NPSH check of the same strategy, from every state.
	unitHours, lowest := 0.0, math.NaN()
	for i, st := range in.Steps {
		for _, u := range study.NPSHAt(p, run.Plant.Models, run.Points[i]) {
			unitHours += st.Hours
			if !(u.Ratio >= lowest) {
				lowest = u.Ratio
			}
		}
	}
	for _, ns := range r.NPSH.Strategies {
		if ns.Name != c.Strategy {
			continue
		}
		if !relClose(ns.UnitHours, unitHours, 1e-12) || ns.LowestRatio != lowest {
			t.Errorf("NPSH of %s: %v unit-hours, lowest ratio %v; over every state %v, %v", ns.Name, ns.UnitHours, ns.LowestRatio, unitHours, lowest)
		}
		return
	}
	t.Errorf("no NPSH figures for %s", c.Strategy)
}
