package handover

import (
	"fmt"

	"wattstage/study"
	"wattstage/workbook"
)

// trendRecord is the trend's coverage and the calibration of predicted
// against logged power, for the Measured sheet; nil without a trend.
func trendRecord(res *study.Result) *workbook.TrendRecord {
	t := res.Trend
	if t == nil {
		return nil
	}
	rep := t.Report
	q := func(label string, v float64, unit string, dec int) workbook.Quantity {
		return workbook.Quantity{Label: label, Value: v, Unit: unit, Decimals: dec}
	}
	tr := &workbook.TrendRecord{Coverage: []workbook.Quantity{
		{Label: "Trend file", Text: t.Name},
		{Label: "Period", Text: t.Start.Format("2006-01-02 15:04") + " to " + t.End.Format("2006-01-02 15:04")},
		q("Data rows", float64(rep.Rows), "rows", 0),
		q("Rows kept", float64(rep.Kept), "rows", 0),
		q("Rows dropped", float64(rep.Dropped), "rows", 0),
		q("Logging interval", t.Interval.Minutes(), "min", 0),
		q("Hours covered", t.Hours, "h", 1),
		q("Span from first to last", t.Span, "h", 1),
		q("Coverage of the span", 100*t.Coverage(), "%", 1),
		q("Gaps", float64(rep.Gaps), "gaps", 0),
		q("Hours in the gaps", rep.MissingHours, "h", 1),
		q("Rows with logged power", float64(rep.WithPower), "rows", 0),
		q("Annualisation factor", res.Period.Factor, "×", 4),
	}}
	if rep.Dropped > 0 {
		tr.Coverage = append(tr.Coverage, workbook.Quantity{Label: "Why rows were dropped", Text: rep.Summary()})
	}
	c := res.Calibration
	if c == nil {
		return tr
	}
	tr.Calibration = []workbook.Quantity{
		{Label: "Strategy compared", Text: c.Strategy},
		q("Intervals compared", float64(c.N), "intervals", 0),
		q("Mean logged power", c.MeanKW, "kW", 2),
		q("Mean error, predicted − logged", c.MeanErr, "kW", 2),
		q("Largest error", c.MaxAbs, "kW", 2),
		{Label: "NMBE", Value: 100 * c.NMBE, Unit: "%", Decimals: 1, Source: fmt.Sprintf("limit ±%.0f %% (ASHRAE Guideline 14, hourly, from memory)", 100*study.MaxHourlyNMBE)},
		{Label: "CV(RMSE)", Value: 100 * c.CVRMSE, Unit: "%", Decimals: 1, Source: fmt.Sprintf("limit %.0f %% (ASHRAE Guideline 14, hourly, from memory)", 100*study.MaxHourlyCVRMSE)},
	}
	if c.Calibrated() {
		tr.Verdict = "Within the hourly calibration criteria: the predictions track the logged power."
	} else {
		tr.Verdict = "Outside the hourly calibration criteria: calibrate the control head, the curves or the motor and drive data before relying on the savings. A negative NMBE means the model predicts more than was logged."
	}
	return tr
}
