package workbook

// The sheets of the workbook, in their order. Measured is there only when
// the Report has a Trend.
const (
	SheetSummary    = sheetSummary
	SheetEconomics  = sheetEconomics
	SheetStaging    = sheetStaging
	SheetCurves     = sheetCurves
	SheetMeasured   = sheetMeasured
	SheetLoadPoints = sheetLoadPoints
	SheetInputs     = sheetInputs
	SheetCurveData  = sheetCurveData
)
