package cmd_test

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"
)

// tableLine is a line of an aligned table: indented by two spaces, with
// columns separated by two spaces or more.
var tableLine = regexp.MustCompile(`^  \S.*\S {2,}\S|^ {3,}\S`)

// TestTablesFit120Columns reads the golden stdout of every command on the
// examples and checks that no table line is wider than 120 columns.
func TestTablesFit120Columns(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "golden", "*.out"))
	if err != nil || len(files) < 10 {
		t.Fatalf("found %d golden files (%v)", len(files), err)
	}
	for _, f := range files {
		if strings.Contains(f, "json") {
			continue
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for i, l := range strings.Split(string(b), "\n") {
			l = strings.TrimRight(l, " ")
			if tableLine.MatchString(l) && utf8.RuneCountInString(l) > 120 {
				t.Errorf("%s:%d: table line of %d columns:\n%s", f, i+1, utf8.RuneCountInString(l), l)
			}
		}
	}
}

// TestWideKeepsOneLineHeaders: --wide writes each header on one line.
func TestWideKeepsOneLineHeaders(t *testing.T) {
	t.Chdir(moduleRoot)
	args := []string{"point", "examples/chilled-water.yaml", "--flow", "1800", "--wide"}
	r := run(t, args...)
	if r.code != 0 {
		t.Fatal(r.describe(args))
	}
	if !strings.Contains(r.out, "pump eff (%)") {
		t.Errorf("--wide: no one-line header \"pump eff (%%)\" in\n%s", r.out)
	}
	r = run(t, args[:4]...)
	if strings.Contains(r.out, "pump eff (%)") {
		t.Errorf("without --wide the header is not wrapped:\n%s", r.out)
	}
}
