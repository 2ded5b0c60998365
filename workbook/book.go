package workbook

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"

	"wattstage/internal/numfmt"
)

// book is a workbook being built: the excelize file, its style cache and
// the formula cells written so far with the values Go computed for them.
type book struct {
	f        *excelize.File
	r        *Report
	econ     Economics
	styles   map[string]int
	formulas []FormulaCell
	err      error // first error; later calls do nothing
}

// sheet writes cells of one worksheet and keeps the widest content of each
// column so the widths can be fitted at the end.
type sheet struct {
	b      *book
	name   string
	widths map[int]float64 // column → widest content, in character widths
	fixed  map[int]float64 // column → width set explicitly, wins over fitting
	tall   []tallRow       // rows whose height follows wrapped text
	used   int             // last row written, for sheets laid out in two steps
}

// Value is what a formula cell evaluates to: a number, or a text when
// IsText is set.
type Value struct {
	Number float64
	Text   string
	IsText bool
}

func num(v float64) Value { return Value{Number: v} }
func text(s string) Value { return Value{Text: s, IsText: true} }
func (v Value) String() string {
	if v.IsText {
		return strconv.Quote(v.Text)
	}
	return strconv.FormatFloat(v.Number, 'g', -1, 64)
}

// FormulaCell is one formula in the workbook and the value the Go code
// computed for it independently of the spreadsheet.
type FormulaCell struct {
	Sheet   string // sheet name
	Cell    string // A1 reference
	Formula string // without the leading "="
	Want    Value
}

func (b *book) fail(err error) {
	if b.err == nil && err != nil {
		b.err = err
	}
}

func (b *book) newSheet(name string, first bool) *sheet {
	if first {
		b.fail(b.f.SetSheetName("Sheet1", name))
	} else if _, err := b.f.NewSheet(name); err != nil {
		b.fail(err)
	}
	return &sheet{b: b, name: name, widths: map[int]float64{}, fixed: map[int]float64{}}
}

func cellName(col, row int) string {
	c, err := excelize.CoordinatesToCellName(col, row)
	if err != nil {
		panic(err) // programmer mistake: columns and rows start at 1
	}
	return c
}

func absCell(col, row int) string {
	c, err := excelize.CoordinatesToCellName(col, row, true)
	if err != nil {
		panic(err)
	}
	return c
}

func colName(col int) string {
	c, err := excelize.ColumnNumberToName(col)
	if err != nil {
		panic(err)
	}
	return c
}

// ref is a sheet-qualified absolute reference, e.g. 'Curve data'!$B$4.
func ref(sheetName string, col, row int) string {
	return quoteSheet(sheetName) + "!" + absCell(col, row)
}

func rangeRef(sheetName string, c1, r1, c2, r2 int) string {
	return quoteSheet(sheetName) + "!" + absCell(c1, r1) + ":" + absCell(c2, r2)
}

func quoteSheet(name string) string {
	if strings.ContainsAny(name, " -'!") {
		return "'" + strings.ReplaceAll(name, "'", "''") + "'"
	}
	return name
}

// text writes a string; an empty string writes nothing.
func (s *sheet) text(col, row int, v, style string) {
	if s.b.err != nil || v == "" {
		s.style(col, row, style)
		return
	}
	cell := cellName(col, row)
	s.b.fail(s.b.f.SetCellStr(s.name, cell, v))
	s.style(col, row, style)
	// Titles, headings and wrapped text overflow or wrap; they must not
	// widen a column (on the Curves sheet that would stretch the charts).
	// Headers widen only to their longest word (see header).
	if !strings.Contains(style, "wrap") && style != "title" && style != "subtitle" && style != "h2" && style != "caution" && style != "header" {
		s.grow(col, float64(utf8.RuneCountInString(v)))
	}
}

// number writes a float with the style's number format; NaN or Inf leaves
// the cell empty (a gap in a chart, "not applicable" in a table).
func (s *sheet) number(col, row int, v float64, style string) {
	if s.b.err != nil {
		return
	}
	s.style(col, row, style)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return
	}
	s.b.fail(s.b.f.SetCellFloat(s.name, cellName(col, row), v, -1, 64))
	s.grow(col, float64(len(formatShown(v, style))))
}

// formula writes a formula and records the value Go computed for it.
func (s *sheet) formula(col, row int, f string, want Value, style string) {
	if s.b.err != nil {
		return
	}
	cell := cellName(col, row)
	s.b.fail(s.b.f.SetCellFormula(s.name, cell, f))
	s.style(col, row, style)
	s.b.formulas = append(s.b.formulas, FormulaCell{Sheet: s.name, Cell: cell, Formula: f, Want: want})
	if want.IsText {
		s.grow(col, float64(utf8.RuneCountInString(want.Text)))
	} else {
		s.grow(col, float64(len(formatShown(want.Number, style))))
	}
}

func (s *sheet) style(col, row int, style string) {
	if s.b.err != nil || style == "" {
		return
	}
	id, err := s.b.style(style)
	if err != nil {
		s.b.fail(err)
		return
	}
	cell := cellName(col, row)
	s.b.fail(s.b.f.SetCellStyle(s.name, cell, cell, id))
}

// header writes a header row: wrapped, bold, shaded. A header widens its
// column only to its longest word; the row grows to show the wrapped lines.
func (s *sheet) header(row, col int, labels ...string) {
	for i, l := range labels {
		s.text(col+i, row, l, "header")
		w := 0.0
		for _, word := range strings.Fields(l) {
			w = math.Max(w, float64(utf8.RuneCountInString(word)))
		}
		s.grow(col+i, w+1)
	}
	s.tall = append(s.tall, tallRow{row: row, col: col, labels: labels, bold: true})
}

// merged writes wrapped text across columns c1..c2 and later sets the row
// height so every line shows (spreadsheet programs do not grow the rows of
// merged cells by themselves).
func (s *sheet) merged(row, c1, c2 int, v, style string) {
	if s.b.err != nil {
		return
	}
	s.text(c1, row, v, style)
	for c := c1 + 1; c <= c2; c++ {
		s.style(c, row, style)
	}
	if c2 > c1 {
		s.b.fail(s.b.f.MergeCell(s.name, cellName(c1, row), cellName(c2, row)))
	}
	s.tall = append(s.tall, tallRow{row: row, col: c1, span: c2 - c1 + 1, labels: []string{v}, bold: isBold(style)})
}

// maxParagraph is the most characters paragraph puts in one row: a
// spreadsheet row is at most 409 points high, 27 lines of the body font,
// and prose spans at least about 60 characters a line (20 lines).
const maxParagraph = 1200

// paragraph writes a text of any length as merged, wrapped rows across
// columns c1..c2: one row where it fits in maxParagraph characters, else
// several, split after a "; " or ". " (a space at worst), each continued on
// the next. It returns the row after the last.
func (s *sheet) paragraph(row, c1, c2 int, v, style string) int {
	for len(v) > maxParagraph {
		cut := splitPoint(v, maxParagraph)
		s.merged(row, c1, c2, strings.TrimSpace(v[:cut]), style)
		v = strings.TrimSpace(v[cut:])
		row++
	}
	s.merged(row, c1, c2, v, style)
	return row + 1
}

// splitPoint is where to break a text at or before n bytes: after the last
// "; " or ". ", else the last space, else at n (kept on a rune boundary).
func splitPoint(v string, n int) int {
	head := v[:n]
	for _, sep := range []string{"; ", ". ", " "} {
		if i := strings.LastIndex(head, sep); i > n/2 {
			return i + len(sep) - 1
		}
	}
	for n > 0 && !utf8.RuneStart(v[n]) {
		n--
	}
	return n
}

// wrapped writes text that wraps inside its column, growing the row.
func (s *sheet) wrapped(col, row int, v, style string) {
	s.text(col, row, v, style)
	s.tall = append(s.tall, tallRow{row: row, col: col, span: 1, labels: []string{v}, bold: isBold(style)})
}

func isBold(style string) bool {
	return style == "header" || style == "caution" || strings.HasPrefix(style, "bold") || style == "h2"
}

// tallRow is a row whose height depends on wrapped text: either one label
// per column from col (span 0), or one text across span columns.
type tallRow struct {
	row, col, span int
	labels         []string
	bold           bool
}

// Column width limits, in character widths.
const (
	minColWidth = 6
	maxColWidth = 48
	lineHeight  = 15.0 // points per wrapped line at the 11 pt body font
)

// setWidths sets the widths of the columns fixed so far. A chart's extent
// is anchored to the columns it covers when it is added, so a sheet with a
// chart sets its widths before adding it.
func (s *sheet) setWidths() {
	for _, col := range sortedKeys(s.fixed) {
		name := colName(col)
		s.b.fail(s.b.f.SetColWidth(s.name, name, name, s.fixed[col]))
	}
}

// finish fits the column widths and the heights of wrapped rows.
func (s *sheet) finish() {
	if s.b.err != nil {
		return
	}
	for col, w := range s.widths {
		if _, ok := s.fixed[col]; ok {
			continue
		}
		s.fixed[col] = math.Min(math.Max(w+3, minColWidth), maxColWidth) // content, indent, margin
	}
	s.setWidths()
	heights := map[int]float64{}
	for _, t := range s.tall {
		lines := 1
		if t.span > 0 {
			w := 0.0
			for c := t.col; c < t.col+t.span; c++ {
				w += s.width(c)
			}
			lines = wrappedLines(t.labels[0], w, t.bold)
		} else {
			for i, l := range t.labels {
				lines = max(lines, wrappedLines(l, s.width(t.col+i), t.bold))
			}
		}
		heights[t.row] = math.Max(heights[t.row], float64(lines)*lineHeight+3)
	}
	for _, row := range sortedKeys(heights) {
		s.b.fail(s.b.f.SetRowHeight(s.name, row, heights[row]))
	}
}

// width is the fitted or fixed width of a column, or the default.
func (s *sheet) width(col int) float64 {
	if w, ok := s.fixed[col]; ok {
		return w
	}
	return 8.43 // the spreadsheet default
}

// wrappedLines counts the lines a greedy word wrap gives text in a column
// of the given width (in widths of the digit 0). The characters per width
// unit were measured on rendered pages with a wide fallback font (about
// 1.18 regular, 1.08 bold) and rounded down, so rows come out a little
// tall rather than cut off.
func wrappedLines(text string, width float64, bold bool) int {
	perUnit := 1.1
	if bold {
		perUnit = 1.0
	}
	perLine := int(math.Max((width-2)*perUnit, 1)) // less the indent
	lines := 0
	for _, para := range strings.Split(text, "\n") {
		lines++
		used := 0
		for _, word := range strings.Fields(para) {
			n := wordWidth(word)
			switch {
			case used == 0:
				used = n
			case used+1+n <= perLine:
				used += 1 + n
			default:
				lines++
				used = n
			}
			for used > perLine { // a word longer than the line
				lines++
				used -= perLine
			}
		}
	}
	return lines
}

// wordWidth is a word's width in characters of average width: a capital
// letter counts as 1.3 (a run of capitals, such as a pump tag, is about a
// third wider than the same number of lower-case letters or digits).
func wordWidth(word string) int {
	w := 0.0
	for _, r := range word {
		if r >= 'A' && r <= 'Z' {
			w += 1.3
		} else {
			w++
		}
	}
	return int(math.Ceil(w))
}

func sortedKeys[V any](m map[int]V) []int {
	keys := make([]int, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func (s *sheet) grow(col int, w float64) {
	if w > s.widths[col] {
		s.widths[col] = w
	}
}

// formatShown approximates the text a spreadsheet shows for v in the
// style's number format, for fitting the column width.
func formatShown(v float64, style string) string {
	d := styleDecimals(style)
	if strings.HasSuffix(style, "pct") {
		return strconv.FormatFloat(v*100, 'f', d, 64) + "%"
	}
	if strings.HasSuffix(style, "sci") {
		return strconv.FormatFloat(v, 'E', 3, 64)
	}
	return numfmt.Grouped(v, d)
}

// styleDecimals reads the decimals from a numeric style name such as "d2"
// or "in_d1"; "int" and others give 0.
func styleDecimals(style string) int {
	style = strings.TrimPrefix(style, "in_")
	style = strings.TrimPrefix(style, "b_")
	if len(style) == 2 && style[0] == 'd' {
		return int(style[1] - '0')
	}
	if strings.HasSuffix(style, "pct") {
		return 1
	}
	return 0
}

// decStyle is the numeric style showing d decimals.
func decStyle(d int) string {
	if d <= 0 {
		return "int"
	}
	return fmt.Sprintf("d%d", min(d, 6))
}

func (b *book) defineName(name, refersTo string) {
	if b.err != nil {
		return
	}
	b.fail(b.f.SetDefinedName(&excelize.DefinedName{Name: name, RefersTo: refersTo}))
}

// printTitles repeats the rows through row and the columns through col on
// every printed page.
func (b *book) printTitles(s *sheet, col, row int) {
	if b.err != nil {
		return
	}
	q := quoteSheet(s.name)
	b.fail(b.f.SetDefinedName(&excelize.DefinedName{
		Name: "_xlnm.Print_Titles", Scope: s.name,
		RefersTo: fmt.Sprintf("%s!$A:$%s,%s!$1:$%d", q, colName(col), q, row),
	}))
}

// freeze keeps the rows above row and the columns left of col in view.
func (b *book) freeze(s *sheet, col, row int) {
	if b.err != nil {
		return
	}
	b.fail(b.f.SetPanes(s.name, &excelize.Panes{
		Freeze: true, XSplit: col - 1, YSplit: row - 1,
		TopLeftCell: cellName(col, row), ActivePane: activePane(col, row),
	}))
}

func activePane(col, row int) string {
	switch {
	case col > 1 && row > 1:
		return "bottomRight"
	case col > 1:
		return "topRight"
	default:
		return "bottomLeft"
	}
}

// pageSetup sets the print area to A1 through (lastCol, lastRow), the
// orientation, the paper, the footer, and scaling to one page wide (as
// many pages down as it takes; manual page breaks keep tables and charts
// whole).
func (b *book) pageSetup(s *sheet, landscape bool, lastCol, lastRow int) {
	b.pageSetupWide(s, landscape, lastCol, lastRow, 1)
}

// pageSetupWide is pageSetup scaled to the given number of pages across.
func (b *book) pageSetupWide(s *sheet, landscape bool, lastCol, lastRow, pagesWide int) {
	if b.err != nil {
		return
	}
	orient := "portrait"
	if landscape {
		orient = "landscape"
	}
	paper, tall := b.paperSize(), 0
	b.fail(b.f.SetPageLayout(s.name, &excelize.PageLayoutOptions{
		Size: &paper, Orientation: &orient, FitToWidth: &pagesWide, FitToHeight: &tall,
	}))
	fit := true
	b.fail(b.f.SetSheetProps(s.name, &excelize.SheetPropsOptions{FitToPage: &fit}))
	margin, edge := 0.5, 0.25
	b.fail(b.f.SetPageMargins(s.name, &excelize.PageLayoutMarginsOptions{
		Left: &margin, Right: &margin, Top: &margin, Bottom: &margin, Header: &edge, Footer: &edge,
	}))
	b.fail(b.f.SetHeaderFooter(s.name, &excelize.HeaderFooterOptions{OddFooter: b.footer()}))
	b.fail(b.f.SetDefinedName(&excelize.DefinedName{
		Name: "_xlnm.Print_Area", Scope: s.name,
		RefersTo: rangeRef(s.name, 1, 1, lastCol, lastRow),
	}))
}

// SpreadsheetML paper sizes.
const (
	paperLetter = 1
	paperA4     = 9
)

// paperSize is the Report's paper: Letter for US units unless it says A4,
// A4 otherwise unless it says Letter.
func (b *book) paperSize() int {
	switch strings.ToLower(b.r.Paper) {
	case "a4":
		return paperA4
	case "letter":
		return paperLetter
	}
	if b.r.Units.System == "US" {
		return paperLetter
	}
	return paperA4
}

// footer is every printed page's footer: the plant on the left, the sheet
// and page x of y in the middle, the program's version and the report date
// on the right, in SpreadsheetML header/footer codes (&A the sheet name,
// &P the page, &N the pages; a literal & is &&).
func (b *book) footer() string {
	plant := []rune(b.r.Plant)
	if len(plant) > 80 { // the whole footer must stay under 255 characters
		plant = append(plant[:79], '…')
	}
	right := "wattstage " + b.version()
	if h := b.r.InputsSHA256; len(h) >= 12 {
		right += " · inputs " + h[:12]
	}
	if b.r.Date != "" {
		right += " · " + b.r.Date
	}
	esc := func(s string) string { return strings.ReplaceAll(s, "&", "&&") }
	return `&L&8` + esc(string(plant)) + `&C&8&A · page &P of &N&R&8` + esc(right)
}

// version is the Report's version, or "devel".
func (b *book) version() string {
	if b.r.Version != "" {
		return b.r.Version
	}
	return "devel"
}
