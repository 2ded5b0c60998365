package econ

// Tariff prices electrical energy and demand.
type Tariff struct {
	EnergyPrice     float64  // currency per kWh: the flat price, or the price outside every period
	Currency        string   // display only, e.g. "USD"
	Periods         []Period // time-of-use periods; empty for a flat price
	DemandCharge    float64  // currency per kW of each month's peak demand; 0 = none
	EmissionsFactor float64  // kg CO₂e per kWh; 0 = not reported
}

// Period is a time-of-use period: a price for hours [StartHour, EndHour) of
// the chosen days.
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
