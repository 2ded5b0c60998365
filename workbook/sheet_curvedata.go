package workbook

import (
	"cmp"
	"slices"
	"strings"
)

const sheetCurveData = "Curve data"

// Curve data layout: portrait, at most dataGroup series side by side (two
// columns each, dataColWidth wide: about 90 character widths, a portrait
// page at full size), and a page break before any group of rows that would
// not fit on the page it starts on, so no table is cut and no row is left
// alone on a page.
const (
	dataGroup    = 4
	dataColWidth = 11
	// pageBudget is the printable height of a portrait page, points: US
	// Letter (the shorter of A4 and Letter) 11 in less 1 in of margins is
	// 720 pt, less the footer and a margin for rows a little taller than
	// estimated.
	pageBudget = 640.0
	rowPt      = 15.0 // points per data row at the 11 pt body font
	headerPt   = 48.0 // a header row of wrapped axis titles, up to three lines
	namePt     = 33.0 // a series-name row, up to two lines
	titlePt    = 20.0 // a chart-title row
)

// seriesRefs are the cells a chart series reads.
type seriesRefs struct {
	name, x, y string
	style      SeriesStyle
}

// dataWriter writes the Curve data sheet and keeps the printed height of
// the current page.
type dataWriter struct {
	b    *book
	s    *sheet
	row  int     // next free row
	used float64 // points used on the current page
}

// curveDataSheet writes the tables behind every chart in charts, filling
// each one's refs.
func (b *book) curveDataSheet(charts []*placed) {
	s := b.newSheet(sheetCurveData, false)
	s.text(1, 1, "Curve data: "+b.r.Plant, "title")
	s.merged(2, 1, 2*dataGroup, "The tables behind the charts. Empty cells are points outside a curve's range or where a strategy cannot serve the flow.", "note_wrap")
	w := &dataWriter{b: b, s: s, row: 4, used: titlePt + 2*rowPt + rowPt}
	for _, p := range charts {
		switch {
		case p.energy:
		case p.bars != nil:
			p.refs = w.bars(p.bars)
		default:
			p.refs = w.scatter(p.scatter)
		}
	}
	for c := 1; c <= 2*dataGroup; c++ {
		s.fixed[c] = dataColWidth
	}
	b.freeze(s, 1, 3)
	b.pageSetup(s, false, 2*dataGroup, max(w.row-1, 3))
	s.finish()
}

// fit starts a new page before a block of the given height when it would
// not fit on the current one, and counts it on the page.
func (w *dataWriter) fit(height float64) {
	if w.used+height > pageBudget && w.used > 0 {
		w.b.fail(w.b.f.InsertPageBreak(w.s.name, cellName(1, w.row)))
		w.used = 0
	}
	w.used += height
}

// scatter writes a chart's series in groups of up to dataGroup side by
// side, the longest series together so that short ones (a marker, a
// vertical line) do not leave a tall group mostly empty, and returns the
// references of each series in the chart's order.
func (w *dataWriter) scatter(ch *Chart) []seriesRefs {
	s := w.s
	refs := make([]seriesRefs, len(ch.Series))
	order := make([]int, len(ch.Series))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(len(ch.Series[b].X), len(ch.Series[a].X)) })
	for g := 0; g < len(order); g += dataGroup {
		group := order[g:min(g+dataGroup, len(order))]
		rows := 1
		for _, i := range group {
			rows = max(rows, len(ch.Series[i].X))
		}
		title := ch.Title
		if g > 0 {
			title += " (continued)"
		}
		w.fit(titlePt + namePt + headerPt + float64(rows)*rowPt + rowPt)
		s.text(1, w.row, title, "h2")
		nameRow, headRow := w.row+1, w.row+2
		for k, i := range group {
			se := ch.Series[i]
			c := 1 + 2*k
			s.merged(nameRow, c, c+1, se.Name, "bold_wrap")
			s.header(headRow, c, ch.XLabel, ch.YLabel)
			for j := range se.X {
				s.number(c, headRow+1+j, se.X[j], "d2")
				s.number(c+1, headRow+1+j, nanIfMissing(se.Y, j), "d2")
			}
			n := max(len(se.X), 1)
			refs[i] = seriesRefs{
				name:  ref(sheetCurveData, c, nameRow),
				x:     rangeRef(sheetCurveData, c, headRow+1, c, headRow+n),
				y:     rangeRef(sheetCurveData, c+1, headRow+1, c+1, headRow+n),
				style: styleOf(se),
			}
		}
		w.row = headRow + rows + 2
	}
	return refs
}

// bars writes a column chart's table: the categories down the first
// column, a column per series.
func (w *dataWriter) bars(bars *Bars) []seriesRefs {
	s := w.s
	n := len(bars.Categories)
	w.fit(titlePt + headerPt + float64(n)*rowPt + rowPt)
	s.text(1, w.row, bars.Title, "h2")
	headRow := w.row + 1
	labels := []string{bars.XLabel}
	for _, se := range bars.Series {
		labels = append(labels, se.Name+" ("+unitOf(bars.YLabel)+")")
	}
	s.header(headRow, 1, labels...)
	for j, c := range bars.Categories {
		s.text(1, headRow+1+j, c, "text")
	}
	var refs []seriesRefs
	for k, se := range bars.Series {
		col := 2 + k
		for j := range bars.Categories {
			s.number(col, headRow+1+j, nanIfMissing(se.Values, j), "int")
		}
		refs = append(refs, seriesRefs{
			name: ref(sheetCurveData, col, headRow),
			x:    rangeRef(sheetCurveData, 1, headRow+1, 1, headRow+n),
			y:    rangeRef(sheetCurveData, col, headRow+1, col, headRow+n),
		})
	}
	w.row = headRow + n + 2
	return refs
}

// unitOf is the unit in an axis title's closing brackets, e.g. "kWh/yr"
// of "Energy (kWh/yr)".
func unitOf(label string) string {
	i, j := strings.LastIndex(label, "("), strings.LastIndex(label, ")")
	if i < 0 || j < i {
		return label
	}
	return label[i+1 : j]
}

// styleOf is a series' style; a line named as a system or control curve
// is dashed.
func styleOf(se Series) SeriesStyle {
	if se.Style == StyleLine && isSystemCurve(se.Name) {
		return StyleDashed
	}
	return se.Style
}

func nanIfMissing(y []float64, i int) float64 {
	if i < len(y) {
		return y[i]
	}
	return nan
}

// isSystemCurve tells a system or control curve from a pump curve by its
// name, so it can be drawn dashed.
func isSystemCurve(name string) bool {
	n := strings.ToLower(name)
	return strings.Contains(n, "system") || strings.Contains(n, "control curve")
}
