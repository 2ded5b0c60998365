package cmd

import (
	"strings"
	"testing"

	"wattstage/optimize"
	"wattstage/plant"
)

// A staging change marks as chosen the combination the sequence runs after
// it, not whichever is listed first: at a crossover two combinations draw
// the same input and their order is rounding (the condenser-water example's
// stage 2 → 3 once showed the stage it left as chosen), and where the stage
// is not the cheapest combination at the change the cheaper one shows a
// negative difference.
func TestChangeMarksTheStageRun(t *testing.T) {
	p := &plant.Plant{Models: []plant.Model{{Name: "L", Count: 2}, {Name: "S", Count: 1}}}
	opts := []optimize.Option{
		{Counts: []int{1, 1}, Power: 20000, Served: true},
		{Counts: []int{2, 0}, Power: 20300, Served: true},
		{Counts: []int{0, 1}, Reason: "runs out"},
	}
	for _, tc := range []struct {
		target []int
		want   string
	}{
		{[]int{1, 1}, " 1 × L + 1 × S 20.00 kW (chosen); 2 × L 20.30 kW (+1.5 %); 1 × S cannot serve it; 5 other combinations draw more or cannot serve it\n"},
		{[]int{2, 0}, " 1 × L + 1 × S 20.00 kW (−1.5 %); 2 × L 20.30 kW (chosen); 1 × S cannot serve it; 5 other combinations draw more or cannot serve it\n"},
	} {
		var b strings.Builder
		writeOptions(&b, p, opts, 5, tc.target)
		if b.String() != tc.want {
			t.Errorf("target %v:\n got %q\nwant %q", tc.target, b.String(), tc.want)
		}
	}
}
