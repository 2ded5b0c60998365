package workbook

import (
	"fmt"
	"strings"

	"github.com/xuri/excelize/v2"
)

// Colours of our own: a dark slate for titles, a pale grey-blue for header
// rows, the usual blue-on-pale-yellow of an input cell (common practice in
// spreadsheet models), and a pale amber for cautions.
const (
	colourTitle   = "1F3A4D"
	colourHeader  = "DCE6EE"
	colourInput   = "FFF6D5"
	colourInputFg = "0B4FA8"
	colourCaution = "FCE9D4"
	colourRule    = "7F95A6"
)

// style returns the excelize style id for a style name, creating it once.
//
// Names: "title", "subtitle", "h2", "header", "text", "wrap", "caution",
// "bold", "italic", and numeric styles "int", "d1".."d6", "pct" (a fraction
// shown as a percentage), "sci"; a prefix "in_" marks an input cell, "b_"
// a bold number.
func (b *book) style(name string) (int, error) {
	if id, ok := b.styles[name]; ok {
		return id, nil
	}
	st, err := styleDef(name)
	if err != nil {
		return 0, err
	}
	id, err := b.f.NewStyle(st)
	if err != nil {
		return 0, fmt.Errorf("workbook: style %q: %w", name, err)
	}
	b.styles[name] = id
	return id, nil
}

// bodyFont is the workbook's font; naming it in every style keeps a
// program from falling back to its own default (a serif face in some).
const bodyFont = "Calibri"

func font(bold, italic bool, size float64, colour string) *excelize.Font {
	if size == 0 {
		size = 11
	}
	return &excelize.Font{Family: bodyFont, Bold: bold, Italic: italic, Size: size, Color: colour}
}

func styleDef(name string) (*excelize.Style, error) {
	// Text cells are indented one step so a text beside a right-aligned
	// number does not run into it.
	top := &excelize.Alignment{Vertical: "top", Horizontal: "left", Indent: 1}
	wrap := &excelize.Alignment{Vertical: "top", Horizontal: "left", Indent: 1, WrapText: true}
	switch name {
	case "title":
		return &excelize.Style{Font: font(true, false, 15, colourTitle)}, nil
	case "subtitle":
		return &excelize.Style{Font: font(false, true, 0, colourTitle)}, nil
	case "h2":
		return &excelize.Style{
			Font:   font(true, false, 12, colourTitle),
			Border: []excelize.Border{{Type: "bottom", Color: colourRule, Style: 1}},
		}, nil
	case "header":
		return &excelize.Style{
			Font:      font(true, false, 0, ""),
			Fill:      excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colourHeader}},
			Alignment: wrap,
			Border:    []excelize.Border{{Type: "bottom", Color: colourRule, Style: 1}},
		}, nil
	case "text":
		return &excelize.Style{Font: font(false, false, 0, ""), Alignment: top}, nil
	case "bold":
		return &excelize.Style{Font: font(true, false, 0, ""), Alignment: top}, nil
	case "italic":
		return &excelize.Style{Font: font(false, true, 0, ""), Alignment: top}, nil
	case "wrap":
		return &excelize.Style{Font: font(false, false, 0, ""), Alignment: wrap}, nil
	case "note_wrap":
		return &excelize.Style{Font: font(false, true, 0, ""), Alignment: wrap}, nil
	case "bold_wrap":
		return &excelize.Style{Font: font(true, false, 0, ""), Alignment: wrap}, nil
	case "caution":
		return &excelize.Style{
			Font:      font(true, false, 0, "7A3B00"),
			Fill:      excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colourCaution}},
			Alignment: wrap,
		}, nil
	}
	input := strings.HasPrefix(name, "in_")
	bold := strings.HasPrefix(name, "b_")
	base := strings.TrimPrefix(strings.TrimPrefix(name, "in_"), "b_")
	var format string
	switch {
	case base == "gen":
		format = "General"
	case base == "int":
		format = "#,##0"
	case base == "pct":
		format = "0.0%"
	case base == "sci":
		format = "0.000E+00"
	case len(base) == 2 && base[0] == 'd' && base[1] >= '1' && base[1] <= '6':
		format = "#,##0." + strings.Repeat("0", int(base[1]-'0'))
	default:
		return nil, fmt.Errorf("workbook: unknown style %q", name)
	}
	// Right-aligned so a formula's text result ("no saving") lines up with
	// the numbers beside it.
	st := &excelize.Style{CustomNumFmt: &format, Alignment: &excelize.Alignment{Vertical: "top", Horizontal: "right"}, Font: font(false, false, 0, "")}
	if input {
		st.Font = font(false, false, 0, colourInputFg)
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colourInput}}
		st.Border = []excelize.Border{
			{Type: "left", Color: colourRule, Style: 1}, {Type: "right", Color: colourRule, Style: 1},
			{Type: "top", Color: colourRule, Style: 1}, {Type: "bottom", Color: colourRule, Style: 1},
		}
	}
	if bold {
		st.Font = font(true, false, 0, "")
	}
	return st, nil
}
