package handover_test

import (
	"regexp"
	"strings"
	"testing"
)

// TestAssumptionsInWords: the Summary's assumptions name the pump model
// and say each defaulted field in words, never as the plant file's field
// path (pumps[0].motor.part_load).
func TestAssumptionsInWords(t *testing.T) {
	path := regexp.MustCompile(`[a-z_]+\[\d+\]|[a-z]+_[a-z_]+|\b[a-z]+\.[a-z_]+:`)
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			for _, a := range ex.report.Assumptions {
				head, _, _ := strings.Cut(a, ": ")
				if m := path.FindString(head); m != "" {
					t.Errorf("assumption %q says %q, a field path", a, m)
				}
			}
			for _, m := range ex.plant.Models {
				found := false
				for _, a := range ex.report.Assumptions {
					found = found || strings.HasPrefix(a, m.Name+", ")
				}
				if !found && len(ex.plant.Defaults) > 0 {
					t.Errorf("no assumption names the model %s", m.Name)
				}
			}
		})
	}
}
