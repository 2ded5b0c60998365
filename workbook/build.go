package workbook

import (
	"fmt"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"
)

// fixedDocDate is the document date stored when a Report has none, so the
// same Report always gives the same bytes.
const fixedDocDate = "2000-01-01T00:00:00Z"

// build lays out every sheet of r and returns the excelize file and the
// formula cells with their Go-computed values.
func build(r *Report) (*excelize.File, []FormulaCell, error) {
	if err := checkReport(r); err != nil {
		return nil, nil, err
	}
	econ, err := ComputeEconomics(r)
	if err != nil {
		return nil, nil, err
	}
	f := excelize.NewFile()
	b := &book{f: f, r: r, econ: econ, styles: map[string]int{}}
	b.summarySheet()
	b.economicsSheet()
	b.stagingSheet()
	curves := b.curvesSheet()
	measured := b.measuredSheet()
	b.loadPointsSheet()
	b.inputsSheet()
	charts := b.curvesCharts()
	data := make([]*placed, 0, len(charts)+1)
	for i := range charts {
		data = append(data, &charts[i])
	}
	var meas *placed
	if measured != nil && len(r.Curves.Measured.Series) > 0 {
		meas = &placed{scatter: &r.Curves.Measured}
		data = append(data, meas)
	}
	b.curveDataSheet(data)
	b.placeCharts(curves, charts)
	if measured != nil {
		b.placeMeasured(measured, meas)
	}
	b.docProps()
	if b.err != nil {
		_ = f.Close()
		return nil, nil, fmt.Errorf("workbook: laying out %q: %w", r.Plant, b.err)
	}
	return f, b.formulas, nil
}

// docProps sets the document properties and asks the spreadsheet program
// to recalculate every formula when the file is opened.
func (b *book) docProps() {
	date := fixedDocDate
	if b.r.Date != "" {
		date = b.r.Date
		if len(date) == len("2006-01-02") {
			date += "T00:00:00Z"
		}
	}
	b.fail(b.f.SetDocProps(&excelize.DocProperties{
		Title:    "Pump group plan: " + b.r.Plant,
		Subject:  "Parallel pump staging, energy and drive retrofit appraisal",
		Creator:  "wattstage",
		Created:  date,
		Modified: date,
		Language: "en",
	}))
	b.fail(b.f.SetAppProps(&excelize.AppProperties{Application: "wattstage"}))
	full := true
	b.fail(b.f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full}))
	b.f.SetActiveSheet(0)
}

// checkReport rejects a Report the sheets cannot show truthfully.
func checkReport(r *Report) error {
	if r == nil {
		return fmt.Errorf("%w: nil report", ErrInvalidReport)
	}
	if strings.TrimSpace(r.Plant) == "" {
		return fmt.Errorf("%w: no plant name", ErrInvalidReport)
	}
	if len(r.Cautions) == 0 {
		return fmt.Errorf("%w: no cautions: a workbook whose results can be acted on must show them", ErrInvalidReport)
	}
	if r.Units.Flow == "" || r.Units.Head == "" {
		return fmt.Errorf("%w: units: flow and head labels are required", ErrInvalidReport)
	}
	if len(r.Motors) > 0 && r.Units.MotorPower == "" {
		return fmt.Errorf("%w: units: motor output label is required when motors are given", ErrInvalidReport)
	}
	if err := checkEconomics(r); err != nil {
		return err
	}
	seen := map[string]int{}
	for i, s := range r.Strategies {
		k := strings.ToLower(s.Name) // spreadsheet comparison ignores case
		if j, ok := seen[k]; ok {
			return fmt.Errorf("%w: strategies[%d] %q has the same name as strategies[%d]", ErrInvalidReport, i, s.Name, j)
		}
		seen[k] = i
	}
	for i, lp := range r.LoadPoints {
		if _, ok := seen[strings.ToLower(lp.Strategy)]; !ok {
			return fmt.Errorf("%w: loadPoints[%d]: strategy %q is not one of the strategies", ErrInvalidReport, i, lp.Strategy)
		}
		for _, v := range []float64{lp.Hours, lp.KWh, lp.Cost} {
			if !finite(v) {
				return fmt.Errorf("%w: loadPoints[%d] (bin %q, %s): hours, kWh and cost must be finite", ErrInvalidReport, i, lp.Bin, lp.Strategy)
			}
		}
	}
	for i, p := range r.Pumps {
		for j, pt := range p.Points {
			if !finite(pt.Flow) || !finite(pt.Head) || !finite(pt.HeadFit) {
				return fmt.Errorf("%w: pumps[%d] %q: points[%d]: flow, head and fitted head must be finite", ErrInvalidReport, i, p.Name, j)
			}
		}
	}
	for _, c := range r.Curves.scatterCharts() {
		for _, s := range c.Series {
			if len(s.X) != len(s.Y) {
				return fmt.Errorf("%w: chart %q: series %q has %d x and %d y values", ErrInvalidReport, c.Title, s.Name, len(s.X), len(s.Y))
			}
			for _, x := range s.X {
				if math.IsNaN(x) || math.IsInf(x, 0) {
					return fmt.Errorf("%w: chart %q: series %q has a non-finite x value", ErrInvalidReport, c.Title, s.Name)
				}
			}
		}
	}
	for _, bars := range []Bars{r.Curves.Hours, r.Curves.Energy} {
		for _, se := range bars.Series {
			if len(se.Values) != len(bars.Categories) {
				return fmt.Errorf("%w: chart %q: series %q has %d values for %d categories", ErrInvalidReport, bars.Title, se.Name, len(se.Values), len(bars.Categories))
			}
		}
	}
	switch strings.ToLower(r.Paper) {
	case "", "a4", "letter":
	default:
		return fmt.Errorf("%w: paper %q: want A4 or Letter", ErrInvalidReport, r.Paper)
	}
	return nil
}

// scatterCharts lists every scatter chart of the report.
func (c *Curves) scatterCharts() []Chart {
	out := append(append([]Chart{}, c.Head...), c.Efficiency...)
	return append(out, c.GroupPower, c.Parallel, c.CountPower, c.Bands, c.Measured)
}

// Formulas returns every formula cell of the workbook r gives, with the
// value the Go code computed for it. A spreadsheet program that opens the
// workbook and recalculates must show these values.
func Formulas(r *Report) ([]FormulaCell, error) {
	f, cells, err := build(r)
	if err != nil {
		return nil, err
	}
	_ = f.Close()
	return cells, nil
}
