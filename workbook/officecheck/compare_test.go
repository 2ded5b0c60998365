package officecheck

import (
	"fmt"
	"os"
	"strings"
	"testing"

	"wattstage/workbook"
)

// TestCheckValue: the comparator accepts a difference within a relative
// 1e-9 (the tolerance) and rejects one beyond it, reads a
// percentage as a fraction, and compares text exactly.
func TestCheckValue(t *testing.T) {
	num := func(v float64) workbook.Value { return workbook.Value{Number: v} }
	txt := func(s string) workbook.Value { return workbook.Value{Text: s, IsText: true} }
	for _, c := range []struct {
		name string
		got  string
		want workbook.Value
		ok   bool
	}{
		{"equal", "12345.678", num(12345.678), true},
		{"relative 5e-10", "1000000.0005", num(1e6), true},
		{"relative 2e-9", "1000000.002", num(1e6), false},
		{"negative, within", "-2.0000000001", num(-2), true},
		{"zero, absolute 5e-10", "0.0000000005", num(0), true},
		{"zero, absolute 2e-9", "0.000000002", num(0), false},
		{"percent as fraction", "12.5%", num(0.125), true},
		{"percent off", "12.6%", num(0.125), false},
		{"spaces", " 42 ", num(42), true},
		{"empty cell", "", num(0), false},
		{"error text", "#VALUE!", num(1), false},
		{"NaN text", "NaN", num(1), false},
		{"text equal", "never", txt("never"), true},
		{"text differs", "Never", txt("never"), false},
	} {
		t.Run(c.name, func(t *testing.T) {
			why := CheckValue(c.got, c.want)
			if (why == "") != c.ok {
				t.Errorf("CheckValue(%q, %v) = %q, want ok=%v", c.got, c.want, why, c.ok)
			}
		})
	}
}

// TestProfileMode: the profile's registry carries the requested mode for
// both OOXML and ODF files.
func TestProfileMode(t *testing.T) {
	for _, mode := range []Recalc{RecalcAlways, RecalcNever} {
		url := Profile(t, mode)
		dir, ok := strings.CutPrefix(url, "file://")
		if !ok {
			t.Fatalf("Profile returned %q, want a file URL", url)
		}
		data, err := os.ReadFile(dir + "/user/registrymodifications.xcu")
		if err != nil {
			t.Fatal(err)
		}
		for _, key := range []string{"OOXMLRecalcMode", "ODFRecalcMode"} {
			want := fmt.Sprintf(`<prop oor:name="%s" oor:op="fuse"><value>%d</value></prop>`, key, mode)
			if !strings.Contains(string(data), want) {
				t.Errorf("mode %d: registry lacks %s", mode, want)
			}
		}
	}
}
