package cmd_test

import (
	"bytes"
	"crypto/sha256"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wattstage/cmd"
)

// moduleRoot is the module's top folder seen from this package's folder,
// where `go test` runs.
const moduleRoot = ".."

// result is what one run of the command line gave.
type result struct {
	code     int
	out, err string
}

// run calls cmd.Main in-process with empty stdin, as the one-line main
// would, and returns the exit code and both streams.
func run(t *testing.T, args ...string) result {
	t.Helper()
	var out, errw bytes.Buffer
	code := cmd.Main(args, strings.NewReader(""), &out, &errw)
	return result{code: code, out: out.String(), err: errw.String()}
}

// describe is a run for failure messages.
func (r result) describe(args []string) string {
	return fmt.Sprintf("wattstage %s: exit %d\n--- stderr\n%s", strings.Join(args, " "), r.code, r.err)
}

// fileHash returns the SHA-256 of a file's bytes.
func fileHash(t *testing.T, path string) [32]byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return sha256.Sum256(b)
}

// copyFile copies src to dst with mode 0644.
func copyFile(t *testing.T, src, dst string) {
	t.Helper()
	b, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(dst, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// copyExamples copies the shipped example plants and trend into dir, so a
// test may run commands on files nobody else reads.
func copyExamples(t *testing.T, dir string) {
	t.Helper()
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "chilled-water-trend.yaml", "chilled-water-trend.csv"} {
		copyFile(t, filepath.Join(moduleRoot, "examples", name), filepath.Join(dir, name))
	}
}

// listDir returns the names in dir, sorted.
func listDir(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range es {
		names = append(names, e.Name())
	}
	return names
}

// isWorkbook reports whether the file starts with the ZIP signature every
// .xlsx file has (ECMA-376 Part 2, Open Packaging Conventions: a ZIP
// package; local file header "PK\x03\x04", PKWARE APPNOTE 4.3.7).
func isWorkbook(t *testing.T, path string) bool {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		return false
	}
	return bytes.HasPrefix(b, []byte("PK\x03\x04"))
}

// exampleWith writes a copy of a shipped example with its first from
// replaced by to into a temporary folder and returns its path; what names
// the line in the failure message.
func exampleWith(t *testing.T, example, from, to, what string) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "examples", example))
	if err != nil {
		t.Fatal(err)
	}
	doc := strings.Replace(string(b), from, to, 1)
	if doc == string(b) {
		t.Fatalf("the example's %s line was not found", what)
	}
	path := filepath.Join(t.TempDir(), example)
	if err := os.WriteFile(path, []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}
