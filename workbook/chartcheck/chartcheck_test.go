package chartcheck

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestCheckFindsFaults: a hand-made workbook whose one chart has a point
// past its x axis, a series with no data and a good series; Check reads
// the chart back (sheet, title, axis titles, limits) and reports exactly
// the two faults.
func TestCheckFindsFaults(t *testing.T) {
	f := excelize.NewFile()
	sheet := "Data sheet"
	if err := f.SetSheetName("Sheet1", sheet); err != nil {
		t.Fatal(err)
	}
	rows := [][]any{{"good", "", "past", "", "empty"}, {1, 10, 1, 10, "a"}, {2, 20, 7, 20, "b"}}
	for r, row := range rows {
		for c, v := range row {
			cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
			if err := f.SetCellValue(sheet, cell, v); err != nil {
				t.Fatal(err)
			}
		}
	}
	lo, hi := 0.0, 5.0
	title := func(s string) excelize.ChartTitle {
		return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s}}}
	}
	ch := &excelize.Chart{Type: excelize.Scatter, Title: title("Test chart"),
		XAxis: excelize.ChartAxis{Title: title("Flow (gpm)"), Minimum: &lo, Maximum: &hi},
		YAxis: excelize.ChartAxis{Title: title("Head (ft)")},
		Series: []excelize.ChartSeries{
			{Name: "'Data sheet'!$A$1", Categories: "'Data sheet'!$A$2:$A$3", Values: "'Data sheet'!$B$2:$B$3"},
			{Name: "'Data sheet'!$C$1", Categories: "'Data sheet'!$C$2:$C$3", Values: "'Data sheet'!$D$2:$D$3"},
			{Name: "'Data sheet'!$E$1", Categories: "'Data sheet'!$A$2:$A$3", Values: "'Data sheet'!$E$2:$E$3"},
		}}
	if err := f.AddChart(sheet, "G2", ch); err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "t.xlsx")
	if err := f.SaveAs(file); err != nil {
		t.Fatal(err)
	}
	charts, problems, err := Check(file, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(charts) != 1 {
		t.Fatalf("read %d charts, want 1", len(charts))
	}
	c := charts[0]
	if c.Sheet != sheet || c.Title != "Test chart" || c.XTitle != "Flow (gpm)" || c.YTitle != "Head (ft)" ||
		c.XMin == nil || *c.XMin != 0 || c.XMax == nil || *c.XMax != 5 || c.YMin != nil || len(c.Series) != 3 {
		t.Errorf("read back %+v", c)
	}
	if len(problems) != 2 || !strings.Contains(problems[0], "x 7 outside the axis [0, 5]") || !strings.Contains(problems[1], "no point to draw") {
		t.Errorf("problems %q, want x 7 outside [0, 5] and an empty series", problems)
	}
}
