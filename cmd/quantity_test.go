package cmd_test

import (
	"strings"
	"testing"

	"wattstage/cmd"
)

// TestQuantityFlags runs each quantity flag with values in and out of its
// range on the shipped examples: in range exits 0; out of range, or not a
// finite number, exits 2 with a message that names the flag.
func TestQuantityFlags(t *testing.T) {
	t.Chdir(moduleRoot)
	const chw, trend, csv = "examples/chilled-water.yaml", "examples/chilled-water-trend.yaml", "examples/chilled-water-trend.csv"
	cases := []struct {
		name string
		args []string
		flag string // "" = must succeed
	}{
		{"flow in the plant's unit", []string{"point", chw, "--flow", "1800"}, ""},
		{"flow with gpm", []string{"point", chw, "--flow", "1800gpm"}, ""},
		{"flow in L/s in a US plant", []string{"point", chw, "--flow", "114L/s"}, ""},
		{"flow in m3/h with a space", []string{"point", chw, "--flow", "410 m3/h"}, ""},
		{"flow in percent", []string{"point", chw, "--flow", "60%"}, ""},
		{"flow NaN", []string{"point", chw, "--flow", "NaN"}, "--flow"},
		{"flow Inf", []string{"point", chw, "--flow", "Inf"}, "--flow"},
		{"flow zero", []string{"point", chw, "--flow", "0"}, "--flow"},
		{"flow negative", []string{"point", chw, "--flow", "-5"}, "--flow"},
		{"flow 1e300", []string{"point", chw, "--flow", "1e300"}, "--flow"},
		{"flow above 500 %", []string{"point", chw, "--flow", "501%"}, "--flow"},
		{"flow with a comma", []string{"point", chw, "--flow", "1,800"}, "--flow"},
		{"flow unknown unit", []string{"point", chw, "--flow", "1800cfm"}, "--flow"},
		{"units zero", []string{"point", chw, "--flow", "1800", "--units", "0"}, "--units"},
		{"units more than installed", []string{"point", chw, "--flow", "1800", "--units", "4"}, "--units"},
		{"bin width in percent", []string{"plan", trend, "--bin-width", "5%", "--json"}, ""},
		{"bin width 1e9", []string{"plan", trend, "--bin-width", "1e9"}, "--bin-width"},
		{"bin width too narrow", []string{"plan", trend, "--bin-width", "1gpm"}, "--bin-width"},
		{"bin width NaN", []string{"plan", trend, "--bin-width", "NaN"}, "--bin-width"},
		{"deadband percent", []string{"setpoints", chw, "--deadband", "15%"}, ""},
		{"deadband zero", []string{"setpoints", chw, "--deadband", "0"}, "--deadband"},
		{"deadband 50 %", []string{"setpoints", chw, "--deadband", "50%"}, "--deadband"},
		{"deadband as a bare percentage", []string{"setpoints", chw, "--deadband", "15"}, "--deadband"},
		{"up delay zero", []string{"setpoints", chw, "--up-delay", "0s"}, "--up-delay"},
		{"down delay two hours", []string{"setpoints", chw, "--down-delay", "2h"}, "--down-delay"},
		{"width with a unit", []string{"bins", csv, "--width", "12L/s"}, ""},
		{"width 1e9", []string{"bins", csv, "--width", "1e9"}, "--width"},
		{"width percent without a plant", []string{"bins", csv, "--width", "5%"}, "--width"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := run(t, c.args...)
			if c.flag == "" {
				if r.code != 0 {
					t.Fatalf("%s", r.describe(c.args))
				}
				return
			}
			if r.code != cmd.ExitBadInput {
				t.Fatalf("exit %d, want %d: %s", r.code, cmd.ExitBadInput, r.describe(c.args))
			}
			if !strings.Contains(r.err, c.flag) {
				t.Errorf("message %q does not name %s", r.err, c.flag)
			}
			if strings.Contains(r.out, "NaN") || strings.Contains(r.out, "Inf") {
				t.Errorf("stdout holds NaN or Inf:\n%s", r.out)
			}
		})
	}
}
