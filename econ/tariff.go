package econ

import (
	"fmt"
	"math"
)

// Tariff prices electrical energy and demand.
type Tariff struct {
	EnergyPrice     float64  // currency per kWh: the flat price, or the price outside every period
	Currency        string   // display only, e.g. "USD"
	Periods         []Period // time-of-use periods; empty for a flat price
	DemandCharge    float64  // currency per kW of each month's peak demand; 0 = none
	EmissionsFactor float64  // kg CO₂e per kWh; 0 = not reported
}

// Period is a time-of-use period: a price for hours [StartHour, EndHour) of
// the chosen days. A period over midnight is written as two periods.
type Period struct {
	Name      string
	Price     float64 // currency per kWh
	StartHour int     // 0–23
	EndHour   int     // 1–24, after StartHour
	Weekdays  bool    // applies Monday–Friday
	Weekends  bool    // applies Saturday and Sunday
}

// Retrofit prices a drive retrofit and sets the terms of its appraisal.
type Retrofit struct {
	DriveCost    float64 // installed cost per drive, currency
	OtherCost    float64 // other one-off costs, currency
	LifeYears    int     // appraisal life, years
	DiscountRate float64 // real discount rate, fraction per year
	Escalation   float64 // energy price escalation, fraction per year
}

func nonNegative(v float64) bool { return v >= 0 && !math.IsInf(v, 0) }

// Validate checks the tariff: prices, charges and the emissions factor
// finite and ≥ 0, every period's hours inside the day and applying to some
// days, and no two periods covering the same hour of the same kind of day.
func (t *Tariff) Validate() error {
	switch {
	case !nonNegative(t.EnergyPrice):
		return fmt.Errorf("%w: energy price %g must be a finite number ≥ 0", ErrTariff, t.EnergyPrice)
	case !nonNegative(t.DemandCharge):
		return fmt.Errorf("%w: demand charge %g must be a finite number ≥ 0", ErrTariff, t.DemandCharge)
	case !nonNegative(t.EmissionsFactor):
		return fmt.Errorf("%w: emissions factor %g must be a finite number ≥ 0", ErrTariff, t.EmissionsFactor)
	}
	var owner [2][24]int // day kind (0 weekday, 1 weekend) × hour → period index + 1
	for i, p := range t.Periods {
		bad := func(format string, args ...any) error {
			return fmt.Errorf("%w: periods[%d]: "+format, append([]any{ErrTariff, i}, args...)...)
		}
		switch {
		case !nonNegative(p.Price):
			return bad("price %g must be a finite number ≥ 0", p.Price)
		case p.StartHour < 0 || p.StartHour > 23:
			return bad("start hour %d must be 0–23", p.StartHour)
		case p.EndHour < 1 || p.EndHour > 24:
			return bad("end hour %d must be 1–24", p.EndHour)
		case p.EndHour <= p.StartHour:
			return bad("end hour %d must be after start hour %d (split a period over midnight in two)", p.EndHour, p.StartHour)
		case !p.Weekdays && !p.Weekends:
			return bad("applies to neither weekdays nor weekends")
		}
		for kind, on := range []bool{p.Weekdays, p.Weekends} {
			if !on {
				continue
			}
			for h := p.StartHour; h < p.EndHour; h++ {
				if j := owner[kind][h]; j != 0 {
					return bad("overlaps periods[%d] at %02d:00 on %s", j-1, h, [2]string{"weekdays", "weekends"}[kind])
				}
				owner[kind][h] = i + 1
			}
		}
	}
	return nil
}

// price returns the energy price and the period index (-1 outside every
// period) for an hour of a weekday or weekend day.
func (t *Tariff) price(hour int, weekend bool) (float64, int) {
	for i, p := range t.Periods {
		if hour >= p.StartHour && hour < p.EndHour && (weekend && p.Weekends || !weekend && p.Weekdays) {
			return p.Price, i
		}
	}
	return t.EnergyPrice, -1
}

// PeriodName is the period's name, or "periods[i]" when it has none.
func (t *Tariff) PeriodName(i int) string {
	if i < 0 {
		return "outside periods"
	}
	if n := t.Periods[i].Name; n != "" {
		return n
	}
	return fmt.Sprintf("periods[%d]", i)
}

// WeekShare is the fraction of the 168 hours of a week that period i
// covers (i = -1: the hours outside every period).
func (t *Tariff) WeekShare(i int) float64 {
	if i >= 0 {
		p := t.Periods[i]
		days := 0
		if p.Weekdays {
			days += 5
		}
		if p.Weekends {
			days += 2
		}
		return float64(days*(p.EndHour-p.StartHour)) / 168
	}
	s := 1.0
	for j := range t.Periods {
		s -= t.WeekShare(j)
	}
	return s
}
