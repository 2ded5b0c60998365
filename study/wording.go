package study

import (
	"fmt"
	"math"

	"wattstage/econ"
	"wattstage/optimize"
)

// Cautions are the one copy of the safety and responsibility cautions that
// every rendering shows where results could be acted on: the text report,
// the JSON and the workbook's Summary.
var Cautions = []string{
	"These figures are planning estimates computed from the stated pump curves, defaults and load profile; they are not measured performance.",
	"Pump, motor and drive limits come from their manufacturers. Before a sequence is changed, confirm with them the minimum flow and minimum speed of each pump, the NPSH margin against cavitation, motor cooling at low speed and any resonance at the new speeds.",
	"Confirm the minimum flow of every chiller and boiler, and the bypass that holds it, with their manufacturers.",
	"Sequences and retrofits are the responsibility of a licensed engineer under local codes; code checks here follow the user's code edition and must be verified locally.",
}

// Grouped writes v rounded to a whole number with thousands separators,
// e.g. 122,665.
func Grouped(v float64) string { return groupedDec(v, 0) }

// GroupedDec writes v with dec decimals and thousands separators, e.g.
// 1,800.0; "—" for NaN and ±Inf.
func GroupedDec(v float64, dec int) string { return groupedDec(v, dec) }

// groupedDec writes v with dec decimals and thousands separators; "—"
// where there is no number.
func groupedDec(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	return optimize.Thousands(v, dec)
}

// recommendation writes the one-paragraph recommendation from the result's
// annual figures.
func recommendation(r *Result) string {
	lo := r.Strategy(KeyLowest)
	if lo == nil || lo.Savings == nil {
		return ""
	}
	base := r.BaselineStrategy()
	sv := lo.Savings
	s := fmt.Sprintf("Run the lowest-power staging: %s kWh/yr against %s kWh/yr for %s (%.0f %% less), saving about %s %s/yr",
		Grouped(lo.Annual.Energy), Grouped(base.Annual.Energy), base.Name, 100*sv.Share(base), Grouped(sv.Cost), r.Currency())
	if a := lo.Appraisal; a != nil {
		s += fmt.Sprintf("; %d drive(s) to buy, investment %s %s, simple payback %s", lo.DrivesAdded, Grouped(a.Investment), r.Currency(), econ.PaybackText(a.SimplePayback))
	} else {
		s += "; no investment appraisal (the plant file has no retrofit section)"
	}
	return s + "."
}
