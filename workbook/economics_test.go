package workbook

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestPVFactor(t *testing.T) {
	// Independent answer: the defining sum, term by term.
	sum := func(d, e float64, n int) float64 {
		var s float64
		for k := 1; k <= n; k++ {
			s += math.Pow((1+e)/(1+d), float64(k))
		}
		return s
	}
	cases := []struct {
		name string
		d, e float64
		n    int
		want float64 // NaN = compare with the sum only
		tol  float64
		src  string
	}{
		// Ordinary annuity factor (1 − 1.07⁻¹⁰)/0.07 = 7.0236, as printed in
		// present-value-of-annuity tables (from memory).
		{"annuity 7% 10 years", 0.07, 0, 10, 7.0236, 5e-5, "annuity table, from memory"},
		// (1 − 1.05⁻²⁰)/0.05 = 12.4622, same tables (from memory).
		{"annuity 5% 20 years", 0.05, 0, 20, 12.4622, 5e-5, "annuity table, from memory"},
		// d = e: every term is 1, so the factor is the life [D].
		{"discount equals escalation", 0.03, 0.03, 12, 12, 1e-12, "derived"},
		{"zero rates", 0, 0, 7, 7, 1e-12, "derived"},
		{"escalation above discount", 0.02, 0.05, 15, math.NaN(), 0, "sum"},
		{"negative escalation", 0.06, -0.01, 25, math.NaN(), 0, "sum"},
		{"one year", 0.08, 0.03, 1, 1.03 / 1.08, 1e-15, "derived"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := PVFactor(c.d, c.e, c.n)
			if s := sum(c.d, c.e, c.n); math.Abs(got-s) > 1e-12*math.Max(1, s) {
				t.Errorf("PVFactor(%v, %v, %d) = %.15g; the defining sum gives %.15g", c.d, c.e, c.n, got, s)
			}
			if !math.IsNaN(c.want) && math.Abs(got-c.want) > c.tol {
				t.Errorf("PVFactor(%v, %v, %d) = %.6f, want %.6f ± %g (%s)", c.d, c.e, c.n, got, c.want, c.tol, c.src)
			}
		})
	}
}

// TestComputeEconomicsByHand checks the appraisal against figures worked by
// hand [D] for round inputs.
func TestComputeEconomicsByHand(t *testing.T) {
	r := &Report{
		Plant: "hand case", Units: Units{Flow: "gpm", Head: "ft"},
		Strategies: []Strategy{
			{Name: "base", EnergyKWh: 100000, PeakKW: 20},
			{Name: "drives", EnergyKWh: 60000, PeakKW: 12, DrivesToBuy: 2},
			{Name: "tou", EnergyKWh: 50000, PeakKW: 10, BilledDemand: 100, EnergyCost: 6000, DrivesToBuy: 1},
		},
		Economics: EconomicsInputs{EnergyPrice: 0.10, DemandCharge: 10, DriveCost: 5000, OtherCost: 1000,
			LifeYears: 10, DiscountRate: 0.03, Escalation: 0.03, EmissionsFactor: 0.5},
	}
	e, err := ComputeEconomics(r)
	if err != nil {
		t.Fatal(err)
	}
	// d = e, so UPV* = life = 10.
	if e.PVFactor != 10 {
		t.Fatalf("PVFactor = %v, want 10", e.PVFactor)
	}
	type row struct {
		energyCost, demandCost, total, saved, investment, payback, npv, emissions float64
		hasSaving                                                                 bool
	}
	want := []row{
		// 100000 × 0.10 = 10000; 12 × 20 × 10 = 2400
		{10000, 2400, 12400, 0, 0, 0, 0, 50, false},
		// 6000; 12 × 12 × 10 = 1440; saved 12400 − 7440 = 4960; 2 × 5000 + 1000;
		// 11000 / 4960; 4960 × 10 − 11000
		{6000, 1440, 7440, 4960, 11000, 11000.0 / 4960, 38600, 30, true},
		// price factor 6000 / (50000 × 0.10) = 1.2 keeps the 6000; billed 100 × 10;
		// saved 12400 − 7000 = 5400; 6000 investment; 60000 − 6000
		{6000, 1000, 7000, 5400, 6000, 6000.0 / 5400, 48000, 25, true},
	}
	for i, w := range want {
		g := e.Strategies[i]
		for _, f := range []struct {
			name      string
			got, want float64
		}{
			{"energy cost", g.EnergyCost, w.energyCost}, {"demand cost", g.DemandCost, w.demandCost},
			{"total", g.TotalCost, w.total}, {"saved", g.CostSaved, w.saved},
			{"investment", g.Investment, w.investment}, {"payback", g.Payback, w.payback},
			{"NPV", g.NPV, w.npv}, {"emissions t/yr", g.Emissions, w.emissions},
		} {
			if math.Abs(f.got-f.want) > 1e-9*math.Max(1, math.Abs(f.want)) {
				t.Errorf("%s: %s = %.10g, want %.10g", g.Name, f.name, f.got, f.want)
			}
		}
		if g.HasSaving != w.hasSaving {
			t.Errorf("%s: HasSaving = %v, want %v", g.Name, g.HasSaving, w.hasSaving)
		}
	}
}

func TestReportValidation(t *testing.T) {
	cases := []struct {
		name   string
		modify func(r *Report)
		want   string
	}{
		{"no plant", func(r *Report) { r.Plant = " " }, "no plant name"},
		{"no flow unit", func(r *Report) { r.Units.Flow = "" }, "flow and head labels"},
		{"no strategies", func(r *Report) { r.Strategies = nil }, "no strategies"},
		{"baseline out of range", func(r *Report) { r.Baseline = 9 }, "baseline 9"},
		{"NaN price", func(r *Report) { r.Economics.EnergyPrice = math.NaN() }, "energy price is NaN"},
		{"zero life", func(r *Report) { r.Economics.LifeYears = 0 }, "life is 0 years"},
		{"rate as percent", func(r *Report) { r.Economics.DiscountRate = 5 }, "0.05 for 5 %"},
		{"negative energy", func(r *Report) { r.Strategies[1].EnergyKWh = -1 }, `strategies[1] "Best count, fixed speed": energy is -1`},
		{"duplicate name by case", func(r *Report) { r.Strategies[2].Name = strings.ToUpper(r.Strategies[0].Name) }, "same name as strategies[0]"},
		{"load point of unknown strategy", func(r *Report) { r.LoadPoints[3].Strategy = "nobody" }, `loadPoints[3]: strategy "nobody"`},
		{"ragged series", func(r *Report) { r.Curves.Head[0].Series[1].Y = r.Curves.Head[0].Series[1].Y[:3] }, "has 13 x and 3 y values"},
		{"NaN x", func(r *Report) { r.Curves.GroupPower.Series[0].X[0] = math.NaN() }, "non-finite x"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := sampleReport()
			c.modify(r)
			_, err := Bytes(r)
			if !errors.Is(err, ErrInvalidReport) {
				t.Fatalf("err = %v, want ErrInvalidReport", err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %q, want it to contain %q", err, c.want)
			}
		})
	}
}
