package cmd_test

import (
	"strings"
	"testing"
)

// TestPlanListsNPSHShortPoints: with the condenser-water example's basin
// lowered to a 4 m suction lift (NPSHa at design 4.15 m, below 1.3 × the
// small pump's NPSHr there), plan lists the short points with their units
// and the study warns of them.
func TestPlanListsNPSHShortPoints(t *testing.T) {
	path := exampleWith(t, "condenser-water.yaml", "  static_head: 1.5 ", "  static_head: -4 ", "suction.static_head")
	args := []string{"plan", path}
	r := run(t, args...)
	if r.code != 0 {
		t.Fatalf("%s", r.describe(args))
	}
	for _, want := range []string{
		"level 4 m below the impeller eye (suction lift)",
		"Points of the lowest-power staging below the margin, worst first:",
		"lowest-power staging runs units with NPSH available below 1.3 × NPSHr",
	} {
		if !strings.Contains(r.out, want) {
			t.Errorf("plan output lacks %q:\n%s", want, r.out)
		}
	}
	// The table's headers wrap (units under the names): each word is there.
	for _, word := range []string{"model", "units", "speed", "NPSHa", "NPSHr", "NPSHa/NPSHr", "h/yr"} {
		if !strings.Contains(r.out, word) {
			t.Errorf("the short-points table lacks the header %q", word)
		}
	}
}
