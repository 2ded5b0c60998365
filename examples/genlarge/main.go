// Command genlarge writes invented plants and trend logs of any size, for
// measuring how the optimiser and `wattstage plan` scale (DEVELOPERS.md,
// "Benchmarks"). Everything it writes is a made-up scenario: pump curves
// scaled from one invented 1000 gpm end-suction curve by the affinity-like
// similarity rules (flow × f, head × g, power × f·g), motors of the next
// standard NEMA size, a DP-controlled chilled-water loop of 3000 gpm design.
// The output is deterministic: the same flags give the same bytes.
//
//	go run ./examples/genlarge -models 6 -units 24 -o /tmp/big.yaml \
//	    -trend ../examples/chilled-water-trend.csv
//	go run ./examples/genlarge -models 3 -units 8 -o /tmp/q.yaml \
//	    -rows 35040 -step 15m -csv /tmp/q.csv
//
// With -csv it also writes a trend of -rows rows at -step from 2025-01-01
// 00:00 UTC (a seasonal and a daily swing around 60 % of design flow, with
// noise) and points the plant at it; with -trend it points the plant at an
// existing trend (a path relative to the plant file) with the columns of
// examples/chilled-water-trend.csv.
package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"time"
)

func main() {
	models := flag.Int("models", 3, "pump models (1–12)")
	units := flag.Int("units", 8, "installed units, shared out as evenly as the models allow")
	out := flag.String("o", "", "plant file to write (default stdout)")
	csvPath := flag.String("csv", "", "trend file to write beside the plant (needs -rows)")
	rows := flag.Int("rows", 8760, "rows of the written trend")
	step := flag.Duration("step", time.Hour, "interval of the written trend")
	trend := flag.String("trend", "", "existing trend file the plant reads, relative to the plant file")
	flag.Parse()
	if err := run(*models, *units, *out, *csvPath, *rows, *step, *trend); err != nil {
		fmt.Fprintln(os.Stderr, "genlarge:", err)
		os.Exit(1)
	}
}

func run(models, units int, out, csvPath string, rows int, step time.Duration, trend string) error {
	if models < 1 || models > 12 || units < models || units > 20*models {
		return fmt.Errorf("need 1–12 models and from one to 20 units per model, got %d models, %d units", models, units)
	}
	if csvPath != "" {
		if err := writeFile(csvPath, func(w io.Writer) error { return writeTrend(w, rows, step) }); err != nil {
			return err
		}
		trend = csvPath
		if out != "" {
			if rel, err := filepath.Rel(filepath.Dir(out), csvPath); err == nil {
				trend = rel
			}
		}
	}
	return writeFile(out, func(w io.Writer) error { return writePlant(w, models, units, trend) })
}

func writeFile(path string, write func(io.Writer) error) error {
	if path == "" {
		return write(os.Stdout)
	}
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(f)
	if err := write(bw); err != nil {
		f.Close()
		return err
	}
	if err := bw.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// base is the invented rated-speed curve every model is scaled from:
// flow gpm, head ft, efficiency %.
var base = [][3]float64{{0, 118, 0}, {400, 112, 60}, {700, 103, 77}, {1000, 91, 84}, {1200, 80, 83}, {1400, 67, 77}}

// nemaHP are standard NEMA motor ratings, hp.
var nemaHP = []float64{5, 7.5, 10, 15, 20, 25, 30, 40, 50, 60, 75, 100, 125, 150, 200, 250, 300}

const designGPM = 3000.0

// counts shares units among models as evenly as possible, larger shares first.
func counts(models, units int) []int {
	c := make([]int, models)
	for i := range c {
		c[i] = units / models
		if i < units%models {
			c[i]++
		}
	}
	return c
}

func writePlant(w io.Writer, models, units int, trend string) error {
	cnt := counts(models, units)
	// Flow factors spread from 0.6 to 1.4 of a common size, then scaled
	// so the installed BEP flow is 1.5 × design; head factors alternate
	// around 1 so the models differ in shape of operation, not just size.
	raw := make([]float64, models)
	sum := 0.0
	for i := range raw {
		raw[i] = 0.6 + 0.8*float64(i)/math.Max(1, float64(models-1))
		sum += raw[i] * float64(cnt[i]) * 1000
	}
	k := 1.5 * designGPM / sum
	fmt.Fprintf(w, "# Invented plant from examples/genlarge: %d models, %d units. Not a real site.\n", models, units)
	fmt.Fprintf(w, "name: Generated plant, %d models, %d units (invented)\nunits: US\n\nfluid:\n  temperature: 44\n\npumps:\n", models, units)
	for i := range models {
		f := raw[i] * k
		g := 1.0 + 0.12*float64(i%3) - 0.04*float64(i%2)
		eff := -2.0 * float64(i%4) // a point or two below the base
		fmt.Fprintf(w, "  - name: P%02d\n    count: %d\n    rated_speed: 1780\n    curve:\n", i+1, cnt[i])
		for _, p := range base {
			if p[2] == 0 {
				fmt.Fprintf(w, "      - {flow: %.1f, head: %.1f}\n", p[0]*f, p[1]*g)
				continue
			}
			fmt.Fprintf(w, "      - {flow: %.1f, head: %.1f, efficiency: %.1f}\n", p[0]*f, p[1]*g, p[2]+eff)
		}
		hp := nemaHP[len(nemaHP)-1]
		for _, r := range nemaHP {
			if r >= 30*f*g*1.08 {
				hp = r
				break
			}
		}
		fmt.Fprintf(w, "    min_speed: 30%%\n    max_speed: 100%%\n    min_flow: %.1f\n    runout: %.1f\n", 300*f, 1400*f)
		fmt.Fprintf(w, "    motor:\n      rated_output: %g\n      service_factor: 1.15\n    drive: variable\n", hp)
	}
	fmt.Fprintf(w, `
system:
  design_flow: %g
  design_head: 90
  dp_control:
    control_head: 15 psi
    reset:
      low_flow: 40%%
      low_head: 8 psi
      high_flow: 80%%
  plant_min_flow: 600
`, designGPM)
	if trend != "" {
		fmt.Fprintf(w, `
profile:
  trend:
    file: %s
    time_column: timestamp
    time_format: "YYYY-MM-DD hh:mm"
    flow_column: plant_flow_gpm
    flow_unit: gpm
    dp_column: loop_dp_psi
    dp_unit: psi
`, trend)
	} else {
		fmt.Fprintf(w, `
profile:
  bins:
    - {flow: 900,  hours: 1500}
    - {flow: 1500, hours: 3000}
    - {flow: 2100, hours: 2760}
    - {flow: 2700, hours: 1500}
`)
	}
	fmt.Fprint(w, `
tariff:
  currency: USD
  energy_price: 0.10
  demand_charge: 12

retrofit:
  drive_cost: 7800
  other_cost: 6500
  life_years: 15
  discount_rate: 5%

sequence:
  stage_up_speed: 95%
  stage_down_speed: 45%
`)
	return nil
}

// writeTrend writes rows of flow and loop DP at the given step: flow
// f = 0.6 + 0.22 sin(season) + 0.13 sin(day) of design, ±2 % noise,
// clamped to 15–98 %; DP tracks the reset between 8 and 15 psi.
func writeTrend(w io.Writer, rows int, step time.Duration) error {
	r := rand.New(rand.NewPCG(13, 2025))
	t0 := time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC)
	if _, err := fmt.Fprintln(w, "timestamp,plant_flow_gpm,loop_dp_psi"); err != nil {
		return err
	}
	year := 365 * 24 * time.Hour
	for i := range rows {
		t := t0.Add(time.Duration(i) * step)
		ys := float64(t.Sub(t0)%year) / float64(year)
		hod := float64(t.Hour()) + float64(t.Minute())/60
		f := 0.6 + 0.22*math.Sin(2*math.Pi*(ys-0.3)) + 0.13*math.Sin(2*math.Pi*(hod-9)/24)
		f = math.Min(0.98, math.Max(0.15, f*(1+0.02*r.NormFloat64())))
		dp := 8 + 7*math.Min(1, math.Max(0, (f-0.4)/0.4))
		if _, err := fmt.Fprintf(w, "%s,%.1f,%.2f\n", t.Format("2006-01-02 15:04"), f*designGPM, dp); err != nil {
			return err
		}
	}
	return nil
}
