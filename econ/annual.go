package econ

// Annual is a bill brought to one year: the figures an appraisal uses.
type Annual struct {
	Factor       float64 // the scale from the bill's hours to a year (8,760 h ÷ covered hours)
	Energy       float64 // kWh/yr
	EnergyCost   float64 // currency/yr
	DemandCost   float64 // currency/yr
	Total        float64 // EnergyCost + DemandCost, currency/yr
	Emissions    float64 // kg CO₂e/yr
	BilledDemand float64 // sum of the monthly billed peaks over a year, kW·month/yr
}

// Annualise brings the bill to a year. Energy, its cost and emissions scale
// by factor (8,760 h over the hours the series covers). The demand charge
// does not scale with hours: a time-stamped bill counts each covered
// month's peak once, and the annual demand cost is the mean over those
// months times 12, each month weighted by the share of it the series
// covers (a trend that ends on the 1st does not let that day's peak stand
// for a whole month), so that a week, a year and two years of the same
// operation give the same annual figure. An untimed bill already charges
// 12 months (its highest bin power every month) and is kept as it is.
func (b *Bill) Annualise(factor float64) Annual {
	a := Annual{Factor: factor, Energy: b.Energy * factor, EnergyCost: b.EnergyCost * factor,
		Emissions: b.Emissions * factor}
	switch {
	case b.Timed && len(b.Months) > 0:
		var cost, peaks, n float64
		for _, m := range b.Months {
			w := min(1, m.Hours/monthHours(m.Year, m.Month))
			cost += w * m.DemandCost
			peaks += w * m.PeakKW
			n += w
		}
		if n > 0 {
			a.DemandCost = 12 * cost / n
			a.BilledDemand = 12 * peaks / n
		}
	default:
		a.DemandCost = b.DemandCost
		a.BilledDemand = 12 * b.PeakKW
	}
	a.Total = a.EnergyCost + a.DemandCost
	return a
}
