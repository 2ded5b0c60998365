package handover_test

import (
	"strings"
	"testing"
)

// TestWorkbookChecksCarryNPSH: the workbook's checks say whether the NPSH
// check was made, with the same numbers as the study (the condenser-water
// example has the data, the chilled-water example does not).
func TestWorkbookChecksCarryNPSH(t *testing.T) {
	cases := []struct {
		file, result, detail string
	}{
		// 9.65 m: the hand-checked NPSHa at design flow (study/npsh_test.go).
		{"condenser-water.yaml", "meets the margin", "9.65 m available at design flow"},
		{"chilled-water.yaml", "not made", "neither the suction conditions"},
	}
	for _, c := range cases {
		t.Run(c.file, func(t *testing.T) {
			ex := loadExample(t, c.file)
			found := false
			for _, ch := range ex.report.Checks {
				if !strings.HasPrefix(ch.Name, "NPSH available against required") {
					continue
				}
				found = true
				if ch.Result != c.result || !strings.Contains(ch.Detail, c.detail) {
					t.Errorf("check %q: result %q, detail %q; want %q and %q", ch.Name, ch.Result, ch.Detail, c.result, c.detail)
				}
			}
			if !found {
				t.Errorf("no NPSH check among %d workbook checks", len(ex.report.Checks))
			}
		})
	}
}
