package officecheck

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// Fold writes text with every run of white space as one space.
func Fold(s string) string { return strings.Join(strings.Fields(s), " ") }

// SheetPages reads each page's footer (its last printed line) and returns the pages (from 0) of
// each of the sheets named, failing the test for a page without the
// footer (a sheet's name, then "· page x of y"), or whose footer numbers
// it wrongly, or that lacks any of the words in footer (the plant's name,
// the program's version, the date).
func (r *Rendered) SheetPages(tb testing.TB, sheets []string, footer ...string) map[string][]int {
	tb.Helper()
	var names []string
	for _, s := range sheets {
		names = append(names, regexp.QuoteMeta(s))
	}
	footerRe := regexp.MustCompile(`(` + strings.Join(names, "|") + `) · page (\d+) of (\d+)`)
	out := map[string][]int{}
	for i := range r.Pages {
		text := Fold(r.Footers[i])
		m := footerRe.FindAllStringSubmatch(text, -1)
		if len(m) == 0 {
			tb.Errorf("page %d has no footer with the sheet and page x of y: %.120q", i+1, text)
			continue
		}
		f := m[len(m)-1]
		if n, _ := strconv.Atoi(f[2]); n != i+1 {
			tb.Errorf("page %d's footer says page %s", i+1, f[2])
		}
		if n, _ := strconv.Atoi(f[3]); n != len(r.Pages) {
			tb.Errorf("page %d's footer says of %s, the PDF has %d pages", i+1, f[3], len(r.Pages))
		}
		for _, w := range footer {
			if !strings.Contains(text, Fold(w)) {
				tb.Errorf("page %d (%s) lacks %q in its footer", i+1, f[1], w)
			}
		}
		out[f[1]] = append(out[f[1]], i)
	}
	return out
}

// SheetText is the folded text of a sheet's pages, joined.
func (r *Rendered) SheetText(pages []int) string {
	var b strings.Builder
	for _, i := range pages {
		b.WriteString(Fold(r.Pages[i]))
		b.WriteByte(' ')
	}
	return b.String()
}

// CheckCellText reads every one-line text cell of each sheet of the
// workbook file (a text cell whose style does not wrap and that is not
// merged) and fails the test where the sheet's printed pages do not hold
// its whole text: a text cut at a cell's edge by its neighbour, or at the
// edge of the print area, shows only its beginning. Cells outside a
// sheet's print area are skipped.
func (r *Rendered) CheckCellText(tb testing.TB, file string, sheets map[string][]int) {
	tb.Helper()
	f, err := excelize.OpenFile(file)
	if err != nil {
		tb.Fatal(err)
	}
	defer f.Close()
	for _, name := range f.GetSheetList() {
		pages, ok := sheets[name]
		if !ok {
			tb.Errorf("sheet %q printed no page", name)
			continue
		}
		text := r.SheetText(pages)
		merged := map[string]bool{}
		if mc, err := f.GetMergeCells(name); err == nil {
			for _, m := range mc {
				merged[m.GetStartAxis()] = true
			}
		}
		lastCol, lastRow := printArea(f, name)
		rows, err := f.GetRows(name)
		if err != nil {
			tb.Fatal(err)
		}
		for ri, row := range rows {
			for ci, v := range row {
				cell, _ := excelize.CoordinatesToCellName(ci+1, ri+1)
				if v == "" || merged[cell] || ci+1 > lastCol || ri+1 > lastRow || isNumber(v) || wraps(f, name, cell) {
					continue
				}
				if formula, _ := f.GetCellFormula(name, cell); formula != "" {
					continue // its shown value is the spreadsheet's, not the stored text
				}
				if !strings.Contains(text, Fold(v)) {
					tb.Errorf("%s!%s: %q is not whole on the printed page (cut at a cell edge?)", name, cell, v)
				}
			}
		}
	}
}

// printArea is the last column and row of a sheet's print area; the whole
// sheet when it has none.
func printArea(f *excelize.File, sheet string) (int, int) {
	for _, dn := range f.GetDefinedName() {
		if dn.Name != "_xlnm.Print_Area" || dn.Scope != sheet {
			continue
		}
		ref := dn.RefersTo
		if i := strings.LastIndex(ref, ":"); i >= 0 {
			c, r, err := excelize.CellNameToCoordinates(strings.ReplaceAll(ref[i+1:], "$", ""))
			if err == nil {
				return c, r
			}
		}
	}
	return 1 << 20, 1 << 30
}

func isNumber(v string) bool {
	_, err := strconv.ParseFloat(v, 64)
	return err == nil
}

func wraps(f *excelize.File, sheet, cell string) bool {
	id, err := f.GetCellStyle(sheet, cell)
	if err != nil {
		return false
	}
	st, err := f.GetStyle(id)
	return err == nil && st.Alignment != nil && st.Alignment.WrapText
}

// PageCount fails the test when a sheet prints on more pages than max (or
// on none).
func PageCount(tb testing.TB, sheets map[string][]int, sheet string, max int) {
	tb.Helper()
	n := len(sheets[sheet])
	if n == 0 || n > max {
		tb.Errorf("sheet %q prints on %d pages, want 1 to %d", sheet, n, max)
	}
}

// Describe lists the pages of each sheet, for a test log.
func Describe(sheets map[string][]int) string {
	var parts []string
	for name, pages := range sheets {
		parts = append(parts, fmt.Sprintf("%s %d", name, len(pages)))
	}
	return strings.Join(parts, ", ")
}
