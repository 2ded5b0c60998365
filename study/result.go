package study

import (
	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/profile"
)

// Result is one study of one plant: every strategy run once over the
// profile, priced once under the tariff, brought to a year and appraised
// against the baseline, with the checks, the savings range, the staging
// setpoints, the chart tables and every warning. The text report, the
// JSON and the workbook are renderings of it and compute nothing.
type Result struct {
	tick   *ticker // counts solved steps for Options.Advance; nil = silent
	Plant  *plant.Plant
	Trend  *profile.Trend  // the trend the profile names; nil for bins
	Binned *profile.Binned // the trend's bins when they were solved instead of every interval
	Steps  []optimize.Step // what every strategy ran over
	Period Period

	Strategies []Strategy
	Baseline   int // index into Strategies

	// Setpoints are the staging setpoints derived from the lowest-power
	// staging (default options), once; nil with SetpointsError saying why.
	Setpoints      *optimize.Setpoints
	SetpointsError string

	// Appraised is false when the plant file has no retrofit section:
	// savings are shown, investments are not appraised.
	Appraised bool

	Range       *Range                 // savings range of the lowest-power staging; nil when it is the baseline
	PartLoad    []PartLoadCheck        // ASHRAE 90.1 §6.5.4.2 style checks
	UnitOut     *optimize.UnitOutCheck // nil with fewer than two units
	Calibration *Calibration           // predicted against logged power; nil without logged power
	Binning     *BinningCheck          // a trend solved interval by interval against the same trend binned
	DP          *DPComparison          // the trend's logged DP against the modelled setpoint; nil without logged DP
	NPSH        *NPSHCheck             // NPSH available against required at every operating point; Made false without the data
	GroupPower  []PowerCurve           // each strategy's group input across plant flow, for the chart

	// Chart tables of the workbook's staging pictures (study/chartdata.go).
	CountPower  []CountPower // the lowest-power staging held at each number of running units
	StageCurves []StageCurve // full-speed parallel curve of each derived stage; mixed plants only

	// LoadBinWidth is the width of the flow groups a trend's intervals are
	// gathered into for the load points; 0 when each step is its own point.
	LoadBinWidth curves.Flow

	// InputsSHA256 fingerprints the plant file and the trend log it names
	// (see InputsSHA256); "" when a file could not be read again.
	InputsSHA256 string

	Recommendation string
	Warnings       []Warning // usable but questionable, each with where it comes from
	Cautions       []string
}

// Strategy is one way of running the plant over the profile.
type Strategy struct {
	Key  string // KeyLowest, …
	Name string
	Note string // how it runs the plant, in plain words
	Run  optimize.Run
	// Drives is the number of units on drives in this strategy;
	// DrivesAdded those bought against the baseline.
	Drives, DrivesAdded int

	Energy Energy     // the period's energy, peak and unmet hours
	Bill   *econ.Bill // the period priced under the tariff
	Annual econ.Annual

	// Savings against the baseline, a year; nil for the baseline itself.
	Savings *Savings
	// Appraisal of the investment against the baseline from the annual
	// savings; nil for the baseline and when the file has no retrofit section.
	Appraisal *econ.Appraisal

	LoadPoints []LoadPoint // the period, by load step or flow group
	// Regions are the unit-hours of the period outside the preferred
	// region, above rated speed and into the motor's service factor.
	Regions Regions

	served []bool   // per step: the strategy served it; nil unless the series is kept (SeriesKept)
	beaten beaten   // where it draws less than the lowest-power staging
	npsh   *npshRun // its NPSH check; nil when not made
}

// SeriesKept reports whether the strategy kept its input step by step
// (Energy.KW) and whether it served each step (Served): always for a
// profile of up to KeepStatesUpTo steps, bins and the JSON detail; on a
// longer trend only for the lowest-power staging and the strategy the
// calibration compares with the log, so that memory does not grow with
// the number of strategies times the trend's length.
func (s *Strategy) SeriesKept() bool { return s.served != nil }

// Served reports whether the strategy served step i; false when the
// series was not kept.
func (s *Strategy) Served(i int) bool { return s.served != nil && s.served[i] }

// Savings are a strategy's annual savings against the baseline.
type Savings struct {
	Energy     float64 // kWh/yr
	EnergyCost float64 // currency/yr
	DemandCost float64 // currency/yr
	Cost       float64 // EnergyCost + DemandCost, currency/yr
	Emissions  float64 // kg CO₂e/yr
}

// Share is the energy saved as a fraction of the baseline's.
func (s *Savings) Share(base *Strategy) float64 {
	if base.Annual.Energy <= 0 {
		return 0
	}
	return s.Energy / base.Annual.Energy
}

// LoadPoint is one load step of a strategy over the period: a bin, or for a
// trend solved interval by interval the intervals whose flow falls in one
// flow group (LoadBinWidth wide).
type LoadPoint struct {
	Low, High  curves.Flow     // group edges; both the step's flow for a bin
	Flow       curves.Flow     // the bin's flow, or the hours-weighted mean load flow of the group
	Steps      int             // steps in the point
	Hours      float64         // h in the period
	HoursUnmet float64         // h of those the strategy could not serve
	KWh        float64         // kWh in the period
	KW         float64         // mean group input over the served hours, kW
	Cost       float64         // the tariff's energy cost of these hours, currency
	State      optimize.Result // the state: the bin's own, or the group's served interval nearest its centre flow
	Grouped    bool            // the point gathers intervals (State is a typical one)
}

// Range is the savings range of the lowest-power staging against the
// baseline: each sensitivity case re-run on both, the range spanning the
// expected case and every case.
type Range struct {
	Cases         []RangeCase
	Low, High     float64 // kWh/yr saved
	LowCost       float64 // currency/yr saved at the low end
	HighCost      float64
	LowBy, HighBy string // the case that sets each end; "as given" when it is the expected case
}

// RangeCase is the lowest-power staging's annual savings in one case.
type RangeCase struct {
	Sensitivity Sensitivity
	BaselineKWh float64 // kWh/yr
	LowestKWh   float64 // kWh/yr
	SavedKWh    float64 // kWh/yr
	SavedCost   float64 // energy and demand, currency/yr
}

// BinningCheck compares a trend solved interval by interval with the same
// trend solved in flow bins (lowest-power staging, a year).
type BinningCheck struct {
	Width     curves.Flow
	Bins      int
	EveryKWh  float64 // kWh/yr, every interval
	BinnedKWh float64 // kWh/yr, bins
	CubeError float64 // profile.Binned.CubeError
}

// PowerCurve is one strategy's group input across plant flow.
type PowerCurve struct {
	Key, Name string
	Flow      []curves.Flow
	KW        []float64 // NaN where the strategy cannot serve the flow
}

// Warning is something usable but questionable, with its origin: a file
// position and field, the trend file, the tariff, or the study itself.
type Warning struct {
	Source  string `json:"source"`
	Message string `json:"message"`
}

// Strategy returns the strategy with the key, or nil.
func (r *Result) Strategy(key string) *Strategy {
	for i := range r.Strategies {
		if r.Strategies[i].Key == key {
			return &r.Strategies[i]
		}
	}
	return nil
}

// BaselineStrategy is the strategy savings are counted against.
func (r *Result) BaselineStrategy() *Strategy { return &r.Strategies[r.Baseline] }

// Currency is the tariff's currency label ("$" when the file gives none).
func (r *Result) Currency() string {
	if c := r.Plant.Tariff.Currency; c != "" {
		return c
	}
	return "$"
}
