package workbook

// Exported for the external tests (package workbook_test), which use
// package officecheck; officecheck imports workbook, so those tests cannot
// live in package workbook itself.

// SampleReport is the invented demo report of sample_test.go.
var SampleReport = sampleReport
