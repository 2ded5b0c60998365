// Package chartcheck reads the charts of a written workbook back from the
// file — which sheet each is on, its title, its axis titles and ranges and
// the cells each series reads — and checks that every series has data and
// that the data lie within the chart's axes. It reads the xlsx package
// (SpreadsheetML, ECMA-376 Part 1: workbook, worksheet and drawing
// relationships, DrawingML charts) with encoding/xml and the cell values
// with excelize, so it checks what a spreadsheet program will draw, not
// what the writer meant to draw.
package chartcheck

import (
	"archive/zip"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"path"
	"sort"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// Chart is one chart as the file holds it.
type Chart struct {
	Part   string // the chart's part, e.g. xl/charts/chart3.xml
	Sheet  string // the sheet it is drawn on
	Kind   string // "scatter" or "bar"
	Title  string
	XTitle string // title of the horizontal axis
	YTitle string // title of the vertical axis
	// XMin… are the fixed axis limits; nil where the axis scales itself.
	XMin, XMax, YMin, YMax *float64
	Series                 []Series
}

// Series is the cells one series reads: sheet-qualified references.
type Series struct {
	Name string // reference of the name cell
	X    string // x values (scatter) or categories (bar)
	Y    string // y values
}

// Read returns every chart of the workbook at file, in sheet order.
func Read(file string) ([]Chart, error) {
	zr, err := zip.OpenReader(file)
	if err != nil {
		return nil, fmt.Errorf("chartcheck: %w", err)
	}
	defer zr.Close()
	parts := map[string]*zip.File{}
	for _, f := range zr.File {
		parts[f.Name] = f
	}
	load := func(name string, v any) error {
		f := parts[name]
		if f == nil {
			return fmt.Errorf("chartcheck: no part %s", name)
		}
		rc, err := f.Open()
		if err != nil {
			return err
		}
		defer rc.Close()
		b, err := io.ReadAll(rc)
		if err != nil {
			return err
		}
		return xml.Unmarshal(b, v)
	}
	var wb struct {
		Sheets []struct {
			Name string `xml:"name,attr"`
			RID  string `xml:"http://schemas.openxmlformats.org/officeDocument/2006/relationships id,attr"`
		} `xml:"sheets>sheet"`
	}
	if err := load("xl/workbook.xml", &wb); err != nil {
		return nil, err
	}
	wbRels, err := rels(load, "xl/_rels/workbook.xml.rels", "xl")
	if err != nil {
		return nil, err
	}
	var out []Chart
	for _, sh := range wb.Sheets {
		sheetPart := wbRels[sh.RID]
		sr, err := rels(load, relsOf(sheetPart), path.Dir(sheetPart))
		if err != nil {
			continue // a sheet without relationships has no drawing
		}
		for _, drawing := range sortedValues(sr, "drawings/") {
			dr, err := rels(load, relsOf(drawing), path.Dir(drawing))
			if err != nil {
				return nil, err
			}
			for _, part := range sortedValues(dr, "charts/") {
				c, err := readChart(load, part)
				if err != nil {
					return nil, err
				}
				c.Sheet = sh.Name
				out = append(out, c)
			}
		}
	}
	return out, nil
}

type loader func(name string, v any) error

// rels reads a relationships part into id → target part, resolved against
// dir.
func rels(load loader, name, dir string) (map[string]string, error) {
	var r struct {
		Rel []struct {
			ID     string `xml:"Id,attr"`
			Target string `xml:"Target,attr"`
		} `xml:"Relationship"`
	}
	if err := load(name, &r); err != nil {
		return nil, err
	}
	out := map[string]string{}
	for _, x := range r.Rel {
		t := x.Target
		if strings.HasPrefix(t, "/") {
			t = strings.TrimPrefix(t, "/")
		} else {
			t = path.Clean(path.Join(dir, t))
		}
		out[x.ID] = t
	}
	return out, nil
}

func relsOf(part string) string {
	return path.Join(path.Dir(part), "_rels", path.Base(part)+".rels")
}

// sortedValues are the targets containing kind, in the order of their
// part names' numbers (chart2 before chart10).
func sortedValues(m map[string]string, kind string) []string {
	var out []string
	for _, v := range m {
		if strings.Contains(v, kind) {
			out = append(out, v)
		}
	}
	sort.Slice(out, func(i, j int) bool { return partNumber(out[i]) < partNumber(out[j]) })
	return out
}

func partNumber(p string) int {
	base := strings.TrimSuffix(path.Base(p), path.Ext(p))
	i := strings.LastIndexFunc(base, func(r rune) bool { return r < '0' || r > '9' })
	n, _ := strconv.Atoi(base[i+1:])
	return n
}

// xmlText is rich text: the runs of every paragraph.
type xmlText struct {
	Runs []string `xml:"tx>rich>p>r>t"`
}

func (t xmlText) String() string { return strings.Join(t.Runs, "") }

type xmlVal struct {
	Val string `xml:"val,attr"`
}

type xmlAxis struct {
	ID    xmlVal  `xml:"axId"`
	Pos   xmlVal  `xml:"axPos"`
	Min   *xmlVal `xml:"scaling>min"`
	Max   *xmlVal `xml:"scaling>max"`
	Title xmlText `xml:"title"`
}

type xmlSer struct {
	Name   string `xml:"tx>strRef>f"`
	XVal   string `xml:"xVal>strRef>f"`
	XNum   string `xml:"xVal>numRef>f"`
	YVal   string `xml:"yVal>numRef>f"`
	Cat    string `xml:"cat>strRef>f"`
	CatNum string `xml:"cat>numRef>f"`
	Val    string `xml:"val>numRef>f"`
}

func readChart(load loader, part string) (Chart, error) {
	var cs struct {
		Title   xmlText `xml:"chart>title"`
		Scatter *struct {
			Ser []xmlSer `xml:"ser"`
		} `xml:"chart>plotArea>scatterChart"`
		Bar *struct {
			Ser []xmlSer `xml:"ser"`
		} `xml:"chart>plotArea>barChart"`
		ValAx []xmlAxis `xml:"chart>plotArea>valAx"`
		CatAx []xmlAxis `xml:"chart>plotArea>catAx"`
	}
	if err := load(part, &cs); err != nil {
		return Chart{}, fmt.Errorf("chartcheck: %s: %w", part, err)
	}
	c := Chart{Part: part, Title: cs.Title.String()}
	var sers []xmlSer
	switch {
	case cs.Scatter != nil:
		c.Kind, sers = "scatter", cs.Scatter.Ser
	case cs.Bar != nil:
		c.Kind, sers = "bar", cs.Bar.Ser
	default:
		return Chart{}, fmt.Errorf("chartcheck: %s: neither a scatter nor a bar chart", part)
	}
	for _, s := range sers {
		c.Series = append(c.Series, Series{Name: s.Name, X: first(s.XVal, s.XNum, s.Cat, s.CatNum), Y: first(s.YVal, s.Val)})
	}
	for _, ax := range append(cs.CatAx, cs.ValAx...) {
		lo, hi := limit(ax.Min), limit(ax.Max)
		if ax.Pos.Val == "b" || ax.Pos.Val == "t" {
			c.XTitle, c.XMin, c.XMax = ax.Title.String(), lo, hi
		} else {
			c.YTitle, c.YMin, c.YMax = ax.Title.String(), lo, hi
		}
	}
	return c, nil
}

func first(v ...string) string {
	for _, s := range v {
		if s != "" {
			return s
		}
	}
	return ""
}

func limit(v *xmlVal) *float64 {
	if v == nil {
		return nil
	}
	f, err := strconv.ParseFloat(v.Val, 64)
	if err != nil {
		return nil
	}
	return &f
}

// Values reads numbers from the cells of a reference such as
// 'Curve data'!$A$5:$A$20 (NaN for an empty cell or a text). formulas, when
// not nil, gives the values of formula cells ("Sheet!A1" → value), which
// excelize does not compute.
func Values(f *excelize.File, ref string, formulas map[string]float64) ([]float64, error) {
	sheet, cells, ok := strings.Cut(ref, "!")
	if !ok {
		return nil, fmt.Errorf("chartcheck: reference %q has no sheet", ref)
	}
	sheet = strings.ReplaceAll(strings.Trim(sheet, "'"), "''", "'")
	cells = strings.ReplaceAll(cells, "$", "")
	from, to, _ := strings.Cut(cells, ":")
	if to == "" {
		to = from
	}
	c1, r1, err := excelize.CellNameToCoordinates(from)
	if err != nil {
		return nil, err
	}
	c2, r2, err := excelize.CellNameToCoordinates(to)
	if err != nil {
		return nil, err
	}
	var out []float64
	for r := r1; r <= r2; r++ {
		for c := c1; c <= c2; c++ {
			name, _ := excelize.CoordinatesToCellName(c, r)
			if v, ok := formulas[sheet+"!"+name]; ok {
				out = append(out, v)
				continue
			}
			s, err := f.GetCellValue(sheet, name, excelize.Options{RawCellValue: true})
			if err != nil {
				return nil, err
			}
			v, err := strconv.ParseFloat(s, 64)
			if err != nil {
				v = math.NaN()
			}
			out = append(out, v)
		}
	}
	return out, nil
}

// Check reads the charts of the workbook at file and returns a problem for
// every series without a finite value, and for every value outside a fixed
// axis range (a bar chart's categories are labels and are not checked).
func Check(file string, formulas map[string]float64) ([]Chart, []string, error) {
	charts, err := Read(file)
	if err != nil {
		return nil, nil, err
	}
	f, err := excelize.OpenFile(file)
	if err != nil {
		return nil, nil, fmt.Errorf("chartcheck: %w", err)
	}
	defer f.Close()
	var problems []string
	for _, c := range charts {
		if len(c.Series) == 0 {
			problems = append(problems, fmt.Sprintf("%s %q: no series", c.Sheet, c.Title))
		}
		for k, s := range c.Series {
			ys, err := Values(f, s.Y, formulas)
			if err != nil {
				return nil, nil, err
			}
			var xs []float64
			if c.Kind == "scatter" {
				if xs, err = Values(f, s.X, formulas); err != nil {
					return nil, nil, err
				}
				if len(xs) != len(ys) {
					problems = append(problems, fmt.Sprintf("%s %q series %d: %d x and %d y cells", c.Sheet, c.Title, k+1, len(xs), len(ys)))
					continue
				}
			}
			points := 0
			for i, y := range ys {
				if math.IsNaN(y) {
					continue
				}
				if xs != nil && math.IsNaN(xs[i]) {
					continue
				}
				points++
				if out(y, c.YMin, c.YMax) {
					problems = append(problems, fmt.Sprintf("%s %q series %d (%s): y %g outside the axis %s", c.Sheet, c.Title, k+1, s.Y, y, span(c.YMin, c.YMax)))
				}
				if xs != nil && out(xs[i], c.XMin, c.XMax) {
					problems = append(problems, fmt.Sprintf("%s %q series %d (%s): x %g outside the axis %s", c.Sheet, c.Title, k+1, s.X, xs[i], span(c.XMin, c.XMax)))
				}
			}
			if points == 0 {
				problems = append(problems, fmt.Sprintf("%s %q series %d (%s): no point to draw", c.Sheet, c.Title, k+1, s.Y))
			}
		}
	}
	return charts, problems, nil
}

func out(v float64, lo, hi *float64) bool {
	const tol = 1e-9 // a value on the axis end is inside
	return lo != nil && v < *lo-tol*math.Max(1, math.Abs(*lo)) || hi != nil && v > *hi+tol*math.Max(1, math.Abs(*hi))
}

func span(lo, hi *float64) string {
	s := func(v *float64) string {
		if v == nil {
			return "auto"
		}
		return strconv.FormatFloat(*v, 'g', -1, 64)
	}
	return "[" + s(lo) + ", " + s(hi) + "]"
}
