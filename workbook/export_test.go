package workbook

// Exported for the external tests (package workbook_test), which use
// package officecheck; officecheck imports workbook, so those tests cannot
// live in package workbook itself.

// SampleReport is the invented demo report of sample_test.go.
var SampleReport = sampleReport

// Sheet names, as the tests check them.
const (
	SheetSummary    = sheetSummary
	SheetEconomics  = sheetEconomics
	SheetStaging    = sheetStaging
	SheetCurves     = sheetCurves
	SheetLoadPoints = sheetLoadPoints
	SheetInputs     = sheetInputs
)
