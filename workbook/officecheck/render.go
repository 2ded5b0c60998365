package officecheck

import (
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// Rendered is a workbook printed to PDF through LibreOffice, for a person to
// look at and a test to read.
type Rendered struct {
	Dir      string   // where the PDF and PNGs go: WORKBOOK_RENDER_DIR, or a temporary folder
	PDF      string   // the PDF
	Pages    []string // each page's text, as pdftotext gives it
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
