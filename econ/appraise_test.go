package econ

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"
)

// yearByYear is the present value of A₀(1+e)^k paid at the end of years
// 1…n, discounted at d, summed year by year: the hand computation the
// closed forms must agree with.
func yearByYear(d, e float64, n int) float64 {
	s := 0.0
	for k := 1; k <= n; k++ {
		s += math.Pow(1+e, float64(k)) / math.Pow(1+d, float64(k))
	}
	return s
}

func TestUPVStar(t *testing.T) {
	cases := []struct {
		name string
		d, e float64
		n    int
		want float64 // 0 = compare with the year-by-year sum only
		tol  float64 // absolute tolerance on want
	}{
		// Uniform present value (no escalation) of a standard annuity,
		// P/A = [(1+d)^N − 1]/[d(1+d)^N]; table values from compound-interest
		// tables in any engineering economics text (from memory).
		{"P/A 3 % 20 y", 0.03, 0, 20, 14.8775, 5e-5},
		{"P/A 10 % 10 y", 0.10, 0, 10, 6.1446, 5e-5},
		{"P/A 7 % 30 y", 0.07, 0, 30, 12.4090, 5e-5},
		// d = e: every year's escalated saving discounts back to A₀, so
		// UPV* = N (NIST Handbook 135, from memory; and by the sum).
		{"d equals e", 0.03, 0.03, 15, 15, 1e-12},
		{"d equals e zero", 0, 0, 7, 7, 1e-12},
		{"escalation above discount", 0.02, 0.05, 20, 0, 0},
		{"typical FEMP-like terms", 0.03, 0.015, 25, 0, 0},
		{"negative real escalation", 0.03, -0.01, 10, 0, 0},
		{"near-equal rates", 0.03, 0.0300000001, 20, 0, 0},
		{"one year", 0.05, 0.02, 1, 1.02 / 1.05, 1e-15},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := UPVStar(c.d, c.e, c.n)
			sum := yearByYear(c.d, c.e, c.n)
			// closed form against the year-by-year sum: relative 1e-9
			if math.Abs(got-sum) > 1e-9*sum {
				t.Errorf("UPVStar(%g, %g, %d) = %.12g, year-by-year sum %.12g", c.d, c.e, c.n, got, sum)
			}
			if c.tol > 0 && math.Abs(got-c.want) > c.tol {
				t.Errorf("UPVStar(%g, %g, %d) = %.6f, want %.6f ± %g", c.d, c.e, c.n, got, c.want, c.tol)
			}
		})
	}
	// With e = 0, UPV* reduces to the uniform present value factor
	// [(1+d)^N − 1]/[d(1+d)^N] (standard annuity formula).
	for _, d := range []float64{0.01, 0.04, 0.08, 0.15} {
		n := 17
		annuity := (math.Pow(1+d, float64(n)) - 1) / (d * math.Pow(1+d, float64(n)))
		if got := UPVStar(d, 0, n); math.Abs(got-annuity) > 1e-12*annuity {
			t.Errorf("UPVStar(%g, 0, %d) = %.15g, annuity factor %.15g", d, n, got, annuity)
		}
	}
	if got := UPVStar(0.03, 0.01, 0); got != 0 {
		t.Errorf("UPVStar over 0 years = %g, want 0", got)
	}
}

func TestAppraise(t *testing.T) {
	base := &Bill{Hours: 8760, Energy: 400000, EnergyCost: 40000, DemandCost: 6000, Emissions: 160000}
	strat := &Bill{Hours: 8760, Energy: 250000, EnergyCost: 25000, DemandCost: 4500, Emissions: 100000}
	r := Retrofit{DriveCost: 12000, OtherCost: 5000, LifeYears: 15, DiscountRate: 0.03, Escalation: 0.02}
	a, err := Appraise(r, base, strat, 3)
	if err != nil {
		t.Fatal(err)
	}
	// Hand-computed: investment 3 × 12000 + 5000 = 41000; savings
	// (40000 − 25000) + (6000 − 4500) = 16500 a year; payback 41000/16500.
	const inv, sav = 41000.0, 16500.0
	upv := yearByYear(0.03, 0.02, 15)
	checks := []struct {
		name      string
		got, want float64
	}{
		{"investment", a.Investment, inv},
		{"energy savings", a.EnergySavings, 15000},
		{"demand savings", a.DemandSavings, 1500},
		{"annual savings", a.AnnualSavings, sav},
		{"energy saved", a.EnergySaved, 150000},
		{"emissions saved", a.EmissionsSaved, 60000},
		{"simple payback", a.SimplePayback, inv / sav},
		{"UPV", a.UPV, upv},
		{"present savings", a.PresentSavings, sav * upv},
		{"NPV", a.NPV, sav*upv - inv},
		{"SIR", a.SIR, sav * upv / inv},
	}
	for _, c := range checks {
		// relative 1e-9: the same arithmetic by another route
		if math.Abs(c.got-c.want) > 1e-9*math.Abs(c.want) {
			t.Errorf("%s = %.10g, want %.10g", c.name, c.got, c.want)
		}
	}
	if !a.PaysBack || len(a.Warnings) != 0 {
		t.Errorf("PaysBack %v, warnings %q", a.PaysBack, a.Warnings)
	}
	// The year-by-year table sums to the NPV, and the discounted payback
	// sits where the cumulative crosses zero.
	if n := len(a.Years); n != 15 || math.Abs(a.Years[n-1].Cumulative-a.NPV) > 1e-6 {
		t.Fatalf("years %d, last cumulative %v, NPV %v", n, a.Years[len(a.Years)-1].Cumulative, a.NPV)
	}
	k := int(a.DiscountedPayback) // the year in which it crosses
	if a.DiscountedPayback < a.SimplePayback || a.Years[k-1].Cumulative >= 0 || a.Years[k].Cumulative < 0 {
		t.Errorf("discounted payback %.3f y does not sit at the zero crossing (simple %.3f)", a.DiscountedPayback, a.SimplePayback)
	}
	// Year 1 savings are A₀(1+e), discounted by (1+d).
	if y := a.Years[0]; math.Abs(y.Savings-sav*1.02) > 1e-9 || math.Abs(y.Discounted-sav*1.02/1.03) > 1e-9 {
		t.Errorf("year 1 = %+v", y)
	}
}

func TestAppraiseEdgeCases(t *testing.T) {
	cases := []struct {
		name         string
		r            Retrofit
		energy, dem  float64
		inv          float64
		paysBack     bool
		payback      float64 // +Inf = never
		discPayback  float64 // +Inf = not within life
		npv, sir     float64
		wantWarnings int
	}{
		// d = e = 0: discounting does nothing, so the discounted payback is
		// the simple payback and NPV = N·A − I (hand computed).
		{"no discounting", Retrofit{LifeYears: 10}, 1000, 0, 4000, true, 4, 4, 6000, 2.5, 0},
		{"d equals e", Retrofit{LifeYears: 10, DiscountRate: 0.04, Escalation: 0.04}, 1000, 0, 4000, true, 4, 4, 6000, 2.5, 0},
		{"zero savings", Retrofit{LifeYears: 10, DiscountRate: 0.03}, 0, 0, 4000, false, math.Inf(1), math.Inf(1), -4000, 0, 1},
		{"negative savings", Retrofit{LifeYears: 5}, -500, 100, 4000, false, math.Inf(1), math.Inf(1), -4000 - 2000, -0.5, 1},
		{"not within life", Retrofit{LifeYears: 3}, 1000, 0, 4000, true, 4, math.Inf(1), -1000, 0.75, 1},
		{"no investment", Retrofit{LifeYears: 2}, 1000, 0, 0, true, 0, 0, 2000, math.Inf(1), 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			a, err := AppraiseSavings(c.r, c.energy, c.dem, c.inv)
			if err != nil {
				t.Fatal(err)
			}
			same := func(got, want float64) bool {
				if math.IsInf(want, 0) {
					return got == want
				}
				return math.Abs(got-want) <= 1e-9*max(1, math.Abs(want))
			}
			if a.PaysBack != c.paysBack || !same(a.SimplePayback, c.payback) || !same(a.DiscountedPayback, c.discPayback) ||
				!same(a.NPV, c.npv) || !same(a.SIR, c.sir) || len(a.Warnings) != c.wantWarnings {
				t.Errorf("got pays %v payback %v disc %v NPV %v SIR %v warnings %q", a.PaysBack, a.SimplePayback,
					a.DiscountedPayback, a.NPV, a.SIR, a.Warnings)
			}
		})
	}
}

func TestAppraiseInvalid(t *testing.T) {
	ok := Retrofit{DriveCost: 1, LifeYears: 10, DiscountRate: 0.03}
	cases := []struct {
		name   string
		edit   func(*Retrofit)
		drives int
		want   string
	}{
		{"no life", func(r *Retrofit) { r.LifeYears = 0 }, 1, "life 0 years"},
		{"life too long", func(r *Retrofit) { r.LifeYears = 101 }, 1, "life 101 years"},
		{"negative drive cost", func(r *Retrofit) { r.DriveCost = -5 }, 1, "drive cost -5"},
		{"NaN other cost", func(r *Retrofit) { r.OtherCost = math.NaN() }, 1, "other cost NaN"},
		{"discount −100 %", func(r *Retrofit) { r.DiscountRate = -1 }, 1, "discount rate -1"},
		{"discount as percent", func(r *Retrofit) { r.DiscountRate = 3 }, 1, "discount rate 3"},
		{"escalation NaN", func(r *Retrofit) { r.Escalation = math.NaN() }, 1, "escalation NaN"},
		{"negative drives", func(*Retrofit) {}, -1, "-1 drives"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := ok
			c.edit(&r)
			_, err := Appraise(r, &Bill{}, &Bill{}, c.drives)
			if !errors.Is(err, ErrRetrofit) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %v, want ErrRetrofit containing %q", err, c.want)
			}
		})
	}
}

func TestAppraisalJSON(t *testing.T) {
	a, err := AppraiseSavings(Retrofit{LifeYears: 3}, -1, 0, 100)
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(a)
	if err != nil {
		t.Fatal(err)
	}
	var back map[string]any
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if back["SimplePayback"] != nil || back["DiscountedPayback"] != nil || back["NPV"] == nil || back["Investment"] != 100.0 {
		t.Errorf("JSON %s", b)
	}
	if got := PaybackText(a.SimplePayback); got != "never" {
		t.Errorf("PaybackText(+Inf) = %q", got)
	}
	if got := PaybackText(0); got != "immediate" {
		t.Errorf("PaybackText(0) = %q", got)
	}
	if got := PaybackText(2.449); got != "2.4 years" {
		t.Errorf("PaybackText(2.449) = %q", got)
	}
}
