package workbook

import (
	"fmt"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestParagraphFitsRows writes a sequence step as long as a 32-unit
// plant's list of stages (every stage naming eight tags) and checks that
// it is continued over rows that each stay under the spreadsheet's
// 409-point row limit (Excel's specification; excelize refuses a taller
// row), and that no text is lost or cut inside a word.
func TestParagraphFitsRows(t *testing.T) {
	var stages []string
	for k := 1; k <= 32; k++ {
		tags := make([]string, 8)
		for i := range tags {
			tags[i] = fmt.Sprintf("P%d #%d", 1+k%4, i+1)
		}
		stages = append(stages, fmt.Sprintf("stage %d runs the lead pump of %s", k, strings.Join(tags, ", ")))
	}
	text := "4. Stages: " + strings.Join(stages, "; ") + "."
	b := &book{f: excelize.NewFile(), styles: map[string]int{}}
	s := b.newSheet("Staging", true)
	next := s.paragraph(5, 1, 11, text, "wrap")
	for c := 1; c <= 10; c++ {
		s.fixed[c] = 13
	}
	s.fixed[11] = 36
	s.finish()
	if b.err != nil {
		t.Fatalf("layout: %v", b.err)
	}
	if next-5 < 2 {
		t.Fatalf("a %d-character step was kept on one row", len(text))
	}
	var parts []string
	for row := 5; row < next; row++ {
		v, err := b.f.GetCellValue("Staging", cellName(1, row))
		if err != nil {
			t.Fatal(err)
		}
		h, err := b.f.GetRowHeight("Staging", row)
		if err != nil {
			t.Fatal(err)
		}
		if h > 409 || len(v) > maxParagraph {
			t.Errorf("row %d: %d characters, %.0f pt high", row, len(v), h)
		}
		if strings.HasSuffix(v, ",") || strings.HasSuffix(v, "#") {
			t.Errorf("row %d ends inside a list item: %q", row, v[max(0, len(v)-20):])
		}
		parts = append(parts, v)
	}
	if got := strings.Join(parts, " "); got != text {
		t.Errorf("the rows do not add up to the step:\n got %.80q…\nwant %.80q…", got, text)
	}
}
