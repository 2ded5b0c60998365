package workbook

import (
	"fmt"
	"math"
)

const sheetLoadPoints = "Load points"

// Load points layout: title rows, the header on lpHeader, data below; per
// running unit a block of lpUnitCols columns after the group columns.
const (
	lpHeader   = 3
	lpGroup    = 13 // group columns before the per-unit blocks
	lpUnitCols = 7
	lpKWhCol   = 10
	lpHoursCol = 6
	lpCostCol  = 11
)

func (b *book) loadPointsSheet() {
	s := b.newSheet(sheetLoadPoints, false)
	r := b.r
	u := r.Units
	cur := b.currency()
	s.text(1, 1, "Load points: "+r.Plant, "title")
	s.text(1, 2, "Each load step (a bin, or a flow group of logged intervals) under each strategy, a year: what runs, how fast, at what efficiency, and the limit that binds.", "subtitle")
	slots := 0
	for _, lp := range r.LoadPoints {
		slots = max(slots, len(lp.Units))
	}
	labels := []string{
		"Bin", "Strategy", "Plant flow (" + u.Flow + ")", "Required head (" + u.Head + ")",
		"Delivered head (" + u.Head + ")", "Hours (h/yr)", "Units running (count)", "Running",
		"Group input, mean (kW)", "Energy (kWh/yr)", "Cost at stated tariff (" + cur + "/yr)", "Binding limit", "Flags",
	}
	for k := 1; k <= slots; k++ {
		p := fmt.Sprintf("Unit %d ", k)
		labels = append(labels, p+"name", p+"speed (%)", p+"flow ("+u.Flow+")", p+"pump efficiency (%)",
			p+"motor efficiency (%)", p+"drive efficiency (%)", p+"input (kW)")
	}
	s.header(lpHeader, 1, labels...)
	row := lpHeader
	for _, lp := range r.LoadPoints {
		row++
		s.text(1, row, lp.Bin, "text")
		s.text(2, row, lp.Strategy, "text")
		s.number(3, row, lp.PlantFlow, "d1")
		s.number(4, row, lp.RequiredHead, "d1")
		s.number(5, row, lp.Head, "d1")
		s.number(lpHoursCol, row, lp.Hours, "int")
		s.number(7, row, float64(lp.UnitsRunning), "int")
		s.wrapped(8, row, lp.Running, "wrap")
		s.number(9, row, lp.KW, "d2")
		s.number(lpKWhCol, row, lp.KWh, "int")
		s.number(lpCostCol, row, lp.Cost, "int")
		s.wrapped(12, row, lp.Binding, "wrap")
		s.wrapped(13, row, lp.Flags, "wrap")
		for k, up := range lp.Units {
			c := lpGroup + 1 + k*lpUnitCols
			s.text(c, row, up.Unit, "bold")
			s.number(c+1, row, up.Speed, "d1")
			s.number(c+2, row, up.Flow, "d1")
			s.number(c+3, row, up.PumpEff, "d1")
			s.number(c+4, row, up.MotorEff, "d1")
			s.number(c+5, row, up.DriveEff, "d1")
			s.number(c+6, row, up.KW, "d2")
		}
	}
	last := lpGroup + slots*lpUnitCols
	first, end := lpHeader+1, max(row, lpHeader+1)

	// Totals per strategy by formula, so a reader can check them against the
	// annual figures on the Economics sheet; each total sits in the column
	// of the figures it adds, under a header of its own.
	row += 2
	s.text(1, row, "Totals by strategy", "h2")
	row++
	s.header(row, 2, "Strategy")
	s.header(row, lpHoursCol, "Hours (h/yr)")
	s.header(row, lpKWhCol, "Energy (kWh/yr)", "Cost at stated tariff ("+cur+"/yr)")
	for _, st := range r.Strategies {
		row++
		var hours, kwh, cost float64
		for _, lp := range r.LoadPoints {
			if lp.Strategy == st.Name {
				hours += lp.Hours
				kwh += lp.KWh
				cost += lp.Cost
			}
		}
		s.text(2, row, st.Name, "bold")
		// SUMPRODUCT of an exact comparison rather than SUMIF, whose
		// criteria would read * ? ~ < > = in a strategy name as operators.
		sumif := func(col int) string {
			return fmt.Sprintf("SUMPRODUCT((%s:%s=%s)*%s:%s)", absCell(2, first), absCell(2, end), cellName(2, row),
				absCell(col, first), absCell(col, end))
		}
		s.formula(lpHoursCol, row, sumif(lpHoursCol), num(hours), "int")
		s.formula(lpKWhCol, row, sumif(lpKWhCol), num(kwh), "int")
		s.formula(lpCostCol, row, sumif(lpCostCol), num(cost), "int")
	}
	for c := 3; c <= last; c++ {
		s.fixed[c] = 11
	}
	// Text columns wrap in widths of their own: a long list of running
	// units or flags grows its row instead of being cut at the cell edge.
	s.fixed[8], s.fixed[12], s.fixed[13] = 44, 16, 40
	b.freeze(s, 3, lpHeader+1)
	b.printTitles(s, 2, lpHeader)
	// About 150 character widths fit across a landscape page at full size;
	// more pages across keep the print readable instead of shrinking it.
	total := 0.0
	for c := 1; c <= last; c++ {
		if w, ok := s.fixed[c]; ok {
			total += w
		} else {
			total += math.Min(math.Max(s.widths[c]+3, minColWidth), maxColWidth)
		}
	}
	b.pageSetupWide(s, true, last, row, max(1, int(math.Ceil(total/150))))
	s.finish()
}
