package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
)

// zipTime is the modification time stored for every part, so that the
// archive does not carry the time it was written.
var zipTime = time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)

// render serialises f to the bytes of a deterministic workbook:
//
//   - parts in a fixed order ([Content_Types].xml first, then by name);
//   - the content-type entries sorted (excelize fills them partly from
//     maps, whose order changes from run to run);
//   - a fixed modification time on every part;
//   - each formula cell carrying the value Go computed as its cached
//     result, so viewers that do not recalculate still show numbers.
func render(f *excelize.File, cells []FormulaCell) ([]byte, error) {
	buf, err := f.WriteToBuffer()
	if err != nil {
		return nil, fmt.Errorf("workbook: serialising: %w", err)
	}
	zr, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	if err != nil {
		return nil, fmt.Errorf("workbook: reading back the archive: %w", err)
	}
	parts := map[string][]byte{}
	for _, zf := range zr.File {
		rc, err := zf.Open()
		if err != nil {
			return nil, fmt.Errorf("workbook: reading back %s: %w", zf.Name, err)
		}
		data, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			return nil, fmt.Errorf("workbook: reading back %s: %w", zf.Name, err)
		}
		parts[zf.Name] = data
	}
	if parts[contentTypesPart], err = sortContentTypes(parts[contentTypesPart]); err != nil {
		return nil, err
	}
	if err := cacheFormulaValues(f, parts, cells); err != nil {
		return nil, err
	}
	for n, data := range parts {
		if strings.HasPrefix(n, "xl/charts/chart") {
			parts[n] = fixChartXML(data)
		}
	}
	names := make([]string, 0, len(parts))
	for n := range parts {
		names = append(names, n)
	}
	slices.SortFunc(names, func(a, b string) int {
		switch {
		case a == contentTypesPart:
			return -1
		case b == contentTypesPart:
			return 1
		}
		return strings.Compare(a, b)
	})
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, n := range names {
		w, err := zw.CreateHeader(&zip.FileHeader{Name: n, Method: zip.Deflate, Modified: zipTime})
		if err != nil {
			return nil, fmt.Errorf("workbook: archiving %s: %w", n, err)
		}
		if _, err := w.Write(parts[n]); err != nil {
			return nil, fmt.Errorf("workbook: archiving %s: %w", n, err)
		}
	}
	if err := zw.Close(); err != nil {
		return nil, fmt.Errorf("workbook: archiving: %w", err)
	}
	return out.Bytes(), nil
}

const contentTypesPart = "[Content_Types].xml"

// emptyTitleTxPr is the text-properties element excelize gives every chart
// and axis title. Its rot="0" overrides the rotation in the title's own
// rich text, and LibreOffice then lays the value-axis title flat, eating
// a third of the plot's width (seen on the rendered Curves page).
const emptyTitleTxPr = `<txPr><a:bodyPr anchorCtr="false" rot="0" spcFirstLastPara="false"></a:bodyPr><a:p></a:p></txPr></title>`

// fixChartXML drops the empty title text properties, leaving each title's
// rich text (and its rotation) in charge.
func fixChartXML(data []byte) []byte {
	return bytes.ReplaceAll(data, []byte(emptyTitleTxPr), []byte("</title>"))
}

type contentTypes struct {
	XMLName   xml.Name          `xml:"http://schemas.openxmlformats.org/package/2006/content-types Types"`
	Defaults  []contentDefault  `xml:"Default"`
	Overrides []contentOverride `xml:"Override"`
}

type contentDefault struct {
	Extension   string `xml:"Extension,attr"`
	ContentType string `xml:"ContentType,attr"`
}

type contentOverride struct {
	PartName    string `xml:"PartName,attr"`
	ContentType string `xml:"ContentType,attr"`
}

// sortContentTypes orders the Default entries by extension and the
// Override entries by part name, dropping exact duplicates.
func sortContentTypes(data []byte) ([]byte, error) {
	var ct contentTypes
	if err := xml.Unmarshal(data, &ct); err != nil {
		return nil, fmt.Errorf("workbook: reading content types: %w", err)
	}
	slices.SortFunc(ct.Defaults, func(a, b contentDefault) int {
		return strings.Compare(a.Extension+"\x00"+a.ContentType, b.Extension+"\x00"+b.ContentType)
	})
	ct.Defaults = slices.Compact(ct.Defaults)
	slices.SortFunc(ct.Overrides, func(a, b contentOverride) int {
		return strings.Compare(a.PartName+"\x00"+a.ContentType, b.PartName+"\x00"+b.ContentType)
	})
	ct.Overrides = slices.Compact(ct.Overrides)
	out, err := xml.Marshal(ct)
	if err != nil {
		return nil, fmt.Errorf("workbook: writing content types: %w", err)
	}
	return append([]byte(xml.Header), out...), nil
}

// formulaCellXML matches one formula cell as excelize writes it: its
// attributes (with t="str", excelize's type for a formula without a
// value) and its formula.
var formulaCellXML = regexp.MustCompile(`<c r="([A-Z]+[0-9]+)"([^>]*?)( t="str")?><f>([^<]*)</f>(<v>[^<]*</v>)?</c>`)

// cacheFormulaValues writes each formula cell's Go-computed value as the
// cell's cached result: a number without a type, a text with t="str".
func cacheFormulaValues(f *excelize.File, parts map[string][]byte, cells []FormulaCell) error {
	bySheet := map[string]map[string]Value{}
	for _, c := range cells {
		if bySheet[c.Sheet] == nil {
			bySheet[c.Sheet] = map[string]Value{}
		}
		bySheet[c.Sheet][c.Cell] = c.Want
	}
	for id, name := range f.GetSheetMap() {
		want := bySheet[name]
		if len(want) == 0 {
			continue
		}
		part := fmt.Sprintf("xl/worksheets/sheet%d.xml", id)
		data, ok := parts[part]
		if !ok {
			return fmt.Errorf("workbook: sheet %q: part %s not found", name, part)
		}
		done := 0
		data = formulaCellXML.ReplaceAllFunc(data, func(m []byte) []byte {
			sub := formulaCellXML.FindSubmatch(m)
			v, ok := want[string(sub[1])]
			if !ok {
				return m
			}
			done++
			var b strings.Builder
			b.WriteString(`<c r="`)
			b.Write(sub[1])
			b.WriteString(`"`)
			b.Write(sub[2])
			if v.IsText {
				b.WriteString(` t="str"`)
			}
			b.WriteString(`><f>`)
			b.Write(sub[4])
			b.WriteString(`</f><v>`)
			if v.IsText {
				xml.EscapeText(&b, []byte(v.Text))
			} else {
				b.WriteString(strconv.FormatFloat(v.Number, 'g', -1, 64))
			}
			b.WriteString(`</v></c>`)
			return []byte(b.String())
		})
		if done != len(want) {
			return fmt.Errorf("workbook: sheet %q: cached %d of %d formula values", name, done, len(want))
		}
		parts[part] = data
	}
	return nil
}
