package workbook

import (
	"fmt"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"
)

const (
	sheetCurves    = "Curves"
	sheetCurveData = "Curve data"
)

// Chart placement on the Curves sheet: two charts per row band.
const (
	chartWidth   = 620 // px
	chartHeight  = 380 // px
	chartCols    = 10  // columns of default width a chart spans, plus a gap
	chartRows    = 20  // rows of default height a chart spans, plus a gap
	chartTopRow  = 3
	chartsPerRow = 2
)

// palette is our own set of line colours, dark enough to read on white and
// distinct in grey print.
var palette = []string{"1B5E8C", "C2571A", "2E7D32", "7B3F98", "8C6D1F", "B0003A", "00838F", "4E5B66"}

// seriesRefs are the cells a chart series reads.
type seriesRefs struct {
	name, x, y string
	dashed     bool
}

// curveDataSheet writes the tables behind the charts and returns, per
// chart in the order charts() lists them, the references of each series.
func (b *book) curveDataSheet(charts []Chart) [][]seriesRefs {
	s := b.newSheet(sheetCurveData, false)
	s.text(1, 1, "Curve data: "+b.r.Plant, "title")
	s.text(1, 2, "The tables behind the charts on the Curves sheet. Empty cells are points outside a curve's range.", "subtitle")
	row := 4
	out := make([][]seriesRefs, len(charts))
	for ci, ch := range charts {
		s.text(1, row, ch.Title, "h2")
		nameRow, headRow := row+1, row+2
		longest := 0
		for k, se := range ch.Series {
			c := 1 + 2*k
			s.merged(nameRow, c, c+1, se.Name, "bold")
			s.header(headRow, c, ch.XLabel, ch.YLabel)
			for i := range se.X {
				s.number(c, headRow+1+i, se.X[i], "d2")
				y := nanIfMissing(se.Y, i)
				s.number(c+1, headRow+1+i, y, "d2")
			}
			n := max(len(se.X), 1)
			longest = max(longest, n)
			out[ci] = append(out[ci], seriesRefs{
				name:   ref(sheetCurveData, c, nameRow),
				x:      rangeRef(sheetCurveData, c, headRow+1, c, headRow+n),
				y:      rangeRef(sheetCurveData, c+1, headRow+1, c+1, headRow+n),
				dashed: isSystemCurve(se.Name),
			})
		}
		row = headRow + longest + 3
	}
	for c := 1; c <= 2*maxSeries(charts); c++ {
		s.fixed[c] = 13
	}
	b.freeze(s, 1, 3)
	b.pageSetup(s, true, 2*maxSeries(charts), row)
	s.finish()
	return out
}

func nanIfMissing(y []float64, i int) float64 {
	if i < len(y) {
		return y[i]
	}
	return nan
}

func maxSeries(charts []Chart) int {
	n := 1
	for _, c := range charts {
		n = max(n, len(c.Series))
	}
	return n
}

// isSystemCurve tells a system or control curve from a pump curve by its
// name, so it can be drawn dashed.
func isSystemCurve(name string) bool {
	n := strings.ToLower(name)
	return strings.Contains(n, "system") || strings.Contains(n, "control curve")
}

// charts lists the scatter charts in the order they are placed.
func (b *book) charts() []Chart {
	c := b.r.Curves
	var out []Chart
	out = append(out, c.Head...)
	out = append(out, c.Efficiency...)
	if len(c.GroupPower.Series) > 0 {
		out = append(out, c.GroupPower)
	}
	return out
}

// curvesSheet starts the Curves sheet; the charts are placed by
// placeCharts once the Curve data sheet exists.
func (b *book) curvesSheet() *sheet {
	s := b.newSheet(sheetCurves, false)
	s.text(1, 1, "Curves: "+b.r.Plant, "title")
	s.text(1, 2, "Native charts drawn from the Curve data and Economics sheets.", "subtitle")
	return s
}

// placeCharts draws every scatter chart from the Curve data sheet, then
// annual energy per strategy as columns, two charts across.
func (b *book) placeCharts(s *sheet, charts []Chart, refs [][]seriesRefs) {
	slot := 0
	for ci, ch := range charts {
		if len(ch.Series) == 0 {
			continue
		}
		b.scatterChart(s, slotCell(slot), ch, refs[ci], ci >= len(b.r.Curves.Head)+len(b.r.Curves.Efficiency))
		slot++
	}
	b.energyChart(s, slotCell(slot))
	slot++
	bands := (slot + chartsPerRow - 1) / chartsPerRow
	lastRow := chartTopRow + bands*chartRows
	// The charts belong on one page: a chart cut across two is unreadable.
	b.pageSetupFit(s, true, chartsPerRow*chartCols, lastRow, 1, 1)
	s.finish()
}

func slotCell(slot int) string {
	col := 1 + (slot%chartsPerRow)*chartCols
	row := chartTopRow + (slot/chartsPerRow)*chartRows
	return cellName(col, row)
}

// axisFont is for tick labels: excelize's default grey is too pale to read
// on the rendered page.
var axisFont = excelize.Font{Color: "3A3A3A", Size: 9}

func axisTitle(t string) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: t, Font: &excelize.Font{Size: 10, Bold: false}}}}
}

func chartTitle(t string) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: t, Font: &excelize.Font{Size: 12, Bold: true}}}}
}

// scatterChart draws ch with lines; markers only when the points are
// results at discrete loads rather than samples of a smooth curve.
func (b *book) scatterChart(s *sheet, cell string, ch Chart, refs []seriesRefs, markers bool) {
	if b.err != nil {
		return
	}
	c := &excelize.Chart{
		Type:         excelize.Scatter,
		Title:        chartTitle(ch.Title),
		Dimension:    excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:       excelize.ChartLegend{Position: "bottom"},
		XAxis:        excelize.ChartAxis{Title: axisTitle(ch.XLabel), MajorGridLines: true, Font: axisFont},
		YAxis:        excelize.ChartAxis{Title: axisTitle(ch.YLabel), MajorGridLines: true, Font: axisFont},
		ShowBlanksAs: "gap",
		Format:       excelize.GraphicOptions{AltText: ch.Title, PrintObject: boolPtr(true)},
	}
	for k, r := range refs {
		colour := palette[k%len(palette)]
		// A scatter series draws no line unless its line type is set.
		line := excelize.LineOptions{Type: excelize.LineSolid, Width: 2}
		if r.dashed {
			line.Dash = excelize.LineDashDash
		}
		c.Series = append(c.Series, excelize.ChartSeries{
			Name:       r.name,
			Categories: r.x,
			Values:     r.y,
			Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}},
			Line:       line,
			Marker:     marker(markers, colour),
		})
	}
	b.fail(wrapChart(ch.Title, b.f.AddChart(s.name, cell, c)))
}

func marker(on bool, colour string) excelize.ChartMarker {
	if !on {
		return excelize.ChartMarker{Symbol: "none"}
	}
	return excelize.ChartMarker{Symbol: "circle", Size: 5,
		Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}}
}

// energyChart draws annual energy per strategy as columns from the
// Economics sheet's strategy table.
func (b *book) energyChart(s *sheet, cell string) {
	if b.err != nil {
		return
	}
	n := len(b.r.Strategies)
	first, last := econCol(0), econCol(n-1)
	gap := uint(60)
	c := &excelize.Chart{
		Type:      excelize.Col,
		Title:     chartTitle("Annual energy by strategy"),
		Dimension: excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:    excelize.ChartLegend{Position: "none"},
		XAxis:     excelize.ChartAxis{Title: axisTitle("Strategy"), Font: axisFont},
		YAxis:     excelize.ChartAxis{Title: axisTitle("Annual energy (kWh/yr)"), MajorGridLines: true, Font: axisFont, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		PlotArea:  excelize.ChartPlotArea{ShowVal: true, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		GapWidth:  &gap,
		Format:    excelize.GraphicOptions{AltText: "Annual energy by strategy", PrintObject: boolPtr(true)},
		Series: []excelize.ChartSeries{{
			Name:       ref(sheetEconomics, 1, econRow(ekWh)),
			Categories: rangeRef(sheetEconomics, first, econTableRow, last, econTableRow),
			Values:     rangeRef(sheetEconomics, first, econRow(ekWh), last, econRow(ekWh)),
			Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{palette[0]}},
		}},
	}
	b.fail(wrapChart("annual energy", b.f.AddChart(s.name, cell, c)))
}

func wrapChart(title string, err error) error {
	if err != nil {
		return fmt.Errorf("workbook: chart %q: %w", title, err)
	}
	return nil
}

var nan = math.NaN()

func boolPtr(v bool) *bool { return &v }
