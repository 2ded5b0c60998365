package officecheck

import (
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// Rendered is a workbook printed to PDF through LibreOffice, for a person to
// look at and a test to read.
type Rendered struct {
	Dir   string   // where the PDF and PNGs go: WORKBOOK_RENDER_DIR, or a temporary folder
	PDF   string   // the PDF
	Pages []string // each page's text, as pdftotext gives it
	// Footers are the text of each page's bottom margin (the lowest 40
	// points), where the footer prints: read apart from the page, whose
	// chart labels can otherwise run into it.
	Footers  []string
	pdftoppm string
}

// Render prints file to Dir/name.pdf (recalculating on load) and reads each
// page's text: in reading order, or laid out when layout is set. It needs
// soffice, pdftoppm and pdftotext, skipping the test without them (failing
// under CI=true). Set WORKBOOK_RENDER_DIR to keep the PDF and PNGs.
func Render(tb testing.TB, file, name string, layout bool) *Rendered {
	tb.Helper()
	soffice := Soffice(tb)
	r := &Rendered{Dir: RenderDir(tb), pdftoppm: Tool(tb, "pdftoppm", "poppler-utils")}
	pdftotext := Tool(tb, "pdftotext", "poppler-utils")
	r.PDF = filepath.Join(r.Dir, name+".pdf")
	if err := os.Rename(Convert(tb, soffice, Profile(tb, RecalcAlways), file, "pdf"), r.PDF); err != nil {
		tb.Fatal(err)
	}
	sizes := pageSizes(tb, Tool(tb, "pdfinfo", "poppler-utils"), r.PDF)
	for i := 1; ; i++ {
		args := []string{"-f", strconv.Itoa(i), "-l", strconv.Itoa(i), r.PDF, "-"}
		if layout {
			args = append([]string{"-layout"}, args...)
		}
		txt, err := exec.Command(pdftotext, args...).Output()
		if err != nil {
			break // past the last page
		}
		r.Pages = append(r.Pages, string(txt))
		footer := ""
		if i-1 < len(sizes) {
			w, h := sizes[i-1][0], sizes[i-1][1]
			out, err := exec.Command(pdftotext, "-f", strconv.Itoa(i), "-l", strconv.Itoa(i), "-x", "0", "-y", strconv.Itoa(int(h)-40),
				"-W", strconv.Itoa(int(w)+1), "-H", "40", r.PDF, "-").Output()
			if err != nil {
				tb.Fatalf("pdftotext page %d's foot: %v", i, err)
			}
			footer = string(out)
		}
		r.Footers = append(r.Footers, footer)
	}
	for i, p := range r.Pages {
		if strings.Contains(p, "###") {
			tb.Errorf("page %d shows ### (a number wider than its column): %.80q", i+1, strings.Join(strings.Fields(p), " "))
		}
	}
	return r
}

// RenderDir is WORKBOOK_RENDER_DIR (made if need be), or a temporary folder.
func RenderDir(tb testing.TB) string {
	tb.Helper()
	out := os.Getenv("WORKBOOK_RENDER_DIR")
	if out == "" {
		return tb.TempDir()
	}
	if err := os.MkdirAll(out, 0o755); err != nil {
		tb.Fatal(err)
	}
	return out
}

// PNG renders page index (from 0) to Dir/name.png and checks it is not
// nearly empty.
func (r *Rendered) PNG(tb testing.TB, index int, name string) {
	tb.Helper()
	n := strconv.Itoa(index + 1)
	prefix := filepath.Join(r.Dir, name)
	if b, err := exec.Command(r.pdftoppm, "-r", "110", "-png", "-singlefile", "-f", n, "-l", n, r.PDF, prefix).CombinedOutput(); err != nil {
		tb.Fatalf("pdftoppm: %v\n%s", err, b)
	}
	if fi, err := os.Stat(prefix + ".png"); err != nil || fi.Size() < 10000 {
		tb.Errorf("%s.png missing or nearly empty", prefix)
	}
}

// pageSizeRe reads pdfinfo's "Page    3 size: 841.92 x 595.32 pts" lines.
var pageSizeRe = regexp.MustCompile(`Page\s+\d+ size:\s+([\d.]+) x ([\d.]+) pts`)

// pageSizes is the width and height of every page of the PDF, in points.
func pageSizes(tb testing.TB, pdfinfo, pdf string) [][2]float64 {
	tb.Helper()
	out, err := exec.Command(pdfinfo, "-f", "1", "-l", "100000", pdf).Output()
	if err != nil {
		tb.Fatalf("pdfinfo: %v", err)
	}
	var sizes [][2]float64
	for _, m := range pageSizeRe.FindAllStringSubmatch(string(out), -1) {
		w, _ := strconv.ParseFloat(m[1], 64)
		h, _ := strconv.ParseFloat(m[2], 64)
		sizes = append(sizes, [2]float64{w, h})
	}
	return sizes
}
