// Package workbook writes the Excel workbook an engineer hands to an owner
// or a controls contractor: the plan for a group of parallel pumps, its
// inputs, load points, staging setpoints, curves and a live appraisal.
//
// The writer takes a [Report]: plain data, already computed and already in
// display units, each number with its unit. It does no physics. The one
// calculation it adds is the appraisal, as spreadsheet formulas over named
// input cells, so the owner can change the energy price or the drive cost
// and see the payback move. [ComputeEconomics] computes the same appraisal
// in Go, and [Formulas] lists every formula cell with the value Go computed
// for it, so a test can open the file in a real spreadsheet program and
// compare.
//
// # Sheets
//
//   - Summary: cautions, the strategies side by side (energy, peak, cost,
//     savings, payback, NPV, emissions, hours unmet), the recommended
//     staging, the checks, the savings range, the assumptions and notes.
//   - Economics: the named inputs (EnergyPrice, DemandCharge, DriveCost,
//     OtherCost, LifeYears, DiscountRate, Escalation, EmissionsFactor),
//     a strategy table computed from them by formula, and on a second page
//     the retrofit's discounted cash flow by formula with its chart and the
//     discounted payback ([CashFlow]).
//   - Staging: stage-up and stage-down setpoints with delays, the settings
//     they were derived with (a record, not inputs) and the sequence of
//     operation.
//   - Curves: native charts, four to a printed page: each model's
//     operating points on its curves (head at maximum and minimum speed,
//     system curves, BEP, preferred-region edges, minimum flow, runout)
//     beside its efficiency; the stages in parallel (mixed plants); input
//     by number of running units with crossovers and stage changes; the
//     staging bands; group input per strategy; annual energy; hours and
//     energy per load step.
//   - Measured (with a trend): the trend's coverage, the calibration
//     figures and logged against predicted power with the 1:1 line.
//   - Load points: every bin under every strategy, with per-unit speeds,
//     flows and efficiencies, and totals per strategy by formula.
//   - Inputs: pump models, fitted coefficients and residuals, motors,
//     drives, system, fluid and tariff.
//   - Curve data: the tables the charts read.
//
// # Printing
//
// Every sheet is set up for A4 or US Letter ([Report].Paper), one page
// wide, with a footer carrying the plant, the sheet, page x of y, the
// program's version and the report date. Every scatter chart's axes are
// fixed to a rounded range around its data.
//
// # Economics
//
// For each strategy, with the baseline's figures subscripted b:
//
//	energy cost = kWh × EnergyPrice × price factor
//	demand cost = billed kW·month × DemandCharge
//	saved       = cost_b − cost
//	investment  = drives × DriveCost + OtherCost   (0 for the baseline)
//	payback     = investment / saved               (when saved > 0)
//	NPV         = saved × UPV* − investment
//
// where UPV* is the modified uniform present value factor of NIST
// Handbook 135 ([PVFactor]).
//
// # Writing
//
// [Write] is atomic (temporary file in the same folder, synced, renamed),
// refuses to overwrite without [Options].Force or to write over an input
// file, and is deterministic: parts in a fixed order, content types
// sorted, fixed timestamps, so the same Report gives the same bytes.
package workbook
