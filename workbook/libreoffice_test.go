package workbook

import (
	"context"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// The LibreOffice check: a real spreadsheet program opens the workbook,
// recalculates every formula and exports each sheet as CSV; every formula
// cell must then equal the value the Go code computed, to a relative 1e-9.

// recalcProfile is the registry of a fresh LibreOffice user profile that
// recalculates every formula when a file is loaded (0 = always, for files
// saved by Excel or others and for ODF files), so cached values in the
// file cannot stand in for a recalculation.
const recalcProfile = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`

// office finds soffice, or skips the test; under CI (CI=true) a missing
// soffice fails instead, so the check cannot silently vanish there.
func office(t *testing.T) string {
	t.Helper()
	path, err := exec.LookPath("soffice")
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("soffice not found and CI=true: install LibreOffice (libreoffice-calc-nogui) to run the recalculation check")
		}
		t.Skip("soffice not found: install LibreOffice 7.4 or later to run the recalculation check (under CI=true this fails)")
	}
	out, err := exec.Command(path, "--version").CombinedOutput()
	if err != nil {
		t.Fatalf("soffice --version: %v\n%s", err, out)
	}
	// The CSV filter's sheet-number option needs LibreOffice 7.4.
	var major, minor int
	if _, err := fmt.Sscanf(strings.TrimPrefix(strings.TrimSpace(string(out)), "LibreOffice "), "%d.%d", &major, &minor); err != nil || major < 7 || major == 7 && minor < 4 {
		t.Fatalf("soffice --version says %q; the per-sheet CSV export needs LibreOffice 7.4 or later", strings.TrimSpace(string(out)))
	}
	return path
}

// newProfile makes a per-test LibreOffice profile that recalculates on load.
func newProfile(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.MkdirAll(filepath.Join(dir, "user"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "user", "registrymodifications.xcu"), []byte(recalcProfile), 0o644); err != nil {
		t.Fatal(err)
	}
	return "file://" + dir
}

// convert runs soffice headless to convert file to format into a fresh
// folder and returns the one file it produced. soffice exits 0 even when
// it cannot read the input, so the output file is what proves success.
func convert(t *testing.T, soffice, profile, file, format string) string {
	t.Helper()
	outDir := t.TempDir()
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, soffice, "-env:UserInstallation="+profile, "--headless", "--norestore",
		"--convert-to", format, "--outdir", outDir, file)
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("soffice --convert-to %s: %v\n%s", format, err, out)
	}
	entries, _ := os.ReadDir(outDir)
	if len(entries) != 1 {
		t.Fatalf("soffice --convert-to %s produced %d files, want 1; its output:\n%s", format, len(entries), out)
	}
	p := filepath.Join(outDir, entries[0].Name())
	if fi, err := os.Stat(p); err != nil || fi.Size() == 0 {
		t.Fatalf("soffice --convert-to %s produced an empty file; its output:\n%s", format, out)
	}
	return p
}

// sheetCSV exports sheet number n (1-based) as CSV with full precision
// (cell contents not "as shown") and parses it.
func sheetCSV(t *testing.T, soffice, profile, file string, n int) [][]string {
	t.Helper()
	// Filter options: separator 44 (,), text delimiter 34 ("), charset 76
	// (UTF-8), first line 1, no cell formats, language default, quoted text
	// as text false, detect special numbers true, save as shown false,
	// export formulas false, remove space false, sheet number n.
	format := fmt.Sprintf("csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,%d", n)
	p := convert(t, soffice, profile, file, format)
	f, err := os.Open(p)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.FieldsPerRecord = -1
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatalf("sheet %d CSV: %v", n, err)
	}
	return rows
}

// compareFormulas checks every formula cell of file against want and
// returns the number of cells compared.
func compareFormulas(t *testing.T, soffice, file string, want []FormulaCell) int {
	t.Helper()
	profile := newProfile(t)
	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	sheets := f.GetSheetList()
	f.Close()
	bySheet := map[string][]FormulaCell{}
	for _, c := range want {
		bySheet[c.Sheet] = append(bySheet[c.Sheet], c)
	}
	compared := 0
	for i, name := range sheets {
		cells := bySheet[name]
		if len(cells) == 0 {
			continue
		}
		rows := sheetCSV(t, soffice, profile, file, i+1)
		// The title in A1 names the sheet: proof the right sheet came out.
		if len(rows) == 0 || len(rows[0]) == 0 || !strings.HasPrefix(rows[0][0], sheetTitlePrefix(name)) {
			t.Fatalf("sheet %d (%s): CSV starts %q, want the sheet's title", i+1, name, rows[0])
		}
		for _, c := range cells {
			col, row, err := excelize.CellNameToCoordinates(c.Cell)
			if err != nil {
				t.Fatal(err)
			}
			got := ""
			if row-1 < len(rows) && col-1 < len(rows[row-1]) {
				got = rows[row-1][col-1]
			}
			if msg := checkValue(got, c.Want); msg != "" {
				t.Errorf("%s!%s =%s: LibreOffice %q, Go %s: %s", c.Sheet, c.Cell, c.Formula, got, c.Want, msg)
			}
			compared++
		}
	}
	return compared
}

// sheetTitlePrefix is how each sheet's title in A1 begins.
func sheetTitlePrefix(sheet string) string {
	switch sheet {
	case sheetSummary:
		return "Pump group plan: "
	case sheetInputs:
		return "Inputs as understood: "
	case sheetStaging:
		return "Staging setpoints: "
	}
	return sheet + ": "
}

// checkValue compares a CSV field with a Go value: text exactly, numbers to
// a relative 1e-9 (absolute 1e-9 around zero). A percentage-formatted cell
// comes out with a % sign even unformatted; it is read as a fraction.
func checkValue(got string, want Value) string {
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
	tol := 1e-9 * math.Abs(want.Number)
	if want.Number == 0 {
		tol = 1e-9
	}
	if d := math.Abs(v - want.Number); d > tol {
		return fmt.Sprintf("differs by %.3g (relative %.3g)", v-want.Number, (v-want.Number)/want.Number)
	}
	return ""
}

func TestLibreOfficeRecalculates(t *testing.T) {
	soffice := office(t)
	dir := t.TempDir()
	file := filepath.Join(dir, "plan.xlsx")
	r := sampleReport()
	if err := Write(file, r, Options{}); err != nil {
		t.Fatal(err)
	}
	want, err := Formulas(r)
	if err != nil {
		t.Fatal(err)
	}
	n := compareFormulas(t, soffice, file, want)
	t.Logf("compared %d formula cells with LibreOffice", n)
	if n != len(want) {
		t.Errorf("compared %d of %d formula cells", n, len(want))
	}
	// Every kind of formula is there: the economics, the Summary links, the
	// fit residuals, the staging bands and the load-point totals.
	perSheet := map[string]int{}
	for _, c := range want {
		perSheet[c.Sheet]++
	}
	for _, s := range []string{sheetSummary, sheetEconomics, sheetStaging, sheetLoadPoints, sheetInputs} {
		if perSheet[s] == 0 {
			t.Errorf("no formula cells on %s", s)
		}
	}
}

// TestLibreOfficeLiveInputs changes the named inputs in a written workbook,
// as an owner would, and checks that LibreOffice's recalculated results
// match the Go appraisal of the changed inputs. The cached values in the
// file are then stale, so only a real recalculation can pass.
func TestLibreOfficeLiveInputs(t *testing.T) {
	soffice := office(t)
	dir := t.TempDir()
	file := filepath.Join(dir, "plan.xlsx")
	r := sampleReport()
	if err := Write(file, r, Options{}); err != nil {
		t.Fatal(err)
	}
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
		if err := f.SetCellFloat(sheetEconomics, cell, v, -1, 64); err != nil {
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
	r2.Strategies = append([]Strategy(nil), r.Strategies...)
	for i := range r2.Strategies {
		r2.Strategies[i].EnergyCost *= changed.EnergyPrice / r.Economics.EnergyPrice
	}
	want, err := Formulas(&r2)
	if err != nil {
		t.Fatal(err)
	}
	old, _ := Formulas(r)
	moved := 0
	for i := range want {
		if want[i].Want != old[i].Want {
			moved++
		}
	}
	if moved < 20 {
		t.Fatalf("only %d formula values move with the inputs; the check would prove little", moved)
	}
	n := compareFormulas(t, soffice, file, want)
	t.Logf("compared %d formula cells after changing the inputs (%d of them changed value)", n, moved)
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
