package study_test

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"wattstage/econ"
	"wattstage/plant"
	"wattstage/study"
)

// tariffs are the tariff types a load point's cost must follow: flat,
// time-of-use, and time-of-use with a demand charge (invented prices).
var tariffs = map[string]econ.Tariff{
	"flat": {EnergyPrice: 0.11, Currency: "USD"},
	"time of use": {EnergyPrice: 0.09, Currency: "USD", Periods: []econ.Period{
		{Name: "on-peak", Price: 0.19, StartHour: 12, EndHour: 18, Weekdays: true},
		{Name: "weekend", Price: 0.07, StartHour: 0, EndHour: 24, Weekends: true}}},
	"time of use and demand": {EnergyPrice: 0.09, Currency: "USD", DemandCharge: 14, Periods: []econ.Period{
		{Name: "on-peak", Price: 0.19, StartHour: 12, EndHour: 18, Weekdays: true}}},
}

// The load points' costs add up to the strategy's energy cost, for every
// strategy and tariff type, on bins and on a trend: a point's cost is the
// tariff's cost of its hours, never a flat price. Their hours and energy
// add up to the period's, and times the annualisation factor to the year's.
func TestLoadPointCostsAddUp(t *testing.T) {
	start := time.Date(2025, 3, 3, 0, 0, 0, 0, time.UTC)
	stamps, flows := hourly(start, 4*168)
	plants := map[string]func() *plant.Plant{
		"bins":  func() *plant.Plant { return examplePlant(t, "chilled-water.yaml") },
		"trend": func() *plant.Plant { return writeTrendPlant(t, stamps, flows) },
	}
	for pname, mk := range plants {
		for tname, tariff := range tariffs {
			t.Run(pname+", "+tname, func(t *testing.T) {
				p := mk()
				p.Tariff = tariff
				r := runPlant(t, p, noRange)
				for _, s := range r.Strategies {
					var hours, kwh, cost float64
					for _, lp := range s.LoadPoints {
						hours += lp.Hours
						kwh += lp.KWh
						cost += lp.Cost
					}
					for _, c := range []struct {
						what      string
						got, want float64
					}{
						{"hours", hours, r.Period.CoveredHours},
						{"energy (period)", kwh, s.Energy.KWh},
						{"energy cost (period)", cost, s.Bill.EnergyCost},
						{"energy cost (a year)", cost * r.Period.Factor, s.Annual.EnergyCost},
						{"energy (a year)", kwh * r.Period.Factor, s.Annual.Energy},
					} {
						if !relClose(c.got, c.want, 1e-9) {
							t.Errorf("%s: load points' %s %.6f, the strategy's %.6f", s.Name, c.what, c.got, c.want)
						}
					}
					if tname != "flat" && pname == "trend" && relClose(cost, kwh*tariff.EnergyPrice, 1e-6) {
						t.Errorf("%s: load points priced at the flat price under a time-of-use tariff", s.Name)
					}
				}
			})
		}
	}
}

// On bins the demand estimate is the highest bin power billed every month,
// so the demand saving has the sign of the peak's fall: never a saving
// where the peak rises, nor a cost where it falls.
func TestBinDemandSavingFollowsPeak(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml"} {
		r := runPlant(t, examplePlant(t, name), noRange)
		base := r.BaselineStrategy()
		for _, s := range r.Strategies {
			if s.Savings == nil {
				continue
			}
			dPeak := base.Energy.PeakKW - s.Energy.PeakKW
			if d := s.Savings.DemandCost; math.Signbit(d) != math.Signbit(dPeak) && math.Abs(d) > 1e-9 && math.Abs(dPeak) > 1e-12 {
				t.Errorf("%s, %s: demand saving %.2f while the peak falls by %.3f kW", name, s.Name, d, dPeak)
			}
		}
	}
}

// A tuning study (no drives bought) carries the file's other costs —
// programming and commissioning — so its payback is real, not
// "immediate"; "immediate" is kept for a truly zero investment.
func TestTuningStudyPaysForItsWork(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water-trend.yaml"), noRange)
	lo := r.Strategy(study.KeyLowest)
	other := r.Plant.Retrofit.OtherCost
	if lo.DrivesAdded != 0 || lo.Appraisal == nil {
		t.Fatalf("lowest: %d drives added, appraisal %v; the example runs on drives today", lo.DrivesAdded, lo.Appraisal)
	}
	if a := lo.Appraisal; a.Investment != other || !relClose(a.SimplePayback, other/a.AnnualSavings, 1e-12) {
		t.Errorf("investment %v, payback %v years; want the other costs %v and %v/%v", a.Investment, a.SimplePayback, other, other, a.AnnualSavings)
	}
	if w := econ.PaybackText(lo.Appraisal.SimplePayback); w == "immediate" {
		t.Errorf("payback %q with %v invested", w, other)
	}
	p := examplePlant(t, "chilled-water-trend.yaml")
	p.Retrofit.OtherCost = 0
	r = runPlant(t, p, noRange)
	if w := econ.PaybackText(r.Strategy(study.KeyLowest).Appraisal.SimplePayback); w != "immediate" {
		t.Errorf("nothing invested and savings positive: payback %q, want immediate", w)
	}
}

// The savings range re-runs the baseline and the lowest-power staging on
// the same varied plant — the across-the-line motors of a throttled
// baseline included — and always brackets the expected savings.
func TestSavingsRangeBracketsAndVariesBoth(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "chilled-water-trend.yaml"} {
		t.Run(name, func(t *testing.T) {
			r := runPlant(t, examplePlant(t, name), study.Options{})
			g, lo, base := r.Range, r.Strategy(study.KeyLowest), r.BaselineStrategy()
			if g == nil || len(g.Cases) != len(study.DefaultSensitivities) {
				t.Fatalf("range %+v, want %d cases", g, len(study.DefaultSensitivities))
			}
			if !(g.Low <= lo.Savings.Energy && lo.Savings.Energy <= g.High) {
				t.Errorf("range %.0f to %.0f kWh/yr does not bracket the expected %.0f", g.Low, g.High, lo.Savings.Energy)
			}
			for _, c := range g.Cases {
				if c.Sensitivity.LossScale == 1 {
					continue
				}
				// More loss draws more, less loss less, in the baseline too.
				if more := c.Sensitivity.LossScale > 1; more != (c.BaselineKWh > base.Annual.Energy) {
					t.Errorf("%s: baseline %.0f kWh/yr against %.0f as given: its losses were not varied", c.Sensitivity.Label, c.BaselineKWh, base.Annual.Energy)
				}
				if more := c.Sensitivity.LossScale > 1; more != (c.LowestKWh > lo.Annual.Energy) {
					t.Errorf("%s: lowest %.0f kWh/yr against %.0f as given", c.Sensitivity.Label, c.LowestKWh, lo.Annual.Energy)
				}
			}
			t.Logf("expected %.0f, range %.0f (%s) to %.0f (%s)", lo.Savings.Energy, g.Low, g.LowBy, g.High, g.HighBy)
		})
	}
}

// A plant file without the optional retrofit section is studied: savings
// are counted, nothing is appraised, a warning says why, and the JSON
// writes null for every appraisal.
func TestNoRetrofitSection(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "examples", "chilled-water.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	i := strings.Index(text, "\nretrofit:")
	if i < 0 {
		t.Fatal("the example has no retrofit section to remove")
	}
	j := strings.Index(text[i+1:], "\n\n")
	cut := text[:i+1]
	if j >= 0 {
		cut += text[i+1+j+2:]
	}
	path := filepath.Join(t.TempDir(), "plant.yaml")
	if err := os.WriteFile(path, []byte(cut), 0o644); err != nil {
		t.Fatal(err)
	}
	p, err := plant.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if p.HasRetrofit {
		t.Fatal("the retrofit section is still there")
	}
	r := runPlant(t, p, noRange)
	if r.Appraised {
		t.Error("appraised without a retrofit section")
	}
	for _, s := range r.Strategies {
		if s.Appraisal != nil {
			t.Errorf("%s: appraisal %+v without a retrofit section", s.Name, s.Appraisal)
		}
		if s.Key != r.BaselineStrategy().Key && s.Savings == nil {
			t.Errorf("%s: no savings counted", s.Name)
		}
	}
	if !hasWarning(r, "no retrofit section") {
		t.Errorf("no warning says why nothing was appraised: %v", r.Warnings)
	}
	var doc map[string]any
	var buf bytes.Buffer
	if err := r.WriteJSON(&buf, false); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	for _, s := range doc["strategies"].([]any) {
		if a, ok := s.(map[string]any)["appraisal"]; !ok || a != nil {
			t.Errorf("strategy %v: appraisal %v, want null", s.(map[string]any)["key"], a)
		}
	}
}

func hasWarning(r *study.Result, part string) bool {
	for _, w := range r.Warnings {
		if strings.Contains(w.Message, part) {
			return true
		}
	}
	return false
}
