package workbook_test

import (
	"path/filepath"
	"strings"
	"testing"

	"wattstage/workbook"
	"wattstage/workbook/officecheck"

	"github.com/xuri/excelize/v2"
)

// TestRenderSummaryAndCurves prints the workbook to PDF through LibreOffice
// and to PNG through pdftoppm, for a person to look at, and checks what a
// machine can: the Summary and Curves pages exist, their text (cautions,
// strategies, chart and axis titles) is on the page, every page has its
// footer, no number shows as ### (a column too narrow), no one-line text
// is cut at a cell edge, and the Curves sheet prints four charts a page.
//
// Set WORKBOOK_RENDER_DIR to keep the PDF and PNGs there.
func TestRenderSummaryAndCurves(t *testing.T) {
	r := workbook.SampleReport()
	file := filepath.Join(officecheck.RenderDir(t), "plan.xlsx")
	if err := workbook.Write(file, r, workbook.Options{Force: true}); err != nil {
		t.Fatal(err)
	}
	rd := officecheck.Render(t, file, "plan", true)
	pages := rd.Pages
	if len(pages) < 3 {
		t.Fatalf("PDF has %d pages", len(pages))
	}
	find := func(prefix string) int {
		for i, p := range pages {
			if strings.HasPrefix(strings.TrimSpace(p), prefix) {
				return i
			}
		}
		t.Fatalf("no page starts with %q", prefix)
		return -1
	}
	summary := pages[find("Pump group plan: ")]
	flat := strings.Join(strings.Fields(summary), " ")
	for _, c := range r.Cautions {
		words := strings.Fields(c)
		if !strings.Contains(flat, strings.Join(words[:6], " ")) {
			t.Errorf("Summary page lacks the caution %q", c)
		}
	}
	for _, want := range []string{"Strategies compared", "NPV over life", "no saving", "Recommended staging"} {
		if !strings.Contains(flat, want) {
			t.Errorf("Summary page lacks %q", want)
		}
	}

	ci := find("Curves: ")
	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	names := f.GetSheetList()
	_ = f.Close()
	sheets := rd.SheetPages(t, names, r.Plant, "wattstage devel · "+r.Date)
	rd.CheckCellText(t, file, sheets)
	curves := rd.SheetText(sheets[workbook.SheetCurves])
	var wantText []string
	for _, c := range append(append(r.Curves.Head, r.Curves.Efficiency...), r.Curves.GroupPower) {
		wantText = append(wantText, c.Title, c.XLabel, c.YLabel)
	}
	wantText = append(wantText, "Annual energy by strategy", "Annual energy (kWh/yr)", "85,940")
	for _, want := range wantText {
		if !strings.Contains(curves, want) {
			t.Errorf("Curves pages lack %q: a chart did not render", want)
		}
	}
	// Four charts to a page: the sample's five charts take two.
	if n := len(sheets[workbook.SheetCurves]); n != 2 {
		t.Errorf("the Curves sheet prints on %d pages, want 2 for its five charts", n)
	}

	for _, pg := range []struct {
		name string
		i    int
	}{{"summary", find("Pump group plan: ")}, {"curves", ci}} {
		rd.PNG(t, pg.i, pg.name)
	}
	t.Logf("rendered %d pages to %s (summary.png, curves.png)", len(pages), rd.Dir)
}
