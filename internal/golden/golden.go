// Package golden compares a test's output with a golden file, or rewrites
// the file when the test runs with -update. Tests only.
package golden

import (
	"os"
	"testing"
)

// Check compares got with the file at path; with update it writes got
// there instead. hint says how to regenerate, for the failure message.
func Check(tb testing.TB, path, got string, update bool, hint string) {
	tb.Helper()
	if update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			tb.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		tb.Fatalf("no golden file (%s): %v", hint, err)
	}
	if got != string(want) {
		tb.Errorf("text differs from %s (%s)\n--- got\n%s--- want\n%s", path, hint, got, want)
	}
}
