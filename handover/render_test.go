package handover_test

import (
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"wattstage/study"
	"wattstage/workbook"
	"wattstage/workbook/officecheck"
)

// TestRenderTrendExample prints the trend example's workbook to PDF through
// LibreOffice and its Summary, Staging and Curves pages to PNG through
// pdftoppm, for a person to look at, and checks what a machine can: each
// of the three sheets fits one page, no number shows as ### (a column too
// narrow), the cautions and strategies are on the Summary, every staging
// row is on the Staging page, and every chart's title and axis titles are
// on the Curves page (a chart that fails to draw leaves none).
//
// Set WORKBOOK_RENDER_DIR to keep the PDF and PNGs there.
func TestRenderTrendExample(t *testing.T) {
	if testing.Short() {
		t.Skip("slow (a year of hourly trend, every strategy): run without -short")
	}
	ex := loadExample(t, "chilled-water-trend.yaml")
	r := ex.report
	file := filepath.Join(officecheck.RenderDir(t), "chilled-water-trend.xlsx")
	if err := workbook.Write(file, r, workbook.Options{Force: true, InputPaths: []string{ex.path}}); err != nil {
		t.Fatal(err)
	}
	// Reading order, not layout: a wrapped chart title stays whole.
	rd := officecheck.Render(t, file, "chilled-water-trend", false)
	var pages []string // each page's text, whitespace folded to single spaces
	for _, p := range rd.Pages {
		pages = append(pages, strings.Join(strings.Fields(p), " "))
	}
	titles := []string{"Pump group plan: ", "Economics: ", "Staging setpoints: ", "Curves: ", "Load points: "}
	page := func(title string) int {
		t.Helper()
		for i, p := range pages {
			if strings.HasPrefix(p, title+r.Plant) {
				return i
			}
		}
		t.Fatalf("no page starts with %q", title+r.Plant)
		return -1
	}
	idx := map[string]int{}
	for _, title := range titles {
		idx[title] = page(title)
	}
	// The Economics, Staging and Curves sheets fit one page each: the next
	// sheet begins on the very next page. The portrait Summary may run on.
	for k := 1; k+1 < len(titles); k++ {
		if pages := idx[titles[k+1]] - idx[titles[k]]; pages != 1 {
			t.Errorf("the %q sheet runs over %d pages", titles[k], pages)
		}
	}
	t.Logf("the Summary takes %d page(s)", idx["Economics: "]-idx["Pump group plan: "])

	summary := pages[idx["Pump group plan: "]]
	for _, c := range study.Cautions {
		if !strings.Contains(summary, strings.Join(strings.Fields(c)[:6], " ")) {
			t.Errorf("the Summary page lacks the caution %q", c)
		}
	}
	for _, s := range r.Strategies {
		if !strings.Contains(summary, strings.Fields(s.Name)[0]) {
			t.Errorf("the Summary page lacks the strategy %q", s.Name)
		}
	}
	for _, want := range []string{"kWh/yr", "(USD)", "Recommended staging", "Checks", "Savings range"} {
		if !strings.Contains(summary, want) {
			t.Errorf("the Summary page lacks %q", want)
		}
	}

	staging := pages[idx["Staging setpoints: "]]
	for _, sr := range r.Staging.Rows {
		// The sheet shows flows to one decimal with grouped thousands.
		whole, tenth, _ := strings.Cut(strconv.FormatFloat(sr.UpFlow, 'f', 1, 64), ".")
		n, _ := strconv.ParseFloat(whole, 64)
		want := thousands(n) + "." + tenth
		if !strings.Contains(staging, want) {
			t.Errorf("the Staging page lacks the stage-up flow %s of %d → %d", want, sr.From, sr.To)
		}
	}
	if len(r.Staging.Sequence) == 0 || !strings.Contains(staging, strconv.Itoa(len(r.Staging.Sequence))+". ") {
		t.Errorf("the Staging page lacks the sequence of operation's last step")
	}

	curves := pages[idx["Curves: "]]
	var want []string
	for _, c := range append(append(r.Curves.Head, r.Curves.Efficiency...), r.Curves.GroupPower) {
		want = append(want, c.Title, c.XLabel, c.YLabel)
	}
	want = append(want, "Annual energy by strategy", thousands(r.Strategies[0].EnergyKWh))
	for _, w := range want {
		if !strings.Contains(curves, w) {
			t.Errorf("the Curves page lacks %q: a chart did not draw", w)
		}
	}

	for _, pg := range []struct {
		name  string
		index int
	}{{"summary", idx["Pump group plan: "]}, {"staging", idx["Staging setpoints: "]}, {"curves", idx["Curves: "]}} {
		rd.PNG(t, pg.index, "chilled-water-trend-"+pg.name)
	}
	t.Logf("rendered %d pages to %s", len(pages), rd.Dir)
}
