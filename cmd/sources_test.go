package cmd_test

import (
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

var sourceRef = regexp.MustCompile(`docs/sources\.md §(\d+)`)

// TestSourcesCitedInRepo checks that every "docs/sources.md §N" cited in
// the code, tests and docs names a section the page has, and that nothing
// cites a notes file outside the repository.
func TestSourcesCitedInRepo(t *testing.T) {
	page, err := os.ReadFile(filepath.Join(moduleRoot, "docs", "sources.md"))
	if err != nil {
		t.Fatal(err)
	}
	outside := []string{"DOM" + "AIN §", "DOM" + "AIN.md", "../" + "shared"}
	cited := 0
	err = filepath.WalkDir(moduleRoot, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && (d.Name() == ".git" || d.Name() == "testdata") {
			return filepath.SkipDir
		}
		if d.IsDir() || !(strings.HasSuffix(path, ".go") || strings.HasSuffix(path, ".md")) {
			return nil
		}
		b, err := os.ReadFile(path)
		if err != nil {
			return err
		}
		s := string(b)
		for _, m := range sourceRef.FindAllStringSubmatch(s, -1) {
			cited++
			if !strings.Contains(string(page), "\n## §"+m[1]+" ") {
				t.Errorf("%s cites docs/sources.md §%s, which the page does not have", path, m[1])
			}
		}
		for _, o := range outside {
			if strings.Contains(s, o) {
				t.Errorf("%s cites %q, outside the repository", path, o)
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if cited < 20 {
		t.Errorf("found %d citations of docs/sources.md; the scan no longer sees them", cited)
	}
}
