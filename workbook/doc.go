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
//     OtherCost, LifeYears, DiscountRate, Escalation, EmissionsFactor) and
//     a strategy table computed from them by formula.
//   - Staging: stage-up and stage-down setpoints with delays, settings and
//     the sequence of operation.
//   - Curves: native charts: head at several speeds with the system curve,
//     efficiency against flow, group input against plant flow per strategy,
//     annual energy per strategy.
//   - Load points: every bin under every strategy, with per-unit speeds,
//     flows and efficiencies, and totals per strategy by formula.
//   - Inputs: pump models, fitted coefficients and residuals, motors,
//     drives, system, fluid and tariff.
//   - Curve data: the tables the charts read.
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
