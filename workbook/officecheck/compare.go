package officecheck

import (
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"wattstage/workbook"
)

// csvAllSheets is the CSV filter with full-precision contents, every sheet
// to its own file. Filter options, in order: separator 44 (,), text
// delimiter 34 ("), charset 76 (UTF-8), first line 1, no cell formats,
// language default, quoted text as text false, detect special numbers
// true, save as shown false (the full value, not the formatted one),
// export formulas false (their results), remove space false, sheet number
// -1 (each sheet to file-SheetName.csv).
const csvAllSheets = "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1"

// SheetsCSV opens file in LibreOffice with profile and returns every
// sheet's cells as CSV rows, by sheet name. It fails the test unless a CSV
// file came out for each sheet the workbook has.
func SheetsCSV(tb testing.TB, soffice, profile, file string) map[string][][]string {
	tb.Helper()
	sheets := sheetList(tb, file)
	outDir, out := run(tb, soffice, profile, file, csvAllSheets)
	base := strings.TrimSuffix(filepath.Base(file), filepath.Ext(file))
	got := map[string][][]string{}
	for _, name := range sheets {
		p := filepath.Join(outDir, base+"-"+name+".csv")
		f, err := os.Open(p)
		if err != nil {
			tb.Fatalf("soffice wrote no CSV for sheet %q of %s (%v); its output:\n%s", name, file, err, out)
		}
		r := csv.NewReader(f)
		r.FieldsPerRecord = -1
		rows, err := r.ReadAll()
		f.Close()
		if err != nil {
			tb.Fatalf("sheet %q CSV: %v", name, err)
		}
		got[name] = rows
	}
	return got
}

// sheetList reads the sheet names of file, in order.
func sheetList(tb testing.TB, file string) []string {
	tb.Helper()
	f, err := excelize.OpenFile(file)
	if err != nil {
		tb.Fatal(err)
	}
	defer f.Close()
	return f.GetSheetList()
}

// Mismatch is one formula cell whose value in LibreOffice differs from
// the Go value.
type Mismatch struct {
	workbook.FormulaCell
	Got string // the CSV field LibreOffice wrote
	Why string // how it differs
}

func (m Mismatch) String() string {
	return fmt.Sprintf("%s!%s =%s: LibreOffice %q, Go %s: %s", m.Sheet, m.Cell, m.Formula, m.Got, m.Want, m.Why)
}

// Result is the outcome of one comparison.
type Result struct {
	Compared   int // formula cells compared
	Mismatches []Mismatch
}

// Compare opens file in LibreOffice with profile and compares every
// formula cell in want with what LibreOffice shows. Each sheet's first
// cell must read as the workbook holds it, so a CSV cannot stand in for
// another sheet's.
func Compare(tb testing.TB, soffice, profile, file string, want []workbook.FormulaCell) Result {
	tb.Helper()
	sheets := SheetsCSV(tb, soffice, profile, file)
	f, err := excelize.OpenFile(file)
	if err != nil {
		tb.Fatal(err)
	}
	defer f.Close()
	for name, rows := range sheets {
		a1, err := f.GetCellValue(name, "A1")
		if err != nil {
			tb.Fatal(err)
		}
		if got := field(rows, 1, 1); got != a1 {
			tb.Fatalf("sheet %q: CSV starts %q, the workbook's A1 holds %q", name, got, a1)
		}
	}
	var res Result
	for _, c := range want {
		rows, ok := sheets[c.Sheet]
		if !ok {
			tb.Fatalf("formula cell %s!%s: the workbook has no sheet %q", c.Sheet, c.Cell, c.Sheet)
		}
		col, row, err := excelize.CellNameToCoordinates(c.Cell)
		if err != nil {
			tb.Fatal(err)
		}
		got := field(rows, row, col)
		if why := CheckValue(got, c.Want); why != "" {
			res.Mismatches = append(res.Mismatches, Mismatch{FormulaCell: c, Got: got, Why: why})
		}
		res.Compared++
	}
	return res
}

// field returns the CSV field at 1-based row and column, or "" past the
// end (LibreOffice drops trailing empty cells).
func field(rows [][]string, row, col int) string {
	if row-1 < len(rows) && col-1 < len(rows[row-1]) {
		return rows[row-1][col-1]
	}
	return ""
}

// CheckFormulas compares every formula cell of file with its Go value in
// LibreOffice forced to recalculate on load, reports each mismatch as a
// test error and returns the number of cells compared.
func CheckFormulas(tb testing.TB, soffice, file string, want []workbook.FormulaCell) int {
	tb.Helper()
	res := Compare(tb, soffice, Profile(tb, RecalcAlways), file, want)
	for _, m := range res.Mismatches {
		tb.Error(m)
	}
	if res.Compared != len(want) {
		tb.Errorf("compared %d of %d formula cells", res.Compared, len(want))
	}
	return res.Compared
}

// Tolerance is the relative difference allowed between LibreOffice's value
// and Go's; around zero it is absolute.
const Tolerance = 1e-9

// CheckValue compares a CSV field with a Go value and says how they
// differ, or returns "" when they agree: text exactly, numbers to a
// relative [Tolerance]. A percentage-formatted cell comes out with a %
// sign even at full precision; it is read as a fraction.
func CheckValue(got string, want workbook.Value) string {
	if want.IsText {
		if got != want.Text {
			return "text differs"
		}
		return ""
	}
	s := strings.TrimSpace(got)
	scale := 1.0
	if strings.HasSuffix(s, "%") {
		s, scale = strings.TrimSuffix(s, "%"), 0.01
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return "not a number"
	}
	v *= scale
	if math.IsNaN(v) || math.IsInf(v, 0) || math.IsNaN(want.Number) || math.IsInf(want.Number, 0) {
		return "not a finite number"
	}
	tol := Tolerance * math.Abs(want.Number)
	if want.Number == 0 {
		tol = Tolerance
	}
	if d := math.Abs(v - want.Number); d > tol {
		return fmt.Sprintf("differs by %.3g (relative %.3g)", v-want.Number, (v-want.Number)/want.Number)
	}
	return ""
}
