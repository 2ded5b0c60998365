package study

// Regions counts, for one strategy over the period, the unit-hours spent
// where a reviewing engineer looks: outside the preferred operating region
// (70–120 % of BEP flow at the unit's speed, ANSI/HI 9.6.3), above rated
// speed, and with the motor into its service factor. Every unit-hour of
// every served step counts (two units for an hour are two unit-hours).
type Regions struct {
	UnitHours        float64 // unit-hours run in the period
	OutsidePreferred float64 // unit-hours outside 70–120 % of BEP flow
	// OutsideAllowable is the unit-hours below the minimum continuous
	// stable flow or past runout: always 0, since the solver plans no unit
	// there (a state that needs it is unmet), kept so reports say so.
	OutsideAllowable float64
	Overspeed        float64 // unit-hours above 100 % of rated speed
	Overload         float64 // unit-hours with the motor above its rated output (into the service factor)
}
