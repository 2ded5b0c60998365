package workbook

import (
	"fmt"
	"math"

	"github.com/xuri/excelize/v2"
)

const sheetCurves = "Curves"

// Chart placement on the Curves sheet: two charts across, two bands of
// charts to a printed page (a page break after every second band), so a
// chart is never cut across two pages on A4 or Letter.
const (
	chartWidth    = 620 // px
	chartHeight   = 460 // px: 23 rows of 20 px
	chartCols     = 10  // columns of default width (64 px) a chart spans, plus a gap
	chartRows     = 24  // rows (chartRowPt, 20 px) a chart spans, plus a gap
	chartTopRow   = 3
	chartsPerRow  = 2
	bandsPerPage  = 2
	chartsPerPage = chartsPerRow * bandsPerPage
	chartRowPt    = 15.0 // row height on the Curves sheet, points (20 px)
	// chartOffset moves each chart a few pixels down into its first row:
	// a chart whose top lies exactly on a page break is also drawn, cut,
	// at the foot of the page before (seen in LibreOffice).
	chartOffset = 4 // px
)

// palette is our own set of line colours, dark enough to read on white and
// distinct in grey print.
var palette = []string{"1B5E8C", "C2571A", "2E7D32", "7B3F98", "8C6D1F", "B0003A", "00838F", "4E5B66",
	"D4A017", "5C8DBF", "6B8E23", "A0522D"}

// legendFont keeps a legend of a dozen series from crowding the plot.
var legendFont = &excelize.Font{Color: "2A2A2A", Size: 8}

// placed is one chart on a sheet: where its data are and how it is drawn.
type placed struct {
	scatter *Chart
	bars    *Bars
	refs    []seriesRefs
	energy  bool // the annual energy columns read from the Economics sheet
}

// curvesSheet starts the Curves sheet; the charts are placed by
// placeCharts once the Curve data sheet exists.
func (b *book) curvesSheet() *sheet {
	s := b.newSheet(sheetCurves, false)
	s.text(1, 1, "Curves: "+b.r.Plant, "title")
	s.text(1, 2, "Charts from the Curve data sheet. Minimum flow, runout and the preferred region are marked: confirm them, NPSH and motor cooling at low speed with the manufacturers (see the cautions).", "subtitle")
	return s
}

// curvesCharts lists the charts of the Curves sheet in the order they are
// placed: each model's operating points beside its efficiency, the stages
// in parallel, power by number running beside the staging bands, group
// power by strategy beside annual energy, then the load profile.
func (b *book) curvesCharts() []placed {
	c := &b.r.Curves
	var out []placed
	add := func(ch *Chart) {
		if len(ch.Series) > 0 {
			out = append(out, placed{scatter: ch})
		}
	}
	for i := range c.Head {
		add(&c.Head[i])
		if i < len(c.Efficiency) {
			add(&c.Efficiency[i])
		}
	}
	for i := len(c.Head); i < len(c.Efficiency); i++ {
		add(&c.Efficiency[i])
	}
	add(&c.Parallel)
	add(&c.CountPower)
	add(&c.Bands)
	add(&c.GroupPower)
	out = append(out, placed{energy: true})
	for _, bars := range []*Bars{&c.Hours, &c.Energy} {
		if len(bars.Series) > 0 && len(bars.Categories) > 0 {
			out = append(out, placed{bars: bars})
		}
	}
	return out
}

// placeCharts draws the Curves sheet's charts, two across, with a page
// break after every second band.
func (b *book) placeCharts(s *sheet, charts []placed) {
	for i, p := range charts {
		cell := slotCell(i)
		if i > 0 && i%chartsPerPage == 0 {
			_, row, _ := excelize.CellNameToCoordinates(cell)
			b.fail(b.f.InsertPageBreak(s.name, cellName(1, row)))
		}
		b.drawChart(s.name, cell, p)
	}
	bands := (len(charts) + chartsPerRow - 1) / chartsPerRow
	lastRow := chartTopRow + bands*chartRows - 1
	// Rows of a set height, so the charts (sized in pixels) sit in the
	// same rows in every spreadsheet program and the page breaks fall
	// between bands.
	for row := chartTopRow; row <= lastRow; row++ {
		b.fail(b.f.SetRowHeight(s.name, row, chartRowPt))
	}
	b.pageSetup(s, true, chartsPerRow*chartCols, lastRow)
	s.finish()
}

func (b *book) drawChart(sheetName, cell string, p placed) {
	switch {
	case p.energy:
		b.energyChart(sheetName, cell)
	case p.bars != nil:
		b.barChart(sheetName, cell, p.bars, p.refs)
	default:
		b.scatterChart(sheetName, cell, p.scatter, p.refs)
	}
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

// scatterChart draws ch, each series in its style, with both axes fixed
// to a rounded range around the data (axisRange).
func (b *book) scatterChart(sheetName, cell string, ch *Chart, refs []seriesRefs) {
	if b.err != nil {
		return
	}
	xlo, xhi, ylo, yhi := dataBounds(ch)
	xmin, xmax := axisRange(xlo, xhi, 0)
	ymin, ymax := axisRange(ylo, yhi, ch.YStep)
	c := &excelize.Chart{
		Type:      excelize.Scatter,
		Title:     chartTitle(ch.Title),
		Dimension: excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:    excelize.ChartLegend{Position: "bottom", Font: legendFont},
		XAxis: excelize.ChartAxis{Title: axisTitle(ch.XLabel), MajorGridLines: true, Font: axisFont,
			Minimum: &xmin, Maximum: &xmax},
		YAxis: excelize.ChartAxis{Title: axisTitle(ch.YLabel), MajorGridLines: true, Font: axisFont,
			Minimum: &ymin, Maximum: &ymax, MajorUnit: ch.YStep},
		ShowBlanksAs: "gap",
		Format:       excelize.GraphicOptions{AltText: ch.Title, PrintObject: boolPtr(true), OffsetY: chartOffset},
	}
	for k, r := range refs {
		colour := palette[k%len(palette)]
		c.Series = append(c.Series, excelize.ChartSeries{
			Name:       r.name,
			Categories: r.x,
			Values:     r.y,
			Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}},
			Line:       lineFor(r.style, colour),
			Marker:     markerFor(r.style, ch.Markers, colour, k),
		})
	}
	b.fail(wrapChart(ch.Title, b.f.AddChart(sheetName, cell, c)))
}

// lineFor is the line of a series style. A scatter series draws no line
// unless its line type is set.
func lineFor(st SeriesStyle, colour string) excelize.LineOptions {
	fill := excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}
	switch st {
	case StyleDashed:
		return excelize.LineOptions{Type: excelize.LineSolid, Width: 1.5, Dash: excelize.LineDashDash, Fill: fill}
	case StylePoints:
		return excelize.LineOptions{Type: excelize.LineNone}
	case StyleBand:
		return excelize.LineOptions{Type: excelize.LineSolid, Width: 9, Fill: fill}
	case StyleGuide:
		return excelize.LineOptions{Type: excelize.LineSolid, Width: 1, Dash: excelize.LineDashSysDot, Fill: fill}
	}
	return excelize.LineOptions{Type: excelize.LineSolid, Width: 2, Fill: fill}
}

// pointSymbols tell apart the point series of one chart (operating
// points, the BEP, crossovers) in grey print as well as in colour.
var pointSymbols = []string{"circle", "diamond", "triangle", "square", "x"}

// markerFor is the marker of the k-th series of a chart in a style.
func markerFor(st SeriesStyle, markAll bool, colour string, k int) excelize.ChartMarker {
	fill := excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}
	switch {
	case st == StylePoints:
		return excelize.ChartMarker{Symbol: pointSymbols[k%len(pointSymbols)], Size: 7, Fill: fill}
	case markAll && (st == StyleLine || st == StyleDashed):
		return excelize.ChartMarker{Symbol: "circle", Size: 5, Fill: fill}
	}
	return excelize.ChartMarker{Symbol: "none"}
}

// barChart draws clustered columns, one series per set, categories along
// the horizontal axis.
func (b *book) barChart(sheetName, cell string, bars *Bars, refs []seriesRefs) {
	if b.err != nil {
		return
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, se := range bars.Series {
		for _, v := range se.Values {
			if finite(v) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	ymin, ymax := axisRange(lo, hi, 0)
	gap := uint(50)
	c := &excelize.Chart{
		Type:      excelize.Col,
		Title:     chartTitle(bars.Title),
		Dimension: excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:    excelize.ChartLegend{Position: "bottom", Font: legendFont},
		XAxis:     excelize.ChartAxis{Title: axisTitle(bars.XLabel), Font: axisFont},
		YAxis: excelize.ChartAxis{Title: axisTitle(bars.YLabel), MajorGridLines: true, Font: axisFont,
			Minimum: &ymin, Maximum: &ymax, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		GapWidth: &gap,
		Format:   excelize.GraphicOptions{AltText: bars.Title, PrintObject: boolPtr(true), OffsetY: chartOffset},
	}
	if len(bars.Series) == 1 {
		c.Legend.Position = "none"
	}
	for k, r := range refs {
		colour := palette[k%len(palette)]
		c.Series = append(c.Series, excelize.ChartSeries{
			Name: r.name, Categories: r.x, Values: r.y,
			Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}},
		})
	}
	b.fail(wrapChart(bars.Title, b.f.AddChart(sheetName, cell, c)))
}

// energyChart draws annual energy per strategy as columns from the
// Economics sheet's strategy table.
func (b *book) energyChart(sheetName, cell string) {
	if b.err != nil {
		return
	}
	n := len(b.r.Strategies)
	first, last := econCol(0), econCol(n-1)
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, st := range b.r.Strategies {
		lo, hi = math.Min(lo, st.EnergyKWh), math.Max(hi, st.EnergyKWh)
	}
	// Headroom for the value labels above the columns.
	ymin, ymax := axisRange(lo, hi*1.08, 0)
	gap := uint(60)
	c := &excelize.Chart{
		Type:      excelize.Col,
		Title:     chartTitle("Annual energy by strategy"),
		Dimension: excelize.ChartDimension{Width: chartWidth, Height: chartHeight},
		Legend:    excelize.ChartLegend{Position: "none"},
		XAxis:     excelize.ChartAxis{Title: axisTitle("Strategy"), Font: axisFont},
		YAxis: excelize.ChartAxis{Title: axisTitle("Annual energy (kWh/yr)"), MajorGridLines: true, Font: axisFont,
			Minimum: &ymin, Maximum: &ymax, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		PlotArea: excelize.ChartPlotArea{ShowVal: true, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "#,##0"}},
		GapWidth: &gap,
		Format:   excelize.GraphicOptions{AltText: "Annual energy by strategy", PrintObject: boolPtr(true), OffsetY: chartOffset},
		Series: []excelize.ChartSeries{{
			Name:       ref(sheetEconomics, 1, econRow(ekWh)),
			Categories: rangeRef(sheetEconomics, first, econTableRow, last, econTableRow),
			Values:     rangeRef(sheetEconomics, first, econRow(ekWh), last, econRow(ekWh)),
			Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{palette[0]}},
		}},
	}
	b.fail(wrapChart("annual energy", b.f.AddChart(sheetName, cell, c)))
}

// dataBounds are the least and greatest finite x and y over a chart's
// series.
func dataBounds(ch *Chart) (xlo, xhi, ylo, yhi float64) {
	xlo, ylo = math.Inf(1), math.Inf(1)
	xhi, yhi = math.Inf(-1), math.Inf(-1)
	for _, se := range ch.Series {
		for i, x := range se.X {
			y := nanIfMissing(se.Y, i)
			if !finite(x) || !finite(y) {
				continue
			}
			xlo, xhi = math.Min(xlo, x), math.Max(xhi, x)
			ylo, yhi = math.Min(ylo, y), math.Max(yhi, y)
		}
	}
	return xlo, xhi, ylo, yhi
}

// axisRange is a rounded axis range holding [lo, hi]: from 0 when lo is
// not negative, else from lo rounded down; to hi rounded up, to a step of
// 1, 2, 2.5 or 5 × 10ᵏ that gives five to eight divisions (fewer leave up
// to a third of the plot empty past the data). With step > 0 the
// range is whole steps with a step of room above hi.
func axisRange(lo, hi, step float64) (float64, float64) {
	if !finite(lo) || !finite(hi) {
		return 0, 1
	}
	if lo >= 0 {
		lo = 0
	}
	if step > 0 {
		return math.Floor(lo/step) * step, (math.Floor(hi/step) + 1) * step
	}
	if hi <= lo {
		hi = lo + math.Max(1, math.Abs(lo))
	}
	d := niceStep((hi - lo) / 8)
	return math.Floor(lo/d) * d, math.Ceil(hi/d-1e-9) * d
}

// niceStep rounds x up to 1, 2, 2.5 or 5 × 10ᵏ.
func niceStep(x float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*p >= x*(1-1e-9) {
			return m * p
		}
	}
	return 10 * p
}

func wrapChart(title string, err error) error {
	if err != nil {
		return fmt.Errorf("workbook: chart %q: %w", title, err)
	}
	return nil
}

var nan = math.NaN()

func boolPtr(v bool) *bool { return &v }
