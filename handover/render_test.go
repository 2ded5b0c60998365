package handover_test

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"wattstage/study"
	"wattstage/workbook"
	"wattstage/workbook/chartcheck"
	"wattstage/workbook/officecheck"

	"github.com/xuri/excelize/v2"
)

// maxPages is the most pages each sheet may print on, for every example on
// A4 and on Letter: the figures the issue that laid the pages out measured,
// with a page of room where a sheet's length follows the plant (more
// strategies, bins or models).
var maxPages = map[string]int{
	workbook.SheetSummary:    3,
	workbook.SheetEconomics:  2, // the strategy table, then the cash flow and its chart
	workbook.SheetStaging:    2, // the table, the signal, and a sequence of operation that states the DP loop and each near-equal band
	workbook.SheetMeasured:   1,
	workbook.SheetLoadPoints: 20, // the trend example: 7 strategies × 20 flow groups, 4 pages across
	workbook.SheetInputs:     3,
	workbook.SheetCurveData:  16,
}

// TestRenderExamples prints each example's workbook to PDF through
// LibreOffice on A4 and on US Letter, and each sheet's first page to PNG
// (for a person to look at; WORKBOOK_RENDER_DIR keeps them), and checks
// what a machine can: every page carries the footer (plant, sheet, page x
// of y, version, date); each sheet prints within its page count, the
// Curves sheet on exactly one page per four charts; every chart is on its
// page with its title and axis titles; no number shows as ###; no one-line
// text is cut at a cell edge; the cautions, strategies and stage-up flows
// are on their pages.
func TestRenderExamples(t *testing.T) {
	if testing.Short() {
		t.Skip("slow (six LibreOffice renders): run without -short")
	}
	for _, name := range exampleFiles {
		for _, paper := range []string{"A4", "Letter"} {
			t.Run(name+"/"+paper, func(t *testing.T) {
				ex := loadExample(t, name)
				r := *ex.report
				r.Paper, r.Date, r.Version = paper, "2026-01-15", "v0.0.0-test"
				base := strings.TrimSuffix(name, ".yaml") + "-" + strings.ToLower(paper)
				file := filepath.Join(officecheck.RenderDir(t), base+".xlsx")
				if err := workbook.Write(file, &r, workbook.Options{Force: true, InputPaths: []string{ex.path}}); err != nil {
					t.Fatal(err)
				}
				rd := officecheck.Render(t, file, base, false)
				footer := "wattstage v0.0.0-test · inputs " + r.InputsSHA256[:12] + " · 2026-01-15"
				sheets := rd.SheetPages(t, sheetNames(t, file), r.Plant, footer)
				t.Logf("pages: %s", officecheck.Describe(sheets))
				for sheet, most := range maxPages {
					if sheet == workbook.SheetMeasured && r.Trend == nil {
						continue
					}
					officecheck.PageCount(t, sheets, sheet, most)
				}
				rd.CheckCellText(t, file, sheets)
				checkChartsOnPages(t, rd, file, sheets)

				summary := rd.SheetText(sheets[workbook.SheetSummary])
				for _, c := range study.Cautions {
					if !strings.Contains(summary, strings.Join(strings.Fields(c)[:6], " ")) {
						t.Errorf("the Summary lacks the caution %q", c)
					}
				}
				for _, s := range r.Strategies {
					if !strings.Contains(summary, strings.Fields(s.Name)[0]) {
						t.Errorf("the Summary lacks the strategy %q", s.Name)
					}
				}
				staging := rd.SheetText(sheets[workbook.SheetStaging])
				for _, sr := range r.Staging.Rows {
					whole, tenth, _ := strings.Cut(strconv.FormatFloat(sr.UpFlow, 'f', 1, 64), ".")
					n, _ := strconv.ParseFloat(whole, 64)
					if want := thousands(n) + "." + tenth; !strings.Contains(staging, want) {
						t.Errorf("the Staging page lacks the stage-up flow %s of %d → %d", want, sr.From, sr.To)
					}
				}
				if r.Trend != nil {
					measured := rd.SheetText(sheets[workbook.SheetMeasured])
					for _, want := range []string{"Trend coverage", "Coverage of the span", "NMBE", "CV(RMSE)"} {
						if !strings.Contains(measured, want) {
							t.Errorf("the Measured page lacks %q", want)
						}
					}
				}
				// Every page for a person to look at when the PNGs are kept;
				// each sheet's first otherwise (pdftoppm is slow).
				keep := os.Getenv("WORKBOOK_RENDER_DIR") != ""
				for _, sheet := range sheetNames(t, file) {
					for k, i := range sheets[sheet] {
						if k > 0 && !keep {
							break
						}
						rd.PNG(t, i, base+"-"+strings.ReplaceAll(strings.ToLower(sheet), " ", "-")+"-"+strconv.Itoa(k+1))
					}
				}
			})
		}
	}
}

// sheetNames are the workbook's sheets in order.
func sheetNames(t *testing.T, file string) []string {
	t.Helper()
	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	return f.GetSheetList()
}

// checkChartsOnPages: every chart's title and axis titles are on a page of
// its sheet, and on the Curves sheet each chart on page k/4 (four charts to
// a page, none cut across two).
func checkChartsOnPages(t *testing.T, rd *officecheck.Rendered, file string, sheets map[string][]int) {
	t.Helper()
	charts, err := chartcheck.Read(file)
	if err != nil {
		t.Fatal(err)
	}
	curves := 0
	for _, c := range charts {
		pages := sheets[c.Sheet]
		if c.Sheet == workbook.SheetCurves {
			k := curves / 4
			curves++
			if k >= len(pages) {
				t.Errorf("chart %q (%d on the Curves sheet) has no page %d", c.Title, curves, k+1)
				continue
			}
			pages = pages[k : k+1]
		}
		text := rd.SheetText(pages)
		for _, want := range []string{c.Title, c.XTitle, c.YTitle} {
			if !strings.Contains(text, officecheck.Fold(want)) {
				t.Errorf("%s chart %q: %q is not on its page", c.Sheet, c.Title, want)
			}
		}
	}
	if want := (curves + 3) / 4; len(sheets[workbook.SheetCurves]) != want {
		t.Errorf("the Curves sheet prints on %d pages for %d charts, want %d", len(sheets[workbook.SheetCurves]), curves, want)
	}
}
