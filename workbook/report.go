package workbook

// Report is everything the workbook shows, already computed and already in
// display units. The writer does no physics: it lays out what it is given
// and adds the live economics formulas. Every number carries its unit in a
// header or a Unit field; nothing is converted here.
//
// Slices may be empty: the matching section then says "none given" rather
// than disappearing, so a reader can tell an empty result from a missing one.
type Report struct {
	Plant    string // plant name, used in titles; required
	Subtitle string // one line under the title, e.g. "Chilled-water secondary pumps"; optional
	Date     string // report date as the user should see it, e.g. "2025-03-14"; also stored as the document date. Empty = no date shown, fixed document date
	Version  string // version of the program that wrote the workbook, shown in every page footer; empty = "devel"
	// InputsSHA256 fingerprints the input files (hex SHA-256), shown on the
	// Inputs sheet and, its first 12 digits, in every page footer; empty =
	// not shown.
	InputsSHA256 string
	// Paper is the paper every sheet is set up to print on: "A4" or
	// "Letter". Empty = Letter for US units, A4 otherwise. Every sheet is
	// laid out to print cleanly on either.
	Paper string
	Units Units // unit labels for every quantity

	Cautions    []string // safety and responsibility cautions shown at the top of the Summary; required (the caller owns their wording)
	Assumptions []string // every default or assumption that was used, in plain words
	Notes       []string // other remarks (warnings from the solver, data quality)

	Recommendation string     // one paragraph naming the recommended strategy and staging, shown on the Summary
	Checks         []Check    // code and redundancy checks (90.1 part-load, one unit out)
	SavingsRange   []Quantity // savings range rows, e.g. {"Savings, low case", 61200, "kWh/yr"}

	Pumps  []PumpModel
	Motors []Motor
	Drives []Drive
	System []Quantity // the system served: control head, design head and flow, reset, minimum flow, static head…
	Fluid  []Quantity // fluid: temperature, density, specific gravity, vapour pressure…
	Tariff Tariff

	Strategies []Strategy // at least one
	Baseline   int        // index in Strategies of the strategy the others are compared against

	LoadPoints []LoadPoint
	Staging    Staging
	Curves     Curves
	Economics  EconomicsInputs

	// CashFlow is the name of the strategy whose retrofit cash flow the
	// Economics sheet tabulates by formula and charts (cumulative
	// discounted cash flow with the payback year); empty = none.
	CashFlow string
	// Trend is the trend log's coverage and the calibration of predicted
	// against logged power, shown on the Measured sheet; nil when the
	// profile is not a trend (no Measured sheet).
	Trend *TrendRecord
}

// TrendRecord is what the workbook says about a trend log: how much of its
// span it covers, and how the predicted power compares with the logged.
type TrendRecord struct {
	Coverage    []Quantity // rows kept and dropped, period, hours covered, logging interval, gaps…
	Calibration []Quantity // comparison figures (intervals, mean logged, NMBE, CV(RMSE), limits); empty without logged power
	Verdict     string     // one sentence on the calibration; empty without logged power
}

// Units holds the display labels of each quantity, e.g. US: "gpm", "ft",
// "hp"; SI: "m³/h", "m", "kW". Electrical power is always kW and energy kWh.
type Units struct {
	System     string // "US" or "SI", shown on the Summary
	Flow       string // e.g. "gpm" or "m³/h"; required
	Head       string // e.g. "ft" or "m"; required
	Pressure   string // e.g. "psi" or "kPa"; optional
	MotorPower string // rated motor output, e.g. "hp" or "kW"; required when Motors is not empty
	Speed      string // speed of rotation at rated speed, e.g. "rpm"; defaults to "rpm"
	Currency   string // currency label used in headers, e.g. "USD" or "$"; defaults to "$"
}

// Quantity is one labelled value. Text, when not empty, is shown instead of
// Value (for things like "DP control, sensor at far riser").
type Quantity struct {
	Label    string
	Value    float64
	Unit     string
	Decimals int    // decimals shown; 0 shows a whole number
	Text     string // shown instead of Value when not empty
	Default  bool   // the value is a default, not user input; flagged in the sheet
	Source   string // where the value comes from (datasheet, 10 CFR 431.25, user), optional
}

// Check is the outcome of one code or redundancy check.
type Check struct {
	Name   string // e.g. "ASHRAE 90.1 §6.5.4.2 part-load power"
	Result string // short verdict, e.g. "pass", "fails", "not applicable"
	Detail string // the numbers behind the verdict, in plain words
}

// PumpModel is one pump model of the group with its fitted curves.
type PumpModel struct {
	Name       string  // model label as the user gave it
	Units      string  // the units of this model, e.g. "P1, P2"
	RatedSpeed float64 // rpm at which the datasheet points were taken
	BEPFlow    float64 // flow at best efficiency, Units.Flow
	BEPHead    float64 // head at BEP, Units.Head
	BEPEff     float64 // pump efficiency at BEP, %
	MinFlow    float64 // minimum continuous stable flow at rated speed, Units.Flow; 0 = not given
	MaxFlow    float64 // runout flow at rated speed, Units.Flow; 0 = not given
	Source     string  // where the curve comes from, e.g. "datasheet rev. C, 1780 rpm"

	// HeadFit are the coefficients a0, a1, a2[, a3] of H(Q) = a0 + a1 Q + a2 Q² (+ a3 Q³)
	// in Units.Head and Units.Flow at rated speed.
	HeadFit []float64
	// EffFit are the coefficients of η(Q) in % against Units.Flow at rated speed.
	EffFit []float64
	// Points are the datasheet points with the fitted values and residuals.
	Points []CurvePoint
	// HeadRMS and EffRMS are the root-mean-square residuals of the fits,
	// Units.Head and % points.
	HeadRMS, EffRMS float64
}

// CurvePoint is one datasheet point beside the fitted curve.
type CurvePoint struct {
	Flow    float64 // Units.Flow
	Head    float64 // datasheet head, Units.Head
	HeadFit float64 // fitted head at Flow
	Eff     float64 // datasheet efficiency, %; NaN = not given
	EffFit  float64 // fitted efficiency at Flow, %; NaN = not fitted
}

// Motor is one unit's motor.
type Motor struct {
	Unit          string  // unit label, e.g. "P1"
	Rated         float64 // rated output, Units.MotorPower
	FullLoadEff   float64 // full-load efficiency, %
	ServiceFactor float64 // e.g. 1.15; 0 = not given
	PartLoad      string  // part-load model, e.g. "DOE appendix A loss factor"
	Source        string  // e.g. "nameplate", "10 CFR 431.25 Table 5"
	Default       bool    // efficiency defaulted rather than given
}

// Drive is one unit's drive, or its absence.
type Drive struct {
	Unit      string  // unit label
	Kind      string  // e.g. "VFD", "across-the-line (fixed speed)"
	MinSpeed  float64 // minimum speed, % of rated; 0 = not applicable
	MaxSpeed  float64 // maximum speed, % of rated; 0 = not applicable
	LossModel string  // e.g. "DOE appendix A motor+drive factor"
	Default   bool    // loss model defaulted rather than given
}

// Tariff is the tariff as understood, for display on the Inputs sheet. The
// Economics sheet's live inputs come from EconomicsInputs.
type Tariff struct {
	Description string     // e.g. "flat energy price with monthly demand charge"
	Items       []Quantity // energy price, demand charge, emissions factor…
	Periods     []TariffPeriod
}

// TariffPeriod is one time-of-use period.
type TariffPeriod struct {
	Name  string
	Price float64 // currency per kWh
	Hours string  // e.g. "Mon–Fri 12:00–18:00"
}

// Strategy is one way of running the group, with its annual totals.
type Strategy struct {
	Name        string  // e.g. "Optimised staging on drives"
	Description string  // one line, optional
	EnergyKWh   float64 // annual electrical energy, kWh/yr
	PeakKW      float64 // annual peak electrical demand, kW
	// BilledDemand is the sum of the monthly billed peaks, kW·month/yr.
	// 0 = 12 × PeakKW (the annual peak billed every month).
	BilledDemand float64
	// EnergyCost is the annual energy cost at the stated tariff, currency/yr,
	// including any time-of-use weighting. 0 = EnergyKWh × EnergyPrice. The
	// Economics sheet keeps the ratio of the two as a price factor, so a new
	// energy price scales the cost as the tariff would.
	EnergyCost  float64
	DrivesToBuy int     // drives this strategy needs bought; bears DriveCost each; every strategy but the baseline bears OtherCost once
	HoursUnmet  float64 // hours per year the strategy cannot serve the load, h/yr
}

// LoadPoint is one bin or interval under one strategy.
type LoadPoint struct {
	Bin          string  // bin label or interval timestamp
	Strategy     string  // strategy name
	PlantFlow    float64 // Units.Flow
	RequiredHead float64 // head the system asks for, Units.Head
	Head         float64 // head the pumps deliver, Units.Head
	Hours        float64 // h/yr in this bin (1 for an hourly interval)
	Running      string  // units running, e.g. "P1+P2"
	UnitsRunning int
	Units        []UnitPoint // one per running unit, in the order of Running
	KW           float64     // group electrical input, kW
	KWh          float64     // kWh/yr in this bin
	Cost         float64     // energy cost at the stated tariff, currency/yr
	Binding      string      // binding limit, e.g. "minimum speed", "plant bypass"; empty = none
	Flags        string      // flags, e.g. "outside POR; default motor efficiency"
}

// UnitPoint is one running unit at one load point.
type UnitPoint struct {
	Unit     string
	Speed    float64 // % of rated
	Flow     float64 // Units.Flow
	PumpEff  float64 // %
	MotorEff float64 // %
	DriveEff float64 // %; NaN = no drive
	KW       float64 // electrical input, kW
}

// Staging is the staging setpoints table and the sequence text.
type Staging struct {
	// Signal is the one signal the sequence stages on ("flow", "speed" or
	// "flow-and-speed") and SignalRule how it is applied, in words.
	Signal, SignalRule string
	Rows               []StagingRow
	Settings           []Quantity // minimum speed, lead rotation interval, failure response…
	Sequence           []string   // the sequence of operation, one paragraph or step per entry
}

// StagingRow is one stage change between two running counts.
type StagingRow struct {
	From, To  int     // units running before and after stage up (To = From+1)
	Units     string  // units added, e.g. "P3"
	UpSpeed   float64 // stage up when speed stays above, %
	UpFlow    float64 // or when plant flow stays above, Units.Flow
	UpDelay   float64 // for, min
	DownSpeed float64 // stage down when speed stays below, %
	DownFlow  float64 // or plant flow below, Units.Flow
	DownDelay float64 // for, min
	Note      string
}

// Curves are the data behind the charts. A NaN in Y leaves a gap. A chart
// with no series is left out.
type Curves struct {
	Head       []Chart // one per pump model: the operating points on its curves with the system curve
	Efficiency []Chart // pump efficiency vs flow, one chart per model or one for all
	GroupPower Chart   // group electrical input vs plant flow, one series per strategy
	Parallel   Chart   // full-speed curve of each stage's units in parallel, against plant flow (mixed plants)
	CountPower Chart   // group input per number of running units, with crossovers and stage changes marked
	Bands      Chart   // the flow range of each stage, with the stage-up and stage-down flows
	Hours      Bars    // hours a year per flow bin
	Energy     Bars    // energy a year per flow bin, by strategy
	Measured   Chart   // logged against predicted power with the 1:1 line; shown on the Measured sheet
}

// Chart is one scatter chart. Its axes run from a rounded value at or
// below its data's least to one at or above its greatest (from 0 when the
// data are not negative).
type Chart struct {
	Title   string
	XLabel  string // axis title with unit, e.g. "Flow (gpm)"
	YLabel  string
	Series  []Series
	Markers bool // mark every point of the Line and Dashed series (results at discrete loads rather than smooth curves)
	// YStep is the spacing of the value axis's labels; 0 = automatic. A
	// count axis (units running) uses 1.
	YStep float64
}

// Series is one line of a chart: X and Y of the same length.
type Series struct {
	Name  string
	X, Y  []float64
	Style SeriesStyle
}

// SeriesStyle is how a series is drawn.
type SeriesStyle int

const (
	StyleLine   SeriesStyle = iota // solid line (dashed when the name says it is a system or control curve)
	StyleDashed                    // dashed line: a system curve, a limit
	StylePoints                    // markers only: operating points, the BEP, crossovers
	StyleBand                      // a thick bar: a range of flow
	StyleGuide                     // thin dotted line: a reference such as the 1:1 line or a region's edge
)

// Bars is a column chart: one column per category in each series.
type Bars struct {
	Title      string
	XLabel     string   // axis title of the categories, with unit
	YLabel     string   // value axis title with unit
	Categories []string // e.g. the flow of each bin
	Series     []BarSeries
}

// BarSeries is one set of columns, a value per category (NaN = none).
type BarSeries struct {
	Name   string
	Values []float64
}

// EconomicsInputs are the live inputs of the Economics sheet, each written to
// a named cell the owner can change.
type EconomicsInputs struct {
	EnergyPrice     float64 // currency/kWh
	DemandCharge    float64 // currency per kW·month
	DriveCost       float64 // installed cost per drive, currency
	OtherCost       float64 // other one-off retrofit cost, currency (applied once to every strategy but the baseline)
	LifeYears       int     // appraisal life, years; ≥ 1
	DiscountRate    float64 // real discount rate, fraction per year (0.05 = 5 %)
	Escalation      float64 // energy price escalation, fraction per year
	EmissionsFactor float64 // kg CO₂e per kWh; 0 = not reported
}
