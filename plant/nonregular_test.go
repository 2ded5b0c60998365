//go:build unix

package plant

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// Issue 15, class 4: a named pipe given as the plant file, or as its trend
// log, waited forever for a writer. Both are refused before they are
// opened; if they were opened, these tests would hang until go test's own
// timeout ends them.
func TestNonRegularFilesRefused(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "plant.yaml")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Load(fifo)
	if !errors.Is(err, ErrInvalid) || !strings.Contains(err.Error(), "named pipe (FIFO), not a regular file") {
		t.Fatalf("Load(FIFO) = %v", err)
	}
	if _, err := Load(os.DevNull); err == nil || !strings.Contains(err.Error(), "character device") {
		t.Fatalf("Load(/dev/null) = %v", err)
	}

	trend := filepath.Join(dir, "trend.csv")
	if err := syscall.Mkfifo(trend, 0o644); err != nil {
		t.Fatal(err)
	}
	src, err := os.ReadFile("../examples/chilled-water-trend.yaml")
	if err != nil {
		t.Fatal(err)
	}
	text := strings.Replace(string(src), "file: chilled-water-trend.csv", "file: trend.csv", 1)
	if text == string(src) {
		t.Fatal("the trend example no longer names chilled-water-trend.csv")
	}
	_, err = Parse("plant.yaml", []byte(text), dir)
	var list ErrorList
	if !errors.As(err, &list) || len(list) != 1 || list[0].Path != "profile.trend.file" || list[0].Line == 0 ||
		!strings.Contains(list[0].Msg, "named pipe") {
		t.Fatalf("Parse with a FIFO trend = %v", err)
	}
}
