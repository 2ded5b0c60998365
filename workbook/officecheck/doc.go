// Package officecheck opens a written workbook in LibreOffice, a real
// spreadsheet program, and checks what it shows: every formula cell, once
// LibreOffice has recalculated it, must equal the value the Go code
// computed ([workbook.Formulas]) to a relative 1e-9.
//
// It is a helper for tests (every function takes a [testing.TB]) shared by
// the workbook package's own tests and by the packages that build real
// reports, so there is one copy of the rules.
//
// # Finding LibreOffice
//
// [Soffice] returns the soffice program, version 7.4 or later. Without it
// the test is skipped with a message saying what to install; under CI
// (environment CI=true) a missing soffice fails the test instead, so the
// check cannot silently vanish there. [Tool] applies the same rule to
// helpers such as pdftoppm.
//
// # Forcing a recalculation
//
// A workbook carries a cached value for each formula, and LibreOffice shows
// it unless told to recalculate. [Profile] makes a fresh LibreOffice user
// profile for one test whose registry sets the recalculation mode on load
// (OOXMLRecalcMode and ODFRecalcMode under
// org.openoffice.Office.Calc/Formula/Load): [RecalcAlways] recalculates
// every formula, [RecalcNever] shows the cached values, for a control that
// proves the check can tell the two apart.
//
// # Reading the results
//
// [SheetsCSV] exports every sheet as CSV in one soffice run (filter option
// sheet number -1, LibreOffice 7.2 and later) with the cell contents at
// full precision rather than as shown, and asserts that a file came out for
// each sheet: soffice exits 0 even when it cannot read its input. [Compare]
// matches every formula cell against its Go value and returns the
// mismatches; [CheckFormulas] reports them as test errors.
package officecheck
