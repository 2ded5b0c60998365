package workbook

import (
	"errors"
	"fmt"
	"math"
)

// Economics is the appraisal the Economics sheet computes with live
// formulas, computed here in Go the same way so the numbers can be printed
// elsewhere and the spreadsheet checked against them.
type Economics struct {
	PVFactor   float64 // modified uniform present value factor UPV*, years
	Strategies []StrategyEconomics
}

// StrategyEconomics is one strategy's row of the Economics sheet.
type StrategyEconomics struct {
	Name         string
	EnergyKWh    float64 // kWh/yr
	PeakKW       float64 // kW
	BilledDemand float64 // kW·month/yr
	PriceFactor  float64 // energy cost at the tariff ÷ (kWh × energy price); 1 for a flat price
	EnergyCost   float64 // currency/yr = EnergyKWh × EnergyPrice × PriceFactor
	DemandCost   float64 // currency/yr = BilledDemand × DemandCharge
	TotalCost    float64 // currency/yr
	EnergySaved  float64 // kWh/yr against the baseline
	CostSaved    float64 // currency/yr against the baseline
	Drives       int     // drives bought
	Investment   float64 // currency = Drives × DriveCost + OtherCost; 0 for the baseline
	Payback      float64 // simple payback, years; valid only when HasSaving
	HasSaving    bool    // CostSaved > 0
	NPV          float64 // currency = CostSaved × PVFactor − Investment
	Emissions    float64 // t CO₂e/yr = EnergyKWh × EmissionsFactor / 1000
	EmissionsCut float64 // t CO₂e/yr against the baseline
}

// ErrInvalidReport is the class of every error about a Report that cannot
// be written.
var ErrInvalidReport = errors.New("workbook: invalid report")

// PVFactor is the modified uniform present value factor of NIST Handbook
// 135 (Fuller & Petersen, Life-Cycle Costing Manual for the Federal Energy
// Management Program, 1995, §5.3 — citation from memory): the present value
// of a yearly amount of 1, paid at the end of each of n years, escalating at
// rate e and discounted at rate d,
//
//	UPV* = Σ_{t=1..n} ((1+e)/(1+d))^t = (1+e)/(d−e) · [1 − ((1+e)/(1+d))^n],
//
// which is n when d = e.
func PVFactor(d, e float64, n int) float64 {
	if math.Abs(d-e) < 1e-12 {
		return float64(n)
	}
	return (1 + e) / (d - e) * (1 - math.Pow((1+e)/(1+d), float64(n)))
}

// pvFactorFormula is PVFactor as a spreadsheet formula over the named cells.
const pvFactorFormula = "IF(ABS(DiscountRate-Escalation)<1E-12,LifeYears," +
	"(1+Escalation)/(DiscountRate-Escalation)*(1-((1+Escalation)/(1+DiscountRate))^LifeYears))"

// ComputeEconomics appraises every strategy of r against r.Baseline with
// the formulas the Economics sheet uses.
func ComputeEconomics(r *Report) (Economics, error) {
	if err := checkEconomics(r); err != nil {
		return Economics{}, err
	}
	in := r.Economics
	e := Economics{PVFactor: PVFactor(in.DiscountRate, in.Escalation, in.LifeYears)}
	for i, s := range r.Strategies {
		se := StrategyEconomics{
			Name:         s.Name,
			EnergyKWh:    s.EnergyKWh,
			PeakKW:       s.PeakKW,
			BilledDemand: billedDemand(s),
			PriceFactor:  priceFactor(s, in.EnergyPrice),
			Drives:       s.DrivesToBuy,
		}
		se.EnergyCost = se.EnergyKWh * in.EnergyPrice * se.PriceFactor
		se.DemandCost = se.BilledDemand * in.DemandCharge
		se.TotalCost = se.EnergyCost + se.DemandCost
		if i != r.Baseline {
			// Programming and commissioning come with any change of
			// operation, drives bought or not.
			se.Investment = float64(se.Drives)*in.DriveCost + in.OtherCost
		}
		se.Emissions = se.EnergyKWh * in.EmissionsFactor / 1000
		e.Strategies = append(e.Strategies, se)
	}
	base := e.Strategies[r.Baseline]
	for i := range e.Strategies {
		se := &e.Strategies[i]
		se.EnergySaved = base.EnergyKWh - se.EnergyKWh
		se.CostSaved = base.TotalCost - se.TotalCost
		se.EmissionsCut = base.Emissions - se.Emissions
		se.HasSaving = se.CostSaved > 0
		if se.HasSaving {
			se.Payback = se.Investment / se.CostSaved
		}
		se.NPV = se.CostSaved*e.PVFactor - se.Investment
	}
	return e, nil
}

// billedDemand is the strategy's billed demand, kW·month/yr.
func billedDemand(s Strategy) float64 {
	if s.BilledDemand > 0 {
		return s.BilledDemand
	}
	return 12 * s.PeakKW
}

// priceFactor keeps a time-of-use tariff's weighting when the owner changes
// the energy price: the ratio of the strategy's energy cost at the tariff to
// its energy at the flat price.
func priceFactor(s Strategy, price float64) float64 {
	if s.EnergyCost > 0 && s.EnergyKWh > 0 && price > 0 {
		return s.EnergyCost / (s.EnergyKWh * price)
	}
	return 1
}

func checkEconomics(r *Report) error {
	if len(r.Strategies) == 0 {
		return fmt.Errorf("%w: no strategies", ErrInvalidReport)
	}
	if r.Baseline < 0 || r.Baseline >= len(r.Strategies) {
		return fmt.Errorf("%w: baseline %d is not one of the %d strategies", ErrInvalidReport, r.Baseline, len(r.Strategies))
	}
	in := r.Economics
	for _, f := range []struct {
		name string
		v    float64
	}{
		{"energy price", in.EnergyPrice}, {"demand charge", in.DemandCharge},
		{"drive cost", in.DriveCost}, {"other cost", in.OtherCost},
		{"emissions factor", in.EmissionsFactor},
	} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v < 0 {
			return fmt.Errorf("%w: economics: %s is %v; want a finite number ≥ 0", ErrInvalidReport, f.name, f.v)
		}
	}
	if in.LifeYears < 1 {
		return fmt.Errorf("%w: economics: life is %d years; want at least 1", ErrInvalidReport, in.LifeYears)
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"discount rate", in.DiscountRate}, {"escalation", in.Escalation}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v <= -1 || f.v >= 1 {
			return fmt.Errorf("%w: economics: %s is %v; want a fraction per year between -1 and 1 (0.05 for 5 %%)", ErrInvalidReport, f.name, f.v)
		}
	}
	for i, s := range r.Strategies {
		if s.Name == "" {
			return fmt.Errorf("%w: strategies[%d]: no name", ErrInvalidReport, i)
		}
		for _, f := range []struct {
			name string
			v    float64
		}{{"energy", s.EnergyKWh}, {"peak demand", s.PeakKW}, {"billed demand", s.BilledDemand}, {"energy cost", s.EnergyCost}, {"hours unmet", s.HoursUnmet}} {
			if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v < 0 {
				return fmt.Errorf("%w: strategies[%d] %q: %s is %v; want a finite number ≥ 0", ErrInvalidReport, i, s.Name, f.name, f.v)
			}
		}
		if s.DrivesToBuy < 0 {
			return fmt.Errorf("%w: strategies[%d] %q: drives to buy is %d", ErrInvalidReport, i, s.Name, s.DrivesToBuy)
		}
	}
	return nil
}
