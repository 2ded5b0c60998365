package workbook

const sheetMeasured = "Measured"

// measuredCol is the first column of the chart on the Measured sheet,
// right of the coverage and calibration tables.
const measuredCol = 6

// measuredSheet writes the trend's coverage and the calibration figures
// when the profile is a trend; nil otherwise. The chart of logged against
// predicted power goes beside the figures (placeMeasured), once the Curve
// data sheet holds its data.
func (b *book) measuredSheet() *sheet {
	t := b.r.Trend
	if t == nil {
		return nil
	}
	s := b.newSheet(sheetMeasured, false)
	s.text(1, 1, "Measured: "+b.r.Plant, "title")
	s.text(1, 2, "What the trend log covers, and how the predicted power compares with the power it logged.", "subtitle")
	row := 4
	s.text(1, row, "Trend coverage", "h2")
	row = b.quantities(s, row+1, t.Coverage, false) + 1
	s.text(1, row, "Predicted against logged power", "h2")
	row++
	if len(t.Calibration) == 0 {
		s.merged(row, 1, 4, "The trend logs no power, so the predictions could not be compared with measurements.", "note_wrap")
		row++
	} else {
		row = b.quantities(s, row, t.Calibration, false)
		if t.Verdict != "" {
			row++
			s.merged(row, 1, 4, t.Verdict, "bold_wrap")
			row++
		}
	}
	s.fixed[1], s.fixed[2], s.fixed[3], s.fixed[4], s.fixed[5] = 30, 14, 10, 26, 2
	s.used = row
	return s
}

// placeMeasured draws the chart of logged against predicted power beside
// the figures and sets up the page.
func (b *book) placeMeasured(s *sheet, p *placed) {
	last := s.used
	if p != nil {
		s.setWidths()
		b.scatterChart(s.name, cellName(measuredCol, 4), p.scatter, p.refs)
		last = max(last, 4+chartRows)
	}
	b.pageSetup(s, true, measuredCol+chartCols-1, last)
	s.finish()
}
