package workbook

import (
	"fmt"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"
)

// CashFlowYear is one year of a retrofit's discounted cash flow, as the
// Economics sheet computes it by formula.
type CashFlowYear struct {
	Year       int     // 0 (the investment) … LifeYears
	Savings    float64 // cost saved in that year, currency: CostSaved·(1+e)^k (0 in year 0)
	Discounted float64 // Savings/(1+d)^k
	Cumulative float64 // −Investment + Σ Discounted up to the year
}

// CashFlow is the discounted cash flow of one strategy's retrofit over the
// appraisal life: savings at base-date prices escalate at e a year and are
// discounted at d a year, each year's savings at its end (the convention of
// NIST Handbook 135's UPV*, see PVFactor):
//
//	savings_k    = saved·(1+e)^k
//	cumulative_k = −investment + Σ_{t=1..k} savings_t/(1+d)^t
//
// Payback is the discounted payback, the year where the cumulative cash
// flow crosses zero, interpolated linearly within the year; +Inf when it
// does not cross within the life.
func CashFlow(se StrategyEconomics, in EconomicsInputs) (years []CashFlowYear, payback float64) {
	cum := -se.Investment
	years = append(years, CashFlowYear{Year: 0, Cumulative: cum})
	payback = math.Inf(1)
	if cum >= 0 {
		payback = 0
	}
	for k := 1; k <= in.LifeYears; k++ {
		sv := se.CostSaved * math.Pow(1+in.Escalation, float64(k))
		d := sv / math.Pow(1+in.DiscountRate, float64(k))
		prev := cum
		cum += d
		years = append(years, CashFlowYear{Year: k, Savings: sv, Discounted: d, Cumulative: cum})
		if math.IsInf(payback, 1) && prev < 0 && cum >= 0 {
			payback = float64(k-1) + -prev/(cum-prev)
		}
	}
	return years, payback
}

// notWithinLife is the payback cell's text when the cash flow does not turn
// positive within the life.
const notWithinLife = "not within the life"

// cashFlowSection writes the CashFlow strategy's discounted cash flow by
// formula from the named inputs and that strategy's column of the strategy
// table, and charts its cumulative value with the payback year. It starts
// on a new page and returns the last row used.
func (b *book) cashFlowSection(s *sheet, row, last int) int {
	idx := -1
	for i, st := range b.r.Strategies {
		if strings.EqualFold(st.Name, b.r.CashFlow) {
			idx = i
		}
	}
	if idx < 0 || idx == b.r.Baseline {
		return row
	}
	cur := b.currency()
	se := b.econ.Strategies[idx]
	years, payback := CashFlow(se, b.r.Economics)
	b.fail(b.f.InsertPageBreak(s.name, cellName(1, row)))
	s.text(1, row, "Cash flow of the retrofit: "+se.Name, "h2")
	row++
	s.merged(row, 1, last, "The saving against "+b.r.Strategies[b.r.Baseline].Name+" escalates at Escalation and is discounted at DiscountRate, each year's at its end; year 0 is the investment. Every cell is a formula of the inputs above, so the table and the chart follow an edit. The table runs over the life as written ("+fmt.Sprint(b.r.Economics.LifeYears)+" years); a shorter LifeYears blanks the later years, a longer one needs rows added.", "note_wrap")
	row++
	head := row
	s.header(head, 1, "Year", "Saving ("+cur+")", "Discounted saving ("+cur+")", "Cumulative discounted cash flow ("+cur+")", "Crossing (year)")
	saved := ref(sheetEconomics, econCol(idx), econRow(ekCostSaved))
	invest := ref(sheetEconomics, econCol(idx), econRow(ekInvestment))
	first := head + 1
	for _, y := range years {
		r := head + 1 + y.Year
		s.number(1, r, float64(y.Year), "int")
		a := cellName(1, r)
		if y.Year == 0 {
			s.number(2, r, 0, "int")
			s.number(3, r, 0, "int")
			s.formula(4, r, "-"+invest, num(y.Cumulative), "b_int")
			continue
		}
		s.formula(2, r, fmt.Sprintf("IF(%s<=LifeYears,%s*(1+Escalation)^%s,NA())", a, saved, a), num(y.Savings), "int")
		s.formula(3, r, fmt.Sprintf("%s/(1+DiscountRate)^%s", cellName(2, r), a), num(y.Discounted), "int")
		s.formula(4, r, fmt.Sprintf("%s+%s", cellName(4, r-1), cellName(3, r)), num(y.Cumulative), "b_int")
		prev, cum := cellName(4, r-1), cellName(4, r)
		cross := text("")
		if p := years[y.Year-1].Cumulative; p < 0 && y.Cumulative >= 0 {
			cross = num(float64(y.Year-1) + -p/(y.Cumulative-p))
		}
		s.formula(5, r, fmt.Sprintf(`IFERROR(IF(AND(%s<0,%s>=0),%s-1+(-%s)/(%s-%s),""),"")`, prev, cum, a, prev, cum, prev), cross, "d2")
	}
	end := head + 1 + len(years) - 1
	row = end + 1
	s.text(1, row, "Discounted payback (years)", "bold")
	want := num(payback)
	if math.IsInf(payback, 1) {
		want = text(notWithinLife)
	}
	crossings := rangeRef(sheetEconomics, 5, first, 5, end)
	s.formula(2, row, fmt.Sprintf(`IF(%s>=0,0,IF(COUNT(%s)>0,MIN(%s),%q))`, absCell(4, first), crossings, crossings, notWithinLife), want, "b_d1")
	paybackCell := ref(sheetEconomics, 2, row)
	s.number(3, row, 0, "int") // the payback point's height on the chart: the zero line
	zeroCell := ref(sheetEconomics, 3, row)
	s.text(4, row, "← the payback point on the chart: (payback, 0)", "italic")
	row += 2

	lifeMax := float64(b.r.Economics.LifeYears)
	xmin := 0.0
	c := &excelize.Chart{
		Type:      excelize.Scatter,
		Title:     chartTitle("Cumulative discounted cash flow: " + se.Name),
		Dimension: excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:    excelize.ChartLegend{Position: "bottom", Font: legendFont},
		XAxis: excelize.ChartAxis{Title: axisTitle("Year"), MajorGridLines: true, Font: axisFont,
			Minimum: &xmin, Maximum: &lifeMax, TickLabelPosition: excelize.ChartTickLabelLow},
		// The value axis scales itself: the cash flow follows the inputs.
		YAxis: excelize.ChartAxis{Title: axisTitle("Cumulative discounted cash flow (" + cur + ")"), MajorGridLines: true, Font: axisFont,
			NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		ShowBlanksAs: "gap",
		Format:       excelize.GraphicOptions{AltText: "Cumulative discounted cash flow", PrintObject: boolPtr(true), OffsetY: chartOffset},
		Series: []excelize.ChartSeries{
			{Name: ref(sheetEconomics, 4, head), Categories: rangeRef(sheetEconomics, 1, first, 1, end), Values: rangeRef(sheetEconomics, 4, first, 4, end),
				Line: lineFor(StyleLine, palette[0]), Marker: markerFor(StyleLine, true, palette[0], 0)},
			{Name: ref(sheetEconomics, 1, row-2), Categories: paybackCell, Values: zeroCell,
				Line: lineFor(StylePoints, palette[1]), Marker: excelize.ChartMarker{Symbol: "diamond", Size: 10,
					Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{palette[1]}}}},
		},
	}
	s.setWidths()
	b.fail(wrapChart("cash flow", b.f.AddChart(s.name, cellName(1, row), c)))
	return row + chartRows
}
