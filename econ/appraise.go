package econ

import (
	"encoding/json"
	"fmt"
	"math"
)

// UPVStar is the modified uniform present value factor: the present value,
// at real discount rate d, of an amount A₀ a year at base-date prices that
// escalates at rate e and is paid at the end of each of n years,
// Σ_{k=1..n} ((1+e)/(1+d))^k A₀, over A₀. In closed form (NIST Handbook 135,
// Life-Cycle Costing Manual for the Federal Energy Management Program,
// Fuller & Petersen 1996; cited from memory):
//
//	UPV* = (1+e)/(d−e) · [1 − ((1+e)/(1+d))^n]     for d ≠ e
//	UPV* = n                                        for d = e
//
// Near d = e the closed form loses precision, so the sum is taken directly.
func UPVStar(d, e float64, n int) float64 {
	if n <= 0 {
		return 0
	}
	if math.Abs(d-e) < 1e-6 {
		x, s, f := (1+e)/(1+d), 0.0, 1.0
		for k := 1; k <= n; k++ {
			f *= x
			s += f
		}
		return s
	}
	return (1 + e) / (d - e) * (1 - math.Pow((1+e)/(1+d), float64(n)))
}

// Year is one year of an appraisal's cash flow.
type Year struct {
	Year       int     // 1…LifeYears
	Savings    float64 // A₀(1+e)^k, currency
	Discounted float64 // Savings/(1+d)^k
	Cumulative float64 // −Investment + Σ Discounted up to this year
}

// Appraisal is the economics of a strategy against a baseline. Savings are
// counted at the tariff's prices (base-date prices) and escalate at the
// retrofit's escalation rate from year 1, demand charges with them; each
// year's savings come at its end.
type Appraisal struct {
	Investment     float64 // drives × DriveCost + OtherCost, currency
	EnergySaved    float64 // kWh/yr
	EmissionsSaved float64 // kg CO₂e/yr
	EnergySavings  float64 // energy cost saved, currency/yr
	DemandSavings  float64 // demand charge saved, currency/yr
	AnnualSavings  float64 // EnergySavings + DemandSavings, currency/yr at base-date prices

	PaysBack          bool    // false when annual savings are ≤ 0: payback never
	SimplePayback     float64 // Investment / AnnualSavings, years; +Inf when it never pays back
	DiscountedPayback float64 // years until the discounted savings repay the investment (interpolated within the year); +Inf if not within the life
	UPV               float64 // UPVStar(DiscountRate, Escalation, LifeYears)
	PresentSavings    float64 // AnnualSavings × UPV, currency
	NPV               float64 // PresentSavings − Investment, currency
	SIR               float64 // savings-to-investment ratio PresentSavings / Investment; +Inf for no investment and positive savings

	Years    []Year
	Warnings []string
}

// maxLife bounds the appraisal life; beyond it discounting makes the answer
// meaningless for pumps and drives.
const maxLife = 100

func (r *Retrofit) validate(drives int) error {
	switch {
	case !nonNegative(r.DriveCost):
		return fmt.Errorf("%w: drive cost %g must be a finite number ≥ 0", ErrRetrofit, r.DriveCost)
	case !nonNegative(r.OtherCost):
		return fmt.Errorf("%w: other cost %g must be a finite number ≥ 0", ErrRetrofit, r.OtherCost)
	case r.LifeYears < 1 || r.LifeYears > maxLife:
		return fmt.Errorf("%w: life %d years must be 1–%d", ErrRetrofit, r.LifeYears, maxLife)
	case !(r.DiscountRate > -1 && r.DiscountRate < 1):
		return fmt.Errorf("%w: discount rate %g must be a fraction between −1 and 1", ErrRetrofit, r.DiscountRate)
	case !(r.Escalation > -1 && r.Escalation < 1):
		return fmt.Errorf("%w: escalation %g must be a fraction between −1 and 1", ErrRetrofit, r.Escalation)
	case drives < 0:
		return fmt.Errorf("%w: %d drives", ErrRetrofit, drives)
	}
	return nil
}

// Appraise prices a retrofit: the strategy's bill against the baseline's,
// with drives new drives to buy.
func Appraise(r Retrofit, baseline, strategy *Bill, drives int) (*Appraisal, error) {
	if err := r.validate(drives); err != nil {
		return nil, err
	}
	a := appraise(r, baseline.EnergyCost-strategy.EnergyCost, baseline.DemandCost-strategy.DemandCost,
		float64(drives)*r.DriveCost+r.OtherCost)
	a.EnergySaved = baseline.Energy - strategy.Energy
	a.EmissionsSaved = baseline.Emissions - strategy.Emissions
	if baseline.Timed != strategy.Timed || math.Abs(baseline.Hours-strategy.Hours) > 1e-6*max(1, baseline.Hours) {
		a.Warnings = append(a.Warnings, fmt.Sprintf("baseline (%.1f h) and strategy (%.1f h) were priced on different profiles", baseline.Hours, strategy.Hours))
	}
	return a, nil
}

// AppraiseSavings prices a retrofit from its annual savings (energy cost and
// demand charge, currency per year at base-date prices) and its investment.
func AppraiseSavings(r Retrofit, energySavings, demandSavings, investment float64) (*Appraisal, error) {
	if err := r.validate(0); err != nil {
		return nil, err
	}
	if !nonNegative(investment) || math.IsNaN(energySavings+demandSavings) || math.IsInf(energySavings+demandSavings, 0) {
		return nil, fmt.Errorf("%w: savings and investment must be finite, investment ≥ 0", ErrRetrofit)
	}
	return appraise(r, energySavings, demandSavings, investment), nil
}

func appraise(r Retrofit, energy, demand, investment float64) *Appraisal {
	a := &Appraisal{Investment: investment, EnergySavings: energy, DemandSavings: demand, AnnualSavings: energy + demand}
	a.UPV = UPVStar(r.DiscountRate, r.Escalation, r.LifeYears)
	a.PresentSavings = a.AnnualSavings * a.UPV
	a.NPV = a.PresentSavings - investment
	a.PaysBack = a.AnnualSavings > 0
	switch {
	case !a.PaysBack:
		a.SimplePayback = math.Inf(1)
		a.Warnings = append(a.Warnings, "the strategy saves nothing against the baseline: it never pays back")
	default:
		a.SimplePayback = investment / a.AnnualSavings
	}
	switch {
	case investment > 0:
		a.SIR = a.PresentSavings / investment
	case a.PresentSavings > 0:
		a.SIR = math.Inf(1)
	}
	a.DiscountedPayback = math.Inf(1)
	cum, grow, disc := -investment, 1.0, 1.0
	if investment == 0 && a.PaysBack {
		a.DiscountedPayback = 0
	}
	for k := 1; k <= r.LifeYears; k++ {
		grow *= 1 + r.Escalation
		disc *= 1 + r.DiscountRate
		y := Year{Year: k, Savings: a.AnnualSavings * grow}
		y.Discounted = y.Savings / disc
		prev := cum
		cum += y.Discounted
		y.Cumulative = cum
		if math.IsInf(a.DiscountedPayback, 1) && prev < 0 && cum >= 0 {
			a.DiscountedPayback = float64(k-1) + (-prev)/y.Discounted
		}
		a.Years = append(a.Years, y)
	}
	if a.PaysBack && math.IsInf(a.DiscountedPayback, 1) {
		a.Warnings = append(a.Warnings, fmt.Sprintf("the discounted savings do not repay the investment within %d years", r.LifeYears))
	}
	return a
}

// MarshalJSON writes an infinite payback or ratio as null (JSON has no
// infinity).
func (a *Appraisal) MarshalJSON() ([]byte, error) {
	type plain Appraisal
	fin := func(v float64) *float64 {
		if math.IsInf(v, 0) || math.IsNaN(v) {
			return nil
		}
		return &v
	}
	return json.Marshal(struct {
		*plain
		SimplePayback     *float64
		DiscountedPayback *float64
		SIR               *float64
	}{(*plain)(a), fin(a.SimplePayback), fin(a.DiscountedPayback), fin(a.SIR)})
}

// PaybackText writes a payback period for a report: "4.2 years", "never",
// or "immediate" where nothing is invested.
func PaybackText(years float64) string {
	if math.IsInf(years, 1) || math.IsNaN(years) {
		return "never"
	}
	if years == 0 {
		return "immediate"
	}
	return fmt.Sprintf("%.1f years", years)
}
