package handover_test

import (
	"path/filepath"
	"strings"
	"testing"

	"wattstage/workbook"
	"wattstage/workbook/officecheck"
)

// TestLibreOfficeExamples writes each example's workbook and opens it in
// LibreOffice forced to recalculate on load: every formula cell must equal
// the value the Go code computed, to a relative 1e-9. Skipped without
// soffice; under CI=true a missing soffice fails.
func TestLibreOfficeExamples(t *testing.T) {
	soffice := officecheck.Soffice(t)
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			t.Parallel() // each run has its own LibreOffice profile
			file := filepath.Join(t.TempDir(), strings.TrimSuffix(name, ".yaml")+".xlsx")
			if err := workbook.Write(file, ex.report, workbook.Options{InputPaths: []string{ex.path}}); err != nil {
				t.Fatal(err)
			}
			want, err := workbook.Formulas(ex.report)
			if err != nil {
				t.Fatal(err)
			}
			n := officecheck.CheckFormulas(t, soffice, file, want)
			perSheet := map[string]int{}
			for _, c := range want {
				perSheet[c.Sheet]++
			}
			// The economics, the Summary's links to them, the fit residuals,
			// the staging bands and the load-point totals.
			for _, s := range []string{"Summary", "Economics", "Staging", "Load points", "Inputs"} {
				if perSheet[s] == 0 {
					t.Errorf("no formula cells on %s", s)
				}
			}
			t.Logf("compared %d formula cells with LibreOffice (%v)", n, perSheet)
		})
	}
}
