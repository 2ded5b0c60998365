package workbook

import (
	"archive/zip"
	"bytes"
	"errors"
	"fmt"
	"io"
	"regexp"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

func openSample(t *testing.T) (*excelize.File, map[string]string) {
	t.Helper()
	data, err := Bytes(sampleReport())
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { f.Close() })
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	parts := map[string]string{}
	for _, z := range zr.File {
		rc, _ := z.Open()
		b, _ := io.ReadAll(rc)
		rc.Close()
		parts[z.Name] = string(b)
	}
	return f, parts
}

func TestNamedInputs(t *testing.T) {
	f, _ := openSample(t)
	r := sampleReport()
	names := map[string]string{}
	for _, d := range f.GetDefinedName() {
		if d.Scope == "Workbook" || d.Scope == "" {
			names[d.Name] = d.RefersTo
		}
	}
	for _, c := range []struct {
		name string
		want float64
	}{
		{"EnergyPrice", r.Economics.EnergyPrice}, {"DemandCharge", r.Economics.DemandCharge},
		{"DriveCost", r.Economics.DriveCost}, {"OtherCost", r.Economics.OtherCost},
		{"LifeYears", float64(r.Economics.LifeYears)}, {"DiscountRate", r.Economics.DiscountRate},
		{"Escalation", r.Economics.Escalation}, {"EmissionsFactor", r.Economics.EmissionsFactor},
	} {
		ref, ok := names[c.name]
		if !ok {
			t.Errorf("no defined name %s", c.name)
			continue
		}
		sheet, cell, _ := strings.Cut(ref, "!")
		got, err := f.GetCellValue(sheet, strings.ReplaceAll(cell, "$", ""), excelize.Options{RawCellValue: true})
		if err != nil || got != fmt.Sprint(c.want) {
			t.Errorf("%s at %s holds %q, want %v (%v)", c.name, ref, got, c.want, err)
		}
	}
	if _, ok := names["PVFactor"]; !ok {
		t.Error("no defined name PVFactor")
	}
}

// TestFormulasUseNames: the appraisal formulas read the named inputs, not
// numbers typed into them, so changing an input changes the result.
func TestFormulasUseNames(t *testing.T) {
	cells, err := Formulas(sampleReport())
	if err != nil {
		t.Fatal(err)
	}
	used := map[string]bool{}
	literal := regexp.MustCompile(`(^|[^A-Z$0-9.])[0-9]+\.[0-9]+`)
	for _, c := range cells {
		for _, n := range []string{"EnergyPrice", "DemandCharge", "DriveCost", "OtherCost", "LifeYears", "DiscountRate", "Escalation", "EmissionsFactor", "PVFactor"} {
			if strings.Contains(c.Formula, n) {
				used[n] = true
			}
		}
		if literal.MatchString(c.Formula) {
			t.Errorf("%s!%s: formula %q carries a decimal constant", c.Sheet, c.Cell, c.Formula)
		}
	}
	if len(used) != 9 {
		t.Errorf("formulas use %d of the 9 names: %v", len(used), used)
	}
}

func TestFrozenHeadersAndPrintSetup(t *testing.T) {
	f, _ := openSample(t)
	for _, c := range []struct {
		sheet   string
		topLeft string
	}{
		{sheetLoadPoints, "C4"}, {sheetStaging, "A5"}, {sheetInputs, "A3"}, {sheetCurveData, "A3"},
	} {
		p, err := f.GetPanes(c.sheet)
		if err != nil {
			t.Fatal(err)
		}
		if !p.Freeze || p.TopLeftCell != c.topLeft {
			t.Errorf("%s: panes %+v, want frozen at %s", c.sheet, p, c.topLeft)
		}
	}
	areas := map[string]bool{}
	for _, d := range f.GetDefinedName() {
		if d.Name == "_xlnm.Print_Area" {
			areas[d.Scope] = true
		}
	}
	for _, s := range []string{sheetSummary, sheetEconomics, sheetStaging, sheetCurves, sheetLoadPoints, sheetInputs, sheetCurveData} {
		if !areas[s] {
			t.Errorf("%s has no print area", s)
		}
	}
	for _, c := range []struct {
		sheet  string
		orient string
	}{{sheetSummary, "portrait"}, {sheetCurves, "landscape"}} {
		pl, err := f.GetPageLayout(c.sheet)
		if err != nil {
			t.Fatal(err)
		}
		if pl.Orientation == nil || *pl.Orientation != c.orient || pl.FitToWidth == nil || *pl.FitToWidth != 1 {
			t.Errorf("%s: page layout orientation %v fit %v, want %s, one page wide", c.sheet, pl.Orientation, pl.FitToWidth, c.orient)
		}
	}
}

// TestHeadersCarryUnits: every numeric column header of the tables names
// its unit in parentheses.
func TestHeadersCarryUnits(t *testing.T) {
	f, _ := openSample(t)
	for _, c := range []struct {
		sheet string
		row   int
		from  int // first numeric column
		to    int
	}{
		{sheetLoadPoints, lpHeader, 3, 7}, {sheetLoadPoints, lpHeader, 9, 11},
		{sheetStaging, stagingHeader, 4, 10},
	} {
		for col := c.from; col <= c.to; col++ {
			h, _ := f.GetCellValue(c.sheet, cellName(col, c.row))
			if !regexp.MustCompile(`\(.+\)$`).MatchString(h) {
				t.Errorf("%s!%s header %q has no unit", c.sheet, cellName(col, c.row), h)
			}
		}
	}
}

// TestScatterLinesVisible: a scatter series without a line type draws
// markers only; every scatter series must carry a solid line.
func TestScatterLinesVisible(t *testing.T) {
	_, parts := openSample(t)
	charts := 0
	series := 0
	ser := regexp.MustCompile(`(?s)<c:ser>.*?</c:ser>|<ser>.*?</ser>`)
	for name, xml := range parts {
		if !strings.HasPrefix(name, "xl/charts/chart") {
			continue
		}
		charts++
		if !strings.Contains(xml, "scatterChart") {
			continue
		}
		for _, s := range ser.FindAllString(xml, -1) {
			series++
			spPr := s[:strings.Index(s, "marker>")]
			if strings.Contains(spPr, "noFill") || !strings.Contains(spPr, "solidFill") {
				t.Errorf("%s: a scatter series has no visible line: %.200s", name, spPr)
			}
		}
	}
	if charts != 5 {
		t.Errorf("%d charts, want 5 (two head, efficiency, group power, annual energy)", charts)
	}
	if series != 5+5+2+4 {
		t.Errorf("%d scatter series, want 16", series)
	}
}

func BenchmarkBytes(b *testing.B) {
	r := sampleReport()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Bytes(r); err != nil {
			b.Fatal(err)
		}
	}
}

// TestMinimalReport: a Report with one strategy and its cautions and
// nothing else still makes a workbook, with "None given." where sections
// are empty; without cautions it is refused.
func TestMinimalReport(t *testing.T) {
	bare := &Report{Plant: "Bare plant", Units: Units{Flow: "m³/h", Head: "m"}, Strategies: []Strategy{{Name: "As found"}},
		Economics: EconomicsInputs{LifeYears: 1}}
	if _, err := Bytes(bare); !errors.Is(err, ErrInvalidReport) || !strings.Contains(err.Error(), "cautions") {
		t.Errorf("a report without cautions: %v, want ErrInvalidReport naming the cautions", err)
	}
	r := &Report{
		Plant:      "Bare plant",
		Cautions:   sampleCautions,
		Units:      Units{Flow: "m³/h", Head: "m", Currency: "EUR"},
		Strategies: []Strategy{{Name: "As found", EnergyKWh: 1000, PeakKW: 1}},
		Economics:  EconomicsInputs{EnergyPrice: 0.2, LifeYears: 1},
	}
	data, err := Bytes(r)
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	v, _ := f.GetCellValue(sheetStaging, "A5")
	if v != "None given." {
		t.Errorf("Staging A5 = %q, want None given.", v)
	}
	h, _ := f.GetCellValue(sheetEconomics, cellName(1, econRow(ekTotal)))
	if h != "Annual cost (EUR/yr)" {
		t.Errorf("Economics cost label %q, want the currency in it", h)
	}
}
