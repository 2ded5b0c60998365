package handover_test

import (
	"path/filepath"
	"testing"

	"wattstage/study"
	"wattstage/workbook"
	"wattstage/workbook/chartcheck"
)

// TestChartsWithinAxes writes each example's workbook and reads its charts
// back from the file: every series of every chart has a point to draw, and
// every point lies within the chart's fixed axis ranges (a point outside
// would be cut off without a sign). The charts the issue asks for are all
// there, on their sheets, with titled axes.
func TestChartsWithinAxes(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			file := filepath.Join(t.TempDir(), "plan.xlsx")
			if err := workbook.Write(file, ex.report, workbook.Options{}); err != nil {
				t.Fatal(err)
			}
			charts, problems, err := chartcheck.Check(file, formulaValues(t, ex.report))
			if err != nil {
				t.Fatal(err)
			}
			for _, p := range problems {
				t.Error(p)
			}
			on := map[string]string{}
			for _, c := range charts {
				on[c.Title] = c.Sheet
				if c.XTitle == "" || c.YTitle == "" {
					t.Errorf("%s %q: axis titles %q and %q", c.Sheet, c.Title, c.XTitle, c.YTitle)
				}
			}
			cv := ex.report.Curves
			want := map[string]string{
				cv.CountPower.Title: workbook.SheetCurves,
				cv.Bands.Title:      workbook.SheetCurves,
				cv.Hours.Title:      workbook.SheetCurves,
				cv.Energy.Title:     workbook.SheetCurves,
				cv.GroupPower.Title: workbook.SheetCurves,
				"Cumulative discounted cash flow: " + ex.report.CashFlow: workbook.SheetEconomics,
			}
			for _, h := range cv.Head {
				want[h.Title] = workbook.SheetCurves
			}
			if len(ex.plant.Models) > 1 {
				want[cv.Parallel.Title] = workbook.SheetCurves
			}
			if ex.result.Calibration != nil {
				want[cv.Measured.Title] = workbook.SheetMeasured
			}
			for title, sheet := range want {
				if title == "" {
					t.Errorf("a chart the workbook should have is empty")
					continue
				}
				if on[title] != sheet {
					t.Errorf("chart %q on sheet %q, want %q", title, on[title], sheet)
				}
			}
		})
	}
}

// formulaValues are the values Go computed for the workbook's formula
// cells, by "Sheet!A1" (excelize does not compute formulas; the
// LibreOffice recalculation test holds the spreadsheet to these values).
func formulaValues(t *testing.T, r *workbook.Report) map[string]float64 {
	t.Helper()
	cells, err := workbook.Formulas(r)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for _, c := range cells {
		if !c.Want.IsText {
			out[c.Sheet+"!"+c.Cell] = c.Want.Number
		}
	}
	return out
}

// TestCashFlowAgreesWithAppraisal: the cumulative discounted cash flow the
// Economics sheet computes by formula (workbook.CashFlow, which the
// LibreOffice recalculation test holds the spreadsheet to) is, year by
// year, the one package econ computed for the lowest-power staging's
// appraisal, and both find the same discounted payback: two separate
// implementations of the NIST Handbook 135 convention (savings at each
// year's end, escalated then discounted).
func TestCashFlowAgreesWithAppraisal(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			lo := ex.result.Strategy(study.KeyLowest)
			if lo.Appraisal == nil {
				t.Skip("no appraisal")
			}
			if ex.report.CashFlow != lo.Name {
				t.Fatalf("cash flow of %q, want the lowest-power staging %q", ex.report.CashFlow, lo.Name)
			}
			e, err := workbook.ComputeEconomics(ex.report)
			if err != nil {
				t.Fatal(err)
			}
			var se workbook.StrategyEconomics
			for _, s := range e.Strategies {
				if s.Name == lo.Name {
					se = s
				}
			}
			years, payback := workbook.CashFlow(se, ex.report.Economics)
			a := lo.Appraisal
			if len(years) != len(a.Years)+1 {
				t.Fatalf("%d years in the workbook (with year 0), %d in the appraisal", len(years), len(a.Years))
			}
			for k, y := range a.Years {
				// 1e-9 relative: the same sums in another order.
				if !near(years[k+1].Cumulative, y.Cumulative, 1e-9) || !near(years[k+1].Savings, y.Savings, 1e-9) {
					t.Errorf("year %d: workbook %v saved, %v cumulative; appraisal %v, %v", y.Year, years[k+1].Savings, years[k+1].Cumulative, y.Savings, y.Cumulative)
				}
			}
			if !near(payback, a.DiscountedPayback, 1e-9) {
				t.Errorf("discounted payback %v years in the workbook, %v in the appraisal", payback, a.DiscountedPayback)
			}
		})
	}
}
