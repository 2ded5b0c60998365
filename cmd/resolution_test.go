package cmd_test

import (
	"regexp"
	"strings"
	"testing"
)

// On a plant whose 1 % of design flow is below one display unit the
// sequence's flow steps are fractions (40 m³/h design: 0.2 m³/h steps),
// and every setpoint and flow the text names must keep the decimal the step
// needs: the text once wrote "rounded to 0 m³/h" and cut stage-up and
// reset flows to whole numbers.
func TestSetpointsKeepTheStepsDecimals(t *testing.T) {
	path := exampleWith(t, "heating-water.yaml", "  design_flow: 100 ", "  design_flow: 40 ", "design_flow")
	args := []string{"setpoints", path}
	r := run(t, args...)
	if r.code != 0 {
		t.Fatalf("%s", r.describe(args))
	}
	if !strings.Contains(r.out, "Flows are rounded to 0.2 m³/h") {
		t.Errorf("the resolution is not written as 0.2 m³/h:\n%s", r.out)
	}
	// Every flow the sequence of operation names is at 0.2 m³/h steps.
	re := regexp.MustCompile(`stays (above|below) ([0-9.,]+) m³/h`)
	m := re.FindAllStringSubmatch(r.out, -1)
	if len(m) < 2 {
		t.Fatalf("no stage-up and stage-down flows found:\n%s", r.out)
	}
	for _, g := range m {
		if !regexp.MustCompile(`^[0-9,]+\.[02468]$`).MatchString(g[2]) {
			t.Errorf("flow %q is not written at 0.2 m³/h steps", g[2])
		}
	}
	// So is every other flow the text names (the reset's, the minimum
	// flow's): with the step's one decimal.
	for _, g := range regexp.MustCompile(`([0-9][0-9.,]*) m³/h`).FindAllStringSubmatch(r.out, -1) {
		if !strings.Contains(g[1], ".") {
			t.Errorf("flow %q m³/h is written without the step's decimal", g[1])
		}
	}
}
