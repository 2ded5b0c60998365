package workbook_test

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"wattstage/workbook"
	"wattstage/workbook/officecheck"
)

// The LibreOffice check: a real spreadsheet program opens the workbook,
// recalculates every formula and exports each sheet as CSV; every formula
// cell must then equal the value the Go code computed, to a relative 1e-9.
// The helpers are in package officecheck, shared with the handover tests.

func TestLibreOfficeRecalculates(t *testing.T) {
	soffice := officecheck.Soffice(t)
	file := filepath.Join(t.TempDir(), "plan.xlsx")
	r := workbook.SampleReport()
	if err := workbook.Write(file, r, workbook.Options{}); err != nil {
		t.Fatal(err)
	}
	want, err := workbook.Formulas(r)
	if err != nil {
		t.Fatal(err)
	}
	n := officecheck.CheckFormulas(t, soffice, file, want)
	t.Logf("compared %d formula cells with LibreOffice", n)
	// Every kind of formula is there: the economics, the Summary links, the
	// fit residuals, the staging bands and the load-point totals.
	perSheet := map[string]int{}
	for _, c := range want {
		perSheet[c.Sheet]++
	}
	for _, s := range []string{workbook.SheetSummary, workbook.SheetEconomics, workbook.SheetStaging, workbook.SheetLoadPoints, workbook.SheetInputs} {
		if perSheet[s] == 0 {
			t.Errorf("no formula cells on %s", s)
		}
	}
}

// changedInputs writes new named inputs into the workbook at file, as an
// owner would, and returns the report whose Go appraisal matches them. The
// cached values in the file are then stale: only a real recalculation
// shows the new values.
func changedInputs(t *testing.T, file string, r *workbook.Report) *workbook.Report {
	t.Helper()
	changed := r.Economics
	changed.EnergyPrice = 0.2175
	changed.DemandCharge = 3.25
	changed.DriveCost = 14250
	changed.OtherCost = 0
	changed.LifeYears = 9
	changed.DiscountRate = 0.071
	changed.Escalation = 0.035
	changed.EmissionsFactor = 0.52

	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	for name, v := range map[string]float64{
		"EnergyPrice": changed.EnergyPrice, "DemandCharge": changed.DemandCharge,
		"DriveCost": changed.DriveCost, "OtherCost": changed.OtherCost,
		"LifeYears": float64(changed.LifeYears), "DiscountRate": changed.DiscountRate,
		"Escalation": changed.Escalation, "EmissionsFactor": changed.EmissionsFactor,
	} {
		cell := namedCell(t, f, name)
		if err := f.SetCellFloat(workbook.SheetEconomics, cell, v, -1, 64); err != nil {
			t.Fatal(err)
		}
	}
	if err := f.Save(); err != nil {
		t.Fatal(err)
	}
	f.Close()

	// The sheet keeps each strategy's time-of-use price factor, so the Go
	// side scales the energy cost at the tariff by the new price.
	r2 := *r
	r2.Economics = changed
	r2.Strategies = append([]workbook.Strategy(nil), r.Strategies...)
	for i := range r2.Strategies {
		r2.Strategies[i].EnergyCost *= changed.EnergyPrice / r.Economics.EnergyPrice
	}
	return &r2
}

// TestLibreOfficeLiveInputs changes the named inputs in a written workbook
// and checks that LibreOffice's recalculated results match the Go
// appraisal of the changed inputs. A control opens the same file in a
// profile that never recalculates on load: it must show the stale cached
// values, so the check can tell a recalculation from none.
func TestLibreOfficeLiveInputs(t *testing.T) {
	soffice := officecheck.Soffice(t)
	file := filepath.Join(t.TempDir(), "plan.xlsx")
	r := workbook.SampleReport()
	if err := workbook.Write(file, r, workbook.Options{}); err != nil {
		t.Fatal(err)
	}
	r2 := changedInputs(t, file, r)
	want, err := workbook.Formulas(r2)
	if err != nil {
		t.Fatal(err)
	}
	old, _ := workbook.Formulas(r)
	moved := 0
	for i := range want {
		if want[i].Want != old[i].Want {
			moved++
		}
	}
	if moved < 20 {
		t.Fatalf("only %d formula values move with the inputs; the check would prove little", moved)
	}
	n := officecheck.CheckFormulas(t, soffice, file, want)
	t.Logf("compared %d formula cells after changing the inputs (%d of them changed value)", n, moved)

	t.Run("never recalculated", func(t *testing.T) {
		res := officecheck.Compare(t, soffice, officecheck.Profile(t, officecheck.RecalcNever), file, want)
		if len(res.Mismatches) < moved {
			t.Errorf("without a recalculation %d of %d cells differ, want at least the %d whose inputs changed: the check cannot tell a recalculation from cached values",
				len(res.Mismatches), res.Compared, moved)
		}
		t.Logf("without a recalculation %d of %d formula cells show stale values", len(res.Mismatches), res.Compared)
	})
}

func namedCell(t *testing.T, f *excelize.File, name string) string {
	t.Helper()
	for _, d := range f.GetDefinedName() {
		if d.Name == name {
			_, cell, ok := strings.Cut(d.RefersTo, "!")
			if !ok {
				break
			}
			return strings.ReplaceAll(cell, "$", "")
		}
	}
	t.Fatalf("no defined name %s", name)
	return ""
}
