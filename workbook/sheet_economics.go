package workbook

import (
	"fmt"
	"strings"
)

const sheetEconomics = "Economics"

// Economics sheet layout: the named inputs from row econInputRow, then the
// strategy table with one column per strategy (from column 2) and one row
// per metric below its header row econTableRow. Metric rows:
const (
	ekWh = iota
	ekPeak
	ekBilled
	ekFactor
	ekDrives
	ekEnergyCost
	ekDemandCost
	ekTotal
	ekKWhSaved
	ekCostSaved
	ekInvestment
	ekPayback
	ekNPV
	ekEmissions
	ekEmissionsCut
	ekCount
)

const (
	econInputRow = 6  // first named input
	econTableRow = 18 // header row of the strategy table (strategy names)
)

// econRow is the row of a metric; econCol the column of strategy i.
func econRow(metric int) int { return econTableRow + 1 + metric }
func econCol(i int) int      { return 2 + i }

// namedInput is one live input of the Economics sheet.
type namedInput struct {
	name  string // defined name
	label string
	value float64
	unit  string
	style string
}

func (b *book) namedInputs() []namedInput {
	in := b.r.Economics
	cur := b.currency()
	return []namedInput{
		{"EnergyPrice", "Energy price", in.EnergyPrice, cur + "/kWh", "in_d4"},
		{"DemandCharge", "Demand charge", in.DemandCharge, cur + "/kW·month", "in_d2"},
		{"DriveCost", "Installed cost per drive", in.DriveCost, cur, "in_int"},
		{"OtherCost", "Other one-off cost of a retrofit", in.OtherCost, cur, "in_int"},
		{"LifeYears", "Appraisal life", float64(in.LifeYears), "years", "in_int"},
		{"DiscountRate", "Real discount rate", in.DiscountRate, "%/yr", "in_pct"},
		{"Escalation", "Energy price escalation", in.Escalation, "%/yr", "in_pct"},
		{"EmissionsFactor", "Emissions factor", in.EmissionsFactor, "kg CO₂e/kWh", "in_d3"},
	}
}

func (b *book) currency() string {
	if b.r.Units.Currency != "" {
		return b.r.Units.Currency
	}
	return "$"
}

func (b *book) economicsSheet() {
	s := b.newSheet(sheetEconomics, false)
	cur := b.currency()
	s.text(1, 1, "Economics: "+b.r.Plant, "title")
	s.text(1, 2, "Blue cells are inputs: change them and every cost, saving, payback and NPV on this sheet and the Summary recalculates.", "subtitle")

	s.text(1, econInputRow-2, "Inputs", "h2")
	s.header(econInputRow-1, 1, "Input", "Value", "Unit", "Cell name")
	row := econInputRow
	for _, in := range b.namedInputs() {
		s.text(1, row, in.label, "text")
		s.number(2, row, in.value, in.style)
		s.text(3, row, in.unit, "text")
		s.text(4, row, in.name, "italic")
		b.defineName(in.name, ref(sheetEconomics, 2, row))
		row++
	}
	s.text(1, row, "Present value factor UPV*", "text")
	s.formula(2, row, pvFactorFormula, num(b.econ.PVFactor), "d4")
	s.text(3, row, "years", "text")
	s.text(4, row, "PVFactor", "italic")
	b.defineName("PVFactor", ref(sheetEconomics, 2, row))

	s.text(1, econTableRow-1, "Strategies", "h2")
	n := len(b.econ.Strategies)
	names := []string{"Per year unless stated"}
	for i, se := range b.econ.Strategies {
		if i == b.r.Baseline {
			names = append(names, se.Name+" (baseline)")
		} else {
			names = append(names, se.Name)
		}
	}
	s.header(econTableRow, 1, names...)
	for _, m := range b.econMetrics(cur) {
		r := econRow(m.row)
		s.text(1, r, m.label, m.labelStyle())
		for i, se := range b.econ.Strategies {
			c := econCol(i)
			switch {
			case m.formula != nil:
				s.formula(c, r, m.formula(c), m.want(se), m.style)
			default:
				s.number(c, r, m.want(se).Number, m.style)
			}
		}
	}
	last := max(econCol(n-1), 4)

	row = econRow(ekCount) + 1
	s.text(1, row, "How it is computed", "h2")
	for _, line := range []string{
		"Energy cost = annual energy × EnergyPrice × price factor. The price factor carries a time-of-use tariff's weighting (1 for a flat price), so a new energy price scales the cost as the tariff would.",
		"Demand cost = billed demand × DemandCharge; billed demand is the sum of the monthly peaks (12 × the annual peak when no monthly peaks were given).",
		"Savings are against the baseline, " + b.r.Strategies[b.r.Baseline].Name + ". Investment = drives to buy × DriveCost + OtherCost, for every strategy but the baseline (programming and commissioning come with any change of operation).",
		"Simple payback = investment ÷ cost saved. NPV = cost saved × PVFactor − investment, where PVFactor is the modified uniform present value factor of NIST Handbook 135: Σ ((1+e)/(1+d))^t over the life, e the escalation and d the real discount rate.",
		"Maintenance, drive replacement, harmonics mitigation and incentives are not included; add them to OtherCost or adjust the result.",
	} {
		row++
		s.merged(row, 1, last, line, "wrap")
	}
	s.fixed[1] = 40
	for c := 2; c <= last; c++ {
		s.fixed[c] = 16
	}
	row = b.cashFlowSection(s, row+2, last)
	b.pageSetup(s, false, last, row)
	s.finish()
}

// econMetric is one row of the strategy table: a value from the Report, or
// a formula of the cells above it in the same column.
type econMetric struct {
	row     int
	label   string
	style   string
	formula func(col int) string // nil: a value
	want    func(se StrategyEconomics) Value
}

func (m econMetric) labelStyle() string {
	if strings.HasPrefix(m.style, "b_") {
		return "bold"
	}
	return "text"
}

func (b *book) econMetrics(cur string) []econMetric {
	at := func(metric, col int) string { return cellName(col, econRow(metric)) }
	baseAt := func(metric int) string { return absCell(econCol(b.r.Baseline), econRow(metric)) }
	return []econMetric{
		{ekWh, "Annual energy (kWh/yr)", "int", nil, func(se StrategyEconomics) Value { return num(se.EnergyKWh) }},
		{ekPeak, "Peak demand (kW)", "d1", nil, func(se StrategyEconomics) Value { return num(se.PeakKW) }},
		{ekBilled, "Billed demand (kW·month/yr)", "int", nil, func(se StrategyEconomics) Value { return num(se.BilledDemand) }},
		{ekFactor, "Energy price factor (–)", "d4", nil, func(se StrategyEconomics) Value { return num(se.PriceFactor) }},
		{ekDrives, "Drives to buy (count)", "in_int", nil, func(se StrategyEconomics) Value { return num(float64(se.Drives)) }},
		{ekEnergyCost, "Energy cost (" + cur + "/yr)", "int",
			func(c int) string { return fmt.Sprintf("%s*EnergyPrice*%s", at(ekWh, c), at(ekFactor, c)) },
			func(se StrategyEconomics) Value { return num(se.EnergyCost) }},
		{ekDemandCost, "Demand cost (" + cur + "/yr)", "int",
			func(c int) string { return fmt.Sprintf("%s*DemandCharge", at(ekBilled, c)) },
			func(se StrategyEconomics) Value { return num(se.DemandCost) }},
		{ekTotal, "Annual cost (" + cur + "/yr)", "b_int",
			func(c int) string { return fmt.Sprintf("%s+%s", at(ekEnergyCost, c), at(ekDemandCost, c)) },
			func(se StrategyEconomics) Value { return num(se.TotalCost) }},
		{ekKWhSaved, "Energy saved vs baseline (kWh/yr)", "int",
			func(c int) string { return fmt.Sprintf("%s-%s", baseAt(ekWh), at(ekWh, c)) },
			func(se StrategyEconomics) Value { return num(se.EnergySaved) }},
		{ekCostSaved, "Cost saved vs baseline (" + cur + "/yr)", "b_int",
			func(c int) string { return fmt.Sprintf("%s-%s", baseAt(ekTotal), at(ekTotal, c)) },
			func(se StrategyEconomics) Value { return num(se.CostSaved) }},
		{ekInvestment, "Investment (" + cur + ")", "int",
			func(c int) string {
				if c == econCol(b.r.Baseline) {
					return "0"
				}
				return fmt.Sprintf("%s*DriveCost+OtherCost", at(ekDrives, c))
			},
			func(se StrategyEconomics) Value { return num(se.Investment) }},
		{ekPayback, "Simple payback (years)", "d1",
			func(c int) string {
				return fmt.Sprintf("IF(%s>0,%s/%s,%q)", at(ekCostSaved, c), at(ekInvestment, c), at(ekCostSaved, c), noSaving)
			},
			func(se StrategyEconomics) Value {
				if se.HasSaving {
					return num(se.Payback)
				}
				return text(noSaving)
			}},
		{ekNPV, "NPV over life (" + cur + ")", "b_int",
			func(c int) string { return fmt.Sprintf("%s*PVFactor-%s", at(ekCostSaved, c), at(ekInvestment, c)) },
			func(se StrategyEconomics) Value { return num(se.NPV) }},
		{ekEmissions, "Emissions (t CO₂e/yr)", "d1",
			func(c int) string { return fmt.Sprintf("%s*EmissionsFactor/1000", at(ekWh, c)) },
			func(se StrategyEconomics) Value { return num(se.Emissions) }},
		{ekEmissionsCut, "Emissions cut vs baseline (t CO₂e/yr)", "d1",
			func(c int) string { return fmt.Sprintf("%s-%s", baseAt(ekEmissions), at(ekEmissions, c)) },
			func(se StrategyEconomics) Value { return num(se.EmissionsCut) }},
	}
}

// noSaving is the payback shown when a strategy saves nothing.
const noSaving = "no saving"
