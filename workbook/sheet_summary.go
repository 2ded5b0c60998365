package workbook

import (
	"fmt"
	"strings"
)

const sheetSummary = "Summary"

// Summary rows not read straight from an Economics metric.
const (
	smSavedShare = -1 // energy saved as a share of the baseline's, by formula
	smReport     = -2 // a value from the Report
)

// summaryRow is one metric of the strategies-compared table, read from the
// Economics sheet by formula.
type summaryRow struct {
	label  string
	metric int // Economics metric row, or one of the kinds below

	style string
	want  func(se StrategyEconomics, s Strategy) Value
}

func (b *book) summarySheet() {
	s := b.newSheet(sheetSummary, true)
	r := b.r
	cur := b.currency()
	n := len(r.Strategies)
	last := max(1+n, 5)

	s.text(1, 1, "Pump group plan: "+r.Plant, "title")
	row := 2
	if r.Subtitle != "" {
		s.text(1, row, r.Subtitle, "subtitle")
		row++
	}
	s.text(1, row, b.unitsLine(), "italic")
	row += 2

	s.text(1, row, "Cautions", "h2")
	for _, c := range r.Cautions {
		row++
		s.merged(row, 1, last, c, "caution")
	}
	row += 2

	s.text(1, row, "Strategies compared", "h2")
	row++
	names := make([]string, 0, n+1)
	names = append(names, "Per year unless stated")
	for i, st := range r.Strategies {
		if i == r.Baseline {
			names = append(names, st.Name+" (baseline)")
		} else {
			names = append(names, st.Name)
		}
	}
	s.header(row, 1, names...)
	if hasDescriptions(r.Strategies) {
		row++
		s.text(1, row, "What it is", "text")
		for i, st := range r.Strategies {
			s.wrapped(2+i, row, st.Description, "note_wrap")
		}
	}
	base := b.econ.Strategies[r.Baseline]
	rows := []summaryRow{
		{"Annual energy (kWh/yr)", ekWh, "int", func(se StrategyEconomics, _ Strategy) Value { return num(se.EnergyKWh) }},
		{"Peak demand (kW)", ekPeak, "d1", func(se StrategyEconomics, _ Strategy) Value { return num(se.PeakKW) }},
		{"Annual cost (" + cur + "/yr)", ekTotal, "int", func(se StrategyEconomics, _ Strategy) Value { return num(se.TotalCost) }},
		{"Energy saved vs baseline (kWh/yr)", ekKWhSaved, "int", func(se StrategyEconomics, _ Strategy) Value { return num(se.EnergySaved) }},
		{"Energy saved vs baseline (%)", smSavedShare, "pct", func(se StrategyEconomics, _ Strategy) Value {
			if base.EnergyKWh > 0 {
				return num(se.EnergySaved / base.EnergyKWh)
			}
			return num(0)
		}},
		{"Cost saved vs baseline (" + cur + "/yr)", ekCostSaved, "b_int", func(se StrategyEconomics, _ Strategy) Value { return num(se.CostSaved) }},
		{"Investment (" + cur + ")", ekInvestment, "int", func(se StrategyEconomics, _ Strategy) Value { return num(se.Investment) }},
		{"Simple payback (years)", ekPayback, "d1", func(se StrategyEconomics, _ Strategy) Value {
			if se.HasSaving {
				return num(se.Payback)
			}
			return text(noSaving)
		}},
		{"NPV over life (" + cur + ")", ekNPV, "b_int", func(se StrategyEconomics, _ Strategy) Value { return num(se.NPV) }},
		{"Emissions (t CO₂e/yr)", ekEmissions, "d1", func(se StrategyEconomics, _ Strategy) Value { return num(se.Emissions) }},
		{"Hours the load is not met (h/yr)", smReport, "int", func(_ StrategyEconomics, st Strategy) Value { return num(st.HoursUnmet) }},
	}
	for _, m := range rows {
		row++
		s.text(1, row, m.label, "text")
		for i, st := range r.Strategies {
			se := b.econ.Strategies[i]
			want := m.want(se, st)
			switch {
			case m.metric >= 0:
				s.formula(2+i, row, ref(sheetEconomics, econCol(i), econRow(m.metric)), want, m.style)
			case m.metric == smSavedShare:
				saved := ref(sheetEconomics, econCol(i), econRow(ekKWhSaved))
				baseKWh := ref(sheetEconomics, econCol(r.Baseline), econRow(ekWh))
				s.formula(2+i, row, fmt.Sprintf("IF(%s>0,%s/%s,0)", baseKWh, saved, baseKWh), want, m.style)
			default:
				s.number(2+i, row, want.Number, m.style)
			}
		}
	}
	row++
	s.merged(row, 1, last, "Costs, savings, payback and NPV are live formulas on the Economics sheet: change the price, drive cost, life or discount rate there.", "note_wrap")
	row += 2

	s.text(1, row, "Recommended staging", "h2")
	row++
	rec := r.Recommendation
	if rec == "" {
		rec = "No recommendation given."
	}
	if r.Recommendation != "" {
		when := "by wattstage " + b.version()
		if r.Date != "" {
			when = "on " + r.Date + " " + when
		}
		rec += " (Written " + when + " from the inputs as given: editing the Economics inputs recalculates the tables and charts, not this sentence.)"
	}
	s.merged(row, 1, last, rec+" Setpoints, delays and the sequence of operation are on the Staging sheet.", "wrap")
	row += 2

	s.text(1, row, "Checks", "h2")
	row++
	if len(r.Checks) == 0 {
		s.text(1, row, "None given.", "italic")
	} else {
		s.header(row, 1, "Check", "Result")
		s.merged(row, 3, last, "Detail", "header")
		for _, c := range r.Checks {
			row++
			s.wrapped(1, row, c.Name, "wrap")
			s.wrapped(2, row, c.Result, "bold_wrap")
			s.merged(row, 3, last, c.Detail, "wrap")
		}
	}
	row += 2

	s.text(1, row, "Savings range", "h2")
	row = b.quantities(s, row+1, r.SavingsRange, false)
	row++

	row = b.bullets(s, row, "Assumptions and defaults", r.Assumptions, last)
	row = b.bullets(s, row, "Notes", r.Notes, last)

	s.fixed[1] = 38
	for c := 2; c <= last; c++ {
		s.fixed[c] = 15
	}
	b.pageSetup(s, false, last, row)
	s.finish()
}

// bullets writes a headed list of wrapped paragraphs and returns the row
// after it.
func (b *book) bullets(s *sheet, row int, title string, items []string, last int) int {
	s.text(1, row, title, "h2")
	row++
	if len(items) == 0 {
		s.text(1, row, "None given.", "italic")
		return row + 2
	}
	for _, it := range items {
		s.merged(row, 1, last, "• "+it, "wrap")
		row++
	}
	return row + 1
}

// quantities writes label, value, unit and source rows from row and
// returns the row after the last. When flagDefaults is set, a default is
// marked in its own column.
func (b *book) quantities(s *sheet, row int, qs []Quantity, flagDefaults bool) int {
	if len(qs) == 0 {
		s.text(1, row, "None given.", "italic")
		return row + 1
	}
	cols := []string{"Quantity", "Value", "Unit", "Source"}
	if flagDefaults {
		cols = append(cols, "Default?")
	}
	s.header(row, 1, cols...)
	for _, q := range qs {
		row++
		s.wrapped(1, row, q.Label, "wrap")
		if q.Text != "" {
			s.merged(row, 2, 3, q.Text, "wrap")
		} else {
			s.number(2, row, q.Value, decStyle(q.Decimals))
		}
		s.text(3, row, q.Unit, "text")
		s.wrapped(4, row, q.Source, "wrap")
		if flagDefaults && q.Default {
			s.text(5, row, "default", "bold")
		}
	}
	return row + 1
}

// unitsLine states the unit system and the date.
func (b *book) unitsLine() string {
	u := b.r.Units
	parts := []string{}
	if u.System != "" {
		parts = append(parts, u.System+" units")
	}
	var q []string
	for _, p := range [][2]string{{"flow", u.Flow}, {"head", u.Head}, {"pressure", u.Pressure}, {"motor output", u.MotorPower}} {
		if p[1] != "" {
			q = append(q, p[0]+" "+p[1])
		}
	}
	q = append(q, "electrical power kW", "energy kWh", "money "+b.currency())
	parts = append(parts, strings.Join(q, ", "))
	line := strings.Join(parts, ": ")
	if b.r.Date != "" {
		line = b.r.Date + " · " + line
	}
	return line
}

func hasDescriptions(ss []Strategy) bool {
	for _, s := range ss {
		if s.Description != "" {
			return true
		}
	}
	return false
}
